// Divergence windows: |compass error| above a threshold for a minimum time, with hysteresis, and the main cause
// from the error split. Defaults 10°, 5 s, 2° are a team choice (common practice); not the 14 CFR 25.1327 deviation limit.
import { describe, expect, it } from 'vitest';
import { findDivergenceWindows } from '../../src/analysis/divergenceWindows.js';
import { analyseDebrief } from '../../src/analysis/analyseDebrief.js';
import { simulateFlight } from '../../src/synth/simulateFlight.js';
import { truthToFlightState } from '../../src/synth/truthToFlightState.js';
import { simulateCompass } from '../../src/compass/simulateCompass.js';
import { DEFAULT_COMPASS_PROFILE } from '../../src/compass/compassProfile.js';
import { traceFromReadings, uniformField } from './lessonFixtures.js';

const OPTS = { thresholdDeg: 10, minS: 5, hysteresisDeg: 2 };

/** A trace at 1 Hz on heading 090 whose error is e(i) and lies wholly in one split component. */
function traceWithError(err: number[], component: 'errDipTurnDeg' | 'errDipAccelDeg' | 'errLagSwirlDeg' | 'errDeviationDeg') {
  const n = err.length;
  const mag = new Float64Array(n).fill(90);
  const reading = Float64Array.from(err, (e) => 90 + e);
  return traceFromReadings(mag, reading, { [component]: Float64Array.from(err) });
}
const t = (n: number) => Float64Array.from({ length: n }, (_, i) => 1000 + i);

describe('findDivergenceWindows', () => {
  it('keeps a 15° excursion lasting 8 s, drops a 20° one lasting 3 s', () => {
    const err = Array.from({ length: 60 }, (_, i) => (i >= 10 && i <= 18 ? 15 : i >= 40 && i <= 43 ? -20 : 0));
    const w = findDivergenceWindows(t(60), new Int32Array(60), traceWithError(err, 'errDipTurnDeg'), OPTS);
    expect(w.length).toBe(1);
    expect(w[0].startT).toBe(1010);
    expect(w[0].endT).toBe(1018);
    expect(w[0].durationS).toBe(8);
    expect(w[0].peakErrorDeg).toBe(15);
  });
  it('hysteresis: a dip to 9° (above 10 − 2) does not split a window; a dip to 7° does', () => {
    const mk = (dip: number) => Array.from({ length: 40 }, (_, i) => (i >= 5 && i < 30 ? (i === 17 ? dip : 12) : 0));
    expect(findDivergenceWindows(t(40), new Int32Array(40), traceWithError(mk(9), 'errDipTurnDeg'), OPTS).length).toBe(1);
    expect(findDivergenceWindows(t(40), new Int32Array(40), traceWithError(mk(7), 'errDipTurnDeg'), OPTS).length).toBe(2);
  });
  it('the window opens only above the threshold itself (9.5° for a long time is no window)', () => {
    const err = Array.from({ length: 40 }, () => 9.5);
    expect(findDivergenceWindows(t(40), new Int32Array(40), traceWithError(err, 'errDipTurnDeg'), OPTS)).toEqual([]);
  });
  it('the peak keeps its sign', () => {
    const err = Array.from({ length: 30 }, (_, i) => (i >= 5 && i < 20 ? -11 - (i === 12 ? 5 : 0) : 0));
    const [w] = findDivergenceWindows(t(30), new Int32Array(30), traceWithError(err, 'errDipTurnDeg'), OPTS);
    expect(w.peakErrorDeg).toBe(-16);
    expect(w.peakT).toBe(1012);
  });
  const causes = [['errDipTurnDeg', 'turn'], ['errDipAccelDeg', 'speed-change'], ['errLagSwirlDeg', 'lag-swirl'], ['errDeviationDeg', 'deviation']] as const;
  for (const [component, cause] of causes) {
    it(`an error carried by ${component} is caused by '${cause}'`, () => {
      const err = Array.from({ length: 30 }, (_, i) => (i >= 5 && i < 20 ? 14 : 0));
      const [w] = findDivergenceWindows(t(30), new Int32Array(30), traceWithError(err, component), OPTS);
      expect(w.cause).toBe(cause);
    });
  }
  it('the cause is the component with the largest mean |value| (turn 8 + lag 6 → turn; turn 5 + lag 9 → lag-swirl)', () => {
    const n = 30;
    const mk = (turn: number, lag: number) => {
      const inW = (i: number) => i >= 5 && i < 20;
      const mag = new Float64Array(n).fill(0);
      const reading = Float64Array.from({ length: n }, (_, i) => (inW(i) ? turn + lag : 0));
      return traceFromReadings(mag, reading, {
        errDipTurnDeg: Float64Array.from({ length: n }, (_, i) => (inW(i) ? turn : 0)),
        errLagSwirlDeg: Float64Array.from({ length: n }, (_, i) => (inW(i) ? lag : 0)),
      });
    };
    expect(findDivergenceWindows(t(n), new Int32Array(n), mk(8, 6), OPTS)[0].cause).toBe('turn');
    const w = findDivergenceWindows(t(n), new Int32Array(n), mk(5, 9), OPTS)[0];
    expect(w.cause).toBe('lag-swirl');
    expect(w.meanAbsSplitDeg.turn).toBeCloseTo(5, 12);
    expect(w.meanAbsSplitDeg.lagSwirl).toBeCloseTo(9, 12);
  });
  it('NaN errors and a new segment close a window', () => {
    const err = Array.from({ length: 40 }, (_, i) => (i >= 5 && i < 35 ? 15 : 0));
    const tr = traceWithError(err, 'errDipTurnDeg');
    tr.errorDeg[20] = NaN;
    const seg = new Int32Array(40);
    seg.fill(1, 28);
    const w = findDivergenceWindows(t(40), seg, tr, OPTS);
    expect(w.map((x) => [x.startIndex, x.endIndex])).toEqual([[5, 19], [21, 27], [28, 34]]);
  });
});

describe('divergence windows in a simulated flight (dynamic card, dip 67)', () => {
  it('a 180° standard-rate turn through north opens windows caused by the turn, the straight legs none', () => {
    const truth = simulateFlight({
      start: { t0: 1.8e9, latDeg: 52.6, lonDeg: 0.4, altM: 600, headingDegTrue: 270, tasMs: 50 },
      sampleRateHz: 5,
      legs: [{ kind: 'straight', durationS: 30 }, { kind: 'turn', direction: 'right', byDeg: 180 }, { kind: 'straight', durationS: 40 }],
    });
    const state = truthToFlightState(truth);
    const field = uniformField(state.n, 19000, 67, 0);
    const compass = simulateCompass(state, field, DEFAULT_COMPASS_PROFILE);
    const { analysis } = analyseDebrief(state, field, compass, {});
    expect(analysis.divergences.length).toBeGreaterThan(0);
    const turn = analysis.turns[0];
    for (const d of analysis.divergences) {
      expect(d.cause).toBe('turn');
      expect(d.startT).toBeGreaterThanOrEqual(turn.startT);
      expect(d.startT).toBeLessThanOrEqual(turn.endT);
    }
  });
});
