// simulateCompass's column passes (body axes once per sample, free axis kept, stop and reading in separate loops)
// against the plain per-sample reference, cardEquilibrium, over random flight conditions (property test).
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { simulateCompass } from '../../src/compass/simulateCompass.js';
import { DEFAULT_COMPASS_PROFILE } from '../../src/compass/compassProfile.js';
import { cardEquilibrium, magnetPerPendulosityFromResidualDip, newCardEquilibrium } from '../../src/compass/cardEquilibrium.js';
import { diff180, makeState, setField, uniformField, type Sample } from './compassFixtures.js';

const DEG = Math.PI / 180;
const P = DEFAULT_COMPASS_PROFILE;
const card = {
  tiltLimitDeg: P.tiltLimitDeg,
  magnetPerPendulosityMs2PerNt: magnetPerPendulosityFromResidualDip(P.residualDipDeg, P.refHorizontalNt, P.refVerticalNt),
};

/** Same angle within 1e-9° (both NaN counts as the same: a card without directive force reads NaN). */
function expectSameDeg(a: number, b: number): void {
  if (Number.isNaN(a) || Number.isNaN(b)) expect([Number.isNaN(a), Number.isNaN(b)]).toEqual([true, true]);
  else expect(Math.abs(diff180(a, b))).toBeLessThan(1e-9);
}

const sampleArb = fc.record({
  headingDegTrue: fc.double({ min: 0, max: 359.999, noNaN: true }),
  pitchDeg: fc.double({ min: -30, max: 30, noNaN: true }),
  bankDeg: fc.double({ min: -70, max: 70, noNaN: true }),
  accN: fc.double({ min: -8, max: 8, noNaN: true }),
  accE: fc.double({ min: -8, max: 8, noNaN: true }),
  accD: fc.double({ min: -4, max: 4, noNaN: true }),
  hNt: fc.double({ min: 3000, max: 40000, noNaN: true }),
  dipDeg: fc.double({ min: -80, max: 80, noNaN: true }),
  variationDeg: fc.double({ min: -30, max: 30, noNaN: true }),
});

describe('simulateCompass static and turn-only readings', () => {
  // Reference: cardEquilibrium per sample (PHYSICS.md §1.1, §1.3, §1.5); the split as in the simulateCompass file comment.
  it('equal cardEquilibrium of each sample, full and lateral-only acceleration, within 1e-9°', () => {
    fc.assert(fc.property(fc.array(sampleArb, { minLength: 1, maxLength: 12 }), (rows) => {
      const samples: Sample[] = rows.map((r, i) => ({ t: 1.7e9 + i * 0.1, ...r }));
      const state = makeState(samples);
      const field = uniformField(rows.length, 20000, 60);
      rows.forEach((r, i) => setField(field, i, r.hNt, r.dipDeg, r.variationDeg));
      const trace = simulateCompass(state, field, P);
      const eq = newCardEquilibrium();
      rows.forEach((r, i) => {
        const h = state.headingDegTrue[i];
        const bx = field.xNt[i], by = field.yNt[i], bz = field.zNt[i];
        cardEquilibrium(h, r.pitchDeg, r.bankDeg, r.accN, r.accE, r.accD, bx, by, bz, eq, card);
        const staticRef = eq.readingDeg;
        expectSameDeg(trace.staticDeg[i], staticRef);
        // Lateral part of the acceleration: (a·p) p, p = (−sin ψ, cos ψ, 0).
        const aLat = -r.accN * Math.sin(h * DEG) + r.accE * Math.cos(h * DEG);
        cardEquilibrium(h, r.pitchDeg, r.bankDeg, -aLat * Math.sin(h * DEG), aLat * Math.cos(h * DEG), 0, bx, by, bz, eq, card);
        const hMag = trace.headingMagDeg![i];
        expectSameDeg(trace.errDipTurnDeg[i], diff180(eq.readingDeg, hMag));
        expectSameDeg(trace.errDipAccelDeg[i], diff180(staticRef, eq.readingDeg));
      });
    }), { numRuns: 200 });
  });
});
