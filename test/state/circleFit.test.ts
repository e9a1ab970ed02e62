// Circle fits. Oracles: PHYSICS.md check 28 (exact ground velocities of three legs in a wind from 045 at
// 30 kt, TAS 100 → centre (N, E) = (−21.21, −21.21) kt, radius 100; the ground speeds come from the hand
// relation GS = √(V² − w_x²) + w_a, not from our code); circles built analytically with seeded noise;
// Chernov's observation that Kasa's fit shrinks the radius on short noisy arcs while the geometric fit
// does not (N. Chernov, Circular and Linear Regression, CRC 2010).
import { describe, expect, it } from 'vitest';
import { geometricCircleFit, kasaCircleFit } from '../../src/state/circleFit.js';
import { gaussianSource } from './syntheticTurns.js';

const D2R = Math.PI / 180;

describe('three legs, exact (check 28)', () => {
  it('both fits recover centre (−21.21, −21.21) kt and radius 100 kt within 0.05 kt', () => {
    const w = 30, V = 100;
    const wN = -w * Math.cos(45 * D2R), wE = -w * Math.sin(45 * D2R);
    const x: number[] = [], y: number[] = [];
    for (const tr of [0, 120, 240]) {
      const th = tr * D2R;
      const across = -wN * Math.sin(th) + wE * Math.cos(th);
      const along = wN * Math.cos(th) + wE * Math.sin(th);
      const gs = Math.sqrt(V * V - across * across) + along;
      x.push(gs * Math.cos(th));
      y.push(gs * Math.sin(th));
    }
    for (const c of [kasaCircleFit(x, y), geometricCircleFit(x, y, kasaCircleFit(x, y))]) {
      expect(Math.abs(c.cx + 21.21)).toBeLessThan(0.05);
      expect(Math.abs(c.cy + 21.21)).toBeLessThan(0.05);
      expect(Math.abs(c.r - 100)).toBeLessThan(0.05);
    }
  });
});

function arc(deg: number, n: number, sigma: number, seed: number): { x: number[]; y: number[] } {
  const rnd = gaussianSource(seed);
  const x: number[] = [], y: number[] = [];
  // TAS 100, wind 30 from 045 → centre (−21.21, −21.21); points on an arc starting at 10°.
  for (let k = 0; k < n; k++) {
    const a = (10 + (deg * k) / (n - 1)) * D2R;
    x.push(-21.21 + 100 * Math.cos(a) + sigma * rnd());
    y.push(-21.21 + 100 * Math.sin(a) + sigma * rnd());
  }
  return { x, y };
}

describe('noisy arcs (PHYSICS.md §5 synthetic check: 25 points, σ 0.5 kt)', () => {
  it('over 360° the geometric fit has RMS centre error below 0.3 kt and radius error below 0.15 kt (20 seeds); 180° within twice that', () => {
    // Theory for a full circle: var(cx) = var(cy) = 2σ²/n, var(r) = σ²/n → RMS 0.20 and 0.10 kt.
    for (const deg of [360, 180]) {
      let c2 = 0, r2 = 0;
      const N = 20;
      for (let s = 1; s <= N; s++) {
        const { x, y } = arc(deg === 360 ? 360 * (24 / 25) : deg, 25, 0.5, s);
        const g = geometricCircleFit(x, y, kasaCircleFit(x, y));
        expect(g.converged).toBe(true);
        c2 += ((g.cx + 21.21) ** 2 + (g.cy + 21.21) ** 2) / N;
        r2 += (g.r - 100) ** 2 / N;
      }
      const k = deg === 360 ? 1 : 2;
      expect(Math.sqrt(c2)).toBeLessThan(0.3 * k);
      expect(Math.sqrt(r2)).toBeLessThan(0.15 * k);
    }
  });
  it('on a 60° arc with σ 3 the mean Kasa radius falls short (bias) and the geometric one is closer to 100', () => {
    let kasa = 0, geo = 0;
    const N = 40;
    for (let s = 1; s <= N; s++) {
      const { x, y } = arc(60, 25, 3, 100 + s);
      const k = kasaCircleFit(x, y);
      kasa += k.r / N;
      geo += geometricCircleFit(x, y, k).r / N;
    }
    expect(kasa).toBeLessThan(100);
    expect(Math.abs(geo - 100)).toBeLessThan(Math.abs(kasa - 100));
  });
  it('reports a covariance that grows as the arc shortens and a residual RMS near the noise', () => {
    const full = arc(345, 50, 0.5, 3), half = arc(120, 50, 0.5, 3);
    const gf = geometricCircleFit(full.x, full.y, kasaCircleFit(full.x, full.y));
    const gh = geometricCircleFit(half.x, half.y, kasaCircleFit(half.x, half.y));
    expect(gh.cov[0] + gh.cov[4]).toBeGreaterThan(5 * (gf.cov[0] + gf.cov[4]));
    expect(gf.rmsResidual).toBeGreaterThan(0.3);
    expect(gf.rmsResidual).toBeLessThan(0.7);
  });
  it('returns NaN for collinear or too few points', () => {
    expect(kasaCircleFit([0, 1, 2], [0, 1, 2]).r).toBeNaN();
    expect(kasaCircleFit([0, 1], [0, 1]).r).toBeNaN();
    expect(geometricCircleFit([0, 1], [0, 1], { cx: NaN, cy: 0, r: 1 }).r).toBeNaN();
  });
});
