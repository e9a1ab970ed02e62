// End to end: synthetic flights with known truth → GPX text → the whole pipeline → samples, checked
// against the truth, against WMM2025 through the geomagnetism package's own API, and against the
// textbook turning-error relation evaluated at the tool's own heading and bank.
import { describe, expect, it } from 'vitest';
import geomagnetism from 'geomagnetism';
import { simulateFlight } from '../../src/synth/simulateFlight.js';
import { toFlightLog } from '../../src/synth/gpsNoise.js';
import { writeGpx } from '../../src/synth/writeGpx.js';
import { parseGpx } from '../../src/import/gpx.js';
import { analyseFlight } from '../../src/analyseFlight.js';
import { angleDiffDeg, wrap360 } from '../../src/geo/angles.js';
import { LESSON_PLACES, lessonScript } from './lessonFlights.js';
import type { SynthTruth } from '../../src/synth/synthTruth.js';

const DEG = Math.PI / 180;

function percentile(xs: number[], p: number): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.floor(p * (s.length - 1)))];
}

/** Truth rows in steady flight: bank and turn rate unchanged over ±4 s (no roll-in, roll-out, ramp). */
function steadyRows(truth: SynthTruth): Set<number> {
  const out = new Set<number>();
  const k = Math.round(4 * truth.sampleRateHz);
  for (let i = k; i < truth.n - k; i++) {
    const b0 = truth.bankDeg[i - k];
    const b1 = truth.bankDeg[i + k];
    const a0 = truth.accelLongMs2[i - k];
    const a1 = truth.accelLongMs2[i + k];
    if (Math.abs(b1 - b0) < 0.5 && Math.abs(truth.bankDeg[i] - b0) < 0.5 && Math.abs(a1 - a0) < 0.05 && Math.abs(truth.velD[i]) < 0.5) out.add(i);
  }
  return out;
}

function analysed(placeIndex: number) {
  const place = LESSON_PLACES[placeIndex];
  const truth = simulateFlight(lessonScript(place));
  const noisy = toFlightLog(truth, { posSigmaM: 2, altSigmaM: 3, seed: 100 + placeIndex, file: `${place.name}.gpx`, format: 'gpx' });
  const gpxText = writeGpx(noisy, { name: `Lesson ${place.name}` });
  const log = parseGpx(gpxText, `${place.name}.gpx`);
  const a = analyseFlight(log, { wind: { kind: 'given', fromDegTrue: place.windFromDeg, speedMs: place.windKt * 1852 / 3600 } });
  const byTimeMs = new Map<number, number>();
  for (let i = 0; i < truth.n; i++) byTimeMs.set(Math.round(truth.t[i] * 1000), i);
  const truthRow = (i: number) => byTimeMs.get(Math.round(a.state.t[i] * 1000)) ?? -1;
  return { place, truth, a, truthRow, steady: steadyRows(truth) };
}

describe.each(LESSON_PLACES.map((p, i) => [p.name, i] as const))('end to end, %s', (_name, index) => {
  const { truth, a, truthRow, steady } = analysed(index);
  const s = a.state;

  it('keeps every sample of a clean log', () => {
    expect(s.n).toBe(truth.n);
  });

  it('recovers true heading and bank within 1.5° (95th percentile, steady flight; truth from src/synth)', () => {
    const dh: number[] = [];
    const db: number[] = [];
    for (let i = 0; i < s.n; i++) {
      const r = truthRow(i);
      if (r < 0 || !steady.has(r)) continue;
      dh.push(Math.abs(angleDiffDeg(s.headingDegTrue[i], truth.headingDegTrue[r])));
      db.push(Math.abs(s.bankDeg[i] - truth.bankDeg[r]));
    }
    expect(dh.length).toBeGreaterThan(s.n * 0.5);
    expect(percentile(dh, 0.95)).toBeLessThan(1.5);
    expect(percentile(db, 0.95)).toBeLessThan(1.5);
  });

  it('gives variation and dip within 0.1° of WMM2025 evaluated through the geomagnetism package API (NOAA WMM2025 coefficients)', () => {
    const model = geomagnetism.model(new Date(a.state.t[0] * 1000));
    let worstD = 0;
    let worstI = 0;
    for (let i = 0; i < s.n; i += 37) {
      const r = truthRow(i);
      const p = model.point([truth.lat[r], truth.lon[r], truth.altM[r] / 1000]);
      worstD = Math.max(worstD, Math.abs(angleDiffDeg(a.field.variationDeg[i], p.decl)));
      worstI = Math.max(worstI, Math.abs(a.field.dipDeg[i] - p.incl));
    }
    expect(worstD).toBeLessThan(0.1);
    expect(worstI).toBeLessThan(0.1);
  });

  it('gives a static reading within 1° of the textbook turning-error relation at its own heading and bank (DESIGN.md closed form, level coordinated turns)', () => {
    let checked = 0;
    const diffs: number[] = [];
    for (let i = 0; i < s.n; i++) {
      const r = truthRow(i);
      if (r < 0 || !steady.has(r) || Math.abs(truth.bankDeg[r]) < 5) continue;
      const psiM = (s.headingDegTrue[i] - a.field.variationDeg[i]) * DEG;
      const phi = s.bankDeg[i] * DEG;
      const mu = a.field.dipDeg[i] * DEG;
      // tan(reading) = (sin ψm cos φ − tan μ sin φ) / cos ψm, quadrant from atan2 (Williams eq. 2 form).
      const expected = wrap360(Math.atan2(Math.sin(psiM) * Math.cos(phi) - Math.tan(mu) * Math.sin(phi), Math.cos(psiM)) / DEG);
      if (a.compass.directiveRatio[i] < 0.3) continue; // near card reversal the relation is singular
      diffs.push(Math.abs(angleDiffDeg(a.compass.staticDeg[i], expected)));
      checked++;
    }
    expect(checked).toBeGreaterThan(100);
    expect(percentile(diffs, 0.95)).toBeLessThan(1);
  });

  it('adds the error split up to the total compass error (DESIGN.md samples contract)', () => {
    const c = a.compass;
    for (let i = 0; i < s.n; i += 7) {
      if (!Number.isFinite(c.errorDeg[i])) continue;
      const sum = c.errDipTurnDeg[i] + c.errDipAccelDeg[i] + c.errLagSwirlDeg[i] + c.errDeviationDeg[i];
      expect(Math.abs(angleDiffDeg(sum, c.errorDeg[i]))).toBeLessThan(1e-6);
    }
  });
});
