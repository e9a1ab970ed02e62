import geodesic from 'geographiclib-geodesic';
import { describe, expect, it } from 'vitest';
import { OptionError } from '../../src/errors.js';
import { buildReportModel } from '../../src/report/reportModel.js';
import { syntheticFlight } from './syntheticFlight.js';

const geod = geodesic.Geodesic.WGS84;
const KNOT_MS = 1852 / 3600; // international knot, exact (1852 m per hour)
const FOOT_M = 0.3048; // international foot, exact (1959 agreement)
const wrap360 = (d: number) => ((d % 360) + 360) % 360;
const angErr = (a: number, b: number) => Math.abs(((((a - b) % 360) + 540) % 360) - 180);

describe('buildReportModel', () => {
  const a = syntheticFlight({ durationS: 3600, hz: 10 });
  const m = buildReportModel(a, { generatedAt: new Date(Date.UTC(2026, 4, 4, 12)) });
  const s = m.series;

  it('thins a one-hour 10 Hz flight to at most the default 5000 drawn points and says so', () => {
    expect(a.state.n).toBe(36_000);
    expect(s.n).toBeLessThanOrEqual(5000);
    expect(m.downsample).toMatchObject({ samples: 36_000, drawn: s.n });
    expect(m.downsample.method).toMatch(/lowest and highest compass error/);
    for (const key of ['tS', 'eastNm', 'northNm', 'gsKt', 'compassDeg', 'errorDeg', 'bankDeg', 'unreliable'] as const) expect(s[key].length).toBe(s.n);
  });

  it('converts to knots, feet and kt/s by the exact unit definitions (rounding 0.1 kt, 1 ft, 0.01 kt/s)', () => {
    for (let k = 0; k < s.n; k += 97) {
      const r = s.row[k];
      expect(Math.abs((s.gsKt[k] as number) - a.state.gsMs[r] / KNOT_MS)).toBeLessThanOrEqual(0.05 + 1e-9);
      expect(Math.abs((s.altFt[k] as number) - a.state.altM[r] / FOOT_M)).toBeLessThanOrEqual(0.5 + 1e-9);
      expect(Math.abs((s.accelLongKtS[k] as number) - a.state.accelLongMs2[r] / KNOT_MS)).toBeLessThanOrEqual(0.005 + 1e-9);
    }
  });

  // Convention (brief, PHYSICS.md §0): variation east +, magnetic = true − variation.
  it('gives the magnetic heading as true heading − variation, in [0, 360)', () => {
    for (let k = 0; k < s.n; k += 53) {
      const r = s.row[k];
      const v = s.headingMagDeg[k] as number;
      expect(v).toBeGreaterThanOrEqual(0);
      expect(v).toBeLessThan(360);
      expect(angErr(v, wrap360(a.state.headingDegTrue[r] - a.field.variationDeg[r]))).toBeLessThanOrEqual(0.05 + 1e-9);
    }
  });

  // Oracle: GeographicLib's inverse geodesic (C. F. F. Karney, J. Geodesy 87, 2013) from the first fix.
  it('places the plan view in NM east/north of the first fix, agreeing with the geodesic distance and azimuth', () => {
    const lat0 = a.state.lat[0];
    const lon0 = a.state.lon[0];
    let checked = 0;
    for (let k = 0; k < s.n; k += 41) {
      const r = s.row[k];
      const g = geod.Inverse(lat0, lon0, a.state.lat[r], a.state.lon[r]);
      const e = s.eastNm[k] as number;
      const nn = s.northNm[k] as number;
      const distM = Math.hypot(e, nn) * 1852;
      expect(Math.abs(distM - (g.s12 as number))).toBeLessThan(0.001 * (g.s12 as number) + 3); // 0.1 % + rounding (0.001 NM)
      if ((g.s12 as number) > 4000) {
        expect(angErr((Math.atan2(e, nn) * 180) / Math.PI, g.azi1 as number)).toBeLessThan(0.1);
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(20);
  });

  it('names the largest |compass error| where the card is reliable first, and its peaks a minute apart (brute force)', () => {
    let iMax = -1;
    for (let i = 0; i < a.compass.n; i++) {
      if (a.compass.unreliable[i] !== 0) continue;
      if (iMax < 0 || Math.abs(a.compass.errorDeg[i]) > Math.abs(a.compass.errorDeg[iMax])) iMax = i;
    }
    const peaks = m.glance.biggestErrors;
    expect(peaks.length).toBe(5);
    expect(peaks[0].errorDeg).toBe(a.compass.errorDeg[iMax]);
    expect(peaks[0].tUtc).toBe(a.state.t[iMax]);
    for (let p = 0; p < peaks.length; p++) for (let q = p + 1; q < peaks.length; q++) expect(Math.abs(peaks[p].tUtc - peaks[q].tUtc)).toBeGreaterThanOrEqual(60);
    expect(m.glance.maxAbsErrorDeg).toBe(Math.abs(a.compass.errorDeg[iMax]));
  });

  it('draws the largest error even though most samples are thinned away', () => {
    const drawnMax = Math.max(...s.errorDeg.map((e, k) => (s.unreliable[k] ? 0 : Math.abs(e ?? 0))));
    expect(Math.abs(drawnMax - m.glance.maxAbsErrorDeg)).toBeLessThanOrEqual(0.05 + 1e-9);
  });

  it('draws the start, end and peak of every divergence window', () => {
    const drawnRows = new Set(s.row);
    for (const d of a.analysis.divergences) {
      expect(drawnRows.has(d.startIndex)).toBe(true);
      expect(drawnRows.has(d.endIndex)).toBe(true);
    }
    expect(m.divergences.length).toBe(a.analysis.divergences.length);
    expect(m.divergences[0].label).toBe('D1');
  });

  it('reports the log gap as a span between the two segments and breaks the drawn segments there', () => {
    expect(m.health.gapSpans.length).toBe(1);
    expect(m.health.gapSpans[0].t1Utc - m.health.gapSpans[0].t0Utc).toBeCloseTo(25.1, 6);
    expect(new Set(s.seg).size).toBe(2);
    expect(m.health.medianStepS).toBeCloseTo(0.1, 5); // UTC seconds near 1.8e9 carry ~1e-7 s of float noise
  });

  it('reports the wind used with its source, and the variation and dip range along the path', () => {
    expect(m.glance.winds).toHaveLength(1);
    expect(m.glance.winds[0]).toMatchObject({ fromDegTrue: 250, source: 'given' });
    expect(m.glance.winds[0].speedKt).toBeCloseTo(15, 9);
    let vMin = Infinity;
    let vMax = -Infinity;
    for (const v of a.field.variationDeg) {
      vMin = Math.min(vMin, v);
      vMax = Math.max(vMax, v);
    }
    expect(m.glance.variationMinDeg).toBe(vMin);
    expect(m.glance.variationMaxDeg).toBe(vMax);
    expect(m.glance.fieldModel).toBe('WMM2025');
  });

  it('puts a compass leg’s believed track on the plan view’s frame, starting where the leg starts', () => {
    const x = a.analysis.excursions[0];
    const row = m.excursions[0];
    expect(row.believedEastNm.length).toBeGreaterThan(10);
    expect(row.believedEastNm.length).toBeLessThanOrEqual(401);
    const k = s.row.indexOf(x.startIndex); // the leg's start is a forced drawn row
    expect(k).toBeGreaterThanOrEqual(0);
    expect(Math.abs((row.believedEastNm[0] as number) - (s.eastNm[k] as number))).toBeLessThanOrEqual(0.002);
    expect(Math.abs((row.believedNorthNm[0] as number) - (s.northNm[k] as number))).toBeLessThanOrEqual(0.002);
    expect(row.observedCrossTrackNm).toBeCloseTo(820 / 1852, 12); // 1 NM = 1852 m exactly
  });

  it('lets the options override the log’s own title, aircraft and pilot', () => {
    const o = buildReportModel(a, { title: 'Lesson 7', aircraft: 'Fenbird 2 (training)', pilot: 'R. Adeyemi-Holm' });
    expect(o.title).toBe('Lesson 7');
    expect(o.meta.aircraft).toBe('Fenbird 2 (training)');
    expect(o.meta.pilot).toBe('R. Adeyemi-Holm');
    expect(m.meta.pilot).toBe('P. Okonkwo-Lindqvist');
    expect(m.generatedAtUtc).toBe('2026-05-04T12:00:00.000Z');
  });

  it('draws every sample of a short flight', () => {
    const short = buildReportModel(syntheticFlight({ durationS: 60, hz: 5 }), {});
    expect(short.series.n).toBe(300);
    expect(short.downsample.method).toBe('every sample is drawn');
  });

  it('rejects a drawing budget below 200 points with an OptionError naming maxDrawnPoints', () => {
    expect(() => buildReportModel(a, { maxDrawnPoints: 50 })).toThrow(OptionError);
    expect(() => buildReportModel(a, { maxDrawnPoints: 50 })).toThrow(/maxDrawnPoints/);
  });
});
