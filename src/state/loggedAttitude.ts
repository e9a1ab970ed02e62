// The log's own heading, attitude and airspeed, checked and turned to true heading, and how far they
// disagree with the values reconstructed from the track.
import type { LogWarning } from '../log/flightLog.js';

/** Magnetic variation (declination) [deg, east +] at a place and time; supplied by the caller (e.g. WMM2025). */
export type VariationAt = (latDeg: number, lonDeg: number, altM: number, t: number) => number;

/** Assumed 1-sigma of a logged heading [deg] (AHRS/heading source) [practice]. */
export const LOGGED_HEADING_SIGMA_DEG = 2;

export interface LoggedColumns {
  headingDeg?: Float64Array;
  headingRef?: 'true' | 'magnetic';
  rollDeg?: Float64Array;
  pitchDeg?: Float64Array;
  tasMs?: Float64Array;
}

export interface LoggedAttitude {
  headingDegTrue?: Float64Array;
  rollDeg?: Float64Array;
  pitchDeg?: Float64Array;
  tasMs?: Float64Array;
  warnings: LogWarning[];
}

/**
 * Checks the logged columns (rows already aligned with the state): heading in [0, 360], roll in [−90, 90],
 * pitch in [−90, 90], TAS in [0, 350] m/s; values outside become NaN and are counted. A magnetic heading
 * becomes true by adding the variation (east +: true = magnetic + variation) when `variationAt` is given;
 * without it, or when the reference is not stated, the heading is not used (warning).
 */
export function loggedAttitude(
  c: LoggedColumns,
  lat: Float64Array,
  lon: Float64Array,
  altM: Float64Array,
  t: Float64Array,
  variationAt?: VariationAt,
): LoggedAttitude {
  const warnings: LogWarning[] = [];
  const out: LoggedAttitude = { warnings };
  const clean = (col: Float64Array | undefined, lo: number, hi: number, name: string): Float64Array | undefined => {
    if (!col) return undefined;
    let bad = 0, good = 0;
    const r = new Float64Array(col.length);
    for (let i = 0; i < col.length; i++) {
      const v = col[i];
      if (Number.isFinite(v) && v >= lo && v <= hi) { r[i] = v; good++; }
      else { r[i] = NaN; if (Number.isFinite(v)) bad++; }
    }
    if (bad > 0) warnings.push({ code: 'state-logged-value-range', message: `${bad} logged ${name} value(s) outside ${lo} to ${hi} were not used`, count: bad });
    return good > 0 ? r : undefined;
  };
  const hdg = clean(c.headingDeg, 0, 360, 'heading');
  if (hdg) {
    if (c.headingRef === 'true') out.headingDegTrue = hdg;
    else if (c.headingRef === 'magnetic' && variationAt) {
      const h = new Float64Array(hdg.length);
      for (let i = 0; i < h.length; i++) {
        const v = hdg[i] + variationAt(lat[i], lon[i], Number.isFinite(altM[i]) ? altM[i] : 0, t[i]);
        h[i] = Number.isFinite(v) ? ((v % 360) + 360) % 360 : NaN;
      }
      out.headingDegTrue = h;
    } else {
      warnings.push({
        code: 'state-logged-heading-unused',
        message: c.headingRef === 'magnetic' ? 'the log\'s magnetic heading was not used: no variation was supplied to make it true' : 'the log\'s heading was not used: its reference (true or magnetic) is not stated',
      });
    }
  }
  out.rollDeg = clean(c.rollDeg, -90, 90, 'roll');
  out.pitchDeg = clean(c.pitchDeg, -90, 90, 'pitch');
  out.tasMs = clean(c.tasMs, 0, 350, 'TAS');
  return out;
}

/** Median and 95th percentile of |a − b| over rows where both are finite (angles wrapped to (−180, 180] when `angular`). */
export function disagreement(a: Float64Array, b: Float64Array, angular: boolean): { median: number; p95: number; n: number } {
  const all = new Float64Array(a.length);
  let k = 0;
  for (let i = 0; i < a.length; i++) {
    if (!(Number.isFinite(a[i]) && Number.isFinite(b[i]))) continue;
    let x = a[i] - b[i];
    if (angular) x -= 360 * Math.round(x / 360);
    all[k++] = Math.abs(x);
  }
  const d = all.subarray(0, k).sort(); // numeric order (typed-array sort); no NaN here
  if (d.length === 0) return { median: NaN, p95: NaN, n: 0 };
  return { median: d[d.length >> 1], p95: d[Math.min(d.length - 1, Math.floor(0.95 * d.length))], n: d.length };
}
