// Quickselect against the plain definition: the k-th entry of the sorted copy.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { kthSmallestInPlace } from '../../src/util/kthSmallestInPlace.js';

describe('kthSmallestInPlace (Hoare FIND)', () => {
  it('returns the entry at k of the ascending sort for any array and k (fast-check against Float64Array.prototype.sort)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.oneof(fc.double({ min: -1e6, max: 1e6, noNaN: true, noDefaultInfinity: true }), fc.integer({ min: -3, max: 3 })), { minLength: 1, maxLength: 400 }),
        fc.nat(),
        (xs, kRaw) => {
          const k = kRaw % xs.length;
          const sorted = Float64Array.from(xs).sort();
          expect(kthSmallestInPlace(Float64Array.from(xs), k) === sorted[k]).toBe(true); // === so −0 and 0 match
        },
      ),
      { numRuns: 3000, seed: 61 },
    );
  });

  it('leaves the array split at k: nothing larger before it, nothing smaller after it (what the median of an even count relies on)', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: -50, max: 50 }), { minLength: 1, maxLength: 300 }), fc.nat(), (xs, kRaw) => {
        const k = kRaw % xs.length;
        const a = Float64Array.from(xs);
        const v = kthSmallestInPlace(a, k);
        expect(a[k]).toBe(v);
        for (let i = 0; i < k; i++) expect(a[i] <= v).toBe(true);
        for (let i = k + 1; i < a.length; i++) expect(a[i] >= v).toBe(true);
      }),
      { numRuns: 3000, seed: 62 },
    );
  });

  it('handles sorted, reversed and constant inputs (the classic quickselect worst cases for a bad pivot)', () => {
    const n = 10_001;
    const up = Float64Array.from({ length: n }, (_, i) => i);
    expect(kthSmallestInPlace(up.slice(), 5000)).toBe(5000);
    expect(kthSmallestInPlace(up.slice().reverse(), 9900)).toBe(9900);
    expect(kthSmallestInPlace(new Float64Array(n).fill(2.5), 17)).toBe(2.5);
    expect(kthSmallestInPlace(Float64Array.of(7), 0)).toBe(7);
  });
});
