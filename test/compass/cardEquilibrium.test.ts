// The vector card model (PHYSICS §1.1) against the closed forms (PHYSICS §1.2), check value 1 and 12.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { cardEquilibrium, magnetPerPendulosityFromResidualDip, newCardEquilibrium } from '../../src/compass/cardEquilibrium.js';
import { accelerationReadingDeg, coordinatedReadingDeg, levelTurnReadingDeg } from '../../src/compass/turningError.js';
import { G, coordinatedTurnAccel, diff180, fieldVector } from './compassFixtures.js';

const DEG = Math.PI / 180;
const eq = newCardEquilibrium();
const fcOpts = { numRuns: 2000, seed: 20260504 };

describe('cardEquilibrium vs the closed forms (PHYSICS check 1: derived, tolerance 1e-9 deg)', () => {
  it('steady coordinated level turn equals Williams eq. 2 for any heading, bank ±40, dip ±80, variation', () => {
    fc.assert(fc.property(
      fc.double({ min: 0, max: 360, noNaN: true }), fc.double({ min: -40, max: 40, noNaN: true }),
      fc.double({ min: -80, max: 80, noNaN: true }), fc.double({ min: -30, max: 30, noNaN: true }),
      (psiM, bank, dip, vari) => {
        const [x, y, z] = fieldVector(20000, dip, vari);
        const a = coordinatedTurnAccel(psiM + vari, bank);
        cardEquilibrium(psiM + vari, 0, bank, a.accN, a.accE, 0, x, y, z, eq);
        if (eq.directiveRatio < 1e-4) return; // exactly at the card-reversal singularity both forms are undefined
        expect(Math.abs(diff180(eq.readingDeg, levelTurnReadingDeg(psiM, bank, dip)))).toBeLessThan(1e-9);
        expect(eq.tiltDeg).toBeLessThan(1e-6); // card banked with the airframe
      }), fcOpts);
  });

  it('apparent gravity along body z at any pitch equals the climbing/banked closed form (PHYSICS §1.2)', () => {
    fc.assert(fc.property(
      fc.double({ min: 0, max: 360, noNaN: true }), fc.double({ min: -20, max: 20, noNaN: true }),
      fc.double({ min: -40, max: 40, noNaN: true }), fc.double({ min: -80, max: 80, noNaN: true }),
      fc.double({ min: -30, max: 30, noNaN: true }),
      (psiM, pitch, bank, dip, vari) => {
        const [x, y, z] = fieldVector(20000, dip, vari);
        const ps = (psiM + vari) * DEG, th = pitch * DEG, ph = bank * DEG;
        // body z in NED; a = g e_z − s z_b with s chosen so that a_D = 0 (apparent gravity exactly along z_b)
        const zb = [Math.cos(ps) * Math.sin(th) * Math.cos(ph) + Math.sin(ps) * Math.sin(ph),
          Math.sin(ps) * Math.sin(th) * Math.cos(ph) - Math.cos(ps) * Math.sin(ph), Math.cos(th) * Math.cos(ph)];
        const s = G / zb[2];
        cardEquilibrium(psiM + vari, pitch, bank, -s * zb[0], -s * zb[1], G - s * zb[2], x, y, z, eq);
        if (eq.directiveRatio < 1e-4) return;
        const want = coordinatedReadingDeg(psiM, pitch, bank, 20000, z);
        expect(Math.abs(diff180(eq.readingDeg, want))).toBeLessThan(1e-9);
      }), fcOpts);
  });

  it('along-heading acceleration ±0.3 g, wings level, equals Williams eq. 3–4', () => {
    fc.assert(fc.property(
      fc.double({ min: 0, max: 360, noNaN: true }), fc.double({ min: -0.3, max: 0.3, noNaN: true }),
      fc.double({ min: -80, max: 80, noNaN: true }), fc.double({ min: -30, max: 30, noNaN: true }),
      (psiM, ag, dip, vari) => {
        const [x, y, z] = fieldVector(20000, dip, vari);
        const p = (psiM + vari) * DEG;
        cardEquilibrium(psiM + vari, 0, 0, ag * G * Math.cos(p), ag * G * Math.sin(p), 0, x, y, z, eq);
        expect(Math.abs(diff180(eq.readingDeg, accelerationReadingDeg(psiM, ag * G, dip)))).toBeLessThan(1e-9);
      }), fcOpts);
  });
});

describe('unaccelerated flight (PHYSICS §1.1 consequence, check 12: derived)', () => {
  it('a steady straight climb at pitch 10 gives no dip error on any heading (card level, within the 18° stop)', () => {
    for (let h = 0; h < 360; h += 15) {
      const [x, y, z] = fieldVector(18000, 67, -4);
      cardEquilibrium(h - 4, 10, 0, 0, 0, 0, x, y, z, eq, { tiltLimitDeg: 18, magnetPerPendulosityMs2PerNt: 0 });
      expect(Math.abs(diff180(eq.readingDeg, h))).toBeLessThan(0.01);
      expect(eq.onStop).toBe(false);
      expect(eq.tiltDeg).toBeCloseTo(10, 9);
    }
  });

  it('a wings-level slip (bank 10, no acceleration) gives no dip error', () => {
    const [x, y, z] = fieldVector(18000, 67, 0);
    for (const h of [0, 45, 135, 200, 300]) {
      cardEquilibrium(h, 0, 10, 0, 0, 0, x, y, z, eq, { tiltLimitDeg: 18, magnetPerPendulosityMs2PerNt: 0 });
      expect(Math.abs(diff180(eq.readingDeg, h))).toBeLessThan(0.01);
    }
  });

  it('declination drops out: the reading is magnetic for a field given in true NED', () => {
    const [x, y, z] = fieldVector(20000, 60, 12.5);
    cardEquilibrium(100, 0, 0, 0, 0, 0, x, y, z, eq);
    expect(eq.readingDeg).toBeCloseTo(87.5, 10);
    expect(eq.directiveRatio).toBeCloseTo(1, 12);
  });
});

describe('tilt stop (PHYSICS §1.5 example: derived)', () => {
  it('dip 65, straight climb at pitch 10, heading 045, tilt limit 5 → reads 053.8 and is on the stop', () => {
    const [x, y, z] = fieldVector(20000, 65, 0);
    cardEquilibrium(45, 10, 0, 0, 0, 0, x, y, z, eq, { tiltLimitDeg: 5, magnetPerPendulosityMs2PerNt: 0 });
    expect(eq.readingDeg).toBeCloseTo(53.8, 1);
    expect(eq.onStop).toBe(true);
    expect(eq.tiltDeg).toBeCloseTo(5, 9);
  });
});

describe('finite pendulosity (PHYSICS §1.3: torque balance tan d = M Z / (m g l + M H))', () => {
  it('level unaccelerated flight tilts the card north end down by the residual dip it was calibrated to', () => {
    const eps = magnetPerPendulosityFromResidualDip(3, 20000, 45000);
    const [x, y, z] = fieldVector(20000, Math.atan2(45000, 20000) / DEG, 0);
    cardEquilibrium(90, 0, 0, 0, 0, 0, x, y, z, eq, { tiltLimitDeg: 18, magnetPerPendulosityMs2PerNt: eps });
    expect(eq.tiltDeg).toBeCloseTo(3, 9);
    expect(eq.kN).toBeLessThan(0); // card "down" axis leans south: north end dips
    expect(eq.kE).toBeCloseTo(0, 12);
  });

  it('residual dip scales with Z: 3° at (50 µT, dip 66) → ~3.4° at (55 µT, 72) and ~0.8° at (35 µT, 20) (PHYSICS §1.3, derived)', () => {
    const F1 = 50000, I1 = 66 * DEG;
    const eps = magnetPerPendulosityFromResidualDip(3, F1 * Math.cos(I1), F1 * Math.sin(I1));
    const tilt = (F: number, I: number) => {
      const [x, y, z] = fieldVector(F * Math.cos(I * DEG), I, 0);
      cardEquilibrium(0, 0, 0, 0, 0, 0, x, y, z, eq, { tiltLimitDeg: 18, magnetPerPendulosityMs2PerNt: eps });
      return eq.tiltDeg;
    };
    expect(tilt(55000, 72)).toBeCloseTo(3.4, 1);
    expect(tilt(35000, 20)).toBeCloseTo(0.8, 1);
  });
});
