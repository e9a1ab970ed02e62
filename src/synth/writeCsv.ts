// Plain CSV text from a FlightLog: UTC time, position, height (ft or m), optionally ground speed and track.
import { FT_M, KT_MS } from '../constants.js';
import { OptionError } from '../errors.js';
import type { FlightLog } from '../log/flightLog.js';
import { isoUtcMs } from './writeGpx.js';

/** altUnit: 'ft' (column alt_ft) or 'm' (alt_m); velocity: add gs_kt and track_deg (the log must have them). */
export interface CsvWriteOptions {
  altUnit: 'ft' | 'm';
  velocity?: boolean;
}

function num(v: number, decimals: number): string {
  return Number.isFinite(v) ? v.toFixed(decimals) : '';
}

/** An angle in [0, 360) to fixed decimals, so that 359.996 prints as 0.00 and not as 360.00. */
function angle(v: number, decimals: number): string {
  const s = num(v, decimals);
  return Number(s) >= 360 ? (0).toFixed(decimals) : s;
}

/**
 * Writes a FlightLog as comma-separated text (RFC 4180 layout, LF line ends), header
 * `time_utc,lat_deg,lon_deg,alt_ft|alt_m[,gs_kt,track_deg]`: time ISO 8601 UTC with ms; lat/lon 7 decimals;
 * alt 1 decimal (ft) or 2 (m); gs_kt 2 decimals; track_deg (true, [0, 360)) 2 decimals. NaN becomes an empty field.
 * No field needs quoting (numbers and ISO times only). Throws OptionError if velocity is asked for and the
 * log has no gsMs / trackDegTrue columns. Pure.
 */
export function writeCsv(log: FlightLog, opts: CsvWriteOptions): string {
  if (opts.altUnit !== 'ft' && opts.altUnit !== 'm') throw new OptionError('altUnit', `must be 'ft' or 'm', got ${String(opts.altUnit)}`);
  const withVel = opts.velocity === true;
  const gs = log.gsMs;
  const track = log.trackDegTrue;
  if (withVel && (gs === undefined || track === undefined)) {
    throw new OptionError('velocity', 'the log has no ground speed / track columns');
  }
  const ft = opts.altUnit === 'ft';
  const header = ['time_utc', 'lat_deg', 'lon_deg', ft ? 'alt_ft' : 'alt_m'];
  if (withVel) header.push('gs_kt', 'track_deg');
  const rows: string[] = [header.join(',')];
  for (let i = 0; i < log.t.length; i++) {
    const t = log.t[i];
    const f = [
      Number.isFinite(t) ? isoUtcMs(t) : '',
      num(log.lat[i], 7),
      num(log.lon[i], 7),
      ft ? num(log.altM[i] / FT_M, 1) : num(log.altM[i], 2),
    ];
    if (withVel && gs !== undefined && track !== undefined) f.push(num(gs[i] / KT_MS, 2), angle(track[i], 2));
    rows.push(f.join(','));
  }
  return `${rows.join('\n')}\n`;
}
