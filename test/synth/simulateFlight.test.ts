// The simulator's truth must obey relations it does not compute itself: geodesy (GeographicLib), the wind
// triangle, coordinated-turn kinematics and plain calculus (finite differences).
import { describe, expect, it } from 'vitest';
import geodesic from 'geographiclib-geodesic';
import { simulateFlight } from '../../src/synth/simulateFlight.js';
import type { FlightScript, ScriptLeg } from '../../src/synth/flightScript.js';
import { OptionError } from '../../src/errors.js';

const WGS84 = geodesic.Geodesic.WGS84;
const KT = 1852 / 3600; // exact, international knot
const G = 9.80665; // standard gravity, BIPM SI Brochure
const D2R = Math.PI / 180;
const T0 = Date.UTC(2026, 4, 4, 10, 0, 0) / 1000;

// Geodesy checks fly at height 0: at height h the path over the ellipsoid is shorter by about h / R
// (1e-4 at 600 m), which the velocity check below corrects for explicitly.
function script(legs: ScriptLeg[], extra: Partial<FlightScript> = {}, tasMs = 100 * KT, headingDegTrue = 0, latDeg = 52.6): FlightScript {
  return { start: { t0: T0, latDeg, lonDeg: 0.4, altM: 0, headingDegTrue, tasMs }, legs, ...extra };
}

/** Mean Earth radius [m] (IUGG, R₁ = (2a + b) / 3), only to scale surface distances to flight height. */
const R_MEAN_M = 6371008.8;

/** Geodesic distance [m] and forward azimuth [deg] between two rows, by GeographicLib (Karney 2013). */
function inverse(lat1: number, lon1: number, lat2: number, lon2: number): { s12: number; azi1: number } {
  const r = WGS84.Inverse(lat1, lon1, lat2, lon2);
  return { s12: r.s12 as number, azi1: r.azi1 as number };
}

/** Circumradius of three points from their geodesic side lengths (plane formula R = abc / 4K, Heron's area). */
function circumradiusM(lat: Float64Array, lon: Float64Array, i: number, j: number, k: number): number {
  const a = inverse(lat[i], lon[i], lat[j], lon[j]).s12;
  const b = inverse(lat[j], lon[j], lat[k], lon[k]).s12;
  const c = inverse(lat[k], lon[k], lat[i], lon[i]).s12;
  const s = (a + b + c) / 2;
  const area = Math.sqrt(s * (s - a) * (s - b) * (s - c));
  return (a * b * c) / (4 * area);
}

describe('simulateFlight: coordinated turns', () => {
  it('banks as the standard-rate table says: 90/100/120/150 kt → 13.9/15.4/18.2/22.4° (PHYSICS.md check 16, tan φ = Vω/g)', () => {
    const table: Array<[number, number]> = [[90, 13.9], [100, 15.4], [120, 18.2], [150, 22.4]];
    for (const [kt, bank] of table) {
      const tr = simulateFlight(script([{ kind: 'orbit', direction: 'right' }], {}, kt * KT));
      expect(Math.abs(tr.bankDeg[60] - bank)).toBeLessThan(0.1);
      expect(tr.turnRateDps[60]).toBeCloseTo(3, 12);
    }
  });

  it('turns at 6.31 °/s with radius 467 m for 100 kt and 30° bank (PHYSICS.md check 18; R measured with GeographicLib)', () => {
    const tr = simulateFlight(script([{ kind: 'orbit', direction: 'left', bankDeg: 30 }], { sampleRateHz: 10 }));
    const i = 200; // established (roll-in is 2 s)
    expect(Math.abs(tr.turnRateDps[i] + 6.31)).toBeLessThan(0.01); // left turn: rate negative
    expect(tr.bankDeg[i]).toBeCloseTo(-30, 9);
    const r = circumradiusM(tr.lat, tr.lon, 100, 250, 400);
    expect(Math.abs(r - 467) / 467).toBeLessThan(0.005);
  });

  it('flies a calm standard-rate circle of radius V/ω (983 m at 100 kt, PHYSICS.md check 17) measured from positions by GeographicLib', () => {
    const tr = simulateFlight(script([{ kind: 'turn', direction: 'right', byDeg: 720 }]));
    const rExpected = (100 * KT) / (3 * D2R); // R = V / ω, handbook
    expect(Math.abs(rExpected - 983) / 983).toBeLessThan(0.005);
    for (const [i, j, k] of [[10, 30, 50], [40, 70, 100], [60, 100, 140], [150, 190, 230]]) {
      const r = circumradiusM(tr.lat, tr.lon, i, j, k);
      // meridian convergence bends the path by sin ψ tan φ / Rₑ ≈ 2e-7 /m against 1e-3 /m: well under 1e-3 relative
      expect(Math.abs(r - rExpected) / rExpected).toBeLessThan(1e-3);
    }
  });

  it('takes 120 s per 360° at standard rate: in calm air the track returns to the same point after 120 s, and is 2R away after 60 s (FAA-H-8083-15B ch. 7)', () => {
    const rExpected = (100 * KT) / (3 * D2R);
    // On the equator true north does not rotate as the aircraft moves east (λ'·sin φ = 0): the circle closes.
    const eq = simulateFlight(script([{ kind: 'turn', direction: 'left', byDeg: 1080 }], {}, 100 * KT, 0, 0));
    // At 52.6 N the heading is held against a north that turns by Δλ·sin φ (≈ 4e-4 rad across the circle):
    // the circle drifts by about 0.6 m per turn.
    const mid = simulateFlight(script([{ kind: 'turn', direction: 'left', byDeg: 1080 }]));
    for (const i of [10, 77, 150, 200]) {
      expect(inverse(eq.lat[i], eq.lon[i], eq.lat[i + 120], eq.lon[i + 120]).s12).toBeLessThan(0.01);
      expect(Math.abs(inverse(eq.lat[i], eq.lon[i], eq.lat[i + 60], eq.lon[i + 60]).s12 - 2 * rExpected)).toBeLessThan(0.01);
      expect(inverse(mid.lat[i], mid.lon[i], mid.lat[i + 120], mid.lon[i + 120]).s12).toBeLessThan(1);
    }
  });

  it('has horizontal acceleration g·tan φ in a level coordinated turn, from finite differences of GeographicLib-derived velocity (PHYSICS.md §7)', () => {
    const tr = simulateFlight(script([{ kind: 'orbit', direction: 'right', bankDeg: 25 }], { sampleRateHz: 10 }));
    for (const i of [100, 300, 555]) {
      // velocity from positions 0.1 s either side, then its change over 0.2 s
      const v = (a: number, b: number): [number, number] => {
        const r = inverse(tr.lat[a], tr.lon[a], tr.lat[b], tr.lon[b]);
        const s = r.s12 / (tr.t[b] - tr.t[a]);
        return [s * Math.cos(r.azi1 * D2R), s * Math.sin(r.azi1 * D2R)];
      };
      const v1 = v(i - 2, i);
      const v2 = v(i, i + 2);
      const aH = Math.hypot(v2[0] - v1[0], v2[1] - v1[1]) / 0.2;
      expect(Math.abs(aH - G * Math.tan(25 * D2R))).toBeLessThan(0.01);
    }
  });

  it('ends a turn to a heading on that heading, with the change flown in the turn direction', () => {
    const tr = simulateFlight(script([{ kind: 'turn', direction: 'left', toHeadingDegTrue: 270 }], {}, 50, 180));
    expect(tr.legs[0].headingEndDegTrue).toBeCloseTo(270, 9);
    expect(tr.legs[0].headingChangeDeg).toBeCloseTo(270, 9);
    expect(tr.turnRateDps[50]).toBeLessThan(0);
  });

  it('turns rate × duration in a timed turn (the duration runs from roll-in start to roll-out start)', () => {
    const tr = simulateFlight(script([{ kind: 'turn', direction: 'right', durationS: 30, rollTimeS: 3 }]));
    expect(tr.legs[0].headingEndDegTrue).toBeCloseTo(90, 9);
    expect(tr.legs[0].rolloutStartT - tr.legs[0].startT).toBeCloseTo(30, 6);
  });

  it('ramps the bank smoothly: no jump between samples larger than the roll-in allows', () => {
    const tr = simulateFlight(script([{ kind: 'straight', durationS: 5 }, { kind: 'orbit', direction: 'right' }], { sampleRateHz: 10 }));
    let maxStep = 0;
    const tanB = (i: number): number => Math.tan(tr.bankDeg[i] * D2R);
    for (let i = 1; i < tr.n; i++) maxStep = Math.max(maxStep, Math.abs(tanB(i) - tanB(i - 1)));
    const bank = tr.legs[1].bankDeg ?? NaN;
    // tan φ ∝ ω follows a smoothstep over 2 s whose steepest slope is 15/8 per ramp: ≤ tan φ · 15/8 · 0.1/2 per sample
    expect(maxStep).toBeLessThan(Math.tan(bank * D2R) * (15 / 8) * 0.05 + 1e-12);
    expect(maxStep).toBeGreaterThan(0.5 * Math.tan(bank * D2R) * (15 / 8) * 0.05);
  });

  it('lets a pilot decide the roll-out: it starts when rolloutWhen first says yes, plus the reaction time', () => {
    const tr = simulateFlight(
      script([{ kind: 'turn', direction: 'right', rolloutWhen: (v) => v.truth.headingDegTrue[v.index] >= 40, reactionS: 1 }]),
    );
    const rec = tr.legs[0];
    expect(rec.timedOut).toBe(false);
    // the smoothstep roll-in over 2 s turns ω·τ/2: heading = 3·(t − 1) once established, 40 at 14.33 s, first
    // sample at or past it 15 s, roll-out from 16 s (heading 45) adding another ω·τ/2 = 3°
    expect(rec.rolloutStartT - T0).toBeCloseTo(16, 6);
    expect(rec.headingEndDegTrue).toBeCloseTo(48, 9);
  });

  it('rolls out at maxDurationS when rolloutWhen never says yes, and flags it', () => {
    const tr = simulateFlight(script([{ kind: 'turn', direction: 'left', rolloutWhen: () => false, maxDurationS: 40 }]));
    expect(tr.legs[0].timedOut).toBe(true);
    expect(tr.t[tr.n - 1] - T0).toBeCloseTo(40, 6);
  });
});

describe('simulateFlight: straight legs and the wind triangle', () => {
  it('covers V·T along the meridian on a northbound calm leg: GeographicLib Inverse distance and azimuth 0', () => {
    const tr = simulateFlight(script([{ kind: 'straight', durationS: 600 }]));
    const r = inverse(tr.lat[0], tr.lon[0], tr.lat[tr.n - 1], tr.lon[tr.n - 1]);
    expect(Math.abs(r.s12 - 100 * KT * 600)).toBeLessThan(1e-3);
    expect(Math.abs(r.azi1)).toBeLessThan(1e-9);
    const d = WGS84.Direct(tr.lat[0], tr.lon[0], 0, 100 * KT * 600);
    expect(Math.abs((d.lat2 as number) - tr.lat[tr.n - 1]) * 111e3).toBeLessThan(1e-3);
  });

  it('flies V·T at its own height: at 3000 m the distance over the ellipsoid is V·T·(1 − h/R) (GeographicLib Inverse)', () => {
    const s0 = script([{ kind: 'straight', durationS: 600 }]);
    const tr = simulateFlight({ ...s0, start: { ...s0.start, altM: 3000 } });
    const r = inverse(tr.lat[0], tr.lon[0], tr.lat[tr.n - 1], tr.lon[tr.n - 1]);
    const vt = 100 * KT * 600;
    expect(Math.abs(r.s12 / vt - (1 - 3000 / R_MEAN_M))).toBeLessThan(1e-5); // R_MEAN vs meridian radius: ~2e-6
    expect(Math.abs(r.s12 / vt - 1)).toBeGreaterThan(4e-4); // the height term is really there
  });

  it('follows the rhumb line of its heading on a calm 060 leg: matches GeographicLib Direct steps of 1 m at constant azimuth', () => {
    const tr = simulateFlight(script([{ kind: 'straight', durationS: 300 }], {}, 50, 60));
    let lat = tr.lat[0];
    let lon = tr.lon[0];
    for (let s = 0; s < 50 * 300; s++) {
      const d = WGS84.Direct(lat, lon, 60, 1);
      lat = d.lat2 as number;
      lon = d.lon2 as number;
    }
    const r = inverse(lat, lon, tr.lat[tr.n - 1], tr.lon[tr.n - 1]);
    expect(r.s12).toBeLessThan(0.01); // 1 m steps: geodesic-vs-rhumb offset per step ~1e-7 m, 15 000 steps
  });

  it('gives GS 102.0/120/102.0/80 kt for TAS 100 kt and wind 270/20 on headings N/E/S/W (PHYSICS.md check 29, KITPLANES), also from positions', () => {
    const expected: Array<[number, number]> = [[0, 102.0], [90, 120], [180, 102.0], [270, 80]];
    for (const [hdg, gsKt] of expected) {
      const tr = simulateFlight(script([{ kind: 'straight', durationS: 120 }], { wind: { fromDegTrue: 270, speedMs: 20 * KT } }, 100 * KT, hdg));
      expect(Math.abs(tr.gsMs[60] / KT - gsKt)).toBeLessThan(0.1);
      const r = inverse(tr.lat[0], tr.lon[0], tr.lat[120], tr.lon[120]);
      expect(Math.abs(r.s12 / 120 / KT - gsKt)).toBeLessThan(0.1);
    }
  });

  it('gives GS 76.5/87.9/128.7 kt on tracks 000/120/240 with TAS 100 kt and wind 045/30 (PHYSICS.md check 28)', () => {
    const w = { fromDegTrue: 45, speedMs: 30 * KT };
    const wN = -30 * Math.cos(45 * D2R); // air moves toward 225
    const wE = -30 * Math.sin(45 * D2R);
    for (const [track, gsKt] of [[0, 76.5], [120, 87.9], [240, 128.7]] as Array<[number, number]>) {
      // wind correction angle from the wind triangle: crosswind / TAS
      const cross = -wN * Math.sin(track * D2R) + wE * Math.cos(track * D2R);
      const heading = track - Math.asin(cross / 100) / D2R;
      const tr = simulateFlight(script([{ kind: 'straight', durationS: 10 }], { wind: w }, 100 * KT, (heading + 360) % 360));
      expect(Math.abs(((tr.trackDegTrue[5] - track + 540) % 360) - 180)).toBeLessThan(1e-6);
      expect(Math.abs(tr.gsMs[5] / KT - gsKt)).toBeLessThan(0.05);
    }
  });

  it('points the nose along the air vector: heading = direction of (ground velocity − wind), |v − w| = TAS·cos γ', () => {
    const tr = simulateFlight(
      script(
        [{ kind: 'orbit', direction: 'right' }, { kind: 'climb', toAltM: 900, rateMs: 4 }],
        { wind: { table: [{ altM: 500, fromDegTrue: 200, speedMs: 8 }, { altM: 1000, fromDegTrue: 260, speedMs: 15 }] } },
      ),
    );
    for (let i = 0; i < tr.n; i += 7) {
      const aN = tr.velN[i] - tr.windN[i];
      const aE = tr.velE[i] - tr.windE[i];
      const hdg = (Math.atan2(aE, aN) / D2R + 360) % 360;
      expect(Math.abs(((hdg - tr.headingDegTrue[i] + 540) % 360) - 180)).toBeLessThan(1e-9);
      const vs = -tr.velD[i];
      expect(Math.hypot(aN, aE, vs)).toBeCloseTo(tr.tasMs[i], 9);
    }
  });
});

describe('simulateFlight: calculus', () => {
  const busy = script(
    [
      { kind: 'straight', durationS: 3 },
      { kind: 'turn', direction: 'right', byDeg: 100, rollTimeS: 3 },
      { kind: 'speed', toTasMs: 60, accelMs2: 0.8 },
      { kind: 'climb', toAltM: 200, rateMs: 5 },
      { kind: 'orbit', direction: 'left', bankDeg: 30 },
      { kind: 'speed', toTasMs: 45, accelMs2: 1 },
    ],
    {
      sampleRateHz: 10,
      wind: { table: [{ altM: -50, fromDegTrue: 180, speedMs: 5 }, { altM: 250, fromDegTrue: 300, speedMs: 14 }] },
    },
    50,
  );

  it('has accelerations equal to the central finite difference of its velocities (turns, speed changes, climb in shear)', () => {
    const tr = simulateFlight(busy);
    let worst = 0;
    for (let i = 1; i < tr.n - 1; i++) {
      const dt = tr.t[i + 1] - tr.t[i - 1];
      const fd = [
        (tr.velN[i + 1] - tr.velN[i - 1]) / dt - tr.accN[i],
        (tr.velE[i + 1] - tr.velE[i - 1]) / dt - tr.accE[i],
        (tr.velD[i + 1] - tr.velD[i - 1]) / dt - tr.accD[i],
      ];
      worst = Math.max(worst, ...fd.map(Math.abs));
    }
    // central difference error h²/6·|v'''| (h = 0.1 s); largest at the climb ramps, where the vertical
    // speed's smoothstep has |vs'''| ≤ 60·vs/τ³ = 11 m/s⁴ (vs 5 m/s, τ 3 s) → 0.018 m/s²
    expect(worst).toBeLessThan(0.02);
  });

  it('has velocities equal to position differences measured by GeographicLib (north, east) and height differences (down)', () => {
    const tr = simulateFlight(busy);
    for (let i = 5; i < tr.n - 5; i += 13) {
      const r = inverse(tr.lat[i - 1], tr.lon[i - 1], tr.lat[i + 1], tr.lon[i + 1]);
      r.s12 *= 1 + tr.altM[i] / R_MEAN_M; // surface distance → distance at flight height
      const dt = tr.t[i + 1] - tr.t[i - 1];
      expect(Math.abs((r.s12 * Math.cos(r.azi1 * D2R)) / dt - tr.velN[i])).toBeLessThan(0.01);
      expect(Math.abs((r.s12 * Math.sin(r.azi1 * D2R)) / dt - tr.velE[i])).toBeLessThan(0.01);
      expect(Math.abs(-(tr.altM[i + 1] - tr.altM[i - 1]) / dt - tr.velD[i])).toBeLessThan(0.01);
    }
  });

  it('has a turn-rate column equal to the finite difference of its heading column', () => {
    const tr = simulateFlight(busy);
    for (let i = 1; i < tr.n - 1; i++) {
      const d = ((tr.headingDegTrue[i + 1] - tr.headingDegTrue[i - 1] + 540) % 360) - 180;
      expect(Math.abs(d / 0.2 - tr.turnRateDps[i])).toBeLessThan(0.02);
    }
  });

  it('has accelLong equal to dTAS/dt on a level speed change in calm air', () => {
    const tr = simulateFlight(script([{ kind: 'speed', toTasMs: 70, accelMs2: 0.7 }], { sampleRateHz: 10 }, 50, 33));
    for (let i = 1; i < tr.n - 1; i++) {
      expect(Math.abs((tr.tasMs[i + 1] - tr.tasMs[i - 1]) / 0.2 - tr.accelLongMs2[i])).toBeLessThan(0.01);
    }
    expect(tr.legs[0].tasEndMs).toBeCloseTo(70, 9);
  });

  it('is deterministic: the same script gives bit-identical columns', () => {
    const a = simulateFlight(busy);
    const b = simulateFlight(busy);
    expect(Array.from(a.lat)).toEqual(Array.from(b.lat));
    expect(Array.from(a.accE)).toEqual(Array.from(b.accE));
  });

  it('puts samples on t0 + k / rate from the start to the end of the last leg', () => {
    const tr = simulateFlight(script([{ kind: 'straight', durationS: 12.35 }], { sampleRateHz: 10 }));
    expect(tr.n).toBe(124);
    expect(tr.t[123] - T0).toBeCloseTo(12.3, 6); // t0 ≈ 1.8e9 s: a double resolves 2.4e-7 s
  });

  it('climbs and descends to the asked height and holds it', () => {
    const tr = simulateFlight(script([{ kind: 'climb', toAltM: 1000, rateMs: 3 }, { kind: 'straight', durationS: 10 }, { kind: 'climb', toAltM: 400, rateMs: -4 }]));
    expect(tr.legs[0].altEndM).toBeCloseTo(1000, 6);
    expect(tr.legs[2].altEndM).toBeCloseTo(400, 6);
    expect(Math.max(...tr.altM)).toBeLessThan(1000 + 1e-6);
    expect(Math.min(...tr.altM.subarray(tr.legs[0].endIndex))).toBeGreaterThan(400 - 1e-6); // no undershoot
  });
});

describe('simulateFlight: parameters', () => {
  it('rejects bad scripts with an OptionError naming the parameter', () => {
    const bad: Array<[FlightScript, string]> = [
      [script([{ kind: 'turn', direction: 'right', byDeg: 90, toHeadingDegTrue: 10 }]), 'legs[0]'],
      [script([{ kind: 'turn', direction: 'right', byDeg: 90, rateDps: 0 }]), 'legs[0].rateDps'],
      [script([{ kind: 'orbit', direction: 'right', bankDeg: 80 }]), 'legs[0].bankDeg'],
      [script([{ kind: 'straight', durationS: -1 }]), 'legs[0].durationS'],
      [script([], { sampleRateHz: 0 }), 'sampleRateHz'],
      [script([], { integrationHz: 20 }), 'integrationHz'],
      [script([{ kind: 'climb', toAltM: 900, rateMs: 40 }]), 'legs[0].rateMs'],
      [{ ...script([]), start: { ...script([]).start, tasMs: 0 } }, 'start.tasMs'],
    ];
    for (const [s, option] of bad) {
      let err: unknown;
      try {
        simulateFlight(s);
      } catch (e) {
        err = e;
      }
      expect(err).toBeInstanceOf(OptionError);
      expect((err as OptionError).option).toBe(option);
    }
  });
});
