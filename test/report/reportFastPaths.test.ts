// Fast paths of the report model and page against the plain code they replaced, compared exactly.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { NM_M } from '../../src/constants.js';
import { nedOffsetM } from '../../src/geo/localFrame.js';
import { jsonForScriptBlock } from '../../src/report/escapeHtml.js';
import { localPlanNm } from '../../src/report/localPlanNm.js';
import { maxRangeNm } from '../../src/report/maxRangeNm.js';

describe('maxRangeNm against the plain scan with Math.hypot at every row', () => {
  const plainMax = (e: Float64Array, n: Float64Array) => {
    let m = 0;
    for (let i = 0; i < e.length; i++) {
      const r = Math.hypot(e[i], n[i]);
      if (Number.isFinite(r) && r > m) m = r;
    }
    return m;
  };
  it('gives the identical value (fast-check: plan-view sizes, near-ties, NaN, ±Infinity, tiny and huge values)', () => {
    const coord = fc.oneof(
      fc.double({ min: -200, max: 200, noNaN: true }),
      fc.double(),
      fc.double({ min: -1e-160, max: 1e-160, noNaN: true }),
      fc.constantFrom(NaN, Infinity, -0, 3, 4, 5, 1e200),
    );
    fc.assert(
      fc.property(fc.array(fc.tuple(coord, coord), { maxLength: 300 }), fc.array(fc.nat(), { maxLength: 40 }), (pts, repeats) => {
        // Repeat some points with their coordinates swapped or negated: exact and near ties of the maximum.
        for (const r of repeats) if (pts.length > 0) { const [e, n] = pts[r % pts.length]; pts.push([n, -e], [e * (1 + 1e-16), n]); }
        const e = Float64Array.from(pts, (p) => p[0]);
        const n = Float64Array.from(pts, (p) => p[1]);
        expect(Object.is(maxRangeNm(e, n), plainMax(e, n))).toBe(true);
      }),
      { numRuns: 3000, seed: 88 },
    );
  });
});

describe('localPlanNm against geo/localFrame nedOffsetM at every fix (the per-fix form it replaced)', () => {
  it('gives bit-identical east and north [NM] (fast-check over fixes within 300 NM of any reference)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -85, max: 85, noNaN: true }), fc.double({ min: -180, max: 180, noNaN: true }),
        fc.array(fc.tuple(fc.double({ min: -5, max: 5, noNaN: true }), fc.double({ min: -5, max: 5, noNaN: true })), { minLength: 1, maxLength: 50 }),
        (lat0, lon0, offs) => {
          const lat = Float64Array.from(offs, ([d]) => lat0 + d);
          const lon = Float64Array.from(offs, ([, d]) => lon0 + d);
          lat[0] = NaN; // a missing fix stays NaN
          const p = localPlanNm(lat, lon, lat0, lon0);
          expect(Number.isNaN(p.eastNm[0]) && Number.isNaN(p.northNm[0])).toBe(true);
          for (let i = 1; i < lat.length; i++) {
            const [north, east] = nedOffsetM(lat0, lon0, 0, lat[i], lon[i], 0);
            expect(Object.is(p.eastNm[i], east / NM_M)).toBe(true);
            expect(Object.is(p.northNm[i], north / NM_M)).toBe(true);
          }
        },
      ),
      { numRuns: 500, seed: 12 },
    );
  });
});

describe('jsonForScriptBlock in one pass against the five replaces it replaced', () => {
  it('writes the same text for any JSON value (fast-check; strings full of < > & U+2028 U+2029)', () => {
    const old = (v: unknown) =>
      JSON.stringify(v).replace(/</g, '\\u003c').replace(/>/g, '\\u003e').replace(/&/g, '\\u0026').replace(/\u2028/g, '\\u2028').replace(/\u2029/g, '\\u2029');
    const hostile = fc.string({ unit: fc.constantFrom('<', '>', '&', '\u2028', '\u2029', '/', 's', '"', '\\', '!', '-', 'é') });
    fc.assert(
      fc.property(fc.oneof(hostile, fc.jsonValue(), fc.dictionary(hostile, fc.oneof(hostile, fc.double({ noNaN: true })))), (v) => {
        expect(jsonForScriptBlock(v)).toBe(old(v));
      }),
      { numRuns: 3000, seed: 2028 },
    );
  });
});
