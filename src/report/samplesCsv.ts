// The samples CSV: one row per sample, the contract columns of DESIGN.md first, the error split after them.
import { KT_MS } from '../constants.js';
import type { FlightAnalysis } from '../flightAnalysis.js';
import { wrap180, wrap360 } from '../geo/angles.js';
import { AsciiRowWriter, roundNonNegative31, writeFixed, writeScaled31, writeTwoDigits, writeUint } from './asciiRowWriter.js';

const POW10 = [1, 10, 100, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9];
const CH_COMMA = 44;
const CH_NL = 10;
const CH_DOT = 46;
const CH_COLON = 58;
const CH_Z = 90;
const CH_0 = 48;

/** Contract columns, exactly these names in this order (DESIGN.md "Samples CSV"). */
export const SAMPLES_CONTRACT_COLUMNS = [
  'time_utc',
  'lat_deg',
  'lon_deg',
  'alt_m',
  'groundspeed_kt',
  'track_true_deg',
  'heading_true_deg',
  'heading_mag_deg',
  'variation_deg',
  'dip_deg',
  'bank_deg',
  'turn_rate_dps',
  'accel_long_ms2',
  'compass_static_deg',
  'compass_deg',
  'compass_error_deg',
] as const;

/** Columns that follow the contract: the error split (they add up to compass_error_deg) and flags. */
export const SAMPLES_EXTRA_COLUMNS = [
  'err_dip_turn_deg',
  'err_dip_accel_deg',
  'err_lag_swirl_deg',
  'err_deviation_deg',
  'card_tilt_deg',
  'card_unreliable',
  'segment',
  'drift_deg',
  'heading_sigma_deg',
  'wind_from_deg',
  'wind_kt',
] as const;

/** An angle wrapped to [0, 360) with `digits` decimals; a value that would round to 360 is written as 0. */
function writeAngle360(buf: Uint8Array, pos: number, x: number, digits: number): number {
  if (!Number.isFinite(x)) return pos;
  const v = wrap360(x); // 0 ≤ v < 360, so |v|·10^digits is far below 2^31
  const scale = POW10[digits];
  const r = roundNonNegative31(v * scale);
  return writeScaled31(buf, pos, false, r >= 360 * scale ? 0 : r, digits);
}

/** A signed angle wrapped to (−180, 180] with `digits` decimals. */
function writeAngle180(buf: Uint8Array, pos: number, x: number, digits: number): number {
  return Number.isFinite(x) ? writeFixed(buf, pos, wrap180(x), digits) : pos;
}

/** ASCII bytes of "YYYY-MM-DDT" for UTC day number d (days since 1970-01-01). */
function dayPrefixBytes(d: number): Uint8Array {
  const text = new Date(d * 86_400_000).toISOString().slice(0, 11);
  const out = new Uint8Array(text.length);
  for (let k = 0; k < text.length; k++) out[k] = text.charCodeAt(k);
  return out;
}

/**
 * ISO 8601 UTC with milliseconds, e.g. 2026-05-04T10:11:12.500Z, at buf[pos] (nothing when tS is not
 * finite); returns the new position. `day` holds the last day number and its "YYYY-MM-DDT" bytes, so the
 * date part is made once per UTC day.
 */
function writeIsoTime(buf: Uint8Array, pos: number, tS: number, day: { d: number; prefix: Uint8Array }): number {
  if (!Number.isFinite(tS)) return pos;
  const ms = roundMs(tS * 1000);
  const d = Math.floor(ms / 86_400_000);
  if (d !== day.d) {
    day.d = d;
    day.prefix = dayPrefixBytes(d);
  }
  // 0 ≤ ms of the day < 86,400,000: int32 arithmetic from here on.
  let rem = (ms - d * 86_400_000) | 0;
  const h = (rem / 3_600_000) | 0;
  rem -= h * 3_600_000;
  const m = (rem / 60_000) | 0;
  rem -= m * 60_000;
  const sec = (rem / 1000) | 0;
  rem -= sec * 1000;
  let p = pos;
  const prefix = day.prefix;
  for (let k = 0; k < prefix.length; k++) buf[p++] = prefix[k];
  p = writeTwoDigits(buf, p, h);
  buf[p++] = CH_COLON;
  p = writeTwoDigits(buf, p, m);
  buf[p++] = CH_COLON;
  p = writeTwoDigits(buf, p, sec);
  buf[p++] = CH_DOT;
  buf[p++] = CH_0 + ((rem / 100) | 0);
  p = writeTwoDigits(buf, p, rem % 100);
  buf[p++] = CH_Z;
  return p;
}

/**
 * Math.round(v), the same value, for the millisecond count of a time: floor(v + 0.5), less one where the
 * addition rounded up across an integer (both steps exact below 2^51); Math.round itself beyond that.
 */
function roundMs(v: number): number {
  if (!(Math.abs(v) < 2 ** 51)) return Math.round(v);
  const r = Math.floor(v + 0.5);
  return r - 0.5 > v ? r - 1 : r;
}

/**
 * Samples CSV text for a whole flight, header first, '\n' line ends. Missing values are empty fields.
 * Angles in [0, 360) except signed quantities; heading_mag = heading_true − variation (east +).
 */
export function samplesCsv(a: FlightAnalysis): string {
  const decoder = new TextDecoder();
  let text = '';
  for (const c of samplesCsvChunks(a)) text += decoder.decode(c);
  return text;
}

export function* samplesCsvChunks(a: FlightAnalysis, chunkBytes = 1 << 20): Generator<Uint8Array> {
  const w = new AsciiRowWriter(Math.max(chunkBytes, 2048));
  w.ascii([...SAMPLES_CONTRACT_COLUMNS, ...SAMPLES_EXTRA_COLUMNS].join(','));
  w.newline();
  const day = { d: NaN, prefix: new Uint8Array(0) };
  for (let i = 0; i < a.state.n; ) {
    i = writeSampleRows(a, i, w, day);
    if (w.nearlyFull()) yield w.take();
  }
  yield w.take();
}

function writeSampleRows(a: FlightAnalysis, i0: number, w: AsciiRowWriter, day: { d: number; prefix: Uint8Array }): number {
  const { state: s, field: f, compass: c } = a;
  const { t, lat, lon, altM, gsMs, trackDegTrue, headingDegTrue, bankDeg, turnRateDps, accelLongMs2, segment, windN, windE } = s;
  const { variationDeg, dipDeg } = f;
  const { staticDeg, readingDeg, errorDeg, errDipTurnDeg, errDipAccelDeg, errLagSwirlDeg, errDeviationDeg, tiltDeg, unreliable } = c;
  const sigma = s.headingSigmaDeg;
  const buf = w.buf;
  const limit = buf.length - 1024;
  let p = w.pos;
  let i = i0;
  for (; i < s.n && p <= limit; i++) {
    const headingMag = headingDegTrue[i] - variationDeg[i];
    const windMs = Math.hypot(windN[i], windE[i]);
    p = writeIsoTime(buf, p, t[i], day); buf[p++] = CH_COMMA;
    p = writeFixed(buf, p, lat[i], 7); buf[p++] = CH_COMMA;
    p = writeFixed(buf, p, lon[i], 7); buf[p++] = CH_COMMA;
    p = writeFixed(buf, p, altM[i], 1); buf[p++] = CH_COMMA;
    p = writeFixed(buf, p, gsMs[i] / KT_MS, 2); buf[p++] = CH_COMMA;
    p = writeAngle360(buf, p, trackDegTrue[i], 2); buf[p++] = CH_COMMA;
    p = writeAngle360(buf, p, headingDegTrue[i], 2); buf[p++] = CH_COMMA;
    p = writeAngle360(buf, p, headingMag, 2); buf[p++] = CH_COMMA;
    p = writeAngle180(buf, p, variationDeg[i], 3); buf[p++] = CH_COMMA;
    p = writeFixed(buf, p, dipDeg[i], 3); buf[p++] = CH_COMMA;
    p = writeFixed(buf, p, bankDeg[i], 2); buf[p++] = CH_COMMA;
    p = writeFixed(buf, p, turnRateDps[i], 3); buf[p++] = CH_COMMA;
    p = writeFixed(buf, p, accelLongMs2[i], 3); buf[p++] = CH_COMMA;
    p = writeAngle360(buf, p, staticDeg[i], 2); buf[p++] = CH_COMMA;
    p = writeAngle360(buf, p, readingDeg[i], 2); buf[p++] = CH_COMMA;
    p = writeAngle180(buf, p, errorDeg[i], 2); buf[p++] = CH_COMMA;
    p = writeFixed(buf, p, errDipTurnDeg[i], 2); buf[p++] = CH_COMMA;
    p = writeFixed(buf, p, errDipAccelDeg[i], 2); buf[p++] = CH_COMMA;
    p = writeFixed(buf, p, errLagSwirlDeg[i], 2); buf[p++] = CH_COMMA;
    p = writeFixed(buf, p, errDeviationDeg[i], 2); buf[p++] = CH_COMMA;
    p = writeFixed(buf, p, tiltDeg[i], 2); buf[p++] = CH_COMMA;
    p = writeUint(buf, p, unreliable[i]); buf[p++] = CH_COMMA;
    p = writeUint(buf, p, segment[i]); buf[p++] = CH_COMMA;
    p = writeAngle180(buf, p, trackDegTrue[i] - headingDegTrue[i], 2); buf[p++] = CH_COMMA;
    p = writeFixed(buf, p, sigma ? sigma[i] : NaN, 2); buf[p++] = CH_COMMA;
    p = writeAngle360(buf, p, windMs > 0 ? (Math.atan2(-windE[i], -windN[i]) * 180) / Math.PI : 0, 1); buf[p++] = CH_COMMA;
    p = writeFixed(buf, p, windMs / KT_MS, 1);
    buf[p++] = CH_NL;
  }
  w.pos = p;
  return i;
}
