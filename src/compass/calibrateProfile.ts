// calibrateProfile: fits compass-profile parameters to observed compass readings (e.g. read off a cockpit video)
// by nonlinear least squares on the simulated trace.
//
// Method: Levenberg–Marquardt with Marquardt's diagonal scaling (K. Levenberg, Q. Appl. Math. 2:164–168, 1944;
// D. W. Marquardt, J. SIAM 11(2):431–441, 1963), Jacobian by central finite differences of simulateCompass,
// simple bounds by projection onto the documented parameter ranges. Positive scale parameters (period, damping,
// time constants) are fitted as logarithms. Residual r_k = wrap180(simulated reading at t_k − observed reading).
// Parameter 1-sigma from s²(JᵀJ)⁻¹ at the solution, s² = Σr²/(m − p) (linearised; an optimistic bound when the
// residuals are correlated in time, as video readings of a swinging card are).
import { wrap180 } from '../geo/angles.js';
import { OptionError } from '../errors.js';
import type { FlightState } from '../state/flightState.js';
import type { FieldAlongPath } from '../magnetic/fieldAlongPath.js';
import { COMPASS_PROFILE_FIELDS, validateCompassProfile, type CompassProfile } from './compassProfile.js';
import { simulateCompass } from './simulateCompass.js';
import type { CompassTrace } from './compassTrace.js';

/** Profile fields the calibration can fit. */
export type CalibratedParam = 'periodS' | 'dampingRatio' | 'swirlCoupling' | 'swirlTimeConstantS' | 'residualDipDeg' | 'tiltLagS';

const LOG_PARAMS: ReadonlySet<CalibratedParam> = new Set(['periodS', 'dampingRatio', 'swirlTimeConstantS', 'tiltLagS']);

/** Observed compass readings: times [s since epoch, UTC] and readings [deg, 0..360); NaN entries are skipped. */
export interface CompassObservations {
  t: Float64Array;
  compassDeg: Float64Array;
}

/**
 * Options. params: what to fit (default period, damping, swirl coupling, residual dip); maxIterations (default 60);
 * deviation: the aircraft's deviation card δ(compass) [deg, east +] if the observed readings include deviation;
 * useUnreliable: also fit samples the simulation flags unreliable (default false).
 */
export interface CalibrationOptions {
  params?: CalibratedParam[];
  maxIterations?: number;
  deviation?: (compassDeg: number) => number;
  useUnreliable?: boolean;
}

/** One fitted parameter: start and fitted value, linearised 1-sigma [the field's unit], and whether it sits on a bound. */
export interface FittedParam {
  name: CalibratedParam;
  initial: number;
  value: number;
  sigma: number;
  atBound: boolean;
}

/**
 * Result. profile: the start profile with the fitted values; residualsDeg: per observation (NaN where not used);
 * rmsDeg: RMS of the used residuals; used: count; correlation: p×p parameter correlation matrix (row-major order of
 * `params`); converged: the relative cost change or the step fell below 1e-10 before maxIterations.
 */
export interface CalibrationResult {
  profile: CompassProfile;
  params: FittedParam[];
  residualsDeg: Float64Array;
  rmsDeg: number;
  initialRmsDeg: number;
  used: number;
  iterations: number;
  converged: boolean;
  correlation: number[][];
}

/** Index mapping each observation to the state interval [j, j+1] containing it and the fraction, once. */
function locateObservations(tState: Float64Array, tObs: Float64Array): { j: Int32Array; f: Float64Array } {
  const m = tObs.length;
  const j = new Int32Array(m).fill(-1);
  const f = new Float64Array(m);
  const n = tState.length;
  for (let k = 0; k < m; k++) {
    const t = tObs[k];
    if (!Number.isFinite(t) || n < 1 || t < tState[0] || t > tState[n - 1]) continue;
    let lo = 0, hi = n - 1;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (tState[mid] <= t) lo = mid; else hi = mid;
    }
    const span = tState[hi] - tState[lo];
    j[k] = lo;
    f[k] = span > 0 ? Math.min(1, Math.max(0, (t - tState[lo]) / span)) : 0;
  }
  return { j, f };
}

/** Solves the small dense system A x = b (p ≤ ~8) by Gaussian elimination with partial pivoting; null if singular. */
function solveSmall(A: number[][], b: number[]): number[] | null {
  const p = b.length;
  const M = A.map((row, i) => [...row, b[i]]);
  for (let c = 0; c < p; c++) {
    let piv = c;
    for (let r = c + 1; r < p; r++) if (Math.abs(M[r][c]) > Math.abs(M[piv][c])) piv = r;
    if (!(Math.abs(M[piv][c]) > 1e-300)) return null;
    [M[c], M[piv]] = [M[piv], M[c]];
    for (let r = c + 1; r < p; r++) {
      const q = M[r][c] / M[c][c];
      for (let k = c; k <= p; k++) M[r][k] -= q * M[c][k];
    }
  }
  const x = new Array<number>(p).fill(0);
  for (let r = p - 1; r >= 0; r--) {
    let s = M[r][p];
    for (let k = r + 1; k < p; k++) s -= M[r][k] * x[k];
    x[r] = s / M[r][r];
  }
  return x;
}

/**
 * Fits compass-profile parameters so that the simulated compass matches observed readings.
 *
 * @param state, field the reconstructed flight and its field (as for simulateCompass)
 * @param observations times and readings of the real compass, any rate, inside the flight's time span
 * @param initial start profile (also supplies every parameter not fitted)
 * @returns the fitted profile, parameters with 1-sigma, residuals and RMS; see {@link CalibrationResult}
 * @throws OptionError for an unknown parameter, mismatched observation columns or fewer usable observations than
 *   parameters + 1.
 * @example calibrateProfile(state, field, { t, compassDeg }, DEFAULT_COMPASS_PROFILE, { params: ['periodS', 'dampingRatio'] })
 */
// Method: Levenberg–Marquardt (Marquardt 1963 scaling) on simulateCompass, central-difference Jacobian.
export function calibrateProfile(
  state: FlightState,
  field: FieldAlongPath,
  observations: CompassObservations,
  initial: CompassProfile,
  options: CalibrationOptions = {},
): CalibrationResult {
  validateCompassProfile(initial, 'initial profile');
  const names = options.params ?? ['periodS', 'dampingRatio', 'swirlCoupling', 'residualDipDeg'];
  for (const nm of names) {
    if (!(nm in COMPASS_PROFILE_FIELDS) || !['periodS', 'dampingRatio', 'swirlCoupling', 'swirlTimeConstantS', 'residualDipDeg', 'tiltLagS'].includes(nm)) {
      throw new OptionError('params', `cannot fit ${JSON.stringify(nm)}`);
    }
  }
  if (new Set(names).size !== names.length) throw new OptionError('params', 'lists a parameter twice');
  if (observations.t.length !== observations.compassDeg.length) {
    throw new OptionError('observations', `t has ${observations.t.length} entries, compassDeg ${observations.compassDeg.length}`);
  }
  const maxIt = options.maxIterations ?? 60;
  if (!(Number.isInteger(maxIt) && maxIt >= 1 && maxIt <= 1000)) throw new OptionError('maxIterations', `${maxIt} is outside [1, 1000]`);
  const p = names.length;
  const { j: obsJ, f: obsF } = locateObservations(state.t, observations.t);
  const m = observations.t.length;
  const refDipDeg = (Math.atan2(initial.refVerticalNt, initial.refHorizontalNt) * 180) / Math.PI;

  // Bounds in parameter space; transform u = log(v) for the scale parameters.
  const lo = names.map((nm) => {
    const d = COMPASS_PROFILE_FIELDS[nm];
    return LOG_PARAMS.has(nm) ? Math.max(d.min, 1e-3) : d.min;
  });
  const hi = names.map((nm) => (nm === 'residualDipDeg' ? Math.min(COMPASS_PROFILE_FIELDS[nm].max, refDipDeg - 0.5) : COMPASS_PROFILE_FIELDS[nm].max));
  const toU = (v: number, q: number) => (LOG_PARAMS.has(names[q]) ? Math.log(v) : v);
  const toV = (u: number, q: number) => {
    const v = LOG_PARAMS.has(names[q]) ? Math.exp(u) : u;
    return Math.min(hi[q], Math.max(lo[q], v));
  };
  const profileAt = (u: number[]): CompassProfile => {
    const pr: CompassProfile = { ...initial };
    for (let q = 0; q < p; q++) pr[names[q]] = toV(u[q], q);
    return pr;
  };

  // Observations used: inside the flight, finite, reliable in the start simulation.
  const mask = new Uint8Array(m);
  const start = simulateCompass(state, field, initial, options.deviation);
  let used = 0;
  for (let k = 0; k < m; k++) {
    const jj = obsJ[k];
    if (jj < 0 || !Number.isFinite(observations.compassDeg[k])) continue;
    const j2 = Math.min(jj + 1, state.n - 1);
    if (!options.useUnreliable && (start.unreliable[jj] === 1 || start.unreliable[j2] === 1)) continue;
    mask[k] = 1;
    used++;
  }
  if (used < p + 1) throw new OptionError('observations', `only ${used} usable readings for ${p} parameters`);

  const residuals = (tr: CompassTrace, out: Float64Array): number => {
    let ss = 0;
    for (let k = 0; k < m; k++) {
      if (mask[k] === 0) { out[k] = NaN; continue; }
      const jj = obsJ[k], j2 = Math.min(jj + 1, state.n - 1), f = obsF[k];
      const a = tr.readingDeg[jj], b = tr.readingDeg[j2];
      const sim = a + f * wrap180(b - a); // circular interpolation between the two samples
      const r = wrap180(sim - observations.compassDeg[k]);
      out[k] = Number.isFinite(r) ? r : 0;
      ss += out[k] * out[k];
    }
    return ss;
  };
  const run = (u: number[], out: Float64Array) => residuals(simulateCompass(state, field, profileAt(u), options.deviation), out);

  let u = names.map((nm, q) => toU(Math.min(hi[q], Math.max(lo[q], initial[nm])), q));
  let r = new Float64Array(m);
  let cost = run(u, r);
  const initialRmsDeg = Math.sqrt(cost / used);
  let lambda = 1e-3;
  let converged = false;
  let it = 0;
  const J: Float64Array[] = names.map(() => new Float64Array(m));
  const rp = new Float64Array(m), rm = new Float64Array(m);

  const jacobian = () => {
    for (let q = 0; q < p; q++) {
      const step = LOG_PARAMS.has(names[q]) ? 1e-3 : 1e-3 * Math.max(1, Math.abs(u[q])) * (names[q] === 'residualDipDeg' ? 50 : 1);
      const up = u.slice(), um = u.slice();
      up[q] += step; um[q] -= step;
      // one-sided at a bound (projection would make the central difference see half a step)
      const vp = toV(up[q], q), vm = toV(um[q], q);
      run(up, rp); run(um, rm);
      const du = (LOG_PARAMS.has(names[q]) ? Math.log(vp) - Math.log(vm) : vp - vm) || step;
      for (let k = 0; k < m; k++) J[q][k] = mask[k] ? (rp[k] - rm[k]) / du : 0;
    }
  };

  for (it = 1; it <= maxIt; it++) {
    jacobian();
    const A: number[][] = [], g: number[] = [];
    for (let a = 0; a < p; a++) {
      A.push(new Array<number>(p).fill(0));
      let s = 0;
      for (let k = 0; k < m; k++) s += J[a][k] * r[k];
      g.push(s);
      for (let b = 0; b <= a; b++) {
        let t = 0;
        for (let k = 0; k < m; k++) t += J[a][k] * J[b][k];
        A[a][b] = t;
      }
    }
    for (let a = 0; a < p; a++) for (let b = a + 1; b < p; b++) A[a][b] = A[b][a];
    let accepted = false;
    for (let tries = 0; tries < 12; tries++) {
      const Al = A.map((row, a) => row.map((v, b) => (a === b ? v + lambda * Math.max(v, 1e-12) : v)));
      const d = solveSmall(Al, g.map((v) => -v));
      if (!d) { lambda *= 10; continue; }
      const un = u.map((v, q) => toU(toV(v + d[q], q), q));
      const rn = new Float64Array(m);
      const cn = run(un, rn);
      if (cn < cost) {
        const rel = (cost - cn) / Math.max(cost, 1e-300);
        const stepNorm = Math.max(...un.map((v, q) => Math.abs(v - u[q])));
        u = un; r = rn; cost = cn;
        lambda = Math.max(lambda / 3, 1e-12);
        accepted = true;
        if (rel < 1e-10 || stepNorm < 1e-10) converged = true;
        break;
      }
      lambda *= 4;
    }
    if (!accepted) { converged = true; break; } // no downhill step left: a (local) minimum
    if (converged) break;
  }

  // Covariance in u, mapped to parameter units.
  jacobian();
  const A: number[][] = [];
  for (let a = 0; a < p; a++) {
    A.push(new Array<number>(p).fill(0));
    for (let b = 0; b < p; b++) {
      let t = 0;
      for (let k = 0; k < m; k++) t += J[a][k] * J[b][k];
      A[a][b] = t;
    }
  }
  const s2 = used > p ? cost / (used - p) : NaN;
  const cov: number[][] = [];
  for (let c = 0; c < p; c++) {
    const e = new Array<number>(p).fill(0);
    e[c] = 1;
    cov.push(solveSmall(A, e) ?? new Array<number>(p).fill(NaN));
  }
  const params: FittedParam[] = names.map((nm, q) => {
    const v = toV(u[q], q);
    const su = Math.sqrt(Math.max(0, cov[q][q] * s2));
    return {
      name: nm, initial: initial[nm], value: v,
      sigma: LOG_PARAMS.has(nm) ? v * su : su,
      atBound: v <= lo[q] * (1 + 1e-9) || v >= hi[q] * (1 - 1e-9),
    };
  });
  const correlation = cov.map((row, a) => row.map((v, b) => v / Math.sqrt(cov[a][a] * cov[b][b])));
  return {
    profile: profileAt(u), params, residualsDeg: r, rmsDeg: Math.sqrt(cost / used), initialRmsDeg,
    used, iterations: Math.min(it, maxIt), converged, correlation,
  };
}
