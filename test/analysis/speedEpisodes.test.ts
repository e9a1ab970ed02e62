// Speed-change episodes: the apparent swing of the compass on straight legs, against ANDS (IFH ch. 7), its
// hemisphere reversal, and the closed form of the acceleration error (Williams eq. 3–4; PHYSICS check 9).
import { describe, expect, it } from 'vitest';
import { detectSpeedEpisodes } from '../../src/analysis/speedEpisodes.js';
import { detectTurns } from '../../src/analysis/detectTurns.js';
import { analyseDebrief } from '../../src/analysis/analyseDebrief.js';
import { simulateFlight } from '../../src/synth/simulateFlight.js';
import { truthToFlightState } from '../../src/synth/truthToFlightState.js';
import { simulateCompass } from '../../src/compass/simulateCompass.js';
import { DEFAULT_COMPASS_PROFILE } from '../../src/compass/compassProfile.js';
import { accelerationReadingDeg } from '../../src/compass/turningError.js';
import { G, stateFromColumns, traceFromReadings, uniformField, wrap360 } from './lessonFixtures.js';

/** Straight flight on a true heading with a speed-up and a slow-down (0.6 m/s², 50 ↔ 60 m/s), dynamic card. */
function speedLesson(headingDegTrue: number, dipDeg: number) {
  const truth = simulateFlight({
    start: { t0: 1.8e9, latDeg: dipDeg > 0 ? 52.6 : -43.7, lonDeg: 0.4, altM: 600, headingDegTrue, tasMs: 50 },
    sampleRateHz: 5,
    legs: [
      { kind: 'straight', durationS: 30 },
      { kind: 'speed', toTasMs: 60, accelMs2: 0.6 },
      { kind: 'straight', durationS: 30 },
      { kind: 'speed', toTasMs: 50, accelMs2: 0.6 },
      { kind: 'straight', durationS: 30 },
    ],
  });
  const state = truthToFlightState(truth);
  const field = uniformField(state.n, 19000, dipDeg, 0);
  const compass = simulateCompass(state, field, DEFAULT_COMPASS_PROFILE);
  return detectSpeedEpisodes(state, field, compass, detectTurns(state));
}

describe('apparent swing on speed changes (ANDS: accelerate north, decelerate south; FAA-H-8083-15B ch. 7)', () => {
  it('northern hemisphere, heading west: accelerating shows a turn to the right (toward north), decelerating to the left (common practice)', () => {
    const [acc, dec] = speedLesson(270, 67);
    expect(acc.kind).toBe('accelerating');
    expect(acc.swingDirection).toBe('right');
    expect(dec.kind).toBe('decelerating');
    expect(dec.swingDirection).toBe('left');
  });
  it('northern hemisphere, heading east: accelerating shows a turn to the left (toward north), decelerating to the right', () => {
    const [acc, dec] = speedLesson(90, 67);
    expect(acc.swingDirection).toBe('left');
    expect(dec.swingDirection).toBe('right');
  });
  it('no apparent turn on north or south headings (IFH ch. 7; PHYSICS check 10)', () => {
    for (const h of [0, 180]) {
      const eps = speedLesson(h, 67);
      expect(eps.length).toBe(2);
      for (const e of eps) {
        expect(e.swingDirection).toBe('none');
        expect(Math.abs(e.expectedSwingDeg)).toBeLessThan(0.01);
      }
    }
  });
  it('southern hemisphere reversed: heading west, accelerating shows a turn to the left (toward south)', () => {
    const [acc, dec] = speedLesson(270, -65);
    expect(acc.swingDirection).toBe('left');
    expect(dec.swingDirection).toBe('right');
  });
  it('peak acceleration and heading are measured, and the dynamic card swings most of the static expectation', () => {
    const [acc] = speedLesson(270, 67);
    expect(acc.peakAccelMs2).toBeCloseTo(0.6, 2);
    expect(acc.headingMagDeg).toBeCloseTo(270, 3);
    // Williams eq. 4 at 0.6 m/s², dip 67, 270: the expectation, and the simulated card reaches most of it.
    expect(acc.expectedSwingDeg).toBeCloseTo(accelerationReadingDeg(270, 0.6, 67) - 270, 6);
    expect(acc.swingRatio).toBeGreaterThan(0.5);
    expect(acc.swingRatio).toBeLessThan(1.1);
  });
});

describe('expected swing from the closed form (PHYSICS check 9: dip 65, 090, +0.1 g → −12.0; −0.1 g → +12.0)', () => {
  function constantAccel(headingDeg: number, accG: number) {
    const n = 40;
    const state = stateFromColumns(n, (i) => ({
      t: i, tasMs: 50, gsMs: 50, headingDegTrue: headingDeg, accelLongMs2: i >= 10 && i < 30 ? accG * G : 0,
    }));
    const field = uniformField(n, 20000, 65, 0);
    const mag = new Float64Array(n).fill(headingDeg);
    const reading = Float64Array.from(state.accelLongMs2, (a) => accelerationReadingDeg(headingDeg, a, 65));
    return detectSpeedEpisodes(state, field, traceFromReadings(mag, reading, { errDipAccelDeg: Float64Array.from(reading, (r) => ((r - headingDeg + 540) % 360) - 180) }), []);
  }
  it('+0.1 g on 090 → expected −12.0°, and a card that shows it gives a swing of −12.0° to the left', () => {
    const [e] = constantAccel(90, 0.1);
    expect(e.expectedSwingDeg).toBeCloseTo(-12.0, 1);
    expect(e.peakSwingDeg).toBeCloseTo(-12.0, 1);
    expect(e.swingDirection).toBe('left');
    expect(e.swingRatio).toBeCloseTo(1, 6);
  });
  it('−0.1 g on 090 → +12.0°, to the right', () => {
    const [e] = constantAccel(90, -0.1);
    expect(e.kind).toBe('decelerating');
    expect(e.expectedSwingDeg).toBeCloseTo(12.0, 1);
    expect(e.swingDirection).toBe('right');
  });
});

describe('what is not a speed episode', () => {
  it('accelerations inside a turn, or shorter than the minimum time (3 s), are not episodes', () => {
    const n = 120;
    let h = 0;
    const state = stateFromColumns(n, (i) => {
      const rate = i >= 20 && i < 60 ? 3 : 0;
      const out = { t: i, tasMs: 50, gsMs: 50, headingDegTrue: wrap360(h), turnRateDps: rate, accelLongMs2: (i >= 30 && i < 50) || (i >= 80 && i < 82) ? 0.8 : 0 };
      h += rate;
      return out;
    });
    const field = uniformField(n, 19000, 67);
    const mag = Float64Array.from(state.headingDegTrue);
    const { analysis } = analyseDebrief(state, field, traceFromReadings(mag, Float64Array.from(mag)), {});
    expect(analysis.turns.length).toBe(1);
    expect(analysis.episodes).toEqual([]);
  });
});
