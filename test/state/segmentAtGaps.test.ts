// Gap splitting: the threshold rule max(5 s, 5 × median step) [practice, issue 2] and its consequences.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { medianPositiveStepS, segmentAtGaps } from '../../src/state/segmentAtGaps.js';

describe('segmentAtGaps', () => {
  it('splits 1 Hz data at a 30 s step (threshold 5 s) and reports the gap times', () => {
    const s = segmentAtGaps(Float64Array.from([0, 1, 2, 32, 33]));
    expect(Array.from(s.segment)).toEqual([0, 0, 0, 1, 1]);
    expect(Array.from(s.starts)).toEqual([0, 3]);
    expect(s.thresholdS).toBe(5);
    expect(s.gaps).toEqual([{ t0: 2, t1: 32 }]);
  });
  it('uses 5 × the median step for slow logs: 4 s steps → 20 s threshold, so a 15 s step is not a gap', () => {
    const s = segmentAtGaps(Float64Array.from([0, 4, 8, 12, 27, 31, 35, 60]));
    expect(s.thresholdS).toBe(20);
    expect(Array.from(s.segment)).toEqual([0, 0, 0, 0, 0, 0, 0, 1]);
  });
  it('keeps a 5 s floor at 10 Hz: a 2 s dropout is not a gap, a 6 s one is', () => {
    const t = [0, 0.1, 0.2, 0.3, 2.3, 2.4, 8.4, 8.5];
    const s = segmentAtGaps(Float64Array.from(t));
    expect(s.thresholdS).toBe(5);
    expect(Array.from(s.segment)).toEqual([0, 0, 0, 0, 0, 0, 1, 1]);
  });
  it('honours an explicit gapS and rejects a non-positive one', () => {
    expect(segmentAtGaps(Float64Array.from([0, 1, 3]), 1.5).gaps.length).toBe(1);
    expect(() => segmentAtGaps(Float64Array.from([0, 1]), 0)).toThrow(/gapS/);
    expect(() => segmentAtGaps(Float64Array.from([0, 1]), NaN)).toThrow(/gapS/);
  });
  it('handles empty and single-sample columns, and ignores zero steps in the median', () => {
    expect(segmentAtGaps(new Float64Array(0)).starts.length).toBe(0);
    expect(Array.from(segmentAtGaps(Float64Array.from([7])).segment)).toEqual([0]);
    expect(medianPositiveStepS(Float64Array.from([0, 0, 0, 1, 2]))).toBe(1);
  });
});

describe('medianPositiveStepS by selection', () => {
  it('equals the median of the sorted positive steps (the plain definition) on random time columns with repeats and zero steps', () => {
    const reference = (t: Float64Array): number => {
      const d: number[] = [];
      for (let i = 1; i < t.length; i++) if (t[i] - t[i - 1] > 0) d.push(t[i] - t[i - 1]);
      if (d.length === 0) return NaN;
      d.sort((a, b) => a - b);
      const m = d.length >> 1;
      return d.length % 2 === 1 ? d[m] : 0.5 * (d[m - 1] + d[m]);
    };
    fc.assert(
      fc.property(
        fc.array(fc.oneof(fc.constant(0), fc.constant(0.1), fc.constant(1), fc.double({ min: 0, max: 50, noNaN: true })), { minLength: 0, maxLength: 400 }),
        (steps) => {
          const t = new Float64Array(steps.length + 1);
          for (let i = 0; i < steps.length; i++) t[i + 1] = t[i] + steps[i];
          expect(medianPositiveStepS(t)).toBe(reference(t));
        },
      ),
      { numRuns: 3000, seed: 7 },
    );
  });
});
