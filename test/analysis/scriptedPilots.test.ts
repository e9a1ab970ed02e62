// Three pilots fly the same compass-turn lesson: one rolls out when the compass shows the target, one uses the
// model's cue, one the handbook rule of thumb. The debrief's grades must tell them apart, and agree with the truth.
// Perceived compass: the textbook static card (Williams eq. 2, staticTurnCompassReading); the debrief is run on the
// same card (staticTurnTrace), so its cue is comparable with what the pilot watched.
import { describe, expect, it } from 'vitest';
import { analyseDebrief } from '../../src/analysis/analyseDebrief.js';
import type { TurnResult } from '../../src/analysis/analysisTypes.js';
import { KT_MS } from '../../src/constants.js';
import { computeFieldAlongPath } from '../../src/magnetic/fieldAlongPath.js';
import { reconstructState } from '../../src/state/reconstructState.js';
import { toFlightLog } from '../../src/synth/gpsNoise.js';
import { staticTurnCompassReading } from '../../src/synth/perceivedCompass.js';
import { flyScriptedPilot, type PilotLeg, type PilotScript, type PilotTurnRecord, type RolloutTechnique } from '../../src/synth/scriptedPilot.js';
import { truthToFlightState } from '../../src/synth/truthToFlightState.js';
import type { FlightState } from '../../src/state/flightState.js';
import { staticTurnTrace, wrap180 } from './lessonFixtures.js';

/** Targets (magnetic) and directions of the lesson, in order: through north, east, south and west both ways. */
const LESSON: Array<[number, 'left' | 'right']> = [
  [0, 'left'], [90, 'right'], [180, 'right'], [270, 'right'], [0, 'right'], [180, 'left'], [90, 'left'], [0, 'left'],
];
const PLAN = `target_mag_deg\n${LESSON.map(([t]) => String(t).padStart(3, '0')).join('\n')}\n`;
const isNS = (t: number) => t === 0 || t === 180;

/** Two invented practice areas: open fenland (52.6 N) and open prairie (38.5 N), both dip ≈ 66–67° (WMM2025). */
const SITES = { fen: { latDeg: 52.6, lonDeg: 0.39 }, prairie: { latDeg: 38.5, lonDeg: -98.0 } } as const;
const T0 = Date.UTC(2026, 4, 4, 10, 0, 0) / 1000;

function variationAt(latDeg: number, lonDeg: number): number {
  const { field } = computeFieldAlongPath(new Float64Array([T0]), new Float64Array([latDeg]), new Float64Array([lonDeg]), new Float64Array([600]));
  return field.variationDeg[0];
}

function lessonScript(site: keyof typeof SITES, tasKt: number): PilotScript {
  const { latDeg, lonDeg } = SITES[site];
  const legs: PilotLeg[] = [{ kind: 'straight', durationS: 40 }];
  for (const [toMagDeg, direction] of LESSON) legs.push({ kind: 'compass-turn', toMagDeg, direction, label: `to ${toMagDeg}` }, { kind: 'straight', durationS: 40 });
  return {
    name: `compass-turn lesson (${site})`,
    start: { t0: T0, latDeg, lonDeg, altM: 600, headingDegTrue: 90 + variationAt(latDeg, lonDeg), tasMs: tasKt * KT_MS },
    sampleRateHz: 10,
    legs,
  };
}

interface Flown {
  records: PilotTurnRecord[];
  turns: TurnResult[];
  state: FlightState;
}

/** Lesson at 100 kt (standard-rate bank 15.4°) or 120 kt (18.2°, the top of the handbook's 15–18° band; PHYSICS check 16). */
function fly(site: keyof typeof SITES, technique: RolloutTechnique, tasKt = 100, noisy = false): Flown {
  const { truth, turns: records } = flyScriptedPilot(lessonScript(site, tasKt), { technique, compassReadingFn: staticTurnCompassReading() });
  let state = truthToFlightState(truth);
  if (noisy) {
    const log = toFlightLog(truth, { posSigmaM: 2, altSigmaM: 3, seed: 5, file: 'lesson.csv', format: 'csv' });
    state = reconstructState(log, { wind: { kind: 'calm' } });
  }
  const { field } = computeFieldAlongPath(state.t, state.lat, state.lon, state.altM);
  const { analysis } = analyseDebrief(state, field, staticTurnTrace(state, field), { planCsvText: PLAN });
  return { records, turns: analysis.turns, state };
}

const flown = {
  naive: fly('fen', 'rolls-out-on-reading'),
  model: fly('fen', 'uses-model-cue'),
  rule: fly('fen', 'rule-of-thumb'),
  rulePrairie: fly('prairie', 'rule-of-thumb', 120),
  naivePrairie: fly('prairie', 'rolls-out-on-reading', 120),
};

/** Roll-out error in the turn's direction (+ overshoot), as the debrief graded it. */
const along = (t: TurnResult) => (t.direction === 'right' ? 1 : -1) * t.rolloutErrorDeg;

describe('the debrief grades agree with the truth (oracle: the simulator\'s end headings in the pilot records)', () => {
  for (const [name, f] of Object.entries(flown)) {
    it(`${name}: every compass turn is found, matched to its plan row, and graded within 0.5° of the truth`, () => {
      expect(f.records.every((r) => !r.timedOut)).toBe(true);
      expect(f.turns.length).toBe(LESSON.length);
      f.turns.forEach((t, k) => {
        expect(t.targetSource).toBe('plan');
        expect(t.targetMagDeg).toBe(LESSON[k][0]);
        expect(t.direction).toBe(LESSON[k][1]);
        expect(Math.abs(along(t) - f.records[k].rolloutErrorDeg)).toBeLessThan(0.5);
      });
    });
  }
});

describe('the grades tell the three pilots apart (±10° tolerance: FAA Instrument ACS heading, from memory)', () => {
  it('the pilot who uses the model cue rolls out on every target (|error| < 3°)', () => {
    for (const t of flown.model.turns) {
      expect(t.withinTolerance).toBe(true);
      expect(Math.abs(t.rolloutErrorDeg)).toBeLessThan(3);
    }
  });
  it('the pilot who rolls out on the reading overshoots north and undershoots south by > 10° (UNOS, IFH ch. 7), is fine on E/W', () => {
    flown.naive.turns.forEach((t, k) => {
      const target = LESSON[k][0];
      if (target === 0) expect(along(t)).toBeGreaterThan(10);
      else if (target === 180) expect(along(t)).toBeLessThan(-10);
      else expect(t.withinTolerance).toBe(true);
    });
  });
  it('at 52.6 N the rule of thumb (lead ≈ latitude) over-corrects: undershoots north and overshoots south by > 10°', () => {
    // Physics: lag ≈ atan(tan 67 · sin 15.6) ≈ 32° against the rule's 52.6° (PHYSICS.md §1.2, §2).
    flown.rule.turns.forEach((t, k) => {
      const target = LESSON[k][0];
      if (target === 0) expect(along(t)).toBeLessThan(-10);
      else if (target === 180) expect(along(t)).toBeGreaterThan(10);
      else expect(t.withinTolerance).toBe(true);
    });
  });
  it('at 38.5 N and 18° bank (120 kt) the rule of thumb lands within tolerance on every target, where the naive pilot still misses N and S', () => {
    expect(flown.rulePrairie.turns.every((t) => t.withinTolerance)).toBe(true);
    const missed = flown.naivePrairie.turns.filter((t) => !t.withinTolerance).map((t) => t.targetMagDeg);
    expect(missed.sort()).toEqual([0, 0, 0, 180, 180]);
  });
  it('grade counts differ: model 8/8, naive 3/8 (E/W only), rule at 52.6 N 3/8 with errors of the opposite sign', () => {
    const count = (f: Flown) => f.turns.filter((t) => t.withinTolerance).length;
    expect(count(flown.model)).toBe(8);
    expect(count(flown.naive)).toBe(3);
    expect(count(flown.rule)).toBe(3);
    const signs = (f: Flown) => f.turns.filter((t, k) => isNS(LESSON[k][0])).map((t) => Math.sign(along(t)));
    expect(signs(flown.naive).map((s) => -s)).toEqual(signs(flown.rule));
  });
});

describe('the cues the debrief gives', () => {
  it('the model cue matches the compass the model pilot started rolling out at (within 4°), and not the naive pilot\'s on N/S (> 15° off)', () => {
    for (const t of flown.model.turns) expect(Math.abs(wrap180(t.compassAtRolloutStartDeg! - t.cueCompassDeg))).toBeLessThan(4);
    flown.naive.turns.forEach((t, k) => {
      if (isNS(LESSON[k][0])) expect(Math.abs(wrap180(t.compassAtRolloutStartDeg! - t.cueCompassDeg))).toBeGreaterThan(15);
    });
  });
  it('the roll-out lead the debrief measures is the heading change after the 90 %-rate point of the simulator\'s roll-out', () => {
    // Oracle: the simulator's roll-out is ω·(1 − S(u)), S the quintic smoothstep (minimum jerk, Flash & Hogan 1985),
    // over r = 2 s at ω = 3 °/s; 90 % of the rate at S(u90) = 0.1; lead = ω r ∫_{u90}^1 (1 − S) du.
    const S = (u: number) => u * u * u * (10 + u * (-15 + 6 * u));
    let lo = 0;
    let hi = 0.5;
    for (let k = 0; k < 60; k++) (S((lo + hi) / 2) < 0.1 ? (lo = (lo + hi) / 2) : (hi = (lo + hi) / 2));
    const F = (u: number) => u - (2.5 * u ** 4 - 3 * u ** 5 + u ** 6);
    const lead = 3 * 2 * (F(1) - F(lo));
    for (const f of Object.values(flown)) for (const t of f.turns) expect(Math.abs(t.rolloutLeadDeg! - lead * (t.steadyRateDps! / 3))).toBeLessThan(0.1);
  });
  it('the debrief\'s rule-of-thumb cue is the pilots\' rule (an independent implementation in src/synth) up to the lead each used', () => {
    // The scripted pilot's normal lead: ω·(reaction 0.3 s + roll 2 s / 2) (scriptedPilot defaults); the rule is linear in it.
    for (const f of [flown.rule, flown.rulePrairie]) {
      f.turns.forEach((t, k) => {
        const dir = t.direction === 'right' ? 1 : -1;
        const pilotLead = 3 * (0.3 + 1);
        expect(wrap180(t.ruleOfThumbCueDeg - f.records[k].cueCompassDeg)).toBeCloseTo(dir * (pilotLead - t.rolloutLeadDeg!), 0);
      });
    }
  });
  it('where rule and model differ: at 52.6 N by ~20° on N/S targets (52.6 − ~32), a few degrees at most on E/W', () => {
    flown.model.turns.forEach((t, k) => {
      const d = Math.abs(t.cueDifferenceDeg!);
      if (isNS(LESSON[k][0])) {
        expect(d).toBeGreaterThan(15);
        expect(d).toBeLessThan(25);
      } else expect(d).toBeLessThan(5); // the turning error passes through zero on E/W but changes fast there
    });
  });
});

describe('the grades survive a noisy log (GPS σ 2 m, 10 Hz, through the state stage)', () => {
  const naive = fly('fen', 'rolls-out-on-reading', 100, true);
  const model = fly('fen', 'uses-model-cue', 100, true);
  it('same turns; model pilot within tolerance everywhere, naive pilot outside on every N/S target', () => {
    expect(naive.turns.length).toBe(LESSON.length);
    expect(model.turns.length).toBe(LESSON.length);
    expect(model.turns.every((t) => t.withinTolerance)).toBe(true);
    naive.turns.forEach((t, k) => expect(t.withinTolerance).toBe(!isNS(LESSON[k][0])));
  });
});
