// Scenarios: the committed samples are exactly what the scripts make, and each scenario is what it claims.
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import geomagnetism from 'geomagnetism';
import {
  SAMPLE_SPECS, SCENARIO_VARIATION_DEG, benchFlight, circuitPracticeScript, equatorTurnsScript, southernNavexScript,
} from '../../src/synth/scenarios.js';
import { simulateFlight } from '../../src/synth/simulateFlight.js';
import { toFlightLog } from '../../src/synth/gpsNoise.js';
import { writeGpx } from '../../src/synth/writeGpx.js';
import { writeCsv } from '../../src/synth/writeCsv.js';
import { writePlanCsv } from '../../src/synth/writePlanCsv.js';
import { studentLesson, STUDENT_SAMPLE } from '../../src/synth/studentLesson.js';
import { parseGpx } from '../../src/import/gpx.js';
import { analyseFlight } from '../../src/analyseFlight.js';

const SAMPLES = join(dirname(fileURLToPath(import.meta.url)), '..', '..', 'samples');
const KT = 1852 / 3600;

/** WMM2025 declination / inclination via the geomagnetism package (NOAA coefficients). */
function wmm(t: number, latDeg: number, lonDeg: number, altM: number): { decl: number; incl: number } {
  return geomagnetism.model(new Date(t * 1000)).point([latDeg, lonDeg, altM / 1000]);
}

describe('committed samples', () => {
  for (const spec of SAMPLE_SPECS) {
    it(`samples/${spec.file} is exactly what its script, noise and writer make (regenerate: npm run samples)`, () => {
      const truth = simulateFlight(spec.script());
      const log = toFlightLog(truth, { ...spec.noise, file: spec.file, format: spec.format });
      const text = spec.format === 'gpx' ? writeGpx(log) : writeCsv(log, spec.csv ?? { altUnit: 'm' });
      expect(text === readFileSync(join(SAMPLES, spec.file), 'utf8')).toBe(true);
      if (spec.file === 'circuit-practice.gpx') {
        const plan = writePlanCsv(truth, SCENARIO_VARIATION_DEG.circuit);
        expect(plan === readFileSync(join(SAMPLES, 'circuit-practice.plan.csv'), 'utf8')).toBe(true);
      }
    });
  }
});

describe('the student lesson sample', () => {
  const student = studentLesson();

  it(`samples/${STUDENT_SAMPLE.file} and its plan are exactly what the scripted student makes (regenerate: npm run samples)`, () => {
    const log = toFlightLog(student.truth, { ...STUDENT_SAMPLE.noise, file: STUDENT_SAMPLE.file, format: 'gpx' });
    expect(writeGpx(log) === readFileSync(join(SAMPLES, STUDENT_SAMPLE.file), 'utf8')).toBe(true);
    expect(student.planCsv === readFileSync(join(SAMPLES, STUDENT_SAMPLE.planFile), 'utf8')).toBe(true);
  });

  it('shows the northern-hemisphere pattern of rolling out on the reading: overshoot onto north, undershoot onto south (FAA-H-8083-15B ch. 7, UNOS), and the debrief grades it so', () => {
    const text = readFileSync(join(SAMPLES, STUDENT_SAMPLE.file), 'utf8');
    const a = analyseFlight(parseGpx(text, STUDENT_SAMPLE.file), { debrief: { planCsvText: readFileSync(join(SAMPLES, STUDENT_SAMPLE.planFile), 'utf8') } });
    const turns = a.analysis.turns;
    expect(turns).toHaveLength(8);
    for (const t of turns) {
      const past = (t.direction === 'right' ? 1 : -1) * t.rolloutErrorDeg; // + = overshoot in the turn direction
      if (t.targetMagDeg === 0) expect(past).toBeGreaterThan(20);
      if (t.targetMagDeg === 180) expect(past).toBeLessThan(-20);
      if (t.targetMagDeg === 0 || t.targetMagDeg === 180) expect(t.withinTolerance).toBe(false);
    }
  });
});

describe('scenarios', () => {
  it('circuit practice: about 25 min at 1 Hz from the strip, wind 250/15, standard-rate turns to magnetic cardinals and an orbit', () => {
    const s = circuitPracticeScript();
    const tr = simulateFlight(s);
    const minutes = (tr.t[tr.n - 1] - tr.t[0]) / 60;
    expect(minutes).toBeGreaterThan(22);
    expect(minutes).toBeLessThan(30);
    expect(tr.sampleRateHz).toBe(1);
    expect(s.wind).toEqual({ fromDegTrue: 250, speedMs: 15 * KT });
    const compassTurns = tr.legs.filter((l) => l.label?.startsWith('compass turn'));
    expect(compassTurns.length).toBeGreaterThanOrEqual(6);
    for (const l of compassTurns) {
      const mag = l.headingEndDegTrue - SCENARIO_VARIATION_DEG.circuit;
      expect(Math.abs(mag - 90 * Math.round(mag / 90))).toBeLessThan(1e-6);
      expect(l.rateDps).toBe(3);
    }
    expect(compassTurns.some((l) => l.headingChangeDeg !== undefined && Math.abs(l.headingChangeDeg - 180) < 1e-6)).toBe(true);
    expect(tr.legs.some((l) => l.kind === 'orbit')).toBe(true);
    expect(tr.legs.filter((l) => l.kind === 'speed').length).toBeGreaterThanOrEqual(6);
  });

  it('uses chart variations within 0.06° of WMM2025 at each start (geomagnetism package, NOAA WMM2025 coefficients)', () => {
    const cases: Array<[ReturnType<typeof circuitPracticeScript>, number]> = [
      [circuitPracticeScript(), SCENARIO_VARIATION_DEG.circuit],
      [southernNavexScript(), SCENARIO_VARIATION_DEG.navex],
      [equatorTurnsScript(), SCENARIO_VARIATION_DEG.equator],
    ];
    for (const [s, v] of cases) {
      const f = wmm(s.start.t0, s.start.latDeg, s.start.lonDeg, 600);
      expect(Math.abs(f.decl - v)).toBeLessThan(0.06);
    }
  });

  it('southern navex lies in the southern magnetic hemisphere (WMM2025 dip < −60°) and has a straight leg of at least 15 min', () => {
    const tr = simulateFlight(southernNavexScript());
    expect(Math.max(...tr.lat)).toBeLessThan(-40);
    expect(wmm(tr.t[0], tr.lat[0], tr.lon[0], tr.altM[0]).incl).toBeLessThan(-60);
    expect(tr.legs.some((l) => l.kind === 'straight' && l.endT - l.startT >= 900)).toBe(true);
  });

  it('equator turns stay within 1° of the magnetic equator all the way (WMM2025 dip via geomagnetism)', () => {
    const tr = simulateFlight(equatorTurnsScript());
    for (let i = 0; i < tr.n; i += 30) expect(Math.abs(wmm(tr.t[i], tr.lat[i], tr.lon[i], tr.altM[i]).incl)).toBeLessThan(1);
  });

  it('benchFlight(3, 10) has exactly 108 000 samples at 10 Hz, with turns both ways, orbits, speed and height changes', () => {
    const s = benchFlight();
    const tr = simulateFlight(s);
    expect(tr.n).toBe(108000);
    expect(tr.sampleRateHz).toBe(10);
    const kinds = new Set(tr.legs.map((l) => (l.kind === 'turn' ? `turn-${l.direction}` : l.kind)));
    for (const k of ['straight', 'turn-left', 'turn-right', 'orbit', 'speed', 'climb']) expect(kinds.has(k)).toBe(true);
    expect(benchFlight(0.5, 1).legs.length).toBeGreaterThan(5);
    expect(simulateFlight(benchFlight(0.5, 1)).n).toBe(1800);
  });
});
