// The wind blend against its plain definition (the formula in blendWindEstimates' comment, written out
// estimate by estimate as it was first implemented), on random estimates and samples, and against two
// cases worked by hand.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { WindEstimate } from '../../src/state/flightState.js';
import { ALT_EXTRAPOLATION_M, blendWindEstimates, TIME_EXTRAPOLATION_S, WIND_DRIFT_MS_PER_S, WIND_SHEAR_MS_PER_M } from '../../src/state/windBlend.js';

/** w_k = 1/(tr C_k/2 + d_k² + 1e-12), d_k² = (Δt/1800)² + (Δh/150)²; wind Σ w w⃗ / Σ w; covariance Σ w² (C + d² I) / (Σ w)². */
function plainBlend(es: WindEstimate[], t: number, a: number): number[] {
  let sw = 0, sn = 0, se = 0, qnn = 0, qne = 0, qee = 0;
  let tMin = Infinity, tMax = -Infinity, hMin = Infinity, hMax = -Infinity;
  for (const e of es) {
    const wn = e.windN!, we = e.windE!;
    const s2 = Number.isFinite(e.sigmaMs) ? e.sigmaMs * e.sigmaMs : 1;
    const [cnn, cne, cee] = e.covNeMs2 ?? [s2, 0, s2];
    const t0 = Number.isFinite(e.t0) ? e.t0 : -Infinity, t1 = Number.isFinite(e.t1) ? e.t1 : Infinity;
    tMin = Math.min(tMin, t0);
    tMax = Math.max(tMax, t1);
    if (Number.isFinite(e.altM)) { hMin = Math.min(hMin, e.altM); hMax = Math.max(hMax, e.altM); }
    const dt = t < t0 ? t0 - t : t > t1 ? t - t1 : 0;
    const dh = Number.isFinite(a) && Number.isFinite(e.altM) ? a - e.altM : 0;
    const d2 = (dt * WIND_DRIFT_MS_PER_S) ** 2 + (dh * WIND_SHEAR_MS_PER_M) ** 2;
    const w = 1 / (0.5 * (cnn + cee) + d2 + 1e-12);
    sw += w; sn += w * wn; se += w * we;
    qnn += w * w * (cnn + d2); qne += w * w * cne; qee += w * w * (cee + d2);
  }
  const outsideAlt = Number.isFinite(a) && Number.isFinite(hMin) && (a < hMin - ALT_EXTRAPOLATION_M || a > hMax + ALT_EXTRAPOLATION_M);
  const ex = t < tMin - TIME_EXTRAPOLATION_S || t > tMax + TIME_EXTRAPOLATION_S || outsideAlt ? 1 : 0;
  return [sn / sw, se / sw, qnn / (sw * sw), qne / (sw * sw), qee / (sw * sw), ex];
}

const estimate = fc.record({
  t0: fc.oneof(fc.double({ min: 0, max: 10000, noNaN: true }), fc.constant(NaN)),
  len: fc.double({ min: 0, max: 600, noNaN: true }),
  altM: fc.oneof(fc.double({ min: -100, max: 4000, noNaN: true }), fc.constant(NaN)),
  windN: fc.double({ min: -30, max: 30, noNaN: true }),
  windE: fc.double({ min: -30, max: 30, noNaN: true }),
  sigmaMs: fc.oneof(fc.double({ min: 0.05, max: 3, noNaN: true }), fc.constant(NaN)),
  cov: fc.option(fc.tuple(fc.double({ min: 0.001, max: 4, noNaN: true }), fc.double({ min: -0.001, max: 0.001, noNaN: true }), fc.double({ min: 0.001, max: 4, noNaN: true })), { nil: undefined }),
}).map((r): WindEstimate => ({
  fromDegTrue: 0, speedMs: 0, source: 'turn-fit', t0: r.t0, t1: r.t0 + r.len, altM: r.altM, sigmaMs: r.sigmaMs, tasMs: NaN, arcDeg: NaN,
  windN: r.windN, windE: r.windE, ...(r.cov ? { covNeMs2: r.cov } : {}),
}));

describe('blendWindEstimates', () => {
  it('gives, bit for bit, the plain per-estimate blend on random estimates (windows, heights and covariances missing or not) and samples', () => {
    fc.assert(
      fc.property(
        fc.array(estimate, { minLength: 1, maxLength: 12 }),
        fc.array(fc.tuple(fc.double({ min: -2000, max: 14000, noNaN: true }), fc.oneof(fc.double({ min: -200, max: 5000, noNaN: true }), fc.constant(NaN))), { minLength: 1, maxLength: 40 }),
        (es, samples) => {
          const t = Float64Array.from(samples, (s) => s[0]);
          const a = Float64Array.from(samples, (s) => s[1]);
          const b = blendWindEstimates(es, t, a);
          samples.forEach(([ti, ai], i) => {
            expect([b.windN[i], b.windE[i], b.covNN[i], b.covNE[i], b.covEE[i], b.extrapolated[i]]).toEqual(plainBlend(es, ti, ai));
          });
        },
      ),
      { numRuns: 1500, seed: 21 },
    );
  });
  it('weights two equal-certainty estimates 1 : 1 inside both windows and leans to the near one outside (worked by hand)', () => {
    const e = (t0: number, windN: number): WindEstimate => ({ fromDegTrue: 0, speedMs: 0, source: 'turn-fit', t0, t1: t0 + 60, altM: 1000, sigmaMs: 1, tasMs: NaN, arcDeg: NaN, windN, windE: 0 });
    // Same time window: w = 1/(1 + 1e-12) each → mean of 4 and 8.
    let b = blendWindEstimates([e(0, 4), e(0, 8)], Float64Array.of(30), Float64Array.of(1000));
    expect(b.windN[0]).toBeCloseTo(6, 12);
    // 1800 s after the first window's end and inside the second: d² = 1 → weights 1/2 and 1 → (4/2 + 8)/(3/2) = 6.667.
    b = blendWindEstimates([e(0, 4), e(1860, 8)], Float64Array.of(1860), Float64Array.of(1000));
    expect(b.windN[0]).toBeCloseTo(20 / 3, 9);
  });
});
