// Timed turns: a turn flown on the clock at standard rate should change the heading by 3 °/s × time.
import { STANDARD_RATE_DPS } from '../constants.js';
import type { TimedTurnCheck } from './analysisTypes.js';

/**
 * Checks a turn flown on time. The clock runs from the start of the roll-in to the start of the roll-out; when the
 * roll-in and roll-out take the same time the heading change is then rate × time (FAA-H-8083-15B ch. 7 "Timed
 * turns": entry and recovery time need not be counted when they are alike — from memory). We measure that time
 * between the half-rate points of the roll-in and the roll-out, which equals it for equal roll-in and roll-out.
 * expected = 3 °/s (standard rate, FAA-H-8083-15B ch. 7) × durationS.
 * @param durationS measured time [s]; @param actualChangeDeg heading change flown [deg, ≥ 0];
 * @param toleranceDeg ± tolerance on the heading change [deg]; @param plannedDurationS the plan's timed_s (NaN if none)
 * @returns the check; differenceDeg = actual − expected (+ = turned faster than standard rate).
 * @example timedTurnCheck(30, 90, 10, NaN, 'near-standard-rate') → expected 90, difference 0, within tolerance.
 */
// Source: standard-rate turn 3 °/s, FAA Instrument Flying Handbook FAA-H-8083-15B ch. 7.
export function timedTurnCheck(
  durationS: number, actualChangeDeg: number, toleranceDeg: number, plannedDurationS: number, basis: 'plan' | 'near-standard-rate',
): Required<TimedTurnCheck> {
  const expectedChangeDeg = STANDARD_RATE_DPS * durationS;
  const differenceDeg = actualChangeDeg - expectedChangeDeg;
  return {
    durationS,
    expectedChangeDeg,
    actualChangeDeg,
    differenceDeg,
    withinTolerance: Math.abs(differenceDeg) <= toleranceDeg,
    plannedDurationS,
    basis,
  };
}

/** Whether a steady rate [°/s] is within ±share of standard rate (a rate-one turn). */
// Source: standard rate 3 °/s, FAA-H-8083-15B ch. 7; the share is a team choice (debriefOptions.ts).
export function isNearStandardRate(steadyRateDps: number, share: number): boolean {
  return Math.abs(steadyRateDps - STANDARD_RATE_DPS) <= share * STANDARD_RATE_DPS;
}
