// The wind the user asks for, and its checks. Wind direction is where it blows FROM, degrees true.
import { DEG } from '../constants.js';
import { OptionError } from '../errors.js';

/**
 * `calm`: no wind (heading taken equal to track, with a warning).
 * `given`: one wind for the whole flight, from `fromDegTrue` [deg true, 0..360] at `speedMs` [m/s, ≥ 0].
 * `auto`: estimate from the log (air data, then turns); falls back to calm with a warning.
 */
export type WindOption = { kind: 'calm' } | { kind: 'given'; fromDegTrue: number; speedMs: number } | { kind: 'auto' };

/** Largest wind speed accepted [m/s] (~190 kt): anything above is a typo or a unit mistake [practice]. */
export const MAX_WIND_MS = 100;

/** Throws OptionError when a WindOption is malformed or out of range. */
export function checkWindOption(w: WindOption): void {
  if (w === null || typeof w !== 'object') throw new OptionError('wind', 'expected {kind: calm | given | auto}');
  if (w.kind === 'calm' || w.kind === 'auto') return;
  if (w.kind === 'given') {
    if (!(Number.isFinite(w.fromDegTrue) && w.fromDegTrue >= 0 && w.fromDegTrue <= 360)) {
      throw new OptionError('wind', `direction from must be 0 to 360 degrees true, got ${w.fromDegTrue}`);
    }
    if (!(Number.isFinite(w.speedMs) && w.speedMs >= 0 && w.speedMs <= MAX_WIND_MS)) {
      throw new OptionError('wind', `speed must be 0 to ${MAX_WIND_MS} m/s, got ${w.speedMs}`);
    }
    return;
  }
  throw new OptionError('wind', `unknown kind ${(w as { kind: unknown }).kind}`);
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
