// calibrateProfile recovers known compass parameters from readings the model itself generated, plus noise.
import { describe, expect, it } from 'vitest';
import { calibrateProfile } from '../../src/compass/calibrateProfile.js';
import { simulateCompass } from '../../src/compass/simulateCompass.js';
import { DEFAULT_COMPASS_PROFILE, type CompassProfile } from '../../src/compass/compassProfile.js';
import { OptionError } from '../../src/errors.js';
import { G, makeState, uniformField, type Sample } from './compassFixtures.js';

const DEG = Math.PI / 180;

/** Seeded uniform generator (mulberry32) and standard normal by Box–Muller: repeatable test noise. */
function normalRng(seed: number): () => number {
  let a = seed >>> 0;
  const uni = () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return () => Math.sqrt(-2 * Math.log(1 - uni())) * Math.cos(2 * Math.PI * uni());
}

/**
 * A training flight at 10 Hz: speed changes on east and west, a right turn of 400° at bank 20 and a left turn of 300°
 * at bank 15, smooth roll-ins of 3 s; bank/heading/acceleration consistent with coordinated flight at 50 m/s.
 */
function trainingFlight(): Sample[] {
  type Piece = { dur: number; bank: number; aLongG: number };
  const pieces: Piece[] = [
    { dur: 20, bank: 0, aLongG: 0 }, { dur: 12, bank: 0, aLongG: 0.15 }, { dur: 15, bank: 0, aLongG: 0 },
    { dur: 12, bank: 0, aLongG: -0.15 }, { dur: 15, bank: 0, aLongG: 0 },
    { dur: 400 / ((G * Math.tan(20 * DEG)) / 50 / DEG), bank: 20, aLongG: 0 }, { dur: 25, bank: 0, aLongG: 0 },
    { dur: 300 / ((G * Math.tan(15 * DEG)) / 50 / DEG), bank: -15, aLongG: 0 }, { dur: 15, bank: 0, aLongG: 0 },
    { dur: 12, bank: 0, aLongG: 0.15 }, { dur: 15, bank: 0, aLongG: 0 }, { dur: 12, bank: 0, aLongG: -0.15 },
    { dur: 20, bank: 0, aLongG: 0 },
  ];
  const hz = 100, keep = 10;
  const out: Sample[] = [];
  let h = 90, t = 0, bank = 0, aLong = 0;
  const ease = 3; // s, first-order-like smoothing of the commanded bank and acceleration
  for (const pc of pieces) {
    for (let i = 0; i < Math.round(pc.dur * hz); i++) {
      bank += ((pc.bank - bank) / (ease * hz)) * 2;
      aLong += ((pc.aLongG * G - aLong) / (ease * hz)) * 2;
      const rate = (G * Math.tan(bank * DEG)) / 50 / DEG;
      const p = h * DEG, ac = G * Math.tan(bank * DEG);
      if (i % (hz / keep) === 0) {
        out.push({ t: 1.75e9 + t, headingDegTrue: h, bankDeg: bank, turnRateDps: rate,
          accN: -ac * Math.sin(p) + aLong * Math.cos(p), accE: ac * Math.cos(p) + aLong * Math.sin(p) });
      }
      h += rate / hz;
      t += 1 / hz;
    }
  }
  return out;
}

describe('calibrateProfile (Levenberg–Marquardt on the simulated trace)', () => {
  const flight = trainingFlight();
  const state = makeState(flight);
  const field = uniformField(flight.length, 20000, 66, 2);
  const truth: CompassProfile = { ...DEFAULT_COMPASS_PROFILE, periodS: 3.1, dampingRatio: 0.55, swirlCoupling: 0.6, residualDipDeg: 6 };
  const tr = simulateCompass(state, field, truth);
  const rnd = normalRng(7);
  const sigmaDeg = 0.3;
  const idx: number[] = [];
  for (let i = 0; i < flight.length; i += 5) idx.push(i); // readings at 2 Hz, as if read off a video
  const obs = {
    t: Float64Array.from(idx, (i) => flight[i].t),
    compassDeg: Float64Array.from(idx, (i) => (tr.readingDeg[i] + sigmaDeg * rnd() + 360) % 360),
  };

  it('recovers period, damping, swirl coupling and residual dip from noisy readings (σ 0.3°) within 4σ of its own uncertainty', () => {
    const res = calibrateProfile(state, field, obs, DEFAULT_COMPASS_PROFILE);
    expect(res.converged).toBe(true);
    expect(res.initialRmsDeg).toBeGreaterThan(1); // the start profile is visibly wrong
    expect(res.rmsDeg).toBeGreaterThan(0.8 * sigmaDeg);
    expect(res.rmsDeg).toBeLessThan(1.2 * sigmaDeg);
    const want: Record<string, number> = { periodS: 3.1, dampingRatio: 0.55, swirlCoupling: 0.6, residualDipDeg: 6 };
    const absTol: Record<string, number> = { periodS: 0.1, dampingRatio: 0.05, swirlCoupling: 0.1, residualDipDeg: 2 };
    for (const p of res.params) {
      expect(Number.isFinite(p.sigma)).toBe(true);
      expect(Math.abs(p.value - want[p.name])).toBeLessThan(Math.max(4 * p.sigma, 1e-6));
      expect(Math.abs(p.value - want[p.name])).toBeLessThan(absTol[p.name]);
    }
    expect(res.profile.periodS).toBe(res.params[0].value);
  });

  it('fits a subset and leaves the other fields as given', () => {
    const start = { ...truth, periodS: 5, dampingRatio: 0.9 };
    const res = calibrateProfile(state, field, obs, start, { params: ['periodS', 'dampingRatio'] });
    expect(res.profile.swirlCoupling).toBe(0.6);
    expect(res.profile.periodS).toBeCloseTo(3.1, 1);
    expect(res.profile.dampingRatio).toBeCloseTo(0.55, 1);
  });

  it('rejects unknown parameters, mismatched columns and too few readings with OptionError', () => {
    expect(() => calibrateProfile(state, field, obs, DEFAULT_COMPASS_PROFILE, { params: ['name' as never] })).toThrow(OptionError);
    expect(() => calibrateProfile(state, field, { t: obs.t, compassDeg: obs.compassDeg.subarray(1) }, DEFAULT_COMPASS_PROFILE)).toThrow(/observations/);
    expect(() => calibrateProfile(state, field, { t: obs.t.subarray(0, 3), compassDeg: obs.compassDeg.subarray(0, 3) }, DEFAULT_COMPASS_PROFILE)).toThrow(/usable/);
  });
});
