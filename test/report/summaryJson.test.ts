// The summary JSON against its published JSON Schema (validated with ajv), and its numbers against the run.
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import Ajv from 'ajv';
import { simulateFlight } from '../../src/synth/simulateFlight.js';
import { toFlightLog } from '../../src/synth/gpsNoise.js';
import { analyseFlight } from '../../src/analyseFlight.js';
import { buildSummary, summaryJson } from '../../src/report/summaryJson.js';
import { KT_MS } from '../../src/constants.js';
import { angleDiffDeg } from '../../src/geo/angles.js';

const schema = JSON.parse(readFileSync(new URL('../../src/report/summary.schema.json', import.meta.url), 'utf8'));
const ajv = new Ajv({ allErrors: true, strict: true, allowUnionTypes: true });
const validate = ajv.compile(schema);

function lesson(windFromDeg: number, windKt: number, latDeg: number) {
  const truth = simulateFlight({
    start: { t0: Date.UTC(2026, 5, 1, 9, 0, 0) / 1000, latDeg, lonDeg: 10, altM: 800, headingDegTrue: 0, tasMs: 95 * KT_MS },
    wind: { fromDegTrue: windFromDeg, speedMs: windKt * KT_MS },
    legs: [
      { kind: 'straight', durationS: 60 },
      { kind: 'orbit', direction: 'right' },
      { kind: 'straight', durationS: 40 },
      { kind: 'turn', direction: 'left', byDeg: 90 },
      { kind: 'straight', durationS: 40 },
      { kind: 'speed', toTasMs: 115 * KT_MS, accelMs2: 0.5 },
      { kind: 'straight', durationS: 40 },
      { kind: 'turn', direction: 'right', byDeg: 180 },
      { kind: 'straight', durationS: 60 },
    ],
  });
  return toFlightLog(truth, { posSigmaM: 2, altSigmaM: 3, seed: 11, file: 'lesson.gpx', format: 'gpx', meta: { name: 'Lesson <b>one</b>' } });
}

describe('summary JSON', () => {
  const a = analyseFlight(lesson(300, 20, 55), { wind: { kind: 'auto' } });
  const summary = buildSummary(a);

  it('validates against src/report/summary.schema.json (JSON Schema draft-07, ajv)', () => {
    const ok = validate(JSON.parse(summaryJson(a)));
    expect(validate.errors ?? []).toEqual([]);
    expect(ok).toBe(true);
  });

  it('a calm flight and a given wind validate too', () => {
    for (const wind of [{ kind: 'calm' } as const, { kind: 'given', fromDegTrue: 90, speedMs: 5 } as const]) {
      const ok = validate(JSON.parse(summaryJson(analyseFlight(lesson(90, 10, -40), { wind }))));
      expect(validate.errors ?? []).toEqual([]);
      expect(ok).toBe(true);
    }
  });

  it('rejects a summary with a field the schema does not know (the schema is closed)', () => {
    expect(validate({ ...JSON.parse(summaryJson(a)), surprise: 1 })).toBe(false);
  });

  it('gives the wind found from the orbit within 2 kt and 5° of the truth (wind from 300 at 20 kt, synthetic)', () => {
    const w = summary.wind as { from_deg: number; speed_kt: number; source: string };
    expect(w.source).toBe('turn-fit');
    expect(Math.abs(angleDiffDeg(w.from_deg, 300))).toBeLessThan(5);
    expect(Math.abs(w.speed_kt - 20)).toBeLessThan(2);
  });

  it('lists every turn flown, with the largest compass error matching the samples', () => {
    const turns = summary.turns as Array<{ direction: string; heading_change_deg: number }>;
    expect(turns.map((t) => t.direction)).toEqual(['right', 'left', 'right']);
    expect(turns[0].heading_change_deg).toBeGreaterThan(340);
    let worst = 0;
    for (let i = 0; i < a.compass.n; i++) if (Number.isFinite(a.compass.errorDeg[i])) worst = Math.max(worst, Math.abs(a.compass.errorDeg[i]));
    expect((summary.compass as { max_abs_error_deg: number }).max_abs_error_deg).toBeCloseTo(worst, 1);
  });

  it('gives the error split per part, whose largest values bound the split columns (samples contract)', () => {
    const split = (summary.compass as { split: Record<string, { rms_deg: number; max_abs_deg: number }> }).split;
    const cols = { dip_turn: a.compass.errDipTurnDeg, dip_accel: a.compass.errDipAccelDeg, lag_swirl: a.compass.errLagSwirlDeg, deviation: a.compass.errDeviationDeg };
    for (const [k, col] of Object.entries(cols)) {
      let m = 0;
      for (const v of col) if (Number.isFinite(v)) m = Math.max(m, Math.abs(v));
      expect(split[k].max_abs_deg).toBeCloseTo(m, 1);
      expect(split[k].rms_deg).toBeLessThanOrEqual(split[k].max_abs_deg + 0.05);
    }
    expect(split.deviation.max_abs_deg).toBe(0); // no deviation card applied
    expect(split.dip_turn.max_abs_deg).toBeGreaterThan(10); // standard-rate turns at dip ~68
  });

  it('carries log text as plain data (JSON escaping only; the report escapes it for HTML)', () => {
    expect((summary.source as { meta: { name: string } }).meta.name).toBe('Lesson <b>one</b>');
  });
});
