// Turning and acceleration errors: closed forms and the vector card against PHYSICS.md check values 2–11.
import { describe, expect, it } from 'vitest';
import {
  accelerationReadingDeg, cardReversalBankDeg, cardinalTurnErrorDeg, firstOrderErrorDeg, levelTurnErrorDeg,
  levelTurnReadingDeg, maxTurningError,
} from '../../src/compass/turningError.js';
import { cardEquilibrium, newCardEquilibrium } from '../../src/compass/cardEquilibrium.js';
import { G, coordinatedTurnAccel, diff180, fieldVector } from './compassFixtures.js';

const DEG = Math.PI / 180;
const eq = newCardEquilibrium();

/** Vector-model static error in a steady coordinated level turn (ideal card). */
function vectorTurnError(psiM: number, bank: number, dip: number): number {
  const [x, y, z] = fieldVector(20000, dip, 0);
  const a = coordinatedTurnAccel(psiM, bank);
  cardEquilibrium(psiM, 0, bank, a.accN, a.accE, 0, x, y, z, eq);
  return diff180(eq.readingDeg, psiM);
}

/** Vector-model static error under a steady along-heading acceleration, wings level. */
function vectorAccelError(psiM: number, accG: number, dip: number): number {
  const [x, y, z] = fieldVector(20000, dip, 0);
  cardEquilibrium(psiM, 0, 0, accG * G * Math.cos(psiM * DEG), accG * G * Math.sin(psiM * DEG), 0, x, y, z, eq);
  return diff180(eq.readingDeg, psiM);
}

describe('level coordinated turns (Williams eq. 2; PHYSICS checks 2–5, tolerance 0.1 deg)', () => {
  it('check 2: dip 55, bank 15 right: 000 reads 339.7 (−20.3), 180 gives +20.3, 090 and 270 give 0', () => {
    expect(levelTurnReadingDeg(0, 15, 55)).toBeCloseTo(339.7, 1);
    expect(vectorTurnError(0, 15, 55)).toBeCloseTo(-20.3, 1);
    expect(vectorTurnError(180, 15, 55)).toBeCloseTo(20.3, 1);
    expect(Math.abs(vectorTurnError(90, 15, 55))).toBeLessThan(1e-9);
    expect(Math.abs(vectorTurnError(270, 15, 55))).toBeLessThan(1e-9);
  });

  it('check 3: dip 65, bank 15: −29.0 at 000, +29.0 at 180, 0 at 090; bank 20: −36.3 at 000, max −51.4 near 054', () => {
    expect(vectorTurnError(0, 15, 65)).toBeCloseTo(-29.0, 1);
    expect(vectorTurnError(180, 15, 65)).toBeCloseTo(29.0, 1);
    expect(Math.abs(vectorTurnError(90, 15, 65))).toBeLessThan(1e-9);
    expect(vectorTurnError(0, 20, 65)).toBeCloseTo(-36.3, 1);
    const m = maxTurningError(20, 65);
    expect(m.errorDeg).toBeCloseTo(-51.4, 1);
    expect(Math.abs(m.headingDegMag - 54)).toBeLessThan(1.5);
    expect(vectorTurnError(m.headingDegMag, 20, 65)).toBeCloseTo(-51.4, 1);
  });

  it('check 4: dip 55, bank 15–20: largest turning error 22.6–31.5 (ours, 0.1) and "about 20–30" (Williams, ±5)', () => {
    const m15 = maxTurningError(15, 55), m20 = maxTurningError(20, 55);
    expect(Math.abs(m15.errorDeg)).toBeCloseTo(22.6, 1);
    expect(Math.abs(m20.errorDeg)).toBeCloseTo(31.5, 1);
    expect(Math.abs(m15.headingDegMag - 27)).toBeLessThan(1.5); // PHYSICS §1.2: −22.6 at 027
    expect(Math.abs(m15.errorDeg)).toBeGreaterThan(20 - 5);
    expect(Math.abs(m20.errorDeg)).toBeLessThan(30 + 5);
  });

  it('check 5: lag/lead at N/S = atan(tan μ sin φ): (60,15) 24.1, (65,15) 29.0, (66,18) 34.8, (70,18) 40.3', () => {
    for (const [dip, bank, want] of [[60, 15, 24.1], [65, 15, 29.0], [66, 18, 34.8], [70, 18, 40.3]]) {
      expect(cardinalTurnErrorDeg(dip, bank)).toBeCloseTo(want, 1);
      expect(-vectorTurnError(0, bank, dip)).toBeCloseTo(want, 1);
      expect(vectorTurnError(180, bank, dip)).toBeCloseTo(want, 1);
    }
  });

  it('check 7: PHAK 40N turn S→W: lead ~40 at S, ~20 mid-turn, 0 at W; physics at dip 67, bank 15–18: 31–36 / 16–18 / 0 (±10, PHAK ch. 8)', () => {
    for (const bank of [15, 18]) {
      const atS = levelTurnErrorDeg(180, bank, 67);
      const mid = levelTurnErrorDeg(225, bank, 67);
      expect(atS).toBeGreaterThan(31 - 0.5);
      expect(atS).toBeLessThan(36 + 0.5);
      expect(Math.abs(atS - 40)).toBeLessThan(10);
      expect(Math.abs(mid - 20)).toBeLessThan(10);
      expect(Math.abs(levelTurnErrorDeg(270, bank, 67))).toBeLessThan(1e-9);
    }
  });

  it('check 8: card reversal: dip 65, bank 30 right, heading 090 reads 270; singular bank = 90 − dip', () => {
    expect(levelTurnReadingDeg(90, 30, 65)).toBeCloseTo(270, 9);
    expect(diff180(vectorTurnError(90, 30, 65) + 90, 270)).toBeCloseTo(0, 9);
    expect(cardReversalBankDeg(65)).toBe(25);
    // At the singular bank the card plane is normal to the field: no directive force.
    const [x, y, z] = fieldVector(20000, 65, 0);
    const a = coordinatedTurnAccel(90, 25);
    cardEquilibrium(90, 0, 25, a.accN, a.accE, 0, x, y, z, eq);
    expect(eq.directiveRatio).toBeLessThan(1e-9);
    // Just either side the reading sits near 090 (below) and near 270 (beyond).
    const b = coordinatedTurnAccel(90, 20);
    cardEquilibrium(90, 0, 20, b.accN, b.accE, 0, x, y, z, eq);
    expect(Math.abs(diff180(eq.readingDeg, 90))).toBeLessThan(1e-9);
  });
});

describe('acceleration errors (Williams eq. 3–4; PHYSICS checks 9–11)', () => {
  it('check 9: heading 090, dip 65: +0.1 g → −12.0 (reads 078), −0.1 g → +12.0, 0.05 g → −6.1; dip 55, 0.1 g → −8.1', () => {
    expect(accelerationReadingDeg(90, 0.1 * G, 65)).toBeCloseTo(78.0, 1);
    expect(vectorAccelError(90, 0.1, 65)).toBeCloseTo(-12.0, 1);
    expect(vectorAccelError(90, -0.1, 65)).toBeCloseTo(12.0, 1);
    expect(vectorAccelError(90, 0.05, 65)).toBeCloseTo(-6.1, 1);
    expect(vectorAccelError(90, 0.1, 55)).toBeCloseTo(-8.1, 1);
  });

  it('check 10: no error on 000 or 180; heading 270, +0.1 g, dip 65 → +12.0 (toward N); none at the magnetic equator (0.01)', () => {
    for (const a of [0.1, -0.1, 0.3]) {
      expect(Math.abs(vectorAccelError(0, a, 65))).toBeLessThan(0.01);
      expect(Math.abs(vectorAccelError(180, a, 65))).toBeLessThan(0.01);
    }
    expect(vectorAccelError(270, 0.1, 65)).toBeCloseTo(12.0, 1);
    for (const h of [0, 90, 180, 270]) expect(Math.abs(vectorAccelError(h, 0.1, 0))).toBeLessThan(0.01);
  });

  it('at the magnetic equator only the second-order lubber-projection term of the tilted card is left (max atan((1 − cos λ)/(2√cos λ)) = 0.14° at 0.1 g; PHYSICS check 10 correction, derived)', () => {
    // Card pitched back by λ = atan(a/g) in a horizontal field: tan ψc = tan ψm / cos λ, exactly Williams eq. 4 at μ = 0.
    const lam = Math.atan(0.1);
    let worst = 0;
    for (let h = 0; h < 360; h += 15) {
      const e = vectorAccelError(h, 0.1, 0);
      const proj = diff180(Math.atan2(Math.sin(h * DEG), Math.cos(h * DEG) * Math.cos(lam)) / DEG, h);
      expect(Math.abs(e - proj)).toBeLessThan(1e-9);
      worst = Math.max(worst, Math.abs(e));
    }
    expect(worst).toBeCloseTo((Math.atan((1 - Math.cos(lam)) / (2 * Math.sqrt(Math.cos(lam)))) / DEG), 2);
    expect(worst).toBeLessThan(0.15);
  });

  it('check 11: first-order rule −tan μ a_E/g: dip 65, a_E 0.1 g → −12.3 (exact −12.0, within 0.5)', () => {
    expect(firstOrderErrorDeg(65, 0.1 * G)).toBeCloseTo(-12.3, 1);
    expect(Math.abs(firstOrderErrorDeg(65, 0.1 * G) - vectorAccelError(90, 0.1, 65))).toBeLessThan(0.5);
  });
});
