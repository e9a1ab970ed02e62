// Turn detection: every turn of a scripted lesson is found (exact and from a noisy log), phases measured against an
// analytic rate profile, ground/taxi ignored, reversals split.
import { describe, expect, it } from 'vitest';
import { detectTurns } from '../../src/analysis/detectTurns.js';
import { DEFAULT_TURN_DETECTION, resolveDebriefOptions } from '../../src/analysis/debriefOptions.js';
import { OptionError } from '../../src/errors.js';
import { circuitPracticeScript } from '../../src/synth/scenarios.js';
import { simulateFlight } from '../../src/synth/simulateFlight.js';
import { truthToFlightState } from '../../src/synth/truthToFlightState.js';
import { toFlightLog } from '../../src/synth/gpsNoise.js';
import { reconstructState } from '../../src/state/reconstructState.js';
import { KT_MS } from '../../src/constants.js';
import { gaussianSource } from '../state/syntheticTurns.js';
import { stateFromColumns } from './lessonFixtures.js';

const truth = simulateFlight(circuitPracticeScript());
const scripted = truth.legs.filter((l) => l.kind === 'turn' || l.kind === 'orbit');

describe('every turn of a scripted lesson is found (oracle: the simulator\'s leg records)', () => {
  it('the circuit lesson has 13 turns and orbits to find', () => {
    expect(scripted.length).toBe(13);
  });

  it('exact flight: same count, direction, heading change within 0.5°, start/end within 1 s of the leg', () => {
    const turns = detectTurns(truthToFlightState(truth));
    expect(turns.length).toBe(scripted.length);
    turns.forEach((t, k) => {
      const leg = scripted[k];
      expect(t.direction).toBe(leg.direction);
      expect(Math.abs(t.headingChangeDeg - (leg.headingChangeDeg as number))).toBeLessThan(0.5);
      expect(Math.abs(t.startT - leg.startT)).toBeLessThanOrEqual(1);
      expect(Math.abs(t.endT - leg.endT)).toBeLessThanOrEqual(1);
      expect(t.complete).toBe(true);
      // Steady rate of the script: standard rate, 3 °/s (FAA-H-8083-15B ch. 7).
      expect(t.steadyRateDps).toBeCloseTo(3, 2);
    });
  });

  it('noisy log (GPS σ 2 m, Gauss–Markov + white) through the state stage: same turns, change within 3°, ends within 5 s', () => {
    const log = toFlightLog(truth, { posSigmaM: 2, altSigmaM: 3, seed: 11, file: 'lesson.gpx', format: 'gpx' });
    const state = reconstructState(log, { wind: { kind: 'given', fromDegTrue: 250, speedMs: 15 * KT_MS } });
    const turns = detectTurns(state);
    expect(turns.length).toBe(scripted.length);
    turns.forEach((t, k) => {
      const leg = scripted[k];
      expect(t.direction).toBe(leg.direction);
      expect(Math.abs(t.headingChangeDeg - (leg.headingChangeDeg as number))).toBeLessThan(3);
      expect(Math.abs(t.startT - leg.startT)).toBeLessThan(5);
      expect(Math.abs(t.endT - leg.endT)).toBeLessThan(5);
    });
  });
});

describe('phases against an analytic trapezoidal rate profile (10 Hz, 2 s linear ramps to 3 °/s, 20 s hold)', () => {
  // Rate r(τ) for τ = t − 10: ramp 0→3 over [0, 2], hold to 22, ramp 3→0 over [22, 24]. Heading = ∫ r.
  const hz = 10;
  const n = 40 * hz + 1;
  const rate = (tau: number): number => (tau <= 0 ? 0 : tau < 2 ? 1.5 * tau : tau <= 22 ? 3 : tau < 24 ? 3 - 1.5 * (tau - 22) : 0);
  const heading = (tau: number): number => {
    if (tau <= 0) return 0;
    if (tau < 2) return 0.75 * tau * tau;
    if (tau <= 22) return 3 + 3 * (tau - 2);
    if (tau < 24) return 63 + 3 * (tau - 22) - 0.75 * (tau - 22) ** 2;
    return 66;
  };
  const state = stateFromColumns(n, (i) => {
    const tau = i / hz - 10;
    return { t: 1e9 + i / hz, tasMs: 50, gsMs: 50, headingDegTrue: (40 + heading(tau)) % 360, turnRateDps: rate(tau), bankDeg: 17 * (rate(tau) / 3) };
  });
  const [t] = detectTurns(state);

  it('one right turn of 66° = 3 °/s × (20 s hold + 2 s ramp) (area of the trapezoid)', () => {
    expect(detectTurns(state).length).toBe(1);
    expect(t.direction).toBe('right');
    expect(t.headingChangeDeg).toBeCloseTo(66, 6);
  });
  it('roll-in ends at 90 % of the steady rate (1.8 s into the ramp), roll-out starts at 90 % (0.2 s into it)', () => {
    expect(t.steadyRateDps).toBeCloseTo(3, 9);
    expect(t.rollInEndT - 1e9).toBeCloseTo(10 + 1.8, 6);
    expect(t.rolloutStartT - 1e9).toBeCloseTo(10 + 22.2, 6);
  });
  it('roll-out lead = heading change after the 90 % point = ½ · 2.7 °/s · 1.8 s = 2.43°', () => {
    expect(t.rolloutLeadDeg).toBeCloseTo(2.43, 6);
  });
  it('half-rate points are 22 s apart (roll-in start to roll-out start for equal ramps)', () => {
    expect(t.halfOutT - t.halfInT).toBeCloseTo(22, 6);
  });
  it('mean rate and bank over the steady phase; peak bank', () => {
    expect(t.meanRateDps).toBeCloseTo(3, 1);
    expect(t.meanBankDeg).toBeCloseTo(17, 1);
    expect(t.peakBankDeg).toBeCloseTo(17, 9);
  });
});

describe('what is not a turn', () => {
  it('taxiing (TAS 5 m/s, heading NaN or turning at 10 °/s) gives no turn', () => {
    const state = stateFromColumns(600, (i) => ({
      t: i, tasMs: 5, gsMs: 5, headingDegTrue: i % 2 ? NaN : (i * 10) % 360, turnRateDps: i < 300 ? 10 : -10,
    }));
    expect(detectTurns(state)).toEqual([]);
  });
  it('rate noise σ 0.3 °/s on a straight leg gives no turn (seeded normal noise)', () => {
    const g = gaussianSource(3);
    const state = stateFromColumns(3600, (i) => ({ t: i, tasMs: 50, gsMs: 50, headingDegTrue: 90, turnRateDps: 0.3 * g() }));
    expect(detectTurns(state)).toEqual([]);
  });
  it('a burst above the entry rate shorter than the hold (2 s at 2 °/s) is not a turn', () => {
    const state = stateFromColumns(100, (i) => ({ t: i, tasMs: 50, gsMs: 50, headingDegTrue: 90, turnRateDps: i >= 50 && i < 52 ? 2 : 0 }));
    expect(detectTurns(state)).toEqual([]);
  });
  it('a turn of less than minHeadingChangeDeg (default 10°) is dropped', () => {
    const rate = (i: number): number => (i >= 50 && i < 56 ? 1.5 : 0);
    let h = 90;
    const state = stateFromColumns(100, (i) => {
      const out = { t: i, tasMs: 50, gsMs: 50, headingDegTrue: h, turnRateDps: rate(i) };
      h += rate(i);
      return out;
    });
    expect(detectTurns(state)).toEqual([]);
    expect(detectTurns(state, { ...DEFAULT_TURN_DETECTION, minHeadingChangeDeg: 5 }).length).toBe(1);
  });
});

describe('reversals and gaps', () => {
  it('an S-turn (right 3 °/s for 30 s, reversal through zero in 1 s, left 30 s) is two turns', () => {
    let h = 0;
    const state = stateFromColumns(100, (i) => {
      const r = i < 10 ? 0 : i < 40 ? 3 : i < 70 ? -3 : 0;
      const out = { t: i, tasMs: 50, gsMs: 50, headingDegTrue: ((h % 360) + 360) % 360, turnRateDps: r };
      h += r;
      return out;
    });
    const turns = detectTurns(state);
    expect(turns.map((t) => t.direction)).toEqual(['right', 'left']);
    expect(turns[0].endIndex).toBeLessThanOrEqual(turns[1].startIndex);
    expect(turns[0].headingChangeDeg).toBeCloseTo(90, 0);
    expect(turns[1].headingChangeDeg).toBeCloseTo(90, 0);
  });
  it('a gap (new segment) ends a turn, which is then marked incomplete', () => {
    const state = stateFromColumns(100, (i) => ({ t: i, tasMs: 50, gsMs: 50, headingDegTrue: (3 * i) % 360, turnRateDps: i >= 10 ? 3 : 0 }));
    for (let i = 50; i < 100; i++) state.segment[i] = 1;
    const turns = detectTurns(state);
    expect(turns.length).toBe(2);
    expect(turns[0].endIndex).toBe(49);
    expect(turns[0].complete).toBe(false);
    expect(turns[1].complete).toBe(false); // runs into the end of the log
  });
});

describe('options', () => {
  it('are checked with an OptionError naming the option and its range', () => {
    expect(() => resolveDebriefOptions({ turns: { enterRateDps: 0 } })).toThrow(OptionError);
    expect(() => resolveDebriefOptions({ turns: { exitRateDps: 2 } })).toThrow(/exitRateDps/);
    expect(() => resolveDebriefOptions({ toleranceDeg: -1 })).toThrow(/toleranceDeg/);
    expect(() => resolveDebriefOptions({ divergenceHysteresisDeg: 12 })).toThrow(/divergenceHysteresisDeg/);
    expect(() => resolveDebriefOptions({ excursion: { startT: 10, endT: 5 } })).toThrow(/excursion/);
  });
});
