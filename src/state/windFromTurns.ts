// Wind from turns: over a level turn at constant TAS in a steady wind, the tips of the ground-velocity
// vectors lie on a circle whose centre is the wind vector and whose radius is the (horizontal) TAS.
import { RAD } from '../constants.js';
import type { WindEstimate } from './flightState.js';
import { geometricCircleFit, kasaCircleFit } from './circleFit.js';
import { findTurnWindows, type TurnWindow } from './turnWindows.js';
import { windFromVector } from './windOption.js';

/** Least air-vector turn [deg] of a usable wind fit [practice; PHYSICS.md §5 says ~90 at least; 120 keeps the wind error within ~2 kt with 2 m GPS noise, see test/state/windFromTurns.test.ts]. */
export const DEFAULT_MIN_ARC_DEG = 120;
/** A fit whose orthogonal residuals exceed this RMS [m/s] is rejected (PHYSICS.md §5: ~1.5 m/s) [practice]. */
export const MAX_FIT_RMS_MS = 1.5;
/** A fit whose radius drifts by more than this over the window [m/s] is rejected as a speed change [practice]. */
export const MAX_TAS_DRIFT_MS = 2.5;
/** A fit whose wind 1-sigma exceeds this [m/s] is rejected as too uncertain [practice]. */
export const MAX_WIND_SIGMA_MS = 3;
/** Correlation time [s] of the velocity errors of the smoothed track: residuals closer than this are not independent [practice, checked on synthetic flights]. */
export const RESIDUAL_CORRELATION_S = 5;

export interface WindFromTurnsInput {
  t: Float64Array;
  altM: Float64Array;
  velN: Float64Array;
  velE: Float64Array;
  velD: Float64Array;
  accN: Float64Array;
  accE: Float64Array;
  /** Horizontal velocity 1-sigma per axis from the smoother [m/s]; NaN-free where velocities are finite. */
  velSigmaMs: Float64Array;
  segment: Int32Array;
}

/** A turn that was looked at and not used, with the reason in words. */
export interface TurnFitRejection {
  t0: number;
  t1: number;
  arcDeg: number;
  reason: 'arc-too-short' | 'fit-failed' | 'poor-fit' | 'speed-change' | 'too-slow' | 'implausible' | 'uncertain';
  detail: string;
}

export interface WindFromTurnsResult {
  /** Accepted estimates, in time order, source 'turn-fit', with covariance. */
  estimates: WindEstimate[];
  rejected: TurnFitRejection[];
  /** Turns left out because the aircraft climbed or descended in them [UTC s]. */
  notLevel: { t0: number; t1: number }[];
}

/**
 * Finds level turns (see findTurnWindows) and fits a circle to the horizontal ground-velocity tips of each:
 * Kasa's algebraic fit (Kasa 1976) as the start, then the geometric fit by Levenberg–Marquardt (Chernov &
 * Lesort 2005). Centre = wind vector (air-mass velocity, blowing TO), radius = horizontal TAS. Geometry:
 * v_g = v_a + w with |v_a| = V constant (D. Gray 1998 after D. Fox, KITPLANES 1995; PHYSICS.md §5).
 * Uncertainty: covariance s² (JᵀJ)⁻¹ with s² = max(residual variance, smoother velocity variance),
 * inflated by n·τ/T (τ = 5 s: residuals closer in time are correlated). Rejected: air-vector arc below
 * `minArcDeg` (default 120°), RMS residual above 1.5 m/s, radius drifting more than 2.5 m/s over the turn
 * (a speed change), radius below 15 m/s, wind above 0.8 × TAS, wind 1-sigma above 3 m/s.
 */
export function windFromTurns(c: WindFromTurnsInput, minArcDeg = DEFAULT_MIN_ARC_DEG): WindFromTurnsResult {
  // Look at every turn of at least 60° of track so that short ones are reported as rejected.
  const search = findTurnWindows(c.t, c.velN, c.velE, c.velD, c.accN, c.accE, c.segment, Math.min(60, minArcDeg));
  const estimates: WindEstimate[] = [];
  const rejected: TurnFitRejection[] = [];
  for (const w of search.windows) {
    const r = fitWindow(c, w, minArcDeg);
    if ('reason' in r) rejected.push(r);
    else estimates.push(r);
  }
  return { estimates, rejected, notLevel: search.notLevel.map((w) => ({ t0: c.t[w.i0], t1: c.t[w.i1 - 1] })) };
}

function fitWindow(c: WindFromTurnsInput, w: TurnWindow, minArcDeg: number): WindEstimate | TurnFitRejection {
  const { i0, i1 } = w;
  const t0 = c.t[i0], t1 = c.t[i1 - 1];
  const reject = (reason: TurnFitRejection['reason'], arcDeg: number, detail: string): TurnFitRejection => ({ t0, t1, arcDeg, reason, detail });
  const start = kasaCircleFit(c.velN, c.velE, i0, i1);
  // Median smoother velocity variance as the floor of the residual variance.
  const vsAll = new Float64Array(i1 - i0);
  let nvs = 0;
  for (let i = i0; i < i1; i++) if (Number.isFinite(c.velSigmaMs[i])) vsAll[nvs++] = c.velSigmaMs[i];
  const vs = vsAll.subarray(0, nvs).sort();
  const velVar = nvs > 0 ? vs[nvs >> 1] ** 2 : 0;
  // sigma2 = 1: cov holds (JᵀJ)⁻¹, scaled below.
  const fit = geometricCircleFit(c.velN, c.velE, start, i0, i1, 1);
  if (!(Number.isFinite(fit.cx) && Number.isFinite(fit.r))) return reject('fit-failed', w.trackChangeDeg, 'the circle fit did not converge');
  // Air-vector arc and radius trend.
  let prev = NaN, unwrapped = 0, lo = 0, hi = 0;
  let n = 0, st = 0, sd = 0, stt = 0, std = 0, altSum = 0, altN = 0;
  for (let i = i0; i < i1; i++) {
    const dx = c.velN[i] - fit.cx, dy = c.velE[i] - fit.cy;
    if (!(Number.isFinite(dx) && Number.isFinite(dy))) continue;
    const a = Math.atan2(dy, dx) * RAD;
    if (Number.isFinite(prev)) {
      let d = a - prev;
      d -= 360 * Math.round(d / 360);
      unwrapped += d;
      lo = Math.min(lo, unwrapped);
      hi = Math.max(hi, unwrapped);
    }
    prev = a;
    const tt = c.t[i] - t0, dd = Math.sqrt(dx * dx + dy * dy);
    n++; st += tt; sd += dd; stt += tt * tt; std += tt * dd;
    if (Number.isFinite(c.altM[i])) { altSum += c.altM[i]; altN++; }
  }
  const arcDeg = hi - lo;
  const slope = n > 2 ? (n * std - st * sd) / (n * stt - st * st) : 0;
  const drift = Math.abs(slope * (t1 - t0));
  if (arcDeg < minArcDeg) return reject('arc-too-short', arcDeg, `the air vector turned ${arcDeg.toFixed(0)}°, less than the ${minArcDeg}° a wind fit needs`);
  if (drift > MAX_TAS_DRIFT_MS) return reject('speed-change', arcDeg, `the airspeed changed by about ${drift.toFixed(1)} m/s during the turn`);
  if (fit.rmsResidual > MAX_FIT_RMS_MS) return reject('poor-fit', arcDeg, `the ground speeds do not lie on one circle (RMS ${fit.rmsResidual.toFixed(1)} m/s): airspeed or wind changed in the turn`);
  if (fit.r < 15) return reject('too-slow', arcDeg, `the fitted airspeed ${fit.r.toFixed(1)} m/s is too low for a wind fit`);
  const windMs = Math.hypot(fit.cx, fit.cy);
  if (windMs > 0.8 * fit.r) return reject('implausible', arcDeg, `the fitted wind ${windMs.toFixed(1)} m/s is implausibly strong for the fitted airspeed ${fit.r.toFixed(1)} m/s`);
  // Covariance: residual (or smoother) variance, inflated for correlated residuals.
  const resVar = (fit.rmsResidual * fit.rmsResidual * n) / Math.max(1, n - 3);
  const s2 = Math.max(resVar, velVar) * Math.max(1, (n * RESIDUAL_CORRELATION_S) / Math.max(t1 - t0, 1e-9));
  const covNN = fit.cov[0] * s2, covNE = fit.cov[1] * s2, covEE = fit.cov[4] * s2;
  const sigmaMs = Math.sqrt(Math.max(0, 0.5 * (covNN + covEE)));
  if (!(sigmaMs <= MAX_WIND_SIGMA_MS)) return reject('uncertain', arcDeg, `the wind from this turn is uncertain by ${sigmaMs.toFixed(1)} m/s`);
  const from = windFromVector(fit.cx, fit.cy);
  return {
    fromDegTrue: from.fromDegTrue,
    speedMs: from.speedMs,
    source: 'turn-fit',
    t0,
    t1,
    altM: altN > 0 ? altSum / altN : NaN,
    sigmaMs,
    tasMs: fit.r,
    arcDeg,
    windN: fit.cx,
    windE: fit.cy,
    covNeMs2: [covNN, covNE, covEE],
    rmsResidualMs: fit.rmsResidual,
  };
}
