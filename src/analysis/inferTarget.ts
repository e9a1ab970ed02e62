// A turn's target heading when there is no plan: the nearest "round" magnetic heading to the one the pilot settled on.
import { wrap180, wrap360 } from '../geo/angles.js';

/**
 * Default candidate targets [deg magnetic]: the multiples of 30° and of 45° (cardinal and intercardinal points
 * plus the 30° steps of a compass card's big marks) — the headings compass-turn exercises are usually flown to
 * (common practice). Adjacent candidates are 15° or 30° apart.
 */
export const DEFAULT_TARGET_CANDIDATES_DEG: readonly number[] = Object.freeze(
  Array.from(new Set([...Array.from({ length: 12 }, (_, k) => 30 * k), ...Array.from({ length: 8 }, (_, k) => 45 * k)])).sort((a, b) => a - b),
);

/**
 * Nearest candidate to a settled magnetic heading, with a confidence.
 * confidence = max(0, 1 − d / (g/2)), d = distance to the nearest candidate, g = the gap between the two candidates
 * either side of the heading: 1 on a candidate, 0 halfway between two. Honest limit: a roll-out more than half a
 * gap off its real target is inferred as the wrong target (with low confidence at best), so a large roll-out error
 * cannot be seen without a plan.
 * @param headingMagDeg the heading the pilot settled on [deg]; @param candidatesDeg candidate targets [deg] (≥ 1)
 * @returns { targetMagDeg [0, 360), confidence [0, 1], distanceDeg ≥ 0 } (NaN target and 0 confidence for a NaN heading).
 * @example inferTargetHeading(93) → { targetMagDeg: 90, confidence: 0.8, distanceDeg: 3 } (gap 90–120 is 30°).
 */
// Method: ours (nearest round heading; confidence from the distance, documented above).
export function inferTargetHeading(
  headingMagDeg: number,
  candidatesDeg: readonly number[] = DEFAULT_TARGET_CANDIDATES_DEG,
): { targetMagDeg: number; confidence: number; distanceDeg: number } {
  if (!Number.isFinite(headingMagDeg)) return { targetMagDeg: NaN, confidence: 0, distanceDeg: NaN };
  const h = wrap360(headingMagDeg);
  let best = NaN;
  let bestD = Infinity;
  let below = -Infinity; // largest signed offset ≤ 0 (candidate at or left of h)
  let above = Infinity; // smallest signed offset > 0
  for (const c of candidatesDeg) {
    const d = wrap180(c - h);
    if (Math.abs(d) < bestD) {
      bestD = Math.abs(d);
      best = wrap360(c);
    }
    if (d <= 0 && d > below) below = d;
    if (d > 0 && d < above) above = d;
  }
  const gap = Number.isFinite(below) && Number.isFinite(above) ? above - below : 360;
  const confidence = Math.max(0, Math.min(1, 1 - bestD / (gap / 2)));
  return { targetMagDeg: best, confidence, distanceDeg: bestD };
}
