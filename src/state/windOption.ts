// The wind the user asks for, and its checks. Wind direction is where it blows FROM, degrees true.
import { DEG } from '../constants.js';
import { OptionError } from '../errors.js';

/** One row of a wind table: at a height [m] or at a time [UTC s], wind from `fromDegTrue` at `speedMs`. */
export interface WindTableRow {
  altM?: number;
  t?: number;
  fromDegTrue: number;
  speedMs: number;
}

/**
 * `calm`: no wind (heading taken equal to track, with a warning).
 * `given`: one wind for the whole flight, from `fromDegTrue` [deg true, 0..360] at `speedMs` [m/s, ≥ 0];
 *   estimates from the log are still made and a warning says when they disagree with it.
 * `table`: wind by height (every row has altM) or by time (every row has t), linear in the north/east
 *   components between rows and held beyond the ends.
 * `auto` (the default): from the log's own air data (TAS + heading) where it has them, else from turns
 *   (circle fits), else `fallback` when given, else calm with a warning.
 */
export type WindOption =
  | { kind: 'calm' }
  | { kind: 'given'; fromDegTrue: number; speedMs: number }
  | { kind: 'table'; rows: WindTableRow[] }
  | { kind: 'auto'; fallback?: { fromDegTrue: number; speedMs: number } };

/** Largest wind speed accepted [m/s] (~190 kt): anything above is a typo or a unit mistake [practice]. */
export const MAX_WIND_MS = 100;

function checkFromSpeed(name: string, fromDegTrue: number, speedMs: number): void {
  if (!(Number.isFinite(fromDegTrue) && fromDegTrue >= 0 && fromDegTrue <= 360)) {
    throw new OptionError(name, `direction from must be 0 to 360 degrees true, got ${fromDegTrue}`);
  }
  if (!(Number.isFinite(speedMs) && speedMs >= 0 && speedMs <= MAX_WIND_MS)) {
    throw new OptionError(name, `speed must be 0 to ${MAX_WIND_MS} m/s, got ${speedMs}`);
  }
}

/** Throws OptionError when a WindOption is malformed or out of range. */
export function checkWindOption(w: WindOption): void {
  if (w === null || typeof w !== 'object') throw new OptionError('wind', 'expected {kind: calm | given | table | auto}');
  switch (w.kind) {
    case 'calm':
      return;
    case 'auto':
      if (w.fallback !== undefined) checkFromSpeed('wind.fallback', w.fallback.fromDegTrue, w.fallback.speedMs);
      return;
    case 'given':
      checkFromSpeed('wind', w.fromDegTrue, w.speedMs);
      return;
    case 'table': {
      if (!Array.isArray(w.rows) || w.rows.length === 0) throw new OptionError('wind.rows', 'a wind table needs at least one row');
      const byAlt = w.rows[0].altM !== undefined;
      w.rows.forEach((r, i) => {
        checkFromSpeed(`wind.rows[${i}]`, r.fromDegTrue, r.speedMs);
        const key = byAlt ? r.altM : r.t;
        if ((r.altM !== undefined) === (r.t !== undefined)) throw new OptionError(`wind.rows[${i}]`, 'give exactly one of altM or t');
        if (byAlt !== (r.altM !== undefined)) throw new OptionError(`wind.rows[${i}]`, 'all rows must be keyed the same way (all altM or all t)');
        if (!Number.isFinite(key)) throw new OptionError(`wind.rows[${i}]`, `${byAlt ? 'altM' : 't'} must be a finite number`);
      });
      return;
    }
    default:
      throw new OptionError('wind', `unknown kind ${(w as { kind: unknown }).kind}`);
  }
}

/**
 * Air-mass velocity (the way the wind blows TO) in NED [m/s] of a wind from `fromDegTrue` at `speedMs`:
 * north = −V cos(from), east = −V sin(from). Example: from 270 (westerly) at 10 m/s → (0, +10).
 */
export function windVectorNe(fromDegTrue: number, speedMs: number): { windN: number; windE: number } {
  return { windN: -speedMs * Math.cos(fromDegTrue * DEG), windE: -speedMs * Math.sin(fromDegTrue * DEG) };
}

/** Inverse of windVectorNe: direction the wind blows from [deg true, [0, 360)] and speed [m/s]. */
export function windFromVector(windN: number, windE: number): { fromDegTrue: number; speedMs: number } {
  const speedMs = Math.hypot(windN, windE);
  let from = speedMs > 0 ? (Math.atan2(-windE, -windN) * 180) / Math.PI : 0;
  if (from < 0) from += 360;
  if (from >= 360) from -= 360;
  return { fromDegTrue: from + 0, speedMs };
}
