import { describe, expect, it } from 'vitest';
import { declinationUncertaintyDeg } from '../../src/magnetic/declinationUncertainty.js';

describe('declinationUncertaintyDeg: δD = √(0.26² + (5417/H)²)', () => {
  // Source: WMM2025 Technical Report sec. 3.4 eq. 43 as transcribed in PHYSICS.md §4, check value 26
  // (0.29 at 41,875 nT, 0.38 at 20,000, 0.94 at 6000, 2.72 at 2000); printed to 0.01°.
  it.each([
    [41_875, 0.29],
    [20_000, 0.38],
    [6_000, 0.94],
    [2_000, 2.72],
  ])('is %f nT → %f° (to the printed 0.01°)', (h, want) => {
    expect(Math.abs(declinationUncertaintyDeg(h) - want)).toBeLessThanOrEqual(0.005);
  });

  it('tends to the 0.26° floor in a strong field and grows as 5417/H in a weak one', () => {
    expect(declinationUncertaintyDeg(1e9)).toBeCloseTo(0.26, 6);
    expect(declinationUncertaintyDeg(100) / (5417 / 100)).toBeCloseTo(1, 4);
  });

  it('is +∞ at H = 0 and NaN for a negative or non-finite H', () => {
    expect(declinationUncertaintyDeg(0)).toBe(Infinity);
    expect(declinationUncertaintyDeg(-1)).toBeNaN();
    expect(declinationUncertaintyDeg(NaN)).toBeNaN();
  });
});
