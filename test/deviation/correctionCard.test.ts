import { describe, expect, it } from 'vitest';
import { OptionError } from '../../src/errors.js';
import { correctionCard } from '../../src/deviation/correctionCard.js';

const D2R = Math.PI / 180;
/** NGA Handbook art. 501 closed-form coefficients (PHYSICS.md check 20). */
const NGA = { aDeg: 1, bDeg: 12, cDeg: 8, dDeg: 5, eDeg: 1.5 };
const smith = (h: number) =>
  NGA.aDeg + NGA.bDeg * Math.sin(h * D2R) + NGA.cDeg * Math.cos(h * D2R) + NGA.dDeg * Math.sin(2 * h * D2R) + NGA.eDeg * Math.cos(2 * h * D2R);

describe('correctionCard', () => {
  it('has 12 lines, 000 to 330 magnetic, each steering the compass heading that makes good that magnetic heading', () => {
    const card = correctionCard(NGA);
    expect(card.map((l) => l.fly_mag_deg)).toEqual([0, 30, 60, 90, 120, 150, 180, 210, 240, 270, 300, 330]);
    for (const l of card) {
      // Definition (NGA Handbook ch. V sign convention): compass + deviation(compass) = magnetic.
      const made = (l.steer_compass_deg + smith(l.steer_compass_deg) + 360) % 360;
      expect(Math.abs(((made - l.fly_mag_deg + 540) % 360) - 180)).toBeLessThan(1e-8);
      expect(l.steer_compass_deg).toBeGreaterThanOrEqual(0);
      expect(l.steer_compass_deg).toBeLessThan(360);
    }
  });

  it('steers 352.5 for north where the deviation there is about 7.5° east', () => {
    // Oracle: solve h + δ(h) = 360 near h = 352.5 by hand: δ(352.5) ≈ 7.5.
    const north = correctionCard(NGA)[0].steer_compass_deg;
    expect(north).toBeCloseTo(352.49, 1);
    expect(north + smith(north)).toBeCloseTo(360, 8);
  });

  it('takes 45° steps (the 14 CFR 25.1547 maximum) and rejects steps that do not divide the circle', () => {
    expect(correctionCard(NGA, 45)).toHaveLength(8);
    expect(() => correctionCard(NGA, 7)).toThrow(OptionError);
    expect(() => correctionCard(NGA, 0)).toThrow(OptionError);
    expect(() => correctionCard(NGA, 120)).toThrow(OptionError);
  });
});
