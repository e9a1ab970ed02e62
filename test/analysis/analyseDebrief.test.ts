// analyseDebrief as a whole: pure, checks its inputs, passes plan errors with their line, warns about what it could
// not match, infers the targets of an unplanned lesson, and settles the compass reading after each roll-out.
import { describe, expect, it } from 'vitest';
import { analyseDebrief } from '../../src/analysis/analyseDebrief.js';
import { settledReading } from '../../src/analysis/compassSettling.js';
import { OptionError, ParseError } from '../../src/errors.js';
import { computeFieldAlongPath } from '../../src/magnetic/fieldAlongPath.js';
import { simulateCompass } from '../../src/compass/simulateCompass.js';
import { DEFAULT_COMPASS_PROFILE } from '../../src/compass/compassProfile.js';
import { SCENARIO_VARIATION_DEG, circuitPracticeScript } from '../../src/synth/scenarios.js';
import { simulateFlight } from '../../src/synth/simulateFlight.js';
import { truthToFlightState } from '../../src/synth/truthToFlightState.js';
import { wrap180, wrap360 } from './lessonFixtures.js';

const truth = simulateFlight(circuitPracticeScript());
const state = truthToFlightState(truth);
const { field } = computeFieldAlongPath(state.t, state.lat, state.lon, state.altM);
const compass = simulateCompass(state, field, DEFAULT_COMPASS_PROFILE);
const scripted = truth.legs.filter((l) => l.kind === 'turn' || l.kind === 'orbit');

describe('analyseDebrief on the circuit lesson (dynamic card, WMM2025 field)', () => {
  const { analysis, warnings } = analyseDebrief(state, field, compass, {});

  it('without a plan, each target is inferred as the magnetic heading the script turned to (oracle: the script)', () => {
    expect(analysis.turns.length).toBe(scripted.length);
    analysis.turns.forEach((t, k) => {
      const scriptedMag = wrap360(scripted[k].headingEndDegTrue - SCENARIO_VARIATION_DEG.circuit);
      expect(t.targetSource).toBe('inferred');
      expect(Math.abs(wrap180(t.rolloutMagDeg - scriptedMag))).toBeLessThan(0.2); // variation from WMM vs the chart's 0.1° rounding
      if (Math.abs(wrap180(scriptedMag - Math.round(scriptedMag / 90) * 90)) < 0.5) {
        expect(t.targetMagDeg).toBe(wrap360(Math.round(scriptedMag / 90) * 90));
        expect(t.targetConfidence).toBeGreaterThan(0.95);
        expect(t.withinTolerance).toBe(true);
      }
    });
    // The turn for home ends on 095 (not a round heading): inferred as 090 with confidence 1 − 5/15.
    const home = analysis.turns[analysis.turns.length - 1];
    expect(home.targetMagDeg).toBe(90);
    expect(home.targetConfidence).toBeCloseTo(1 - 5 / 15, 1);
  });
  it('every turn carries the contract fields (DESIGN.md "Turns in the summary JSON") as finite numbers', () => {
    for (const t of analysis.turns) {
      for (const v of [t.startT, t.endT, t.headingChangeDeg, t.entryMagDeg, t.rolloutMagDeg, t.compassAtRolloutDeg, t.targetMagDeg, t.rolloutErrorDeg, t.cueCompassDeg, t.ruleOfThumbCueDeg, t.compassSettledDeg]) {
        expect(Number.isFinite(v)).toBe(true);
      }
      expect(['left', 'right']).toContain(t.direction);
      expect(typeof t.withinTolerance).toBe('boolean');
    }
  });
  it('the compass settles after roll-out near the magnetic heading (within 3°, the card lags and swirls)', () => {
    for (const t of analysis.turns) {
      expect(t.compassSettledT! - t.endT).toBeLessThanOrEqual(10 + 1e-9);
      expect(Math.abs(wrap180(t.compassSettledDeg - t.rolloutMagDeg))).toBeLessThan(3);
    }
  });
  it('speed changes on east and west and the turns\' divergences are all found; no warnings', () => {
    expect(analysis.episodes.filter((e) => Math.abs(wrap180(e.headingMagDeg - 90)) < 2).length).toBe(3);
    expect(analysis.episodes.filter((e) => Math.abs(wrap180(e.headingMagDeg - 270)) < 2).length).toBe(3);
    expect(analysis.divergences.every((d) => d.cause === 'turn')).toBe(true);
    expect(warnings).toEqual([]);
  });
  it('is pure: the input columns are unchanged', () => {
    const before = [state.headingDegTrue, state.turnRateDps, compass.readingDeg, field.variationDeg].map((c) => Float64Array.from(c));
    analyseDebrief(state, field, compass, { planCsvText: 'target_mag_deg\n000\n' });
    [state.headingDegTrue, state.turnRateDps, compass.readingDeg, field.variationDeg].forEach((c, k) => expect(c).toEqual(before[k]));
  });
});

describe('inputs and warnings', () => {
  it('columns of different lengths throw an OptionError', () => {
    const short = { ...compass, n: compass.n - 1 };
    expect(() => analyseDebrief(state, field, short, {})).toThrow(OptionError);
    expect(() => analyseDebrief(state, { ...field, n: 3 }, compass, {})).toThrow(/field/);
  });
  it('a bad plan row throws a ParseError carrying its line', () => {
    let err: unknown;
    try {
      analyseDebrief(state, field, compass, { planCsvText: 'target_mag_deg\n090\nnorth\n' });
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(ParseError);
    expect((err as ParseError).line).toBe(3);
  });
  it('more plan rows than turns: plan-rows-unmatched with their lines; fewer: turns-not-in-plan', () => {
    const rows = Array.from({ length: scripted.length + 2 }, () => '090').join('\n');
    const many = analyseDebrief(state, field, compass, { planCsvText: `target_mag_deg\n${rows}\n` }).warnings;
    expect(many.find((w) => w.code === 'plan-rows-unmatched')?.lines).toEqual([scripted.length + 2, scripted.length + 3]);
    const few = analyseDebrief(state, field, compass, { planCsvText: 'target_mag_deg\n000\n090\n' });
    expect(few.warnings.find((w) => w.code === 'turns-not-in-plan')?.count).toBe(scripted.length - 2);
    expect(few.analysis.turns.map((t) => t.targetSource).slice(0, 3)).toEqual(['plan', 'plan', 'inferred']);
    expect(few.analysis.turns[0].planLine).toBe(2);
  });
  it('a turn cut off by the end of the log is graded with the default roll-out and warned about', () => {
    const cut = state.t.findIndex((t) => t > scripted[0].startT + 20);
    const s2 = truthToFlightState(truth, 0, cut);
    const f2 = { ...field, n: cut, ...Object.fromEntries((['xNt', 'yNt', 'zNt', 'hNt', 'variationDeg', 'dipDeg'] as const).map((k) => [k, field[k].subarray(0, cut)])), zone: field.zone.subarray(0, cut) };
    const c2 = simulateCompass(s2, f2, DEFAULT_COMPASS_PROFILE);
    const r = analyseDebrief(s2, f2, c2, {});
    expect(r.analysis.turns.length).toBe(1);
    expect(r.analysis.turns[0].rolloutDurationSource).toBe('default');
    // bank / 10 °/s of roll (the default roll rate, from memory)
    expect(r.analysis.turns[0].rolloutDurationS).toBeCloseTo(r.analysis.turns[0].meanBankDeg / 10, 9);
    expect(r.warnings.map((w) => w.code)).toContain('turns-cut-short');
  });
});

describe('degenerate flights', () => {
  it('an empty flight and a one-sample flight give empty results, no throw', () => {
    for (const n of [0, 1]) {
      const s = truthToFlightState(truth, 0, n);
      const f = { ...field, n, ...Object.fromEntries((['xNt', 'yNt', 'zNt', 'hNt', 'variationDeg', 'dipDeg'] as const).map((k) => [k, field[k].subarray(0, n)])), zone: field.zone.subarray(0, n) };
      const r = analyseDebrief(s, f, simulateCompass(s, f, DEFAULT_COMPASS_PROFILE), {});
      expect(r.analysis).toEqual({ turns: [], episodes: [], divergences: [], excursions: [] });
    }
  });
});

describe('settledReading', () => {
  it('finds the first quiet 2 s of a damped card swing (oracle: the formula sampled at 1 kHz)', () => {
    // reading = 90 + 10 e^(−t/2) cos(2π t / 4), sampled at 10 Hz.
    const f = (t: number) => 90 + 10 * Math.exp(-t / 2) * Math.cos((Math.PI * t) / 2);
    const n = 200;
    const t = Float64Array.from({ length: n }, (_, i) => i / 10);
    const r = Float64Array.from(t, f);
    const s = settledReading(t, r, 0, 20, 0.5, 2);
    // Brute force: the first t0 on the 10 Hz grid from which every 10 Hz step rate stays ≤ 0.5 °/s for 2 s.
    let want = NaN;
    for (let i = 0; i < n && Number.isNaN(want); i++) {
      let ok = true;
      for (let k = i + 1; k < n && t[k] - t[i] < 2 + 1e-9; k++) if (Math.abs(f(t[k]) - f(t[k - 1])) / 0.1 > 0.5) ok = false;
      if (ok && i + 20 < n) want = t[i + 20];
    }
    expect(s.how).toBe('quiet');
    expect(s.t).toBeCloseTo(want, 9);
    expect(s.deg).toBeCloseTo(f(want), 9);
  });
  it('times out at untilT when the card never quiets, reading the last row before it', () => {
    const t = Float64Array.from({ length: 100 }, (_, i) => i);
    const r = Float64Array.from(t, (x) => (x * 3) % 360);
    const s = settledReading(t, r, 10, 20, 0.5, 2);
    expect(s).toEqual({ index: 20, t: 20, deg: 60, how: 'timeout' });
  });
});
