// The RTS smoother against independent oracles: (1) the batch weighted least-squares solution of the same
// linear-Gaussian model, solved densely here (the RTS smoother's defining property: Rauch, Tung & Striebel,
// AIAA J. 3(8), 1965 — its mean and covariance equal the batch posterior); (2) exact kinematics of a
// constant-acceleration motion; (3) chi-square quantiles from their closed-form CDFs (PHYSICS.md check 30).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CHI2_99, CHI2_9999, rtsSmoothWhiteJerk } from '../../src/state/rtsSmoother.js';
import { gaussianSource } from './syntheticTurns.js';

/** Dense solve of A x = b (Gaussian elimination, partial pivoting); returns x and A⁻¹'s diagonal. */
function solveDense(A: number[][], b: number[]): { x: number[]; invDiag: number[] } {
  const n = b.length;
  const M = A.map((row, i) => [...row, b[i], ...Array.from({ length: n }, (_, j) => (i === j ? 1 : 0))]);
  for (let c = 0; c < n; c++) {
    let p = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(M[r][c]) > Math.abs(M[p][c])) p = r;
    [M[c], M[p]] = [M[p], M[c]];
    for (let r = 0; r < n; r++) {
      if (r === c) continue;
      const f = M[r][c] / M[c][c];
      for (let k = c; k < 2 * n + 1; k++) M[r][k] -= f * M[c][k];
    }
  }
  return { x: M.map((row, i) => row[n] / row[i]), invDiag: M.map((row, i) => row[n + 1 + i] / row[i]) };
}

/** 3×3 inverse by Gauss–Jordan (small dense helper). */
function inv3(A: number[][]): number[][] {
  const cols = [0, 1, 2].map((j) => solveDense(A, [0, 1, 2].map((i) => (i === j ? 1 : 0))).x);
  return [0, 1, 2].map((i) => [0, 1, 2].map((j) => cols[j][i]));
}

describe('rtsSmoothWhiteJerk equals the batch least-squares posterior of the white-jerk model', () => {
  it('matches mean and marginal variances on an irregular 8-sample track with position and velocity fixes', () => {
    const t = Float64Array.from([0, 0.7, 1.9, 2.0, 3.4, 5.1, 5.3, 6.0]);
    const z = Float64Array.from([0.3, 12.1, 30.4, NaN, 55.0, 80.2, 79.6, 95.5]);
    const R = Float64Array.from([4, 9, 4, 4, 16, 4, 4, 9]);
    const vz = Float64Array.from([NaN, 15.2, NaN, 16.0, NaN, NaN, 14.8, NaN]);
    const vR = new Float64Array(8).fill(0.25);
    const q = 1.7;
    const res = rtsSmoothWhiteJerk(t, [{ pos: z, posVar: R, vel: vz, velVar: vR, jerkPsd: q }], { gate: false, velPriorSigmaMs: 150, accPriorSigmaMs2: 10 });
    // Batch: minimise prior + Σ measurement residuals² / R + Σ w_kᵀ Q_k⁻¹ w_k, w_k = x_{k+1} − F x_k.
    const n = t.length, N = 3 * n;
    const A = Array.from({ length: N }, () => new Array(N).fill(0));
    const b = new Array(N).fill(0);
    // Prior as in the smoother: p ~ N(z0, 1e8), v ~ N(0, 150²), a ~ N(0, 10²).
    A[0][0] += 1 / 1e8; b[0] += z[0] / 1e8;
    A[1][1] += 1 / 150 ** 2;
    A[2][2] += 1 / 10 ** 2;
    for (let k = 0; k < n; k++) {
      if (Number.isFinite(z[k])) { A[3 * k][3 * k] += 1 / R[k]; b[3 * k] += z[k] / R[k]; }
      if (Number.isFinite(vz[k])) { A[3 * k + 1][3 * k + 1] += 1 / vR[k]; b[3 * k + 1] += vz[k] / vR[k]; }
    }
    for (let k = 0; k + 1 < n; k++) {
      const T = t[k + 1] - t[k];
      if (T === 0) {
        // Zero step: the two states are the same; tie them with a very stiff spring.
        for (let j = 0; j < 3; j++) { const a = 3 * k + j, c = 3 * (k + 1) + j; A[a][a] += 1e12; A[c][c] += 1e12; A[a][c] -= 1e12; A[c][a] -= 1e12; }
        continue;
      }
      const F = [[1, T, T * T / 2], [0, 1, T], [0, 0, 1]];
      const Q = [[T ** 5 / 20, T ** 4 / 8, T ** 3 / 6], [T ** 4 / 8, T ** 3 / 3, T ** 2 / 2], [T ** 3 / 6, T ** 2 / 2, T]].map((r) => r.map((x) => q * x));
      const W = inv3(Q);
      // Residual r = [−F I] [x_k; x_{k+1}]; add Gᵀ W G.
      const G = [0, 1, 2].map((i) => [...F[i].map((x) => -x), ...[0, 1, 2].map((j) => (i === j ? 1 : 0))]);
      for (let r = 0; r < 6; r++) for (let c = 0; c < 6; c++) {
        let s = 0;
        for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) s += G[i][r] * W[i][j] * G[j][c];
        A[3 * k + r][3 * k + c] += s;
      }
    }
    const { x, invDiag } = solveDense(A, b);
    const ax = res.axes[0];
    for (let k = 0; k < n; k++) {
      expect(ax.p[k]).toBeCloseTo(x[3 * k], 4);
      expect(ax.v[k]).toBeCloseTo(x[3 * k + 1], 4);
      expect(ax.a[k]).toBeCloseTo(x[3 * k + 2], 4);
      expect(ax.pVar[k] / invDiag[3 * k]).toBeCloseTo(1, 4);
      expect(ax.vVar[k] / invDiag[3 * k + 1]).toBeCloseTo(1, 4);
      expect(ax.aVar[k] / invDiag[3 * k + 2]).toBeCloseTo(1, 4);
    }
  });
});

describe('two fixes at one instant', () => {
  it('act as one fix of the information-weighted mean z = (z1/R1 + z2/R2)/(1/R1 + 1/R2), R = 1/(1/R1 + 1/R2)', () => {
    const t2 = Float64Array.from([0, 1, 2, 2, 3, 4]);
    const z2 = Float64Array.from([0, 10.5, 19, 22, 30.2, 41]);
    const R2 = Float64Array.from([4, 4, 4, 12, 4, 4]);
    const t1 = Float64Array.from([0, 1, 2, 3, 4]);
    const z1 = Float64Array.from([0, 10.5, (19 / 4 + 22 / 12) / (1 / 4 + 1 / 12), 30.2, 41]);
    const R1 = Float64Array.from([4, 4, 1 / (1 / 4 + 1 / 12), 4, 4]);
    const a = rtsSmoothWhiteJerk(t2, [{ pos: z2, posVar: R2, jerkPsd: 2 }], { gate: false }).axes[0];
    const b = rtsSmoothWhiteJerk(t1, [{ pos: z1, posVar: R1, jerkPsd: 2 }], { gate: false }).axes[0];
    const map = [0, 1, 2, 2, 3, 4];
    for (let k = 0; k < 6; k++) {
      expect(a.p[k]).toBeCloseTo(b.p[map[k]], 6);
      expect(a.v[k]).toBeCloseTo(b.v[map[k]], 6);
      expect(a.aVar[k]).toBeCloseTo(b.aVar[map[k]], 6);
    }
  });
});

describe('rtsSmoothWhiteJerk on exact constant-acceleration motion', () => {
  it('recovers p = p0 + v0 t + a t²/2, v and a (1 mm, 1 mm/s, 0.01 m/s²) with tiny measurement noise', () => {
    const n = 200;
    const t = Float64Array.from({ length: n }, (_, i) => i * 0.5 + (i % 3) * 0.1);
    const p = Float64Array.from(t, (s) => 100 + 40 * s + 0.5 * 1.2 * s * s);
    const R = new Float64Array(n).fill(1e-6);
    const r = rtsSmoothWhiteJerk(t, [{ pos: p, posVar: R, jerkPsd: 1 }]).axes[0];
    for (let i = 5; i < n - 5; i++) {
      expect(Math.abs(r.p[i] - p[i])).toBeLessThan(1e-3);
      expect(Math.abs(r.v[i] - (40 + 1.2 * t[i]))).toBeLessThan(1e-3);
      expect(Math.abs(r.a[i] - 1.2)).toBeLessThan(0.01);
    }
  });
});

describe('gating', () => {
  it('uses the 99 % chi-square quantiles: CDFs 1 − e^(−x/2) (2 dof), erf(√(x/2)) (1 dof), erf(√(x/2)) − √(2x/π)e^(−x/2) (3 dof)', () => {
    // erf by its Maclaurin series (exact enough for x ≤ 2.5 with 60 terms).
    const erf = (x: number): number => {
      let s = 0, term = x;
      for (let k = 0; k < 80; k++) { s += term / (2 * k + 1); term *= (-x * x) / (k + 1); }
      return (2 / Math.sqrt(Math.PI)) * s;
    };
    expect(erf(Math.sqrt(CHI2_99[1] / 2))).toBeCloseTo(0.99, 4);
    expect(1 - Math.exp(-CHI2_99[2] / 2)).toBeCloseTo(0.99, 4);
    const x3 = CHI2_99[3];
    expect(erf(Math.sqrt(x3 / 2)) - Math.sqrt((2 * x3) / Math.PI) * Math.exp(-x3 / 2)).toBeCloseTo(0.99, 4);
    // The spike level, 99.99 %.
    expect(erf(Math.sqrt(CHI2_9999[1] / 2))).toBeCloseTo(0.9999, 6);
    expect(1 - Math.exp(-CHI2_9999[2] / 2)).toBeCloseTo(0.9999, 6);
    const y3 = CHI2_9999[3];
    expect(erf(Math.sqrt(y3 / 2)) - Math.sqrt((2 * y3) / Math.PI) * Math.exp(-y3 / 2)).toBeCloseTo(0.9999, 6);
  });
  it('skips a 300 m spike on a noisy 2-axis track, calls only that fix a spike, and keeps the track within 5 m there', () => {
    const rnd = gaussianSource(11);
    const n = 120;
    const t = Float64Array.from({ length: n }, (_, i) => i);
    const north = Float64Array.from(t, (s) => 50 * s + 3 * rnd());
    const east = Float64Array.from(t, (s) => 0.1 * s * s + 3 * rnd());
    const R = new Float64Array(n).fill(9);
    const spikeAt = 60;
    const trueN = 50 * spikeAt;
    north[spikeAt] += 300;
    const res = rtsSmoothWhiteJerk(t, [{ pos: north, posVar: R, jerkPsd: 1 }, { pos: east, posVar: R, jerkPsd: 1 }]);
    expect(res.posRejected[spikeAt]).toBe(1);
    expect(res.posSpike[spikeAt]).toBe(1);
    let spikes = 0;
    for (let i = 0; i < n; i++) spikes += res.posSpike[i];
    expect(spikes).toBe(1);
    expect(Math.abs(res.axes[0].p[spikeAt] - trueN)).toBeLessThan(5);
  });
  it('takes a persistent 300 m step after a run of rejections (inflated R) instead of dropping the rest', () => {
    const n = 80;
    const t = Float64Array.from({ length: n }, (_, i) => i);
    const pos = Float64Array.from(t, (s) => 50 * s + (s >= 40 ? 300 : 0));
    const R = new Float64Array(n).fill(9);
    const res = rtsSmoothWhiteJerk(t, [{ pos, posVar: R, jerkPsd: 1 }], { maxRejectRun: 5 });
    let rejected = 0, inflated = 0;
    for (let i = 0; i < n; i++) { rejected += res.posRejected[i]; inflated += res.posInflated[i]; }
    expect(inflated).toBeGreaterThan(0);
    expect(rejected).toBeLessThan(20);
    expect(Math.abs(res.axes[0].p[n - 1] - pos[n - 1])).toBeLessThan(10);
  });
});

describe('parameters', () => {
  it('throw OptionError for a non-positive jerk PSD or mismatched columns', () => {
    const t = Float64Array.from([0, 1]);
    const p = Float64Array.from([0, 1]);
    expect(() => rtsSmoothWhiteJerk(t, [{ pos: p, posVar: p, jerkPsd: 0 }])).toThrow(/jerkPsd/);
    expect(() => rtsSmoothWhiteJerk(t, [{ pos: Float64Array.from([0]), posVar: p, jerkPsd: 1 }])).toThrow(/length/);
  });
});

describe('rtsSmoothWhiteJerk with axes sharing one covariance', () => {
  it('gives, bit for bit, what each axis gives smoothed on its own (no gating: the axes are then independent)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.double({ min: 0, max: 3, noNaN: true }), fc.double({ min: -500, max: 500, noNaN: true }), fc.double({ min: -500, max: 500, noNaN: true }), fc.double({ min: 0.5, max: 50, noNaN: true }), fc.boolean(), fc.double({ min: -60, max: 60, noNaN: true }), fc.double({ min: -60, max: 60, noNaN: true }), fc.boolean()), { minLength: 1, maxLength: 60 }),
        fc.double({ min: 0.01, max: 10, noNaN: true }),
        (rows, q) => {
          const n = rows.length;
          const t = new Float64Array(n);
          for (let i = 1; i < n; i++) t[i] = t[i - 1] + rows[i][0];
          const col = (f: (r: (typeof rows)[number]) => number): Float64Array => Float64Array.from(rows, f);
          const miss = (r: (typeof rows)[number]): boolean => r[4];
          const noVel = (r: (typeof rows)[number]): boolean => r[7];
          const pa = col((r) => (miss(r) ? NaN : r[1])), pb = col((r) => (miss(r) ? NaN : r[2]));
          const R = col((r) => r[3]);
          const va = col((r) => (noVel(r) ? NaN : r[5])), vb = col((r) => (noVel(r) ? NaN : r[6]));
          const vR = new Float64Array(n).fill(0.09);
          const A = { pos: pa, posVar: R, vel: va, velVar: vR, jerkPsd: q };
          const B = { pos: pb, posVar: Float64Array.from(R), vel: vb, velVar: vR, jerkPsd: q };
          const both = rtsSmoothWhiteJerk(t, [A, B], { gate: false });
          const a = rtsSmoothWhiteJerk(t, [A], { gate: false }).axes[0];
          const b = rtsSmoothWhiteJerk(t, [B], { gate: false }).axes[0];
          for (const k of ['p', 'v', 'a', 'pVar', 'vVar', 'aVar'] as const) {
            expect(Array.from(both.axes[0][k])).toEqual(Array.from(a[k]));
            expect(Array.from(both.axes[1][k])).toEqual(Array.from(b[k]));
          }
        },
      ),
      { numRuns: 500, seed: 17 },
    );
  });
});
