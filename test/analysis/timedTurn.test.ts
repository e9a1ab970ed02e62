// Timed turns: flown on the clock at standard rate, the heading change is 3 °/s × time (FAA-H-8083-15B ch. 7).
import { describe, expect, it } from 'vitest';
import { analyseDebrief } from '../../src/analysis/analyseDebrief.js';
import { isNearStandardRate, timedTurnCheck } from '../../src/analysis/timedTurn.js';
import { simulateFlight } from '../../src/synth/simulateFlight.js';
import { truthToFlightState } from '../../src/synth/truthToFlightState.js';
import { circuitPracticeScript } from '../../src/synth/scenarios.js';
import { computeFieldAlongPath } from '../../src/magnetic/fieldAlongPath.js';
import { staticTurnTrace, uniformField } from './lessonFixtures.js';

describe('timedTurnCheck (standard rate 3 °/s, FAA-H-8083-15B ch. 7)', () => {
  it('expects 3 °/s × the time: 30 s → 90°, 60 s → 180°, 120 s → a full circle', () => {
    expect(timedTurnCheck(30, 90, 10, NaN, 'near-standard-rate').expectedChangeDeg).toBe(90);
    expect(timedTurnCheck(60, 180, 10, NaN, 'near-standard-rate').expectedChangeDeg).toBe(180);
    expect(timedTurnCheck(120, 360, 10, NaN, 'plan').expectedChangeDeg).toBe(360);
  });
  it('flags a turn that turned further or less than the clock promised beyond the tolerance', () => {
    const over = timedTurnCheck(30, 105, 10, 30, 'plan');
    expect(over.differenceDeg).toBe(15);
    expect(over.withinTolerance).toBe(false);
    expect(timedTurnCheck(30, 82, 10, 30, 'plan').withinTolerance).toBe(true);
  });
  it('a rate-one turn is within ±15 % of 3 °/s by default (team choice)', () => {
    expect(isNearStandardRate(2.6, 0.15)).toBe(true);
    expect(isNearStandardRate(2.5, 0.15)).toBe(false);
    expect(isNearStandardRate(3.44, 0.15)).toBe(true);
  });
});

describe('timed turns in a flight', () => {
  it('the circuit lesson\'s timed turns (30 s right, 60 s left at standard rate) time as 30 s and 60 s and turn 90° and 180°', () => {
    const truth = simulateFlight(circuitPracticeScript());
    const state = truthToFlightState(truth);
    const { field } = computeFieldAlongPath(state.t, state.lat, state.lon, state.altM);
    const { analysis } = analyseDebrief(state, field, staticTurnTrace(state, field), {});
    const timedLegs = truth.legs.filter((l) => l.label?.startsWith('timed turn'));
    expect(timedLegs.length).toBe(2);
    for (const [leg, want] of [[timedLegs[0], 30], [timedLegs[1], 60]] as const) {
      const turn = analysis.turns.find((t) => Math.abs(t.startT - leg.startT) < 2);
      expect(turn?.timed).toBeDefined();
      expect(turn!.timed!.durationS).toBeCloseTo(want, 1);
      expect(turn!.timed!.expectedChangeDeg).toBeCloseTo(3 * want, 0);
      expect(Math.abs(turn!.timed!.differenceDeg!)).toBeLessThan(0.5);
      expect(turn!.timed!.withinTolerance).toBe(true);
    }
  });

  // Rate 2.6 °/s for 40 s (a pilot whose turn needle sat short of the rate-one mark): 104°, not 120°.
  const truth = simulateFlight({
    start: { t0: 1.8e9, latDeg: 52.6, lonDeg: 0.4, altM: 600, headingDegTrue: 0, tasMs: 50 },
    sampleRateHz: 10,
    legs: [
      { kind: 'straight', durationS: 20 },
      { kind: 'turn', direction: 'right', durationS: 30 },
      { kind: 'straight', durationS: 20 },
      { kind: 'turn', direction: 'left', durationS: 40, rateDps: 2.6 },
      { kind: 'straight', durationS: 20 },
      { kind: 'turn', direction: 'right', byDeg: 90, rateDps: 2 },
      { kind: 'straight', durationS: 20 },
    ],
  });
  const state = truthToFlightState(truth);
  const field = uniformField(state.n, 19000, 67, 0);
  const compass = staticTurnTrace(state, field);
  const plan = 'target_mag_deg,timed_s\n090,30\n346,40\n076,\n';

  it('planned timed turns are checked against the plan\'s time; a slow rate shows as a heading change short of 3 °/s × time', () => {
    const { analysis } = analyseDebrief(state, field, compass, { planCsvText: plan });
    const [a, b, c] = analysis.turns;
    expect(a.timed?.basis).toBe('plan');
    expect(a.timed?.plannedDurationS).toBe(30);
    expect(a.timed?.withinTolerance).toBe(true);
    expect(b.timed?.basis).toBe('plan');
    expect(b.timed!.durationS).toBeCloseTo(40, 1);
    expect(b.timed!.expectedChangeDeg).toBeCloseTo(120, 0);
    expect(b.timed!.actualChangeDeg).toBeCloseTo(104, 0); // 2.6 °/s × 40 s
    expect(b.timed!.differenceDeg!).toBeCloseTo(-16, 0);
    expect(b.timed!.withinTolerance).toBe(false);
    // 2 °/s is not a rate-one turn and the plan does not time it: no check.
    expect(c.timed).toBeUndefined();
  });
  it('timedTurns "none" checks nothing; "plan" only the planned ones', () => {
    expect(analyseDebrief(state, field, compass, { timedTurns: 'none', planCsvText: '#\ntarget_mag_deg\n090\n346\n076\n' }).analysis.turns.every((t) => t.timed === undefined)).toBe(true);
    const onlyPlan = analyseDebrief(state, field, compass, { timedTurns: 'plan', planCsvText: 'target_mag_deg,timed_s\n090,\n346,40\n076,\n' }).analysis.turns;
    expect(onlyPlan.map((t) => t.timed?.basis)).toEqual([undefined, 'plan', undefined]);
  });
});
