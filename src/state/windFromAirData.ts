// Wind from the log's own air data: w = v_ground − v_air, with v_air from logged TAS and true heading.
import { DEG } from '../constants.js';
import type { WindEstimate } from './flightState.js';
import { windFromVector } from './windOption.js';

/** Length of one air-data wind window [s] [practice]. */
export const AIR_DATA_WINDOW_S = 60;
/** Floor of an air-data wind 1-sigma [m/s]: a 1° heading bias or a 2 % TAS error at 50 m/s is ~1 m/s [practice]. */
export const AIR_DATA_SIGMA_FLOOR_MS = 1;
/** Correlation time of per-sample air-data wind errors [s] (gusts, sensor lag) [practice]. */
export const AIR_DATA_CORRELATION_S = 10;
/** Least logged TAS [m/s] for a usable air-data wind sample [practice]. */
export const AIR_DATA_MIN_TAS_MS = 15;

export interface AirDataWindInput {
  t: Float64Array;
  altM: Float64Array;
  velN: Float64Array;
  velE: Float64Array;
  velD: Float64Array;
  /** Logged TAS [m/s] and TRUE heading [deg], NaN where missing. */
  tasMs: Float64Array;
  headingDegTrue: Float64Array;
  segment: Int32Array;
}

/**
 * Per sample w = v_h − V_h (cos ψ, sin ψ), V_h = √(TAS² − v_D²) (no sideslip; the wind triangle of
 * PHYSICS.md §5), averaged over consecutive 60 s windows within a segment (a window needs 10 usable
 * samples). Each window is one estimate, source 'log-air-data', with covariance = scatter / n_eff
 * (n_eff = window length / 10 s) plus a 1 m/s isotropic floor.
 */
export function windFromAirData(c: AirDataWindInput): WindEstimate[] {
  const n = c.t.length;
  const out: WindEstimate[] = [];
  let i = 0;
  while (i < n) {
    const seg = c.segment[i];
    const tStart = c.t[i];
    let j = i;
    let k = 0, sn = 0, se = 0, snn = 0, sne = 0, see = 0, st = 0, sa = 0, na = 0, first = NaN, last = NaN;
    while (j < n && c.segment[j] === seg && c.t[j] - tStart < AIR_DATA_WINDOW_S) {
      const tas = c.tasMs[j], psi = c.headingDegTrue[j] * DEG;
      const vh = Math.sqrt(Math.max(0, tas * tas - c.velD[j] * c.velD[j]));
      const wN = c.velN[j] - vh * Math.cos(psi);
      const wE = c.velE[j] - vh * Math.sin(psi);
      if (tas >= AIR_DATA_MIN_TAS_MS && Number.isFinite(wN) && Number.isFinite(wE)) {
        k++; sn += wN; se += wE; snn += wN * wN; sne += wN * wE; see += wE * wE; st += tas;
        if (Number.isFinite(c.altM[j])) { sa += c.altM[j]; na++; }
        if (!Number.isFinite(first)) first = c.t[j];
        last = c.t[j];
      }
      j++;
    }
    if (k >= 10) {
      const mN = sn / k, mE = se / k;
      const span = Math.max(last - first, 1e-9);
      const nEff = Math.max(1, Math.min(k, span / AIR_DATA_CORRELATION_S));
      const f2 = AIR_DATA_SIGMA_FLOOR_MS ** 2;
      const covNN = (snn / k - mN * mN) / nEff + f2;
      const covNE = (sne / k - mN * mE) / nEff;
      const covEE = (see / k - mE * mE) / nEff + f2;
      const from = windFromVector(mN, mE);
      out.push({
        fromDegTrue: from.fromDegTrue, speedMs: from.speedMs, source: 'log-air-data',
        t0: first, t1: last, altM: na > 0 ? sa / na : NaN,
        sigmaMs: Math.sqrt(0.5 * (covNN + covEE)), tasMs: st / k, arcDeg: NaN,
        windN: mN, windE: mE, covNeMs2: [covNN, covNE, covEE],
      });
    }
    i = j > i ? j : i + 1;
  }
  return out;
}
