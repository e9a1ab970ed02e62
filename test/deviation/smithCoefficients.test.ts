import { describe, expect, it } from 'vitest';
import { OptionError } from '../../src/errors.js';
import {
  compassForMagneticDeg,
  deviationAtDeg,
  fitSmithCoefficients,
  magneticForCompassDeg,
  smithCoefficientsFromEightPoints,
  type SmithCoefficients,
} from '../../src/deviation/smithCoefficients.js';

const D2R = Math.PI / 180;
const EIGHT = [0, 45, 90, 135, 180, 225, 270, 315];

/** NGA Handbook of Magnetic Compass Adjustment (2004) art. 501 example deviations, easterly + (PHYSICS.md check 20). */
const NGA_501 = { n: 10.5, ne: 20.0, e: 11.5, se: -1.2, s: -5.5, sw: -8.0, w: -12.5, nw: -6.8 };
const NGA_501_LIST = [NGA_501.n, NGA_501.ne, NGA_501.e, NGA_501.se, NGA_501.s, NGA_501.sw, NGA_501.w, NGA_501.nw];

/** The 5-term model written out independently of the code under test (NGA Handbook ch. V). */
function smith(c: SmithCoefficients, hDeg: number): number {
  const h = hDeg * D2R;
  return c.aDeg + c.bDeg * Math.sin(h) + c.cDeg * Math.cos(h) + c.dDeg * Math.sin(2 * h) + c.eDeg * Math.cos(2 * h);
}

function expectCoefficients(got: SmithCoefficients, want: SmithCoefficients, tol: number): void {
  expect(Math.abs(got.aDeg - want.aDeg)).toBeLessThan(tol);
  expect(Math.abs(got.bDeg - want.bDeg)).toBeLessThan(tol);
  expect(Math.abs(got.cDeg - want.cDeg)).toBeLessThan(tol);
  expect(Math.abs(got.dDeg - want.dDeg)).toBeLessThan(tol);
  expect(Math.abs(got.eDeg - want.eDeg)).toBeLessThan(tol);
}

/**
 * Least squares on m equally spaced headings = discrete Fourier coefficients, by the orthogonality of
 * 1, sin h, cos h, sin 2h, cos 2h on such headings (m ≥ 5): A = mean, B = (2/m) Σ δ sin h, … (textbook).
 */
function fourierCoefficients(headingsDeg: number[], devDeg: number[]): SmithCoefficients {
  const m = headingsDeg.length;
  let a = 0, b = 0, c = 0, d = 0, e = 0;
  headingsDeg.forEach((hDeg, i) => {
    const h = hDeg * D2R;
    a += devDeg[i] / m;
    b += (2 / m) * devDeg[i] * Math.sin(h);
    c += (2 / m) * devDeg[i] * Math.cos(h);
    d += (2 / m) * devDeg[i] * Math.sin(2 * h);
    e += (2 / m) * devDeg[i] * Math.cos(2 * h);
  });
  return { aDeg: a, bDeg: b, cDeg: c, dDeg: d, eDeg: e };
}

describe('8-point closed forms on the NGA Handbook art. 501 example', () => {
  const c = smithCoefficientsFromEightPoints(NGA_501);

  it('give A +1.0, B +12.0, C +8.0, D +5.0, E +1.5 (NGA Handbook art. 501; PHYSICS.md check 20)', () => {
    expectCoefficients(c, { aDeg: 1.0, bDeg: 12.0, cDeg: 8.0, dDeg: 5.0, eDeg: 1.5 }, 1e-12);
  });

  it('reproduce the cardinal deviations exactly and the intercardinals within 0.142° (PHYSICS.md check 21 says 0.14, rounded)', () => {
    const residuals = EIGHT.map((h, i) => NGA_501_LIST[i] - deviationAtDeg(c, h));
    for (const i of [0, 2, 4, 6]) expect(Math.abs(residuals[i])).toBeLessThan(1e-12);
    const worst = Math.max(...residuals.map(Math.abs));
    // NE: 1 + 20·sin 45° + 5 = 20.142 against 20.0.
    expect(worst).toBeCloseTo(20 * Math.SQRT1_2 + 6 - 20, 12);
    expect(worst).toBeLessThan(0.1422);
  });

  it('say steer C087.8 to make good M100 (PHYSICS.md check 21)', () => {
    const hc = compassForMagneticDeg(c, 100);
    expect(Math.abs(hc - 87.8)).toBeLessThan(0.05);
    // The definition: compass + deviation = magnetic (independent evaluation of the model).
    expect(hc + smith(c, hc)).toBeCloseTo(100, 9);
  });
});

describe('fitSmithCoefficients (least squares, mathjs QR)', () => {
  it('equals the 8-point closed forms when the data follow the 5-term model exactly', () => {
    const truth = { aDeg: -0.7, bDeg: 3.2, cDeg: -2.1, dDeg: 0.9, eDeg: -0.4 };
    const dev = EIGHT.map((h) => smith(truth, h));
    const fit = fitSmithCoefficients(EIGHT, dev);
    const closed = smithCoefficientsFromEightPoints({ n: dev[0], ne: dev[1], e: dev[2], se: dev[3], s: dev[4], sw: dev[5], w: dev[6], nw: dev[7] });
    expectCoefficients(closed, truth, 1e-12);
    expectCoefficients(fit, closed, 1e-12);
  });

  it('on the raw NGA example differs from the closed forms only in B and C (11.94, 7.96: the discrete Fourier coefficients)', () => {
    const fit = fitSmithCoefficients(EIGHT, NGA_501_LIST);
    expectCoefficients(fit, fourierCoefficients(EIGHT, NGA_501_LIST), 1e-12);
    expect(fit.bDeg).toBeCloseTo(11.94, 2);
    expect(fit.cDeg).toBeCloseTo(7.96, 2);
    expect(fit.aDeg).toBeCloseTo(1.0, 12);
    expect(fit.dDeg).toBeCloseTo(5.0, 12);
    expect(fit.eDeg).toBeCloseTo(1.5, 12);
  });

  it('recovers the coefficients of a 12-point (30°) swing and equals its discrete Fourier coefficients with noise', () => {
    const h12 = Array.from({ length: 12 }, (_, k) => 30 * k);
    const truth = { aDeg: 0.6, bDeg: -4.5, cDeg: 2.8, dDeg: -1.1, eDeg: 0.75 };
    expectCoefficients(fitSmithCoefficients(h12, h12.map((h) => smith(truth, h))), truth, 1e-12);
    // Reading noise of ±0.25° (a fixed pattern): the fit is still the Fourier projection, and near the truth.
    const noise = [0.2, -0.1, 0.25, -0.25, 0.05, 0.15, -0.2, 0.1, -0.05, 0.25, -0.15, 0];
    const noisy = h12.map((h, k) => smith(truth, h) + noise[k]);
    const fit = fitSmithCoefficients(h12, noisy);
    expectCoefficients(fit, fourierCoefficients(h12, noisy), 1e-12);
    expectCoefficients(fit, truth, 0.25);
  });

  it('recovers exact coefficients from 7 unevenly spaced headings', () => {
    const hs = [3, 61, 95, 170, 200, 260, 333];
    const truth = { aDeg: 1.2, bDeg: 0.4, cDeg: -6.3, dDeg: 2.2, eDeg: -1.9 };
    expectCoefficients(fitSmithCoefficients(hs, hs.map((h) => smith(truth, h))), truth, 1e-9);
  });

  it('throws OptionError for fewer than 5 rows, fewer than 5 distinct headings, unequal columns or non-finite values', () => {
    expect(() => fitSmithCoefficients([0, 90, 180, 270], [1, 2, 3, 4])).toThrow(OptionError);
    expect(() => fitSmithCoefficients([0, 90, 180, 270, 0, 90], [1, 2, 3, 4, 1, 2])).toThrow(OptionError);
    expect(() => fitSmithCoefficients([0, 360, 90, 450, 180, 540], [1, 1, 2, 2, 3, 3])).toThrow(OptionError);
    expect(() => fitSmithCoefficients([0, 45, 90, 135, 180], [1, 2, 3])).toThrow(OptionError);
    expect(() => fitSmithCoefficients([0, 45, NaN, 135, 180], [1, 2, 3, 4, 5])).toThrow(OptionError);
  });
});

describe('deviationAtDeg, magneticForCompassDeg and compassForMagneticDeg', () => {
  const c = { aDeg: 1, bDeg: 12, cDeg: 8, dDeg: 5, eDeg: 1.5 };

  it('is the 5-term model, periodic in 360°, easterly +', () => {
    for (const h of [0, 17, 123.4, 359.9]) {
      expect(deviationAtDeg(c, h)).toBeCloseTo(smith(c, h), 12);
      expect(deviationAtDeg(c, h + 360)).toBeCloseTo(deviationAtDeg(c, h), 9);
    }
    expect(deviationAtDeg(c, NaN)).toBeNaN();
  });

  it('applies compass + deviation = magnetic, wrapped to [0, 360)', () => {
    // N by compass: deviation 10.5 E → magnetic 010.5; W by compass: −12.5 → 257.5.
    expect(magneticForCompassDeg(c, 0)).toBeCloseTo(10.5, 12);
    expect(magneticForCompassDeg(c, 270)).toBeCloseTo(257.5, 12);
    expect(magneticForCompassDeg({ ...c, aDeg: -15 }, 2)).toBeGreaterThan(300);
  });

  it('round-trips compass → magnetic → compass and magnetic → compass → magnetic on every degree', () => {
    for (let h = 0; h < 360; h++) {
      const m = magneticForCompassDeg(c, h);
      const back = compassForMagneticDeg(c, m);
      expect(Math.abs(((back - h + 540) % 360) - 180)).toBeLessThan(1e-8);
      const hc = compassForMagneticDeg(c, h);
      expect(Math.abs(((magneticForCompassDeg(c, hc) - h + 540) % 360) - 180)).toBeLessThan(1e-8);
      expect(hc).toBeGreaterThanOrEqual(0);
      expect(hc).toBeLessThan(360);
    }
  });

  it('gives NaN where the card has no unique inverse (B = 100°) or the heading is not finite', () => {
    expect(compassForMagneticDeg({ aDeg: 0, bDeg: 100, cDeg: 0, dDeg: 0, eDeg: 0 }, 90 + 45)).toBeNaN();
    expect(compassForMagneticDeg(c, NaN)).toBeNaN();
  });
});
