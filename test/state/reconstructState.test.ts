// The state stage end to end on flights built analytically in test/state/syntheticTurns.ts (positions
// placed on WGS-84 with GeographicLib; truth heading from the construction, truth bank from
// tan φ = V ω / g for a level coordinated turn, PHYSICS.md §7). Tolerances are the product's targets
// (heading within 1.5° at the 95th percentile in steady flight, from the issue).
import geodesic from 'geographiclib-geodesic';
import { describe, expect, it } from 'vitest';
import type { FlightLog } from '../../src/log/flightLog.js';
import { reconstructState } from '../../src/state/reconstructState.js';
import { absQuantile, gaussianSource, makeFlight, type FlightSpec } from './syntheticTurns.js';

const geod = geodesic.Geodesic.WGS84;
const wrap = (d: number): number => ((((d + 180) % 360) + 360) % 360) - 180;
const D2R = Math.PI / 180;

const turn = (hz: number, over: Partial<FlightSpec> = {}): FlightSpec => ({
  latDeg: 52.1, lonDeg: -1.3, altM: 600, tasMs: 50,
  headingDeg: (t) => 10 + 3 * t, rateDps: () => 3,
  windFromDeg: 250, windMs: 10, hz, durationS: 300, noiseM: 2, seed: 7, ...over,
});

/** Errors over the steady middle of a flight (first and last 15 s left out: smoother end effects). */
function errors(spec: FlightSpec, opts: Parameters<typeof reconstructState>[1], withVel = false) {
  const f = makeFlight(spec);
  if (withVel) {
    const rnd = gaussianSource(99);
    f.log.gsMs = Float64Array.from(f.truth.gsMs, (v) => v + 0.2 * rnd());
    f.log.trackDegTrue = Float64Array.from(f.truth.trackDeg, (v, i) => v + ((0.2 * rnd()) / f.truth.gsMs[i]) / D2R);
  }
  const st = reconstructState(f.log, opts);
  const heading: number[] = [], bank: number[] = [], rate: number[] = [], track: number[] = [];
  for (let i = 0; i < st.n; i++) {
    const ts = f.truth.tS[i];
    if (ts < 15 || ts > spec.durationS - 15) continue;
    heading.push(wrap(st.headingDegTrue[i] - f.truth.headingDeg[i]));
    track.push(wrap(st.trackDegTrue[i] - f.truth.trackDeg[i]));
    bank.push(st.bankDeg[i] - f.truth.bankDeg[i]);
    rate.push(st.turnRateDps[i] - f.truth.rateDps[i]);
  }
  const median = (a: number[]): number => [...a].sort((x, y) => x - y)[a.length >> 1];
  return { st, f, heading, bank, rate, track, medianBank: median(bank) };
}

const given = { kind: 'given', fromDegTrue: 250, speedMs: 10 } as const;

describe('steady coordinated turn in a 10 m/s wind, 2 m GPS noise (truth: construction + GeographicLib)', () => {
  for (const hz of [1, 10]) {
    it(`at ${hz} Hz: heading within 1.5° (95th pct), bank within 3° (95th) and unbiased to 0.5°, rate within 0.6°/s`, () => {
      const e = errors(turn(hz), { wind: given });
      expect(absQuantile(e.heading, 0.95)).toBeLessThan(1.5);
      expect(absQuantile(e.bank, 0.95)).toBeLessThan(3);
      expect(Math.abs(e.medianBank)).toBeLessThan(0.5);
      expect(absQuantile(e.rate, 0.95)).toBeLessThan(0.6);
      // The truth bank is the handbook one: atan(50 m/s × 3°/s / g) = 14.95°.
      expect(e.f.truth.bankDeg[10]).toBeCloseTo(Math.atan((50 * 3 * D2R) / 9.80665) / D2R, 9);
    });
  }
  it('a 30° bank left turn at 60 m/s (1 Hz): bank −30 ± 3° (95th), heading within 1.5°', () => {
    const rate = -((9.80665 * Math.tan(30 * D2R)) / 60) / D2R;
    const e = errors(turn(1, { tasMs: 60, headingDeg: (t) => 200 + rate * t, rateDps: () => rate, seed: 3 }), { wind: given });
    expect(e.f.truth.bankDeg[5]).toBeCloseTo(-30, 9);
    expect(absQuantile(e.heading, 0.95)).toBeLessThan(1.5);
    expect(absQuantile(e.bank, 0.95)).toBeLessThan(3);
  });
  it('logged ground speed/track (Doppler, 0.2 m/s) tighten the heading to 0.5° (95th pct)', () => {
    const e = errors(turn(1), { wind: given }, true);
    expect(absQuantile(e.heading, 0.95)).toBeLessThan(0.5);
  });
  it('with the wrong (calm) wind, heading equals track and the "no wind" warning is raised', () => {
    const e = errors(turn(1), { wind: { kind: 'calm' } });
    const w = e.st.warnings.find((x) => x.code === 'no-wind');
    expect(w?.message).toBe('no wind: heading taken equal to track');
    for (let i = 0; i < e.st.n; i++) {
      if (Number.isFinite(e.st.headingDegTrue[i])) expect(Math.abs(wrap(e.st.headingDegTrue[i] - e.st.trackDegTrue[i]))).toBeLessThan(1e-9);
    }
    // and the ground track itself is still right
    expect(absQuantile(e.track, 0.95)).toBeLessThan(1.5);
  });
});

describe('velocities are expressed in each sample\'s own NED frame', () => {
  it('a 200 km straight geodesic flight at 60°N: track equals the GeographicLib azimuth at each point within 0.05°', () => {
    const line = geod.DirectLine(60, 5, 80, 220000);
    const n = 3600;
    const t = new Float64Array(n), lat = new Float64Array(n), lon = new Float64Array(n), altM = new Float64Array(n).fill(0); // on the ellipsoid, where geodesic distance is ground distance
    const azi = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const p = line.Position(60 * i);
      t[i] = 1_780_000_000 + i;
      lat[i] = p.lat2!;
      lon[i] = p.lon2!;
      azi[i] = p.azi2!;
    }
    const log: FlightLog = { source: { format: 'csv', file: 'g.csv', warnings: [], meta: {}, altDatum: 'ellipsoid' }, t, lat, lon, altM, line: Int32Array.from({ length: n }, (_, i) => i + 1) };
    const st = reconstructState(log, { wind: { kind: 'calm' } });
    let worst = 0;
    for (let i = 10; i < n - 10; i++) worst = Math.max(worst, Math.abs(wrap(st.trackDegTrue[i] - azi[i])));
    expect(worst).toBeLessThan(0.05);
    // the azimuth itself changes by more than 2° along the line, so a single frame would not do
    expect(Math.abs(wrap(azi[n - 1] - azi[0]))).toBeGreaterThan(2);
    expect(Math.abs(st.gsMs[n >> 1] - 60)).toBeLessThan(0.01);
    expect(Math.abs(st.bankDeg[n >> 1])).toBeLessThan(0.1);
  });
});

describe('bad samples', () => {
  it('a 300 m position spike is skipped, counted with its source line, and does not move the track', () => {
    const f = makeFlight(turn(1, { durationS: 200 }));
    const clean = reconstructState(f.log, { wind: given });
    const k = 100;
    // Move fix k 300 m north (0.0027° of latitude ≈ 300 m: 1° ≈ 111.25 km at 52°N).
    const d = geod.Direct(f.log.lat[k], f.log.lon[k], 0, 300);
    f.log.lat[k] = d.lat2!;
    const st = reconstructState(f.log, { wind: given });
    const w = st.warnings.find((x) => x.code === 'state-position-spike');
    expect(w?.count).toBe(1);
    expect(w?.lines).toEqual([f.log.line[k]]);
    const moved = geod.Inverse(st.lat[k], st.lon[k], clean.lat[k], clean.lon[k]).s12!;
    expect(moved).toBeLessThan(2);
    expect(Math.abs(wrap(st.headingDegTrue[k] - clean.headingDegTrue[k]))).toBeLessThan(0.5);
  });
  it('a 60 s gap splits the flight, nothing is invented inside it, and the state after it does not remember before', () => {
    // North at 50 m/s for 120 s, 60 s without fixes, then east.
    const n0 = 120;
    const rows: { t: number; lat: number; lon: number }[] = [];
    let p = { lat: 52, lon: 0 };
    for (let i = 0; i < n0; i++) { rows.push({ t: i, ...p }); const d = geod.Direct(p.lat, p.lon, 0, 50); p = { lat: d.lat2!, lon: d.lon2! }; }
    for (let i = 0; i < n0; i++) { const d = geod.Direct(p.lat, p.lon, 90, 50); p = { lat: d.lat2!, lon: d.lon2! }; rows.push({ t: n0 + 60 + i, ...p }); }
    const n = rows.length;
    const log: FlightLog = {
      source: { format: 'csv', file: 'gap.csv', warnings: [], meta: {}, altDatum: 'ellipsoid' },
      t: Float64Array.from(rows, (r) => 1_780_000_000 + r.t), lat: Float64Array.from(rows, (r) => r.lat), lon: Float64Array.from(rows, (r) => r.lon),
      altM: new Float64Array(n).fill(500), line: Int32Array.from({ length: n }, (_, i) => i + 1),
    };
    const st = reconstructState(log, { wind: { kind: 'calm' } });
    expect(st.n).toBe(n);
    expect(st.segment[n0 - 1]).toBe(0);
    expect(st.segment[n0]).toBe(1);
    const gap = st.warnings.find((x) => x.code === 'state-gap');
    expect(gap?.count).toBe(1);
    expect(gap?.lines).toEqual([n0 + 1]);
    // Last sample before and first after: pure north and pure east, no blending across the gap.
    expect(Math.abs(wrap(st.trackDegTrue[n0 - 1] - 0))).toBeLessThan(0.5);
    expect(Math.abs(wrap(st.trackDegTrue[n0] - 90))).toBeLessThan(0.5);
    expect(Math.abs(st.gsMs[n0] - 50)).toBeLessThan(0.5);
  });
  it('rows without position and rows earlier than the row before are left out and counted with their lines', () => {
    const f = makeFlight(turn(1, { durationS: 60 }));
    f.log.lat[10] = NaN;
    f.log.t[20] = f.log.t[19] - 5;
    const st = reconstructState(f.log, { wind: given });
    expect(st.n).toBe(f.log.t.length - 2);
    expect(st.warnings.find((x) => x.code === 'state-no-position')?.lines).toEqual([f.log.line[10]]);
    expect(st.warnings.find((x) => x.code === 'state-time-backwards')?.lines).toEqual([f.log.line[20]]);
    expect(st.logRow[10]).toBe(11);
  });
  it('a parked aircraft (2 m noise) has no heading or bank, with a low-speed warning counting every sample', () => {
    const n = 120;
    const rnd = gaussianSource(5);
    const log: FlightLog = {
      source: { format: 'csv', file: 'parked.csv', warnings: [], meta: {}, altDatum: 'ellipsoid' },
      t: Float64Array.from({ length: n }, (_, i) => 1_780_000_000 + i),
      lat: Float64Array.from({ length: n }, () => 52 + (2 * rnd()) / 111_250),
      lon: Float64Array.from({ length: n }, () => 0 + (2 * rnd()) / 68_600),
      altM: Float64Array.from({ length: n }, () => 20 + 3 * rnd()),
      line: Int32Array.from({ length: n }, (_, i) => i + 1),
    };
    const st = reconstructState(log, { wind: { kind: 'given', fromDegTrue: 0, speedMs: 20 } });
    expect(st.warnings.find((x) => x.code === 'state-low-speed')?.count).toBe(n);
    for (let i = 0; i < n; i++) expect(st.headingDegTrue[i]).toBeNaN();
  });
});

describe('contract', () => {
  it('does not modify the log and fills every column with n rows', () => {
    const f = makeFlight(turn(1, { durationS: 60 }));
    const before = Array.from(f.log.lat);
    const st = reconstructState(f.log, { wind: given });
    expect(Array.from(f.log.lat)).toEqual(before);
    for (const c of ['lat', 'lon', 'altM', 'velN', 'velE', 'velD', 'accN', 'accE', 'accD', 'accSigmaMs2', 'gsMs', 'trackDegTrue', 'windN', 'windE', 'tasMs', 'headingDegTrue', 'bankDeg', 'pitchDeg', 'turnRateDps', 'accelLongMs2'] as const) {
      expect(st[c].length).toBe(st.n);
    }
    expect(st.winds[0].source).toBe('given');
    // wind columns: from 250° → blowing toward 070°
    expect(Math.atan2(st.windE[0], st.windN[0]) / D2R).toBeCloseTo(70, 9);
  });
  it('throws OptionError for out-of-range options', () => {
    const f = makeFlight(turn(1, { durationS: 10 }));
    expect(() => reconstructState(f.log, { jerkPsdH: 0 })).toThrow(/jerkPsdH/);
    expect(() => reconstructState(f.log, { gapS: -1 })).toThrow(/gapS/);
    expect(() => reconstructState(f.log, { wind: { kind: 'given', fromDegTrue: 90, speedMs: 500 } })).toThrow(/wind/);
    expect(() => reconstructState(f.log, { aoaDeg: 60 })).toThrow(/aoaDeg/);
  });
});
