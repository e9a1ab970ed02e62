// largestErrorPeaks against the plain greedy definition (sort by |error|, earlier row first on ties, take a
// row when it is at least separationS from every row taken), on random columns with NaN and ties.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { largestErrorPeaks } from '../../src/report/largestErrorPeaks.js';

function reference(t: Float64Array, e: Float64Array, count: number, sep: number): number[] {
  const order: number[] = [];
  for (let i = 0; i < e.length; i++) if (Number.isFinite(e[i]) && Number.isFinite(t[i])) order.push(i);
  order.sort((a, b) => Math.abs(e[b]) - Math.abs(e[a]) || a - b);
  const picked: number[] = [];
  for (const i of order) {
    if (picked.length >= count) break;
    if (picked.every((j) => Math.abs(t[i] - t[j]) >= sep)) picked.push(i);
  }
  return picked;
}

describe('largestErrorPeaks', () => {
  it('picks exactly what the greedy sort-and-suppress definition picks', () => {
    fc.assert(
      fc.property(
        fc.array(fc.oneof(fc.integer({ min: -40, max: 40 }), fc.constant(NaN)), { minLength: 0, maxLength: 300 }),
        fc.integer({ min: 0, max: 8 }),
        fc.integer({ min: 0, max: 60 }),
        (vals, count, sep) => {
          const e = Float64Array.from(vals);
          const t = Float64Array.from(vals, (_, i) => i * 0.7);
          expect(largestErrorPeaks(t, e, count, sep)).toEqual(reference(t, e, count, sep));
        },
      ),
      { numRuns: 2000, seed: 11 },
    );
  });
});
