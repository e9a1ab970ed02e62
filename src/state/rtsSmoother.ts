// Rauch–Tung–Striebel fixed-interval smoother over a constant-acceleration (white-jerk) model, one
// independent filter per axis, irregular time steps, position and velocity measurements, joint innovation
// gating across the axes of one fix. Hand-written scalar 3×3 algebra on typed arrays; no object per sample.
import { OptionError } from '../errors.js';

/** Chi-square 99 % quantiles for 1, 2, 3 degrees of freedom (index = dof). PHYSICS.md §6 / check 30. */
export const CHI2_99 = [NaN, 6.635, 9.21, 11.345] as const;

/** Chi-square 99.99 % quantiles for 1, 2, 3 dof: a gated fix this far off the smoothed track is a spike. */
export const CHI2_9999 = [NaN, 15.137, 18.421, 21.108] as const;

/** One axis of measurements. Arrays have the length of the time column; NaN marks "no measurement". */
export interface WhiteJerkAxis {
  /** Measured position [m]. */
  pos: Float64Array;
  /** Variance of each position measurement [m²] (> 0 where pos is finite). */
  posVar: Float64Array;
  /** Measured velocity [m/s] (e.g. GPS Doppler), optional. */
  vel?: Float64Array;
  /** Variance of each velocity measurement [m²/s²]. */
  velVar?: Float64Array;
  /** Jerk power spectral density q [m²/s⁵] of the white-jerk model. */
  jerkPsd: number;
}

export interface RtsOptions {
  /** Gate fixes by d² = Σ ν²/S against the 99 % chi-square quantile of the fix's dimension. Default true. */
  gate?: boolean;
  /** After this many consecutive gated position fixes, the next is taken with R inflated. Default 5. */
  maxRejectRun?: number;
  /** Prior 1-sigma of the velocity [m/s] and of the acceleration [m/s²] at the first sample. */
  velPriorSigmaMs?: number;
  accPriorSigmaMs2?: number;
}

/**
 * Smoothed state of one axis: p [m], v [m/s], a [m/s²] and their marginal variances. Axes whose covariances
 * are the same (same jerk PSD, variances and missing values) share one set of variance columns: read only.
 */
export interface RtsAxisResult {
  p: Float64Array;
  v: Float64Array;
  a: Float64Array;
  pVar: Float64Array;
  vVar: Float64Array;
  aVar: Float64Array;
}

export interface RtsResult {
  axes: RtsAxisResult[];
  /** 1 where the position fix was gated out (not used). */
  posRejected: Uint8Array;
  /**
   * 1 where a gated fix also lies far off the smoothed track: leave-one-out d² = Σ (z − p_s)²/(R + P_s)
   * above the 99.99 % quantile. Good fixes trip the 99 % gate 1 % of the time by chance; spikes do not
   * come back to the track.
   */
  posSpike: Uint8Array;
  /** 1 where the position fix was taken with an inflated R after a run of rejections. */
  posInflated: Uint8Array;
  /** 1 where the velocity measurement was gated out. */
  velRejected: Uint8Array;
}

/**
 * Rauch–Tung–Striebel fixed-interval smoother (Rauch, Tung & Striebel, AIAA J. 3(8), 1965), white-jerk
 * (continuous Wiener-process acceleration) model per axis (Bar-Shalom, Li & Kirubarajan 2001, ch. 6).
 * State x = [p, v, a]; per step of length T (irregular):
 *   F = [[1, T, T²/2], [0, 1, T], [0, 0, 1]],
 *   Q = q·[[T⁵/20, T⁴/8, T³/6], [T⁴/8, T³/3, T²/2], [T³/6, T²/2, T]].
 * Forward Kalman filter with scalar updates (H = [1 0 0] for position, [0 1 0] for velocity); backward pass
 *   C_k = P_k|k Fᵀ P_k+1|k⁻¹, x_k|N = x_k|k + C_k (x_k+1|N − x_k+1|k), P_k|N = P_k|k + C_k (P_k+1|N − P_k+1|k) C_kᵀ.
 * Gating (PHYSICS.md §6): the position fix of a sample (all axes with a finite value) is skipped when
 * d² = Σ ν²/S exceeds the 99 % chi-square quantile for that many dof; after `maxRejectRun` consecutive
 * skips, fixes are taken with R inflated so that d² sits on the gate (model mismatch, not outliers) until one
 * passes the gate unaided.
 * Velocity measurements are gated the same way (not inflated).
 * `t` must be non-decreasing [s]; steps of 0 are allowed (two fixes at one instant).
 * Throws OptionError for a non-positive jerk PSD or mismatched column lengths.
 */
export function rtsSmoothWhiteJerk(t: Float64Array, axes: WhiteJerkAxis[], opts: RtsOptions = {}): RtsResult {
  const n = t.length;
  const m = axes.length;
  const gate = opts.gate ?? true;
  const maxRun = opts.maxRejectRun ?? 5;
  const v0Var = (opts.velPriorSigmaMs ?? 150) ** 2;
  const a0Var = (opts.accPriorSigmaMs2 ?? 10) ** 2;
  for (const ax of axes) {
    if (!(Number.isFinite(ax.jerkPsd) && ax.jerkPsd > 0)) throw new OptionError('jerkPsd', `must be a positive number of m²/s⁵, got ${ax.jerkPsd}`);
    if (ax.pos.length !== n || ax.posVar.length !== n) throw new OptionError('rtsSmoothWhiteJerk', 'position columns must have the length of t');
    if (ax.vel && (ax.vel.length !== n || !ax.velVar || ax.velVar.length !== n)) throw new OptionError('rtsSmoothWhiteJerk', 'velocity columns must have the length of t');
  }
  // Plain arrays of the columns, so that the loops below read them without looking at axis objects.
  const pos: Float64Array[] = [], posVar: Float64Array[] = [], vel: Float64Array[] = [], velVar: Float64Array[] = [];
  for (const ax of axes) {
    pos.push(ax.pos);
    posVar.push(ax.posVar);
    vel.push(ax.vel ?? NO_COLUMN);
    velVar.push(ax.vel ? ax.velVar! : NO_COLUMN);
  }
  const anyVel = vel.some((v) => v.length > 0);
  // Covariance groups: in a linear Kalman filter the covariance depends on the steps, the model and which
  // measurements were taken with which variances, never on the measured values. Axes with the same jerk
  // PSD, the same variances and the same missing values (the north and east axes of a track) therefore
  // have the same covariance at every step, and it is computed once for them (the same operations in the
  // same order as for each on its own). The gating decisions are joint over all axes anyway.
  const groups: number[][] = [];
  for (let j = 0; j < m; j++) {
    const g = groups.find((gr) => sameCovariance(axes[gr[0]], axes[j], pos[gr[0]], pos[j], vel[gr[0]], vel[j]));
    if (g) g.push(j);
    else groups.push([j]);
  }
  const nG = groups.length;
  const gOf = new Int32Array(m); // group of each axis
  const order = new Int32Array(m); // axes by group, gStart[g] .. gStart[g + 1] − 1 in `order`
  const gStart = new Int32Array(nG + 1);
  const qg = new Float64Array(nG);
  for (let g = 0, u = 0; g < nG; g++) {
    gStart[g] = u;
    qg[g] = axes[groups[g][0]].jerkPsd;
    for (const j of groups[g]) { gOf[j] = g; order[u++] = j; }
    gStart[g + 1] = u;
  }
  // Flat working arrays, so that the loop reads a handful of typed arrays: measurement of axis j at sample
  // i at i·m + j; filtered state (p, v, a) at 3(i·m + j); filtered covariance of group g (p00 p01 p02 p11
  // p12 p22) at 6(i·G + g). The filter runs in place: step i predicts from row i − 1 into row i, then
  // updates row i.
  // One axis (the along-track speed) is flat already: its columns are used as they are.
  const flat = m === 1;
  const Z = flat ? pos[0] : new Float64Array(n * m), ZR = flat ? posVar[0] : new Float64Array(n * m);
  const VZ = anyVel ? (flat ? vel[0] : new Float64Array(n * m)) : NO_COLUMN, VR = anyVel ? (flat ? velVar[0] : new Float64Array(n * m)) : NO_COLUMN;
  for (let j = 0; j < m && !flat; j++) {
    const pj = pos[j], rj = posVar[j], vj = vel[j], wj = velVar[j];
    for (let i = 0, o = j; i < n; i++, o += m) { Z[o] = pj[i]; ZR[o] = rj[i]; }
    if (anyVel) for (let i = 0, o = j; i < n; i++, o += m) { VZ[o] = vj.length > 0 ? vj[i] : NaN; VR[o] = vj.length > 0 ? wj[i] : NaN; }
  }
  const m3 = 3 * m, g6 = 6 * nG;
  const X = new Float64Array(m3 * n);
  const P = new Float64Array(g6 * n);
  for (let j = 0; j < m; j++) for (let i = 0; i < n; i++) if (Number.isFinite(pos[j][i])) { X[3 * j] = pos[j][i]; break; }
  if (n > 0) {
    for (let g = 0; g < nG; g++) {
      P[6 * g] = 1e8; // 10 km prior sigma: the first fix decides
      P[6 * g + 3] = v0Var;
      P[6 * g + 5] = a0Var;
    }
  }
  const posRejected = new Uint8Array(n);
  const posInflated = new Uint8Array(n);
  const velRejected = new Uint8Array(n);
  filterForward(t, { Z, ZR, VZ, VR, anyVel }, { m, nG, gOf, order, gStart, qg }, { gate, maxRun }, X, P, { posRejected, posInflated, velRejected });

  const out: RtsAxisResult[] = new Array(m);
  for (let g = 0; g < nG; g++) {
    const mem = order.subarray(gStart[g], gStart[g + 1]);
    const res = smoothBackward(t, P, g6, 6 * g, X, m3, mem, qg[g]);
    for (let u = 0; u < mem.length; u++) out[mem[u]] = res[u];
  }
  const posSpike = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    if (posRejected[i] === 0) continue;
    let d2 = 0;
    let dof = 0;
    for (let j = 0; j < m; j++) {
      const z = pos[j][i];
      if (!Number.isFinite(z)) continue;
      const r = z - out[j].p[i];
      d2 += (r * r) / (posVar[j][i] + out[j].pVar[i]);
      dof++;
    }
    if (dof > 0 && d2 > CHI2_9999[dof]) posSpike[i] = 1;
  }
  return { axes: out, posRejected, posSpike, posInflated, velRejected };
}

/** The measurement columns of the forward pass, flat (sample i, axis j at i·m + j). */
interface FlatMeasurements {
  Z: Float64Array;
  ZR: Float64Array;
  VZ: Float64Array;
  VR: Float64Array;
  anyVel: boolean;
}

/** The axes and their covariance groups: m axes, nG groups, group of each axis, axes by group, jerk PSD per group. */
interface AxisGroups {
  m: number;
  nG: number;
  gOf: Int32Array;
  order: Int32Array;
  gStart: Int32Array;
  qg: Float64Array;
}

/** Per-sample flags written by the forward pass. */
interface GateFlags {
  posRejected: Uint8Array;
  posInflated: Uint8Array;
  velRejected: Uint8Array;
}

// The forward pass is a function of its own so that the engine's on-stack replacement of its loop compiles
// the loop alone: compiled inside rtsSmoothWhiteJerk, the code after the loop had no type feedback yet, was
// thrown away on the first run through it and compiled again on the next flight (9 times in a batch of 24).
/** Forward pass of {@link rtsSmoothWhiteJerk}: predicts and updates X and P row by row, in place, and sets the gate flags. */
function filterForward(
  t: Float64Array, meas: FlatMeasurements, groups: AxisGroups, gating: { gate: boolean; maxRun: number }, X: Float64Array, P: Float64Array, flags: GateFlags,
): void {
  const { Z, ZR, VZ, VR, anyVel } = meas;
  const { m, nG, gOf, order, gStart, qg } = groups;
  const { gate, maxRun } = gating;
  const { posRejected, posInflated, velRejected } = flags;
  const n = t.length;
  const m3 = 3 * m, g6 = 6 * nG;
  let run = 0;
  const invS = new Float64Array(nG); // 1/S of the current fix, per group


  for (let i = 0; i < n; i++) {
    const zi = m * i, xi = m3 * i, pi = g6 * i;
    if (i > 0) {
      const T = t[i] - t[i - 1];
      if (T > 0) {
        for (let g = 0; g < nG; g++) predictCovariance(P, pi - g6 + 6 * g, pi + 6 * g, T, qg[g]);
        for (let j = 0; j < m; j++) predictState(X, xi - m3 + 3 * j, xi + 3 * j, T);
      } else {
        P.copyWithin(pi, pi - g6, pi);
        X.copyWithin(xi, xi - m3, xi);
      }
    }

    // Position fix, gated jointly over the axes that have a value. 1/S once per group (the axes of a
    // group have the same S); d² = Σ ν²·(1/S) differs from Σ ν²/S by an ulp at most.
    for (let g = 0; g < nG; g++) {
      const r = order[gStart[g]];
      invS[g] = 1 / (P[pi + 6 * g] + ZR[zi + r]);
    }
    let d2 = 0;
    let dof = 0;
    for (let j = 0; j < m; j++) {
      const z = Z[zi + j];
      if (!Number.isFinite(z)) continue;
      const nu = z - X[xi + 3 * j];
      d2 += nu * nu * invS[gOf[j]];
      dof++;
    }
    if (dof > 0) {
      const limit = CHI2_99[dof];
      let scale = 1; // S multiplier applied through R
      let use = true;
      if (gate && d2 > limit) {
        if (run >= maxRun) {
          // A run this long is a jump or a model mismatch, not outliers: take fixes on the gate until one fits.
          scale = d2 / limit;
          posInflated[i] = 1;
        } else {
          use = false;
          posRejected[i] = 1;
          run++;
        }
      } else {
        run = 0;
      }
      if (use) {
        for (let g = 0; g < nG; g++) {
          const r = order[gStart[g]];
          if (!Number.isFinite(Z[zi + r])) continue;
          const c = pi + 6 * g;
          const inv = scale === 1 ? invS[g] : 1 / ((P[c] + ZR[zi + r]) * scale);
          const g0 = P[c], g1 = P[c + 1], g2 = P[c + 2];
          for (let u = gStart[g]; u < gStart[g + 1]; u++) {
            const j = order[u];
            const x = xi + 3 * j;
            const nu = Z[zi + j] - X[x];
            X[x] += g0 * inv * nu;
            X[x + 1] += g1 * inv * nu;
            X[x + 2] += g2 * inv * nu;
          }
          updateCovariance(P, c, g0, g1, g2, inv);
        }
      }
    }

    // Velocity measurement, gated jointly, never inflated.
    if (!anyVel) continue;
    for (let g = 0; g < nG; g++) {
      const r = order[gStart[g]];
      invS[g] = 1 / (P[pi + 6 * g + 3] + VR[zi + r]);
    }
    d2 = 0;
    dof = 0;
    for (let j = 0; j < m; j++) {
      const vz = VZ[zi + j];
      if (!Number.isFinite(vz)) continue;
      const nu = vz - X[xi + 3 * j + 1];
      d2 += nu * nu * invS[gOf[j]];
      dof++;
    }
    if (dof > 0) {
      if (gate && d2 > CHI2_99[dof]) {
        velRejected[i] = 1;
      } else {
        for (let g = 0; g < nG; g++) {
          const r = order[gStart[g]];
          if (!Number.isFinite(VZ[zi + r])) continue;
          const c = pi + 6 * g;
          const inv = invS[g];
          const g0 = P[c + 1], g1 = P[c + 3], g2 = P[c + 4];
          for (let u = gStart[g]; u < gStart[g + 1]; u++) {
            const j = order[u];
            const x = xi + 3 * j;
            const nu = VZ[zi + j] - X[x + 1];
            X[x] += g0 * inv * nu;
            X[x + 1] += g1 * inv * nu;
            X[x + 2] += g2 * inv * nu;
          }
          updateCovariance(P, c, g0, g1, g2, inv);
        }
      }
    }
  }
}

/** Same jerk PSD, same variance columns (by value) and the same missing positions and velocities. */
function sameCovariance(a: WhiteJerkAxis, b: WhiteJerkAxis, posA: Float64Array, posB: Float64Array, velA: Float64Array, velB: Float64Array): boolean {
  if (a.jerkPsd !== b.jerkPsd || velA.length !== velB.length) return false;
  if (!sameValues(a.posVar, b.posVar)) return false;
  if (velA.length > 0 && !sameValues(a.velVar!, b.velVar!)) return false;
  for (let i = 0; i < posA.length; i++) if (Number.isFinite(posA[i]) !== Number.isFinite(posB[i])) return false;
  for (let i = 0; i < velA.length; i++) if (Number.isFinite(velA[i]) !== Number.isFinite(velB[i])) return false;
  return true;
}

function sameValues(a: Float64Array, b: Float64Array): boolean {
  if (a === b) return true;
  for (let i = 0; i < a.length; i++) if (!Object.is(a[i], b[i])) return false;
  return true;
}

/** Stands for an absent velocity column in the loops (length 0). */
const NO_COLUMN = new Float64Array(0);

/** Kalman prediction of the state over T [s] from x[a..a+2] into x[b..b+2]: x ← F x. */
function predictState(x: Float64Array, a: number, b: number, T: number): void {
  const h = 0.5 * T * T;
  const x0 = x[a], x1 = x[a + 1], x2 = x[a + 2];
  x[b] = x0 + T * x1 + h * x2;
  x[b + 1] = x1 + T * x2;
  x[b + 2] = x2;
}

/** Kalman prediction of the covariance over T [s] from P[a..a+5] into P[b..b+5]: P ← F P Fᵀ + Q. */
function predictCovariance(s: Float64Array, a: number, b: number, T: number, q: number): void {
  const h = 0.5 * T * T;
  const p00 = s[a], p01 = s[a + 1], p02 = s[a + 2], p11 = s[a + 3], p12 = s[a + 4], p22 = s[a + 5];
  // A = F P (rows 0 and 1 change), then A Fᵀ.
  const a00 = p00 + T * p01 + h * p02;
  const a01 = p01 + T * p11 + h * p12;
  const a02 = p02 + T * p12 + h * p22;
  const a11 = p11 + T * p12;
  const a12 = p12 + T * p22;
  const T2 = T * T, T3 = T2 * T;
  s[b] = a00 + T * a01 + h * a02 + q * (T3 * T2) / 20;
  s[b + 1] = a01 + T * a02 + q * (T2 * T2) / 8;
  s[b + 2] = a02 + q * T3 / 6;
  s[b + 3] = a11 + T * a12 + q * T3 / 3;
  s[b + 4] = a12 + q * T2 / 2;
  s[b + 5] = p22 + q * T;
}

/** Covariance part of a scalar Kalman update, P ← P − g gᵀ/S, with g = P Hᵀ (g0, g1, g2) and inv = 1/S. */
function updateCovariance(s: Float64Array, c: number, g0: number, g1: number, g2: number, inv: number): void {
  s[c] -= g0 * g0 * inv;
  s[c + 1] -= g0 * g1 * inv;
  s[c + 2] -= g0 * g2 * inv;
  s[c + 3] -= g1 * g1 * inv;
  s[c + 4] -= g1 * g2 * inv;
  s[c + 5] -= g2 * g2 * inv;
}

/**
 * RTS backward pass for the axes of one covariance group: filtered covariances in P (row stride pS, this
 * group at offset pO), filtered states in X (row stride xS, axis j at 3j). The axes' results share their
 * variance columns.
 */
function smoothBackward(t: Float64Array, P: Float64Array, pS: number, pO: number, X: Float64Array, xS: number, axesOf: Int32Array, q: number): RtsAxisResult[] {
  const n = t.length;
  const nA = axesOf.length;
  const pVar = new Float64Array(n), vVar = new Float64Array(n), aVar = new Float64Array(n);
  const rp: Float64Array[] = [], rv: Float64Array[] = [], ra: Float64Array[] = [];
  const xo = new Int32Array(nA); // offset of each axis's state in a row of X
  const res: RtsAxisResult[] = [];
  for (let u = 0; u < nA; u++) {
    const r: RtsAxisResult = { p: new Float64Array(n), v: new Float64Array(n), a: new Float64Array(n), pVar, vVar, aVar };
    res.push(r);
    rp.push(r.p);
    rv.push(r.v);
    ra.push(r.a);
    xo[u] = 3 * axesOf[u];
  }
  if (n === 0) return res;
  const k0 = n - 1;
  const e = pS * k0 + pO;
  let s00 = P[e], s01 = P[e + 1], s02 = P[e + 2];
  let s11 = P[e + 3], s12 = P[e + 4], s22 = P[e + 5];
  pVar[k0] = s00; vVar[k0] = s11; aVar[k0] = s22;
  for (let u = 0; u < nA; u++) {
    const x = xS * k0 + xo[u];
    rp[u][k0] = X[x]; rv[u][k0] = X[x + 1]; ra[u][k0] = X[x + 2];
  }
  for (let k = n - 2; k >= 0; k--) {
    const T = t[k + 1] - t[k];
    const h = 0.5 * T * T;
    const b = pS * k + pO;
    const p00 = P[b], p01 = P[b + 1], p02 = P[b + 2], p11 = P[b + 3], p12 = P[b + 4], p22 = P[b + 5];
    // Predicted P of step k+1 from the filtered values at k.
    const a00 = p00 + T * p01 + h * p02;
    const a01 = p01 + T * p11 + h * p12;
    const a02 = p02 + T * p12 + h * p22;
    const a11 = p11 + T * p12;
    const a12 = p12 + T * p22;
    const T2 = T * T, T3 = T2 * T;
    const m00 = a00 + T * a01 + h * a02 + (q * T3 * T2) / 20;
    const m01 = a01 + T * a02 + (q * T2 * T2) / 8;
    const m02 = a02 + (q * T3) / 6;
    const m11 = a11 + T * a12 + (q * T3) / 3;
    const m12 = a12 + (q * T2) / 2;
    const m22 = p22 + q * T;
    // Inverse of the symmetric predicted covariance by cofactors.
    const i00 = m11 * m22 - m12 * m12;
    const i01 = m02 * m12 - m01 * m22;
    const i02 = m01 * m12 - m02 * m11;
    const i11 = m00 * m22 - m02 * m02;
    const i12 = m01 * m02 - m00 * m12;
    const i22 = m00 * m11 - m01 * m01;
    const det = m00 * i00 + m01 * i01 + m02 * i02;
    const id = 1 / det;
    // B = P_f Fᵀ (general 3×3).
    const b00 = p00 + T * p01 + h * p02, b01 = p01 + T * p02, b02 = p02;
    const b10 = p01 + T * p11 + h * p12, b11 = p11 + T * p12, b12 = p12;
    const b20 = p02 + T * p12 + h * p22, b21 = p12 + T * p22, b22 = p22;
    // C = B · M⁻¹.
    const c00 = (b00 * i00 + b01 * i01 + b02 * i02) * id;
    const c01 = (b00 * i01 + b01 * i11 + b02 * i12) * id;
    const c02 = (b00 * i02 + b01 * i12 + b02 * i22) * id;
    const c10 = (b10 * i00 + b11 * i01 + b12 * i02) * id;
    const c11 = (b10 * i01 + b11 * i11 + b12 * i12) * id;
    const c12 = (b10 * i02 + b11 * i12 + b12 * i22) * id;
    const c20 = (b20 * i00 + b21 * i01 + b22 * i02) * id;
    const c21 = (b20 * i01 + b21 * i11 + b22 * i12) * id;
    const c22 = (b20 * i02 + b21 * i12 + b22 * i22) * id;
    // States: x_k|N = x_k|k + C (x_k+1|N − F x_k|k), per axis.
    for (let u = 0; u < nA; u++) {
      const p = rp[u], v = rv[u], a = ra[u];
      const x = xS * k + xo[u];
      const f0 = X[x], f1 = X[x + 1], f2 = X[x + 2];
      const d0 = p[k + 1] - (f0 + T * f1 + h * f2), d1 = v[k + 1] - (f1 + T * f2), d2 = a[k + 1] - f2;
      p[k] = f0 + c00 * d0 + c01 * d1 + c02 * d2;
      v[k] = f1 + c10 * d0 + c11 * d1 + c12 * d2;
      a[k] = f2 + c20 * d0 + c21 * d1 + c22 * d2;
    }
    // Covariance: P_f + C (P_s − M) Cᵀ, with D = P_s − M symmetric, E = C D.
    const e00 = s00 - m00, e01 = s01 - m01, e02 = s02 - m02, e11 = s11 - m11, e12 = s12 - m12, e22 = s22 - m22;
    const g00 = c00 * e00 + c01 * e01 + c02 * e02;
    const g01 = c00 * e01 + c01 * e11 + c02 * e12;
    const g02 = c00 * e02 + c01 * e12 + c02 * e22;
    const g10 = c10 * e00 + c11 * e01 + c12 * e02;
    const g11 = c10 * e01 + c11 * e11 + c12 * e12;
    const g12 = c10 * e02 + c11 * e12 + c12 * e22;
    const g20 = c20 * e00 + c21 * e01 + c22 * e02;
    const g21 = c20 * e01 + c21 * e11 + c22 * e12;
    const g22 = c20 * e02 + c21 * e12 + c22 * e22;
    s00 = p00 + g00 * c00 + g01 * c01 + g02 * c02;
    s01 = p01 + g00 * c10 + g01 * c11 + g02 * c12;
    s02 = p02 + g00 * c20 + g01 * c21 + g02 * c22;
    s11 = p11 + g10 * c10 + g11 * c11 + g12 * c12;
    s12 = p12 + g10 * c20 + g11 * c21 + g12 * c22;
    s22 = p22 + g20 * c20 + g21 * c21 + g22 * c22;
    pVar[k] = s00; vVar[k] = s11; aVar[k] = s22;
  }
  return res;
}
