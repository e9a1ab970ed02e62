// Where to start rolling out of a compass turn: the model's cue (turning-error closed form) and the rule of thumb.
// Headings magnetic [deg]; dir +1 right / −1 left; bank a magnitude [deg]; dip down + [deg] (north magnetic hemisphere +).
import { wrap180, wrap360 } from '../geo/angles.js';
import { levelTurnReadingDeg } from '../compass/turningError.js';

const DEG = Math.PI / 180;

/**
 * Magnetic heading at which the roll-out must begin to finish on the target: target − dir × lead, where lead is
 * the heading change flown during the roll-out [deg, ≥ 0] (for a roll-out of duration T at steady rate ω with a
 * linear or raised-cosine bank ramp, lead = ω T / 2).
 */
// Geometry of the roll-out (the heading keeps changing while the wings come level).
export function cueHeadingMagDeg(targetMagDeg: number, dir: 1 | -1, rolloutLeadDeg: number): number {
  return wrap360(targetMagDeg - dir * rolloutLeadDeg);
}

/**
 * The model's roll-out cue: the reading of a card in a steady coordinated level turn at the cue heading,
 * tan ψc = (sin ψm cos φ − tan μ sin φ) / cos ψm with φ = dir × bank (Williams eq. 2, src/compass/turningError.ts).
 * This is the static card; add the dynamic card's offset (lag, swirl) and deviation separately where known.
 * @returns compass reading [0, 360) at which to begin the roll-out; NaN if an input is not finite.
 * @example NH dip 66.5, 16.9° bank, right turn onto 000 with a 3° roll-out lead → reading ≈ 324.3 (roll out 36° before the card shows N).
 */
// Source: Williams, "Compass Errors" (2001) eq. 2 via levelTurnReadingDeg; PHYSICS.md §1.2.
export function modelCueCompassDeg(targetMagDeg: number, dir: 1 | -1, bankDeg: number, dipDeg: number, rolloutLeadDeg: number): number {
  const h = cueHeadingMagDeg(targetMagDeg, dir, rolloutLeadDeg);
  return levelTurnReadingDeg(h, dir * Math.abs(bankDeg), dipDeg);
}

/**
 * The usual rule of thumb for compass turns (FAA Instrument Flying Handbook FAA-H-8083-15B ch. 7 "Compass turns"):
 * with 15–18° of bank the lead or lag is about equal to the latitude; turning to north (northern hemisphere) roll
 * out early by latitude + the normal roll-out lead ("undershoot north"); turning to south continue past south by
 * latitude − normal lead ("overshoot south"); on east and west only the normal lead; southern hemisphere reversed.
 * Between the cardinal points the handbook gives no figure; we scale the latitude term by cos(target) (common
 * practice: the turning error goes as cos ψm, PHYSICS.md §1.2 small-angle form). The hemisphere is that of the
 * dip (magnetic), which is what the rule is about.
 *   cue = target − dir × (normalLead + sgn(dip) × |lat| × cos(target))
 * @param latDeg latitude [deg] (only |lat| is used); @param dipDeg sign picks the hemisphere (0: no turning-error term)
 * @param normalLeadDeg the normal roll-out lead [deg, ≥ 0] (the same one the pilot uses on a heading indicator)
 * @returns compass reading [0, 360) at which the rule says to begin the roll-out.
 */
// Source: FAA-H-8083-15B ch. 7 "Compass turns" (lead/lag ≈ latitude at 15–18° bank; UNOS); cos interpolation: common practice.
export function ruleOfThumbCueDeg(targetMagDeg: number, dir: 1 | -1, latDeg: number, dipDeg: number, normalLeadDeg: number): number {
  const hemi = dipDeg > 0 ? 1 : dipDeg < 0 ? -1 : 0;
  const lat = Math.abs(latDeg) * hemi * Math.cos(targetMagDeg * DEG);
  return wrap360(targetMagDeg - dir * (normalLeadDeg + lat));
}

/**
 * How a cue relates to the target in the turn's direction: dir × (target − cue) wrapped [deg].
 * > 0: roll out before the compass shows the target (undershoot); < 0: let it run past the target (overshoot).
 */
// Convention: UNOS wording of FAA-H-8083-15B ch. 7 (undershoot = roll out before the card shows the target).
export function cueLeadDeg(targetMagDeg: number, cueDeg: number, dir: 1 | -1): number {
  return dir * wrap180(targetMagDeg - cueDeg);
}
