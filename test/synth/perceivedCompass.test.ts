// The compass a scripted pilot reads, and the helpers that hand simulated truth to other stages.
import { describe, expect, it } from 'vitest';
import geomagnetism from 'geomagnetism';
import { modelCompassReading, staticTurnCompassReading } from '../../src/synth/perceivedCompass.js';
import { simulateFlight } from '../../src/synth/simulateFlight.js';
import { truthToFlightState } from '../../src/synth/truthToFlightState.js';
import { decimateTruth } from '../../src/synth/decimateTruth.js';
import { flyScriptedPilot } from '../../src/synth/scriptedPilot.js';
import { compassTurnLessonScript } from '../../src/synth/scenarios.js';
import type { SynthTruth } from '../../src/synth/synthTruth.js';

const T0 = Date.UTC(2026, 4, 4, 10) / 1000;
const w180 = (d: number): number => ((((d + 180) % 360) + 360) % 360) - 180;

describe('perceived compass', () => {
  it('reads true heading − WMM2025 variation in straight level flight (geomagnetism package, NOAA coefficients)', () => {
    const tr = simulateFlight({
      start: { t0: T0, latDeg: 52.612, lonDeg: 0.387, altM: 600, headingDegTrue: 45, tasMs: 50 },
      legs: [{ kind: 'straight', durationS: 30 }],
    });
    const decl = geomagnetism.model(new Date(T0 * 1000)).point([52.612, 0.387, 0.6]).decl;
    const reading = modelCompassReading()({ truth: tr, index: 29 });
    expect(Math.abs(w180(reading - (45 - decl)))).toBeLessThan(0.05);
  });

  it('static card reads 339.7 heading 000 magnetic at 15° right bank, dip 55 (PHYSICS.md check 2, Williams eq. 2)', () => {
    const one = (v: number): Float64Array => Float64Array.of(v);
    const truth = { n: 1, t: one(T0), lat: one(50), lon: one(0), altM: one(0), headingDegTrue: one(0), bankDeg: one(15) } as SynthTruth;
    const r = staticTurnCompassReading({ kind: 'constant', variationDeg: 0, dipDeg: 55 })({ truth, index: 0 });
    expect(Math.abs(r - 339.7)).toBeLessThan(0.1);
    const r2 = staticTurnCompassReading({ kind: 'constant', variationDeg: 10, dipDeg: 55 })({ truth: { ...truth, headingDegTrue: one(190) }, index: 0 });
    expect(Math.abs(r2 - (180 + 20.3))).toBeLessThan(0.1); // ψm 180 → +20.3 (check 2)
  });
});

describe('lesson with the dynamic card', () => {
  it('the model-cue pilot rolls out nearer the targets than the rule-of-thumb and the naive pilot (plausibility, no outside oracle for the card dynamics)', () => {
    const mean = (t: Array<{ rolloutErrorDeg: number }>): number => t.reduce((a, b) => a + Math.abs(b.rolloutErrorDeg), 0) / t.length;
    const cue = flyScriptedPilot(compassTurnLessonScript(), { technique: 'uses-model-cue' }).turns;
    const rule = flyScriptedPilot(compassTurnLessonScript(), { technique: 'rule-of-thumb' }).turns;
    const naive = flyScriptedPilot(compassTurnLessonScript(), { technique: 'rolls-out-on-reading' }).turns;
    expect(cue.length).toBe(8);
    expect(cue.every((t) => !t.timedOut)).toBe(true);
    expect(mean(cue)).toBeLessThan(4);
    expect(mean(cue)).toBeLessThan(mean(rule));
    expect(mean(rule)).toBeLessThan(mean(naive));
  });
});

describe('truth helpers', () => {
  const tr = simulateFlight({
    start: { t0: T0, latDeg: 52.6, lonDeg: 0.4, altM: 600, headingDegTrue: 0, tasMs: 50 },
    sampleRateHz: 10,
    legs: [{ kind: 'straight', durationS: 10 }, { kind: 'orbit', direction: 'right' }, { kind: 'straight', durationS: 10 }],
  });

  it('truthToFlightState gives the same rows as views, one segment, logRow = truth row', () => {
    const s = truthToFlightState(tr, 100, 200);
    expect(s.n).toBe(100);
    expect(s.bankDeg[0]).toBe(tr.bankDeg[100]);
    expect(s.logRow[99]).toBe(199);
    expect(s.segment.every((v) => v === 0)).toBe(true);
    expect(() => truthToFlightState(tr, 0, tr.n + 1)).toThrow(RangeError);
  });

  it('decimateTruth keeps every k-th row and re-counts the leg rows', () => {
    const d = decimateTruth(tr, 10);
    expect(d.sampleRateHz).toBe(1);
    expect(d.n).toBe(Math.ceil(tr.n / 10));
    expect(d.t[3]).toBe(tr.t[30]);
    expect(d.legs[1].startIndex).toBe(10);
    expect(d.t[d.legs[1].endIndex]).toBeLessThanOrEqual(d.legs[1].endT);
    expect(() => decimateTruth(tr, 0.5)).toThrow(/factor/);
  });
});
