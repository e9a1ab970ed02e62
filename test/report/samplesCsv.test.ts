// The samples CSV: contract header, one row per sample, values against the pipeline's own columns and
// the exact unit definitions, angle intervals, and chunked writing identical to the whole text.
import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { syntheticFlight } from './syntheticFlight.js';
import { samplesCsv, samplesCsvChunks, SAMPLES_CONTRACT_COLUMNS, SAMPLES_EXTRA_COLUMNS } from '../../src/report/samplesCsv.js';

describe('samples CSV', () => {
  const a = syntheticFlight({ durationS: 900, hz: 1 });
  const text = samplesCsv(a);
  const rows = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true });

  it('has exactly the contract columns first, in order (DESIGN.md "Samples CSV"), then the extras', () => {
    expect(rows.meta.fields).toEqual([...SAMPLES_CONTRACT_COLUMNS, ...SAMPLES_EXTRA_COLUMNS]);
    expect(rows.data).toHaveLength(a.state.n);
  });

  it('writes ground speed in knots (1 kt = 1852/3600 m/s exactly) and ISO 8601 UTC times with milliseconds', () => {
    for (const i of [0, 123, 899]) {
      expect(Number(rows.data[i].groundspeed_kt)).toBeCloseTo(a.state.gsMs[i] / (1852 / 3600), 2);
      expect(Date.parse(rows.data[i].time_utc)).toBe(Math.round(a.state.t[i] * 1000));
      expect(rows.data[i].time_utc).toMatch(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{3}Z$/);
    }
  });

  it('keeps headings in [0, 360) and signed errors in (−180, 180]', () => {
    for (const r of rows.data) {
      for (const k of ['track_true_deg', 'heading_true_deg', 'heading_mag_deg', 'compass_deg', 'compass_static_deg']) {
        if (r[k] === '') continue;
        const v = Number(r[k]);
        expect(v).toBeGreaterThanOrEqual(0);
        expect(v).toBeLessThan(360);
      }
      if (r.compass_error_deg !== '') {
        expect(Number(r.compass_error_deg)).toBeGreaterThan(-180);
        expect(Number(r.compass_error_deg)).toBeLessThanOrEqual(180);
      }
    }
  });

  it('gives the same bytes written in chunks of any size', () => {
    const joined = (size: number) => Buffer.concat(Array.from(samplesCsvChunks(a, size))).toString('latin1');
    expect(joined(2048)).toBe(text);
    expect(joined(4096 + 17)).toBe(text);
    expect(joined(1 << 22)).toBe(text);
  });

  it('writes each number as toFixed would (ECMA-262 Number.prototype.toFixed as oracle, away from binary ties)', () => {
    const cols: Array<[string, Float64Array, number]> = [
      ['lat_deg', a.state.lat, 7], ['alt_m', a.state.altM, 1], ['bank_deg', a.state.bankDeg, 2], ['dip_deg', a.field.dipDeg, 3],
      ['turn_rate_dps', a.state.turnRateDps, 3], ['err_lag_swirl_deg', a.compass.errLagSwirlDeg, 2],
    ];
    for (const [name, col, d] of cols) {
      for (let i = 0; i < a.state.n; i += 13) {
        const v = col[i];
        if (!Number.isFinite(v)) { expect(rows.data[i][name]).toBe(''); continue; }
        const scaled = Math.abs(v) * 10 ** d;
        if (Math.abs(scaled - Math.floor(scaled) - 0.5) < 1e-6) continue;
        expect(rows.data[i][name]).toBe(v.toFixed(d).replace(/^-(0\.0*)$/, '$1'));
      }
    }
  });
});
