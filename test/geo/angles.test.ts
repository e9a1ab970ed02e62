// Interval contracts of src/geo/angles.ts (STYLE.md habit 5): boundaries −180, 180, 360, 359.9 vs 0.1.
// The expected values follow from the stated intervals themselves ([0, 360) and (−180, 180]).
import { describe, expect, it } from 'vitest';
import { acosClamped, angleDiffDeg, asinClamped, circularMeanDeg, unwrapDegInPlace, wrap180, wrap360 } from '../../src/geo/angles.js';

describe('wrap360 returns [0, 360)', () => {
  it('maps 360 to 0, −0 to +0, −180 to 180, 720.5 to 0.5, −0.1 to 359.9', () => {
    expect(wrap360(360)).toBe(0);
    expect(Object.is(wrap360(-0), 0)).toBe(true);
    expect(wrap360(-180)).toBe(180);
    expect(wrap360(720.5)).toBeCloseTo(0.5, 12);
    expect(wrap360(-0.1)).toBeCloseTo(359.9, 12);
  });
  it('never returns 360 even for −1e-15 (rounding would give 360)', () => {
    const w = wrap360(-1e-15);
    expect(w).toBeGreaterThanOrEqual(0);
    expect(w).toBeLessThan(360);
  });
  it('keeps NaN', () => expect(wrap360(NaN)).toBeNaN());
});

describe('wrap180 returns (−180, 180]', () => {
  it('maps −180 to 180 and keeps 180', () => {
    expect(wrap180(-180)).toBe(180);
    expect(wrap180(180)).toBe(180);
    expect(wrap180(540)).toBe(180);
  });
  it('maps 190 to −170 and −190 to 170', () => {
    expect(wrap180(190)).toBeCloseTo(-170, 12);
    expect(wrap180(-190)).toBeCloseTo(170, 12);
  });
});

describe('angleDiffDeg is the signed shortest turn, right +', () => {
  it('359.9 vs 0.1 is −0.2 (a is left of b) and 0.1 vs 359.9 is +0.2', () => {
    expect(angleDiffDeg(359.9, 0.1)).toBeCloseTo(-0.2, 10);
    expect(angleDiffDeg(0.1, 359.9)).toBeCloseTo(0.2, 10);
  });
  it('opposite directions give +180, never −180', () => {
    expect(angleDiffDeg(0, 180)).toBe(180);
    expect(angleDiffDeg(180, 0)).toBe(180);
  });
});

describe('circularMeanDeg', () => {
  it('averages across north: 359.9 and 0.1 → 0 (not 180)', () => {
    const m = circularMeanDeg([359.9, 0.1]);
    expect(Math.min(m, 360 - m)).toBeLessThan(1e-9);
  });
  it('skips NaN and returns NaN for cancelling sets', () => {
    expect(circularMeanDeg([10, NaN, 20])).toBeCloseTo(15, 9);
    expect(circularMeanDeg([0, 180])).toBeNaN();
    expect(circularMeanDeg([])).toBeNaN();
  });
});

describe('unwrapDegInPlace', () => {
  it('turns 350, 359.9, 0.1, 10 into a continuous run and keeps NaN rows', () => {
    const a = unwrapDegInPlace(Float64Array.from([350, 359.9, NaN, 0.1, 10]));
    expect(a[3]).toBeCloseTo(360.1, 10);
    expect(a[4]).toBeCloseTo(370, 10);
    expect(a[2]).toBeNaN();
  });
});

describe('clamped inverse trigonometric functions', () => {
  it('give ±π/2 and 0/π just past ±1 instead of NaN', () => {
    expect(asinClamped(1 + 1e-15)).toBe(Math.PI / 2);
    expect(asinClamped(-1 - 1e-15)).toBe(-Math.PI / 2);
    expect(acosClamped(1 + 1e-15)).toBe(0);
    expect(acosClamped(-1 - 1e-15)).toBe(Math.PI);
  });
});
