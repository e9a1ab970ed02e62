// FIT activity files (binary) to FlightLog columns through fit-file-parser: record messages, plus the
// aviation_attitude message's roll and pitch where a device logs them.
//
// Source: Garmin FIT SDK, "FIT Protocol" (file header, records, CRC) and the FIT Profile: record message
// (#20) fields timestamp (s since 1989-12-31T00:00:00Z), position_lat/position_long (sint32 semicircles,
// degrees = semicircles · 180 / 2^31), altitude / enhanced_altitude (scale 5, offset 500, m), speed /
// enhanced_speed (scale 1000, m/s), gps_accuracy (m); aviation_attitude (#178) pitch and roll (radians,
// scale 10430.38) with timestamp_ms. fit-file-parser applies the scales, offsets and semicircle conversion.
// The sign of roll (right wing down +) is taken from the profile's aviation use [from memory].
import FitParser from 'fit-file-parser';
import { ParseError } from '../errors.js';
import type { FlightLog, LogMeta, LogWarning } from '../log/flightLog.js';
import { LineTally, plural, pushTally } from '../log/logWarnings.js';
import { fitExtent } from './fitStructure.js';
import { LogBuilder } from './logBuilder.js';
import { toPlainText } from './plainText.js';

interface FitRecord {
  timestamp?: Date | number;
  position_lat?: number;
  position_long?: number;
  altitude?: number;
  enhanced_altitude?: number;
  speed?: number;
  enhanced_speed?: number;
  gps_accuracy?: number;
}

interface FitAttitude {
  timestamp?: Date | number;
  timestamp_ms?: number;
  system_time?: number[] | number;
  pitch?: number[] | number;
  roll?: number[] | number;
}

interface FitParsed {
  records?: FitRecord[];
  messages?: { aviation_attitude?: FitAttitude[] };
  file_ids?: Array<{ manufacturer?: unknown; product_name?: unknown; garmin_product?: unknown; product?: unknown }>;
}

/** Largest time difference [s] between a record and the attitude sample given to it (common practice: half a 1 Hz step). */
const ATTITUDE_MATCH_S = 0.5;

function seconds(ts: Date | number | undefined): number {
  if (ts instanceof Date) return ts.getTime() / 1000;
  return NaN;
}

function finite(v: unknown): number {
  return typeof v === 'number' && Number.isFinite(v) ? v : NaN;
}

function asArray(v: number[] | number | undefined): number[] {
  if (Array.isArray(v)) return v;
  return typeof v === 'number' ? [v] : [];
}

/** Runs fit-file-parser synchronously (its callback is called before parse returns). */
function runParser(bytes: Uint8Array, force: boolean): { error?: string; data?: FitParsed } {
  let out: { error?: string; data?: FitParsed } = { error: 'the FIT decoder gave no result' };
  const exact = bytes.slice().buffer; // an ArrayBuffer of exactly these bytes: reads past the end throw
  try {
    new FitParser({ force, mode: 'list', speedUnit: 'm/s', lengthUnit: 'm' }).parse(exact, (error, data) => {
      out = error !== undefined ? { error: String(error) } : { data: data as unknown as FitParsed };
    });
  } catch (err) {
    out = { error: err instanceof Error ? err.message : String(err) };
  }
  return out;
}

/**
 * Reads a FIT activity file (format 'fit'). One row per record message with a position: t [s UTC],
 * lat/lon [deg], altM [m] (enhanced_altitude preferred), gsMs (enhanced_speed preferred), hAccM from
 * gps_accuracy; rollDeg/pitchDeg from aviation_attitude samples within 0.5 s of a record. `line` is the
 * record's ordinal (1-based) among the file's record messages. A file cut off mid-way (declared data
 * longer than the bytes) is read up to its last complete message, with a warning; a CRC mismatch is
 * reported and the file read anyway.
 * @throws ParseError when the bytes are not a FIT file or hold no record with a position.
 */
export function parseFit(bytes: Uint8Array, file: string): FlightLog {
  const extent = fitExtent(bytes);
  if (!extent) throw new ParseError('not a FIT file (no ".FIT" file header)', { hint: 'the file may be damaged' });
  const warnings: LogWarning[] = [];
  let input = bytes;
  let truncated = false;
  const available = bytes.length - extent.headerSize;
  if (extent.declaredDataSize > available) {
    // Cut off: keep the complete messages only, and say so (FIT Protocol: data size in header bytes 4-7).
    truncated = true;
    input = bytes.slice(0, extent.headerSize + extent.completeDataSize);
    new DataView(input.buffer).setUint32(4, extent.completeDataSize, true);
    warnings.push({
      code: 'file-truncated',
      message: `The FIT file ends after ${available} of its ${extent.declaredDataSize} data bytes (after message ${extent.messages}): it was probably cut off while being written; the complete messages before the cut are read.`,
      lines: [extent.messages],
    });
  }
  let result = truncated ? runParser(input, true) : runParser(input, false);
  if (!truncated && result.error !== undefined && /CRC/i.test(result.error)) {
    warnings.push({ code: 'fit-crc-mismatch', message: `The FIT file's check sum does not match (${result.error}); the file may be damaged and is read as it is.` });
    result = runParser(input, true);
  }
  if (result.error !== undefined || !result.data) {
    throw new ParseError(`the FIT file cannot be decoded: ${result.error ?? 'no data'}`, { hint: 'the file may be damaged' });
  }
  const data = result.data;
  const records = data.records ?? [];
  const rows = new LogBuilder(Math.max(16, records.length));
  const noPosition = new LineTally();
  const noTime = new LineTally();
  for (let i = 0; i < records.length; i++) {
    const r = records[i];
    const t = seconds(r.timestamp);
    const lat = finite(r.position_lat);
    const lon = finite(r.position_long);
    if (!Number.isFinite(t)) {
      noTime.add(i + 1);
      continue;
    }
    if (!Number.isFinite(lat) || !Number.isFinite(lon)) {
      noPosition.add(i + 1);
      continue;
    }
    const alt = Number.isFinite(finite(r.enhanced_altitude)) ? finite(r.enhanced_altitude) : finite(r.altitude);
    rows.addRow(t, lat, lon, alt, i + 1);
    const gs = Number.isFinite(finite(r.enhanced_speed)) ? finite(r.enhanced_speed) : finite(r.speed);
    if (Number.isFinite(gs) || rows.has('gsMs')) rows.set('gsMs', gs);
    const acc = finite(r.gps_accuracy);
    if (Number.isFinite(acc) || rows.has('hAccM')) rows.set('hAccM', acc);
  }
  pushTally(warnings, 'fit-no-position', `${plural(noPosition.count, 'record')} without a position left out`, noPosition, 'record');
  pushTally(warnings, 'fit-no-time', `${plural(noTime.count, 'record')} without a timestamp left out`, noTime, 'record');
  if (rows.length === 0) {
    throw new ParseError(
      records.length === 0 ? 'the FIT file has no record messages' : `none of the ${plural(records.length, 'record')} in the FIT file has a position`,
      { hint: 'record the activity with GPS on' },
    );
  }

  const meta: LogMeta = {};
  const id = data.file_ids?.[0];
  if (id) {
    const parts = [id.manufacturer, id.product_name ?? id.garmin_product ?? id.product].filter((x) => typeof x === 'string' && x.length > 0) as string[];
    if (parts.length > 0) meta.device = toPlainText(parts.join(' '));
  }
  const log = rows.build({
    format: 'fit',
    file,
    warnings,
    meta,
    altDatum: 'unknown',
    reader: { recordsRead: records.length, recordsDropped: noPosition.count + noTime.count, truncated },
  });
  attachAttitude(log, data.messages?.aviation_attitude ?? [], warnings);
  return log;
}

/** Gives each row the roll and pitch of the nearest aviation_attitude sample within ATTITUDE_MATCH_S. */
function attachAttitude(log: FlightLog, messages: FitAttitude[], warnings: LogWarning[]): void {
  const at: number[] = [];
  const roll: number[] = [];
  const pitch: number[] = [];
  for (const m of messages) {
    const t0 = seconds(m.timestamp) + finite(m.timestamp_ms ?? 0) / 1000;
    if (!Number.isFinite(t0)) continue;
    const sys = asArray(m.system_time);
    const rs = asArray(m.roll);
    const ps = asArray(m.pitch);
    const n = Math.max(rs.length, ps.length);
    for (let k = 0; k < n; k++) {
      // Samples within one message are spaced by their system_time [ms] from the first.
      const dt = sys.length === n && Number.isFinite(sys[k]) && Number.isFinite(sys[0]) ? (sys[k] - sys[0]) / 1000 : 0;
      at.push(t0 + dt);
      roll.push(Number.isFinite(rs[k]) ? (rs[k] * 180) / Math.PI : NaN);
      pitch.push(Number.isFinite(ps[k]) ? (ps[k] * 180) / Math.PI : NaN);
    }
  }
  if (at.length === 0) return;
  const order = at.map((_, i) => i).sort((a, b) => at[a] - at[b]);
  const n = log.t.length;
  const rollDeg = new Float64Array(n).fill(NaN);
  const pitchDeg = new Float64Array(n).fill(NaN);
  let j = 0;
  let matched = 0;
  for (let i = 0; i < n; i++) {
    const t = log.t[i];
    while (j + 1 < order.length && at[order[j + 1]] <= t) j++;
    let best = order[j];
    if (j + 1 < order.length && Math.abs(at[order[j + 1]] - t) < Math.abs(at[best] - t)) best = order[j + 1];
    if (Math.abs(at[best] - t) <= ATTITUDE_MATCH_S) {
      rollDeg[i] = roll[best];
      pitchDeg[i] = pitch[best];
      matched++;
    }
  }
  log.rollDeg = rollDeg;
  log.pitchDeg = pitchDeg;
  warnings.push({ code: 'fit-attitude', message: `Bank and pitch come from the file's attitude messages (${matched} of ${n} records matched within ${ATTITUDE_MATCH_S} s).` });
}
