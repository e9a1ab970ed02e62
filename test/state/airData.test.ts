// Air data and pseudo-attitude against closed forms: tan φ = V ω / g for a level coordinated turn and the
// pseudo-roll check "a = (0, g tan 20°, 0) heading north → 20.0°" (PHYSICS.md §7, check 31); the wind
// triangle of KITPLANES "Finding TAS from GPS Data" (PHYSICS.md check 29: TAS 100 kt, wind 20 kt from
// 270, headings N/E/S/W → GS 102.0/120/102.0/80 kt); flight-path angle γ = atan2(climb, horizontal speed).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { computeAirData } from '../../src/state/airData.js';
import { windFromVector, windVectorNe } from '../../src/state/windOption.js';

const G = 9.80665; // standard gravity, BIPM
const KT = 1852 / 3600;
const D2R = Math.PI / 180;
const col = (...v: number[]): Float64Array => Float64Array.from(v);

function one(v: [number, number, number], a: [number, number, number], w: [number, number] = [0, 0], aoaDeg = 0) {
  const r = computeAirData(
    { velN: col(v[0]), velE: col(v[1]), velD: col(v[2]), accN: col(a[0]), accE: col(a[1]), accD: col(a[2]), windN: col(w[0]), windE: col(w[1]) },
    { aoaDeg },
  );
  return { gs: r.gsMs[0], track: r.trackDegTrue[0], tas: r.tasMs[0], heading: r.headingDegTrue[0], bank: r.bankDeg[0], pitch: r.pitchDeg[0], rate: r.turnRateDps[0], along: r.accelLongMs2[0], low: r.lowSpeed[0] };
}

describe('bank from coordinated flight', () => {
  it('pseudo-roll of a = (0, g tan 20°, 0) heading north is 20.0° right (PHYSICS.md check 31)', () => {
    expect(one([60, 0, 0], [0, G * Math.tan(20 * D2R), 0]).bank).toBeCloseTo(20, 6);
  });
  it('left turn heading 135° gives negative bank, rate and tan φ = V ω / g (level coordinated turn)', () => {
    const V = 55, phi = -25 * D2R, psi = 135 * D2R;
    const omega = (G * Math.tan(phi)) / V; // rad/s
    // Centripetal acceleration V ω, perpendicular to the velocity, toward the turn (left here).
    const r = one([V * Math.cos(psi), V * Math.sin(psi), 0], [-V * omega * Math.sin(psi), V * omega * Math.cos(psi), 0]);
    expect(r.bank).toBeCloseTo(-25, 6);
    expect(r.rate).toBeCloseTo(omega / D2R, 6);
    expect(r.heading).toBeCloseTo(135, 9);
  });
  it('uses air-relative quantities in wind: a circle in the air mass gives the same bank on every ground track', () => {
    const V = 50, omega = 3 * D2R;
    const w = windVectorNe(250, 12);
    for (let psiDeg = 0; psiDeg < 360; psiDeg += 30) {
      const psi = psiDeg * D2R;
      const r = one([V * Math.cos(psi) + w.windN, V * Math.sin(psi) + w.windE, 0], [-V * omega * Math.sin(psi), V * omega * Math.cos(psi), 0], [w.windN, w.windE]);
      expect(r.bank).toBeCloseTo(Math.atan((V * omega) / G) / D2R, 6);
      expect(r.rate).toBeCloseTo(3, 6);
      expect(r.tas).toBeCloseTo(V, 9);
      expect(Math.abs(((r.heading - psiDeg + 540) % 360) - 180)).toBeLessThan(1e-9);
    }
  });
});

describe('wind triangle (KITPLANES worked example, PHYSICS.md check 29)', () => {
  it('TAS 100 kt, wind 20 kt from 270: headings N/E/S/W give GS 102.0/120/102.0/80 kt and back TAS 100, those headings', () => {
    const w = windVectorNe(270, 20 * KT);
    const expected = [102.0, 120, 102.0, 80];
    [0, 90, 180, 270].forEach((h, k) => {
      const vN = 100 * KT * Math.cos(h * D2R) + w.windN;
      const vE = 100 * KT * Math.sin(h * D2R) + w.windE;
      const r = one([vN, vE, 0], [0, 0, 0], [w.windN, w.windE]);
      expect(r.gs / KT).toBeCloseTo(expected[k], 0);
      expect(Math.abs(r.gs / KT - expected[k])).toBeLessThan(0.1);
      expect(r.tas / KT).toBeCloseTo(100, 9);
      expect(Math.abs(((r.heading - h + 540) % 360) - 180)).toBeLessThan(1e-9);
    });
  });
  it('wind vectors: from 270 blows toward east; windFromVector inverts windVectorNe', () => {
    const w = windVectorNe(270, 10);
    expect(w.windE).toBeCloseTo(10, 12);
    expect(Math.abs(w.windN)).toBeLessThan(1e-12);
    for (const from of [0, 45, 181, 359.5]) expect(windFromVector(windVectorNe(from, 7).windN, windVectorNe(from, 7).windE).fromDegTrue).toBeCloseTo(from, 9);
  });
});

describe('pitch and longitudinal acceleration', () => {
  it('climb at 5 m/s and 50 m/s horizontal: pitch = atan2(5, 50) + α (wings level)', () => {
    expect(one([50, 0, -5], [0, 0, 0], [0, 0], 3).pitch).toBeCloseTo(Math.atan2(5, 50) / D2R + 3, 9);
  });
  it('accelerating 1 m/s² along a 060° track, level: accelLong = 1 (α = 0)', () => {
    const psi = 60 * D2R;
    expect(one([50 * Math.cos(psi), 50 * Math.sin(psi), 0], [Math.cos(psi), Math.sin(psi), 0]).along).toBeCloseTo(1, 9);
  });
});

describe('low speed', () => {
  it('leaves heading, bank, pitch, turn rate undefined (NaN) below 15 m/s TAS or 5 m/s ground speed, and flags the sample', () => {
    const slow = one([10, 0, 0], [0, 1, 0]);
    expect(slow.heading).toBeNaN();
    expect(slow.bank).toBeNaN();
    expect(slow.rate).toBeNaN();
    expect(slow.low).toBe(1);
    expect(slow.track).toBeCloseTo(0, 9);
    // Parked in a 20 m/s wind: TAS would be 20 m/s but the aircraft is not flying.
    const w = windVectorNe(0, 20);
    const parked = one([0.2, 0, 0], [0, 0, 0], [w.windN, w.windE]);
    expect(parked.heading).toBeNaN();
    expect(parked.track).toBeNaN();
    expect(one([40, 0, 0], [0, 0, 0]).low).toBe(0);
  });
  it('rejects an angle of attack outside −5..20° with an OptionError', () => {
    expect(() => one([40, 0, 0], [0, 0, 0], [0, 0], 45)).toThrow(/aoaDeg/);
  });
});

describe('computeAirData against the angle-by-angle definition', () => {
  it('matches ψ = atan2, φ = atan2(f·y_w, −f·z_w), θ = γ + α cos φ, accelLong = a·(cos θ cos ψ, cos θ sin ψ, −sin θ) with trigonometry of the angles, to 1e-9', () => {
    const plain = (v: number[], a: number[], w: number[], aoaDeg: number) => {
      const uN = v[0] - w[0], uE = v[1] - w[1], uD = v[2];
      const uh = Math.hypot(uN, uE), tas = Math.hypot(uN, uE, uD);
      const psi = Math.atan2(uE, uN);
      const xN = uN / tas, xE = uE / tas, xD = uD / tas, yN = -uE / uh, yE = uN / uh;
      const zN = -xD * yE, zE = xD * yN, zD = xN * yE - xE * yN;
      const fy = a[0] * yN + a[1] * yE, fz = a[0] * zN + a[1] * zE + (a[2] - G) * zD;
      const phi = Math.atan2(fy, -fz);
      const theta = Math.atan2(-uD, uh) + aoaDeg * D2R * Math.cos(phi);
      const ct = Math.cos(theta);
      return { bank: phi / D2R, pitch: theta / D2R, along: a[0] * ct * Math.cos(psi) + a[1] * ct * Math.sin(psi) - a[2] * Math.sin(theta) };
    };
    const comp = fc.double({ min: -80, max: 80, noNaN: true });
    const acc = fc.double({ min: -15, max: 15, noNaN: true });
    fc.assert(
      fc.property(fc.tuple(comp, comp, fc.double({ min: -10, max: 10, noNaN: true })), fc.tuple(acc, acc, acc), fc.tuple(fc.double({ min: -20, max: 20, noNaN: true }), fc.double({ min: -20, max: 20, noNaN: true })), fc.double({ min: -5, max: 20, noNaN: true }), (v, a, w, aoa) => {
        const r = one(v, a, w, aoa);
        if (r.low) return;
        const p = plain(v, a, w, aoa);
        expect(Math.abs(r.bank - p.bank)).toBeLessThan(1e-9);
        expect(Math.abs(r.pitch - p.pitch)).toBeLessThan(1e-9);
        expect(Math.abs(r.along - p.along)).toBeLessThan(1e-9);
      }),
      { numRuns: 5000, seed: 13 },
    );
  });
});
