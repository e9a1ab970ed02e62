// Scripted pilots: where each roll-out technique ends a compass turn, checked against the closed-form static
// turning-error relation (Williams, "Compass Errors" 2001, eq. 2; DESIGN.md) solved independently here.
import { describe, expect, it } from 'vitest';
import { flyScriptedPilot, type PilotLeg, type RolloutTechnique, type ScriptedPilot } from '../../src/synth/scriptedPilot.js';
import type { CompassReadingFn } from '../../src/synth/perceivedCompass.js';
import type { PilotMagnetics } from '../../src/synth/pilotMagnetics.js';
import { OptionError } from '../../src/errors.js';

const D2R = Math.PI / 180;
const G = 9.80665; // standard gravity, BIPM SI Brochure
const TAS = 50;
const RATE = 3; // standard rate, FAA-H-8083-15B ch. 7
const BANK = Math.atan((TAS * RATE * D2R) / G) / D2R; // tan φ = V ω / g (PHYSICS.md §7)
const REACTION = 0.3;
const ROLL = 2;
const LEAD = RATE * (REACTION + ROLL / 2); // heading flown between decision and wings level (ramp integral ω τ / 2)
const HZ = 10;
const w180 = (d: number): number => ((((d + 180) % 360) + 360) % 360) - 180;
const w360 = (d: number): number => ((d % 360) + 360) % 360;

/** Williams eq. 2: steady coordinated level-turn reading, tan ψc = (sin ψm cos φ − tan μ sin φ) / cos ψm. */
function williams(psiMagDeg: number, bankDeg: number, dipDeg: number): number {
  const p = psiMagDeg * D2R;
  const f = bankDeg * D2R;
  return w360(Math.atan2(Math.sin(p) * Math.cos(f) - Math.tan(dipDeg * D2R) * Math.sin(f), Math.cos(p)) / D2R);
}

/** The perceived compass of these tests: Williams eq. 2 on the truth's heading and bank, constant field. */
function closedFormCompass(variationDeg: number, dipDeg: number): CompassReadingFn {
  return ({ truth, index }) => williams(truth.headingDegTrue[index] - variationDeg, truth.bankDeg[index], dipDeg);
}

/**
 * Where a pilot who rolls out when the static card has shown the turn up to `cue` ends up. Before the roll-in
 * the card reads the magnetic heading (level, unaccelerated); the pilot means to turn intended = dir × (target −
 * entry); the card's shown turn is accumulated along the established turn (bank BANK, from ω τ / 2 into it) in
 * steps of 0.001°; the decision falls where it reaches intended − dir × (target − cue); then the heading flown
 * during reaction and roll-out is added. Returns the error dir × (end − target) [deg].
 */
function predictedErrorDeg(entryMag: number, target: number, dir: 1 | -1, cue: number, dipDeg: number): number {
  const intended = w360(dir * (target - entryMag));
  const need = intended - dir * w180(target - cue);
  let last = entryMag;
  let shown = 0;
  for (let d = RATE * (ROLL / 2); d < 720; d += 0.001) {
    const psi = entryMag + dir * d;
    const reading = williams(psi, dir * BANK, dipDeg);
    shown += dir * w180(reading - last);
    last = reading;
    if (shown >= need) return dir * w180(psi + dir * LEAD - target);
  }
  return NaN;
}

interface Case {
  latDeg: number;
  variationDeg: number;
  dipDeg: number;
}
const NH: Case = { latDeg: 52.6, variationDeg: 1.2, dipDeg: 67.5 }; // Harrowgate Fen, WMM2025 ≈ 1.2 E, 67.5
const SH: Case = { latDeg: -43.75, variationDeg: 24.7, dipDeg: -68.9 }; // Canterbury plains, WMM2025
const EQ: Case = { latDeg: 10.4, variationDeg: 2.5, dipDeg: 0 }; // dip equator

function fly(c: Case, technique: RolloutTechnique, entryMag: number, turns: Array<[number, 'left' | 'right']>, extra: Partial<ScriptedPilot> = {}) {
  const magnetics: PilotMagnetics = { kind: 'constant', variationDeg: c.variationDeg, dipDeg: c.dipDeg };
  const legs: PilotLeg[] = [{ kind: 'straight', durationS: 10 }];
  for (const [toMagDeg, direction] of turns) legs.push({ kind: 'compass-turn', toMagDeg, direction }, { kind: 'straight', durationS: 10 });
  return flyScriptedPilot(
    {
      start: { t0: Date.UTC(2026, 4, 4, 10) / 1000, latDeg: c.latDeg, lonDeg: 0.4, altM: 600, headingDegTrue: entryMag + c.variationDeg, tasMs: TAS },
      sampleRateHz: HZ,
      legs,
    },
    { technique, magnetics, reactionS: REACTION, compassReadingFn: closedFormCompass(c.variationDeg, c.dipDeg), ...extra },
  );
}

// Decisions fall on the 10 Hz grid: the heading may run up to ω / 10 Hz = 0.3° past the crossing.
const GRID = RATE / HZ + 0.01;

describe('scripted pilot, static closed-form compass', () => {
  it('rolls-out-on-reading overshoots north and undershoots south in the northern hemisphere, by the amounts Williams eq. 2 gives', () => {
    const r = fly(NH, 'rolls-out-on-reading', 90, [[0, 'left'], [180, 'left'], [90, 'left'], [180, 'right']]);
    // each turn starts where the previous one really ended
    const entry = [90, ...r.turns.map((t) => t.rolloutMagDeg)];
    const expected = [predictedErrorDeg(entry[0], 0, -1, 0, NH.dipDeg), predictedErrorDeg(entry[1], 180, -1, 180, NH.dipDeg),
      predictedErrorDeg(entry[2], 90, -1, 90, NH.dipDeg), predictedErrorDeg(entry[3], 180, 1, 180, NH.dipDeg)];
    expect(expected[0]).toBeGreaterThan(25); // lag through north (IFH: "undershoot north" is the cure)
    expect(expected[1]).toBeLessThan(-25); // lead through south ("overshoot south")
    r.turns.forEach((t, k) => {
      expect(t.timedOut).toBe(false);
      expect(t.rolloutErrorDeg - expected[k]).toBeGreaterThanOrEqual(-0.01);
      expect(t.rolloutErrorDeg - expected[k]).toBeLessThanOrEqual(GRID);
    });
  });

  it('rolls-out-on-reading shows the southern hemisphere reversed: undershoots north, overshoots south', () => {
    const r = fly(SH, 'rolls-out-on-reading', 270, [[0, 'right'], [180, 'right']]);
    const e0 = predictedErrorDeg(270, 0, 1, 0, SH.dipDeg);
    const e1 = predictedErrorDeg(r.turns[0].rolloutMagDeg, 180, 1, 180, SH.dipDeg);
    expect(e0).toBeLessThan(-25);
    expect(e1).toBeGreaterThan(25);
    expect(r.turns[0].rolloutErrorDeg - e0).toBeGreaterThanOrEqual(-0.01);
    expect(r.turns[0].rolloutErrorDeg - e0).toBeLessThanOrEqual(GRID);
    expect(r.turns[1].rolloutErrorDeg - e1).toBeGreaterThanOrEqual(-0.01);
    expect(r.turns[1].rolloutErrorDeg - e1).toBeLessThanOrEqual(GRID);
  });

  it('uses-model-cue ends on the target onto north, south, east and west in both hemispheres', () => {
    for (const c of [NH, SH]) {
      const r = fly(c, 'uses-model-cue', 90, [[0, 'left'], [180, 'left'], [270, 'right'], [0, 'right'], [90, 'right'], [180, 'right']]);
      for (const t of r.turns) {
        expect(t.rolloutErrorDeg).toBeGreaterThanOrEqual(-0.01);
        expect(t.rolloutErrorDeg).toBeLessThanOrEqual(GRID);
      }
      // the cue onto north is taken early in the NH (lag) and late in the SH
      expect(c.dipDeg * w180(r.turns[0].cueCompassDeg - 0)).toBeGreaterThan(0);
    }
  });

  it('rule-of-thumb rolls out at latitude + normal lead before north and latitude − normal lead past south (FAA-H-8083-15B ch. 7), ending where Williams eq. 2 puts it', () => {
    const r = fly(NH, 'rule-of-thumb', 90, [[0, 'left'], [180, 'left']]);
    const cueN = w360(0 + (LEAD + NH.latDeg)); // left turn onto north: roll out lat + lead early
    const cueS = w360(180 - (NH.latDeg - LEAD)); // left turn onto south: continue past south (below 180) by lat − lead
    // the pilot uses the latitude where he is (the flight drifts a few km from 52.6 N: < 0.01°)
    expect(Math.abs(w180(r.turns[0].cueCompassDeg - cueN))).toBeLessThan(0.01);
    expect(Math.abs(w180(r.turns[1].cueCompassDeg - cueS))).toBeLessThan(0.01);
    const eN = predictedErrorDeg(90, 0, -1, cueN, NH.dipDeg);
    const eS = predictedErrorDeg(r.turns[0].rolloutMagDeg, 180, -1, cueS, NH.dipDeg);
    // at 52.6 N the static lag at 15° bank is ~31°, so "lead = latitude" over-corrects: undershoot north, overshoot south
    expect(eN).toBeLessThan(-10);
    expect(eS).toBeGreaterThan(10);
    expect(r.turns[0].rolloutErrorDeg - eN).toBeGreaterThanOrEqual(-0.01);
    expect(r.turns[0].rolloutErrorDeg - eN).toBeLessThanOrEqual(GRID);
    expect(r.turns[1].rolloutErrorDeg - eS).toBeGreaterThanOrEqual(-0.01);
    expect(r.turns[1].rolloutErrorDeg - eS).toBeLessThanOrEqual(GRID);
  });

  it('at the magnetic equator the model cue and the rule end on target and the naive pilot overshoots by just the normal lead', () => {
    for (const technique of ['uses-model-cue', 'rule-of-thumb', 'rolls-out-on-reading'] as const) {
      const r = fly(EQ, technique, 0, [[90, 'right'], [0, 'left'], [180, 'right'], [270, 'right']]);
      const expected = technique === 'rolls-out-on-reading' ? LEAD : 0;
      for (const t of r.turns) {
        expect(t.rolloutErrorDeg - expected).toBeGreaterThanOrEqual(-0.01);
        expect(t.rolloutErrorDeg - expected).toBeLessThanOrEqual(GRID);
      }
    }
  });

  it('counts the card through turns beyond 180° and rolls out at once when the cue lies behind a short turn', () => {
    const r = fly(NH, 'uses-model-cue', 40, [[180, 'left'], [190, 'right'], [0, 'right'], [10, 'right']]);
    const entry = [40, ...r.turns.map((t) => t.rolloutMagDeg)];
    const targets = [180, 190, 0, 10];
    const dirs: Array<1 | -1> = [-1, 1, 1, 1];
    r.turns.forEach((t, k) => {
      const e = predictedErrorDeg(entry[k], targets[k], dirs[k], t.cueCompassDeg, NH.dipDeg);
      expect(t.timedOut).toBe(false);
      expect(t.rolloutErrorDeg - e).toBeGreaterThanOrEqual(-0.01);
      expect(t.rolloutErrorDeg - e).toBeLessThanOrEqual(GRID);
    });
    // 000 → 010 right: the card first swings back past 330, the pilot waits until it has caught up to the cue
    expect(Math.abs(r.turns[3].rolloutErrorDeg)).toBeLessThanOrEqual(GRID);
    // rule of thumb 350 → 000 right: the cue (lat + lead before north) lies behind the entry, so the pilot rolls
    // out as soon as established: heading change = roll-in ω τ / 2 + reaction and roll-out LEAD
    const rt = fly(NH, 'rule-of-thumb', 350, [[0, 'right']]);
    expect(rt.truth.legs[1].headingChangeDeg).toBeCloseTo(RATE * ROLL / 2 + LEAD, 6);
  });

  it('applies the variation: a turn onto 000 magnetic with 2.5 E ends on 002.5 true', () => {
    const r = fly(EQ, 'uses-model-cue', 90, [[0, 'left']]);
    const end = r.truth.legs[1].headingEndDegTrue;
    expect(Math.abs(w180(end - 2.5))).toBeLessThan(GRID);
  });

  it('gives up after maxDurationS when the compass never shows the cue, and says so', () => {
    const r = fly(NH, 'rolls-out-on-reading', 90, [[0, 'left']], { compassReadingFn: () => 90 });
    expect(r.turns[0].timedOut).toBe(true);
    expect(Number.isNaN(r.turns[0].decisionT)).toBe(true);
  });

  it('rejects bad pilot options with an OptionError', () => {
    expect(() => fly(NH, 'by-feel' as RolloutTechnique, 90, [[0, 'left']])).toThrow(OptionError);
    expect(() => fly(NH, 'uses-model-cue', 90, [[0, 'left']], { reactionS: -1 })).toThrow(/reactionS/);
    expect(() => fly({ ...NH, dipDeg: 90 }, 'uses-model-cue', 90, [[0, 'left']])).toThrow(/dipDeg/);
  });
});

describe('scripted pilot, dynamic compass model (src/compass) in the WMM2025 field', () => {
  it('with the model cue ends within a few degrees of north and south, far closer than the naive pilot (plausibility: lag and swirl are not in the static cue)', () => {
    const legs: PilotLeg[] = [
      { kind: 'straight', durationS: 20 },
      { kind: 'compass-turn', toMagDeg: 0, direction: 'left' },
      { kind: 'straight', durationS: 20 },
      { kind: 'compass-turn', toMagDeg: 180, direction: 'right' },
      { kind: 'straight', durationS: 10 },
    ];
    const script = { start: { t0: Date.UTC(2026, 4, 4, 10) / 1000, latDeg: 52.612, lonDeg: 0.387, altM: 600, headingDegTrue: 91.2, tasMs: TAS }, sampleRateHz: HZ, legs };
    const cue = flyScriptedPilot(script, { technique: 'uses-model-cue' });
    const naive = flyScriptedPilot(script, { technique: 'rolls-out-on-reading' });
    for (let k = 0; k < 2; k++) {
      expect(Math.abs(cue.turns[k].rolloutErrorDeg)).toBeLessThan(5);
      expect(Math.abs(naive.turns[k].rolloutErrorDeg)).toBeGreaterThan(Math.abs(cue.turns[k].rolloutErrorDeg) + 20);
    }
  });
});
