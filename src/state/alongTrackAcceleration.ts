// Along-track acceleration of the air vector, smoothed on its own slower time scale, recombined with the
// lateral (turning) acceleration. Speed changes of a light aircraft are slow; turns are not.
import { rtsSmoothWhiteJerk } from './rtsSmoother.js';

/**
 * Default jerk PSD of the airspeed model [m²/s⁷], i.e. of d³V/dt³. Chosen on the synthetic lessons
 * (src/synth: 0.5 m/s² speed changes ramped over 1 s, 2 m GPS noise at 1 Hz): it brings the along-track
 * acceleration noise in steady flight from about 0.23 to 0.05 m/s² (95th percentile) while a speed change
 * is still followed within a few seconds [derived estimate, to be calibrated on real logs].
 */
export const DEFAULT_SPEED_JERK_PSD = 3e-4;

export interface AlongTrackInput {
  t: Float64Array;
  /** First row of each segment (ascending). */
  segmentStarts: Int32Array;
  velN: Float64Array;
  velE: Float64Array;
  accN: Float64Array;
  accE: Float64Array;
  windN: Float64Array;
  windE: Float64Array;
  /** Horizontal velocity 1-sigma per axis [m/s] from the track smoother. */
  velSigmaMs: Float64Array;
}

/**
 * Splits the smoothed horizontal acceleration into the part along the horizontal air vector x̂ and the
 * part across it ŷ (the turn's centripetal acceleration), replaces the along part by dV/dt of the
 * horizontal airspeed V = |v_g − w| smoothed by a Rauch–Tung–Striebel white-jerk smoother of its own
 * (Rauch, Tung & Striebel 1965; model as in rtsSmoother.ts, V as the "position"), and recombines:
 *   a_h = (dV/dt) x̂ + (a · ŷ) ŷ.
 * The across part (bank, turn rate) keeps the fast time scale. The speed measurements are the track
 * smoother's own output, so their errors are correlated; σ_V is taken as that smoother's velocity sigma
 * (a heuristic: the second smoothing is a low-pass with a physical time scale, not a new estimate).
 * Returns new accN/accE columns; rows with a NaN input stay as they were. Pure.
 */
export function smoothAlongTrackAcceleration(inp: AlongTrackInput, speedJerkPsd = DEFAULT_SPEED_JERK_PSD): { accN: Float64Array; accE: Float64Array } {
  const n = inp.t.length;
  const accN = inp.accN.slice();
  const accE = inp.accE.slice();
  const { velN, velE, windN, windE, velSigmaMs } = inp;
  // Horizontal airspeed, and the same as the smoother's measurement (NaN where it has no variance).
  const Vh = new Float64Array(n);
  const V = new Float64Array(n);
  const varV = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const uN = velN[i] - windN[i];
    const uE = velE[i] - windE[i];
    const h = Math.sqrt(uN * uN + uE * uE);
    Vh[i] = h;
    const s = velSigmaMs[i];
    const ok = Number.isFinite(s) && s > 0;
    varV[i] = ok ? s * s : NaN;
    V[i] = ok ? h : NaN;
  }
  const starts = inp.segmentStarts;
  for (let k = 0; k < starts.length; k++) {
    const i0 = starts[k];
    const i1 = k + 1 < starts.length ? starts[k + 1] : n;
    if (i1 - i0 < 3) continue;
    const r = rtsSmoothWhiteJerk(inp.t.subarray(i0, i1), [{ pos: V.subarray(i0, i1), posVar: varV.subarray(i0, i1), jerkPsd: speedJerkPsd }], { gate: false });
    const dVdt = r.axes[0].v;
    for (let j = 0; j < i1 - i0; j++) {
      const i = i0 + j;
      const h = Vh[i];
      const aN = inp.accN[i], aE = inp.accE[i], dv = dVdt[j];
      if (!(h > 1) || !Number.isFinite(dv) || !Number.isFinite(aN) || !Number.isFinite(aE)) continue;
      const xN = (velN[i] - windN[i]) / h;
      const xE = (velE[i] - windE[i]) / h;
      // ŷ = (−xE, xN): right of the air vector.
      const across = -aN * xE + aE * xN;
      accN[i] = dv * xN - across * xE;
      accE[i] = dv * xE + across * xN;
    }
  }
  return { accN, accE };
}
