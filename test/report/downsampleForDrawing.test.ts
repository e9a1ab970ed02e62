import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { downsampleForDrawing } from '../../src/report/downsampleForDrawing.js';

/** Brute-force oracle: the rows of the lowest and highest finite value in each equal-count bucket. */
function bucketExtremes(err: Float64Array, buckets: number): number[] {
  const out: number[] = [];
  for (let b = 0; b < buckets; b++) {
    const i0 = Math.floor((b * err.length) / buckets);
    const i1 = Math.floor(((b + 1) * err.length) / buckets);
    const seg = Array.from(err.slice(i0, i1));
    const finite = seg.map((v, k) => [v, i0 + k] as const).filter(([v]) => Number.isFinite(v));
    if (finite.length === 0) continue;
    out.push(finite.reduce((a, c) => (c[0] < a[0] ? c : a))[1], finite.reduce((a, c) => (c[0] > a[0] ? c : a))[1]);
  }
  return out;
}

describe('downsampleForDrawing', () => {
  it('returns every row when the flight is short enough', () => {
    expect(Array.from(downsampleForDrawing(new Float64Array([1, 2, 3]), 10, []))).toEqual([0, 1, 2]);
  });

  it('keeps the flight-wide largest and smallest error, the first and last row, and every forced row', () => {
    const n = 50_000;
    const err = Float64Array.from({ length: n }, (_, i) => 10 * Math.sin(i / 700) + ((i * 7919) % 13) / 10);
    err[31_337] = 80; // one sharp spike, a single sample wide
    err[4_242] = -75;
    const rows = Array.from(downsampleForDrawing(err, 1000, [12_345, 40_000, 40_000, -1, n + 5]));
    expect(rows.length).toBeLessThanOrEqual(1000);
    for (const r of [0, n - 1, 31_337, 4_242, 12_345, 40_000]) expect(rows).toContain(r);
  });

  it('keeps in every bucket exactly the rows of its error extremes (property, brute-force oracle)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.oneof(fc.double({ min: -90, max: 90, noNaN: true }), fc.constant(NaN)), { minLength: 30, maxLength: 600 }),
        fc.integer({ min: 4, max: 29 }),
        (values, maxPoints) => {
          const err = Float64Array.from(values);
          const rows = downsampleForDrawing(err, maxPoints, []);
          const list = Array.from(rows);
          // sorted, distinct, in range, within budget
          for (let k = 1; k < list.length; k++) expect(list[k]).toBeGreaterThan(list[k - 1]);
          expect(list.length).toBeLessThanOrEqual(maxPoints);
          for (const r of bucketExtremes(err, Math.max(1, Math.floor((maxPoints - 2) / 2)))) { // first and last row take 2 of the budget
            // ties may pick another row with the same value; the value must be drawn
            expect(list.some((k) => err[k] === err[r])).toBe(true);
          }
        },
      ),
      { numRuns: 200 },
    );
  });
});
