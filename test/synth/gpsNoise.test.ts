// GPS noise: seeded and reproducible, with the sigma and correlation the options ask for.
import { describe, expect, it } from 'vitest';
import geodesic from 'geographiclib-geodesic';
import { randomSpikes, toFlightLog, type GpsNoiseOptions } from '../../src/synth/gpsNoise.js';
import { mulberry32, seededNormal } from '../../src/synth/seededRandom.js';
import { simulateFlight } from '../../src/synth/simulateFlight.js';
import { OptionError } from '../../src/errors.js';

const WGS84 = geodesic.Geodesic.WGS84;
const T0 = Date.UTC(2026, 4, 4, 10, 0, 0) / 1000;
const D2R = Math.PI / 180;

const long = simulateFlight({
  start: { t0: T0, latDeg: 52.6, lonDeg: 0.4, altM: 0, headingDegTrue: 90, tasMs: 50 },
  legs: [{ kind: 'straight', durationS: 40000 }, { kind: 'orbit', direction: 'right' }, { kind: 'straight', durationS: 39870 }],
});

function opts(extra: Partial<GpsNoiseOptions> = {}): GpsNoiseOptions {
  return { posSigmaM: 2, altSigmaM: 3, seed: 42, file: 'synthetic.gpx', format: 'gpx', ...extra };
}

/** North/east/up error of each log row against its truth row; north/east by GeographicLib Inverse. */
function errors(log: ReturnType<typeof toFlightLog>): { n: number[]; e: number[]; u: number[] } {
  const out = { n: [] as number[], e: [] as number[], u: [] as number[] };
  for (let j = 0; j < log.t.length; j++) {
    const i = log.line[j] - 1;
    const r = WGS84.Inverse(long.lat[i], long.lon[i], log.lat[j], log.lon[j]);
    const s = r.s12 as number;
    const az = (r.azi1 as number) * D2R;
    out.n.push(s * Math.cos(az));
    out.e.push(s * Math.sin(az));
    out.u.push(log.altM[j] - long.altM[i]);
  }
  return out;
}

const sd = (x: number[]): number => {
  const m = x.reduce((a, b) => a + b, 0) / x.length;
  return Math.sqrt(x.reduce((a, b) => a + (b - m) ** 2, 0) / (x.length - 1));
};
const lag1 = (x: number[]): number => {
  const m = x.reduce((a, b) => a + b, 0) / x.length;
  let num = 0;
  let den = 0;
  for (let i = 0; i < x.length; i++) {
    den += (x[i] - m) ** 2;
    if (i > 0) num += (x[i] - m) * (x[i - 1] - m);
  }
  return num / den;
};

describe('seeded random numbers', () => {
  it('repeats for a seed and differs between seeds', () => {
    const a = mulberry32(7);
    const b = mulberry32(7);
    const c = mulberry32(8);
    const xa = [a(), a(), a()];
    expect([b(), b(), b()]).toEqual(xa);
    expect([c(), c(), c()]).not.toEqual(xa);
  });

  it('gives standard normal deviates: mean 0, sigma 1, 95.45 % within ±2 (normal distribution table)', () => {
    const z = seededNormal(123);
    const x = Array.from({ length: 200000 }, () => z());
    const m = x.reduce((p, q) => p + q, 0) / x.length;
    expect(Math.abs(m)).toBeLessThan(0.01); // 4.5 standard errors (1/√200000 = 0.0022)
    expect(Math.abs(sd(x) - 1)).toBeLessThan(0.01);
    const inside = x.filter((v) => Math.abs(v) < 2).length / x.length;
    expect(Math.abs(inside - 0.9545)).toBeLessThan(0.003);
  });
});

describe('toFlightLog', () => {
  it('is reproducible: the same seed gives the same log, another seed another', () => {
    const a = toFlightLog(long, opts());
    const b = toFlightLog(long, opts());
    const c = toFlightLog(long, opts({ seed: 43 }));
    expect(Array.from(a.lat.subarray(0, 500))).toEqual(Array.from(b.lat.subarray(0, 500)));
    expect(Array.from(a.lat.subarray(0, 500))).not.toEqual(Array.from(c.lat.subarray(0, 500)));
  });

  it('has the asked 1-sigma per axis (north, east from GeographicLib; up) within 10 %', () => {
    // 80 000 s with a 60 s correlation time: ~670 independent stretches, sigma known to ~3 % (1/√(2·670))
    const log = toFlightLog(long, opts());
    const e = errors(log);
    expect(Math.abs(sd(e.n) / 2 - 1)).toBeLessThan(0.1);
    expect(Math.abs(sd(e.e) / 2 - 1)).toBeLessThan(0.1);
    expect(Math.abs(sd(e.u) / 3 - 1)).toBeLessThan(0.1);
  });

  it('is white with whiteShare 1 (lag-1 correlation ≈ 0) and Gauss–Markov with whiteShare 0 (lag-1 ≈ e^(−Δt/τ), first-order Gauss–Markov autocorrelation)', () => {
    const white = errors(toFlightLog(long, opts({ whiteShare: 1 })));
    expect(Math.abs(lag1(white.n))).toBeLessThan(0.02);
    expect(Math.abs(sd(white.n) / 2 - 1)).toBeLessThan(0.02);
    const gm = errors(toFlightLog(long, opts({ whiteShare: 0, correlationTimeS: 20 })));
    expect(Math.abs(lag1(gm.e) - Math.exp(-1 / 20))).toBeLessThan(0.01);
    // default: a quarter of the variance white → lag-1 = 0.75·e^(−1/60)
    const mix = errors(toFlightLog(long, opts()));
    expect(Math.abs(lag1(mix.n) - 0.75 * Math.exp(-1 / 60))).toBeLessThan(0.03);
  });

  it('adds spikes at the asked rows and sizes, and leaves dropouts out as gaps', () => {
    const spikes = randomSpikes(long, 5, 150, 9);
    const log = toFlightLog(long, opts({ posSigmaM: 0, altSigmaM: 0, spikes, dropouts: [{ t0: T0 + 100, t1: T0 + 130 }] }));
    expect(log.t.length).toBe(long.n - 30);
    const gapRow = log.t.findIndex((t) => t >= T0 + 100);
    expect(log.t[gapRow]).toBe(T0 + 130);
    const e = errors(log);
    const big = e.n.map((n, j) => Math.hypot(n, e.e[j])).map((d, j) => [d, log.t[j]] as const).filter(([d]) => d > 1);
    expect(big.length).toBe(5);
    for (const [d, t] of big) {
      expect(Math.abs(d - 150)).toBeLessThan(1e-3);
      expect(spikes.some((s) => s.t === t)).toBe(true);
    }
  });

  it('keeps the noise of other rows when a dropout is added', () => {
    const a = toFlightLog(long, opts());
    const b = toFlightLog(long, opts({ dropouts: [{ t0: T0 + 10, t1: T0 + 20 }] }));
    const ia = Array.from(a.line).indexOf(501);
    const ib = Array.from(b.line).indexOf(501);
    expect(b.lat[ib]).toBe(a.lat[ia]);
  });

  it('adds Doppler-like velocity columns and true air data when asked, without changing the positions', () => {
    const plain = toFlightLog(long, opts());
    const log = toFlightLog(long, opts({ velocity: { sigmaMs: 0.1 }, airData: true }));
    expect(Array.from(log.lat.subarray(0, 100))).toEqual(Array.from(plain.lat.subarray(0, 100)));
    const dv = Array.from(log.gsMs ?? [], (g, j) => g - long.gsMs[j]);
    expect(Math.abs(sd(dv) - 0.1)).toBeLessThan(0.01);
    expect(log.headingRef).toBe('true');
    expect(log.headingDeg?.[40100]).toBe(long.headingDegTrue[40100]);
    expect(log.rollDeg?.[40050]).toBe(long.bankDeg[40050]);
  });

  it('rejects bad options with an OptionError naming them', () => {
    expect(() => toFlightLog(long, opts({ posSigmaM: -1 }))).toThrow(OptionError);
    expect(() => toFlightLog(long, opts({ whiteShare: 1.5 }))).toThrow(/whiteShare/);
    expect(() => toFlightLog(long, opts({ dropouts: [{ t0: 5, t1: 5 }] }))).toThrow(/dropouts\[0\]\.t1/);
    expect(() => toFlightLog(long, opts({ spikes: [{ t: T0 - 100, northM: 1, eastM: 1 }] }))).toThrow(/spikes\[0\]\.t/);
  });
});
