import { describe, expect, it } from 'vitest';
import { flagSpans, mergeCloseSpans, segmentGaps } from '../../src/report/flagSpans.js';

const t = Float64Array.from({ length: 12 }, (_, i) => 100 + i);

describe('flagSpans and segmentGaps', () => {
  it('turns each run of flagged samples into one [first, last] time span', () => {
    const flag = [0, 1, 1, 0, 0, 1, 0, 0, 1, 1, 1, 1];
    expect(flagSpans(t, flag, new Array(12).fill(0))).toEqual([
      { t0Utc: 101, t1Utc: 102 },
      { t0Utc: 105, t1Utc: 105 },
      { t0Utc: 108, t1Utc: 111 },
    ]);
  });

  it('splits a run where the segment changes (a gap is never shaded as part of a run)', () => {
    const seg = [0, 0, 0, 0, 0, 0, 1, 1, 1, 1, 1, 1];
    expect(flagSpans(t, new Array(12).fill(1), seg)).toEqual([
      { t0Utc: 100, t1Utc: 105 },
      { t0Utc: 106, t1Utc: 111 },
    ]);
    expect(segmentGaps(t, seg)).toEqual([{ t0Utc: 105, t1Utc: 106 }]);
  });
});

describe('mergeCloseSpans', () => {
  it('joins spans whose gap is at most the limit and keeps the others apart', () => {
    const spans = [
      { t0Utc: 0, t1Utc: 1 },
      { t0Utc: 3, t1Utc: 4 },
      { t0Utc: 20, t1Utc: 21 },
    ];
    expect(mergeCloseSpans(spans, 2)).toEqual([
      { t0Utc: 0, t1Utc: 4 },
      { t0Utc: 20, t1Utc: 21 },
    ]);
    expect(spans[0]).toEqual({ t0Utc: 0, t1Utc: 1 }); // input untouched
  });

  it('bounds the count: with a limit of duration/K at most K + 1 spans remain', () => {
    const many = Array.from({ length: 5000 }, (_, k) => ({ t0Utc: 2 * k, t1Utc: 2 * k + 0.5 }));
    const durationS = 10_000;
    expect(mergeCloseSpans(many, durationS / 100).length).toBeLessThanOrEqual(101);
  });
});
