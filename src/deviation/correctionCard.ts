// The compass correction card: which compass heading to steer for each wanted magnetic heading.
import { OptionError } from '../errors.js';
import { compassForMagneticDeg, type SmithCoefficients } from './smithCoefficients.js';

/** One line of a correction card [deg]: to fly magnetic fly_mag_deg, steer compass steer_compass_deg (both [0, 360)). */
export interface CardLine {
  fly_mag_deg: number;
  steer_compass_deg: number;
}

/**
 * Correction card every stepDeg of magnetic heading from 000 (default 30°, i.e. 12 lines; 14 CFR 25.1547 asks for
 * steps of not more than 45°). steer_compass_deg solves compass + δ(compass) = magnetic (compassForMagneticDeg);
 * NaN where the card has no unique inverse. Full precision: round for display only.
 * Throws OptionError unless stepDeg divides 360 into whole steps with 1 ≤ stepDeg ≤ 90.
 * Example (NGA art. 501 swing, A..E = 1, 12, 8, 5, 1.5): the line for 090 is steer ≈ 073.8.
 */
export function correctionCard(c: SmithCoefficients, stepDeg = 30): CardLine[] {
  const steps = 360 / stepDeg;
  if (!(stepDeg >= 1 && stepDeg <= 90) || !Number.isInteger(steps)) {
    throw new OptionError('stepDeg', `must divide 360° into whole steps of 1° to 90°, got ${stepDeg}`);
  }
  const card: CardLine[] = [];
  for (let k = 0; k < steps; k++) {
    const mag = k * stepDeg;
    card.push({ fly_mag_deg: mag, steer_compass_deg: compassForMagneticDeg(c, mag) });
  }
  return card;
}
