// The compass as it really behaves: finite pendulosity, tilt lag and stop, liquid swirl (PHYSICS.md §1.3–1.6).
import { describe, expect, it } from 'vitest';
import { simulateCompass } from '../../src/compass/simulateCompass.js';
import { DEFAULT_COMPASS_PROFILE, TEXTBOOK_COMPASS_PROFILE, type CompassProfile } from '../../src/compass/compassProfile.js';
import { cardEquilibrium, magnetPerPendulosityFromResidualDip, newCardEquilibrium } from '../../src/compass/cardEquilibrium.js';
import { levelTurnReadingDeg } from '../../src/compass/turningError.js';
import { G, coordinatedTurnAccel, diff180, fieldVector, makeState, uniformField, type Sample } from './compassFixtures.js';

const DEG = Math.PI / 180;

describe('finite pendulosity (PHYSICS §1.3)', () => {
  it('steady coordinated turns converge to the textbook relation as pendulosity grows (residual dip → 0)', () => {
    const eq = newCardEquilibrium();
    const worstFor = (residualDipDeg: number) => {
      const eps = magnetPerPendulosityFromResidualDip(residualDipDeg, 20000, 45000);
      let worst = 0;
      for (const dip of [30, 55, 65]) {
        const [x, y, z] = fieldVector(20000, dip, 0);
        for (let h = 0; h < 360; h += 10) {
          const a = coordinatedTurnAccel(h, 15);
          cardEquilibrium(h, 0, 15, a.accN, a.accE, 0, x, y, z, eq, { tiltLimitDeg: 90, magnetPerPendulosityMs2PerNt: eps });
          worst = Math.max(worst, Math.abs(diff180(eq.readingDeg, levelTurnReadingDeg(h, 15, dip))));
        }
      }
      return worst;
    };
    const w = [5, 2, 0.5, 0.1, 0.01].map(worstFor);
    for (let i = 1; i < w.length; i++) expect(w[i]).toBeLessThan(w[i - 1]);
    expect(w[0]).toBeGreaterThan(0.01); // the finite card does differ
    expect(w[w.length - 1]).toBeLessThan(1e-3);
    expect(worstFor(0)).toBeLessThan(1e-9);
  });

  it('residual dip only shifts the level-flight reading by a second-order projection term (≤ 0.04° at 3°)', () => {
    const s: Sample[] = [];
    for (let h = 0; h < 360; h += 15) s.push({ t: 1.7e9 + h, headingDegTrue: h });
    s.forEach((p, i) => { p.segment = i; }); // each sample its own steady condition
    const tr = simulateCompass(makeState(s), uniformField(s.length, 20000, Math.atan2(45000, 20000) / DEG, 0), DEFAULT_COMPASS_PROFILE);
    for (let i = 0; i < tr.n; i++) {
      expect(tr.tiltDeg[i]).toBeCloseTo(3, 6); // the card sits north end down by the residual dip
      // flat card tilted by d about its E–W axis: tan(reading) = tan ψm / cos d (derived)
      const want = Math.atan2(Math.sin(s[i].headingDegTrue * DEG), Math.cos(s[i].headingDegTrue * DEG) * Math.cos(3 * DEG)) / DEG;
      expect(Math.abs(diff180(tr.readingDeg[i], want))).toBeLessThan(1e-6);
      expect(Math.abs(tr.errorDeg[i])).toBeLessThan(0.04);
    }
  });
});

describe('tilt lag and tilt stop (PHYSICS §1.5, §1.6)', () => {
  it('the card tilt follows apparent gravity as a first-order lag: 63.2 % of a step after τ', () => {
    const tau = 0.5;
    const s: Sample[] = [];
    for (let i = 0; i <= 500; i++) s.push({ t: 1.7e9 + i / 100, headingDegTrue: 0, accN: i >= 100 ? 0.1 * G : 0 });
    const prof: CompassProfile = { ...TEXTBOOK_COMPASS_PROFILE, tiltLagS: tau };
    const tr = simulateCompass(makeState(s), uniformField(s.length, 20000, 60, 0), prof);
    const target = Math.atan(0.1) / DEG;
    expect(tr.tiltDeg[99]).toBeLessThan(1e-9);
    // small-angle: the tilt angle of the lagged unit vector follows 1 − e^{−t/τ} to ~0.2 % (input ramps over 0.01 s)
    expect(tr.tiltDeg[100 + 50] / target).toBeCloseTo(1 - Math.exp(-1), 2);
    expect(tr.tiltDeg[100 + 150] / target).toBeCloseTo(1 - Math.exp(-3), 2);
    expect(tr.tiltDeg[500]).toBeCloseTo(target, 2); // 8 τ: e^{−8} = 3e-4 left
  });

  it('a straight climb at pitch 10 with a 5° stop reads 053.8 on heading 045, dip 65, and is flagged (PHYSICS §1.5)', () => {
    const s: Sample[] = [];
    for (let i = 0; i < 20; i++) s.push({ t: 1.7e9 + i, headingDegTrue: 45, pitchDeg: 10 });
    const tr = simulateCompass(makeState(s), uniformField(s.length, 20000, 65, 0), { ...TEXTBOOK_COMPASS_PROFILE, tiltLimitDeg: 5 });
    expect(tr.staticDeg[10]).toBeCloseTo(53.8, 1);
    expect(tr.readingDeg[10]).toBeCloseTo(53.8, 1);
    expect(tr.tiltDeg[10]).toBeCloseTo(5, 6);
    expect(tr.unreliable[10]).toBe(1);
  });
});

describe('liquid swirl (PHYSICS §1.6)', () => {
  /** Flat (unbanked, unaccelerated) turn at `rate` deg/s for `turnS`, then straight: isolates swirl from dip. */
  function flatTurn(rate: number, turnS: number, afterS: number, leadS = 0): Sample[] {
    const out: Sample[] = [];
    for (let i = 0; i <= leadS + turnS + afterS; i++) {
      const u = Math.min(Math.max(i - leadS, 0), turnS);
      const inTurn = i >= leadS && i < leadS + turnS;
      out.push({ t: 1.7e9 + i, headingDegTrue: rate * u, turnRateDps: inTurn ? rate : 0 });
    }
    return out;
  }
  const prof: CompassProfile = { ...TEXTBOOK_COMPASS_PROFILE, periodS: 4, dampingRatio: 0.7, swirlTimeConstantS: 10, swirlCoupling: 1 };

  it('check 15: fully spun-up swirl gives a steady lag asin(2ζω/ω_n): T0 4 s, ζ 0.7, 3°/s → 2.7° in the turn direction', () => {
    const s = flatTurn(3, 200, 0);
    const tr = simulateCompass(makeState(s), uniformField(s.length, 20000, 60, 0), prof);
    const want = Math.asin((2 * 0.7 * 3 * DEG) / ((2 * Math.PI) / 4)) / DEG;
    expect(want).toBeCloseTo(2.7, 1);
    expect(tr.errLagSwirlDeg[199]).toBeCloseTo(-want, 3); // right turn: the card is dragged right, the reading lags
    const left = simulateCompass(makeState(flatTurn(-3, 200, 0)), uniformField(201, 20000, 60, 0), prof);
    expect(left.errLagSwirlDeg[199]).toBeCloseTo(want, 3);
  });

  it('spins up with τ_s and vanishes again in straight flight', () => {
    const s = flatTurn(3, 200, 150, 20);
    const tr = simulateCompass(makeState(s), uniformField(s.length, 20000, 60, 0), prof);
    const full = -tr.errLagSwirlDeg[219];
    expect(full).toBeCloseTo(2.7, 1);
    expect(Math.abs(tr.errLagSwirlDeg[19])).toBeLessThan(1e-9); // straight lead-in: no swirl
    const afterTau = -tr.errLagSwirlDeg[30] / full; // ≈ 1 − e^{−1} = 0.63 after τ_s, minus the card's own response
    expect(afterTau).toBeGreaterThan(0.5);
    expect(afterTau).toBeLessThan(0.7);
    expect(Math.abs(tr.errLagSwirlDeg[370])).toBeLessThan(0.01 * full); // 15 τ_s after roll-out
    // without swirl the same flat turn leaves the card exactly on its equilibrium
    const none = simulateCompass(makeState(s), uniformField(s.length, 20000, 60, 0), { ...prof, swirlCoupling: 0 });
    for (let i = 0; i < none.n; i++) expect(Math.abs(none.errLagSwirlDeg[i])).toBeLessThan(1e-6);
  });

  it('adds to the turning error through the nearer pole and takes from it through the further one (src: Illustrated Dictionary of Aviation, "turning error")', () => {
    // Two full right turns (second lap spun up), dip 65, bank 15: compare the reading error with and without swirl.
    const rate = (G * Math.tan(15 * DEG)) / 50 / DEG;
    const st: Sample[] = [];
    for (let i = 0; rate * (i / 2) <= 760; i++) {
      const h = rate * (i / 2);
      const a = coordinatedTurnAccel(h, 15);
      st.push({ t: 1.7e9 + i / 2, headingDegTrue: h, bankDeg: 15, accN: a.accN, accE: a.accE, turnRateDps: rate });
    }
    const unwrapped = st.map((p) => p.headingDegTrue);
    const field = uniformField(st.length, 20000, 65, 0);
    const withSwirl = simulateCompass(makeState(st), field, { ...prof, residualDipDeg: 0 });
    const noSwirl = simulateCompass(makeState(st), field, { ...prof, residualDipDeg: 0, swirlCoupling: 0 });
    const at = (hdg: number) => unwrapped.findIndex((h) => h >= hdg);
    const iN = at(720), iS = at(540);
    // through N (nearer pole, NH) the error is a lag (negative): swirl makes it larger
    expect(noSwirl.errorDeg[iN]).toBeLessThan(-20);
    expect(withSwirl.errorDeg[iN]).toBeLessThan(noSwirl.errorDeg[iN] - 1);
    // through S the error is a lead (positive): swirl makes it smaller
    expect(noSwirl.errorDeg[iS]).toBeGreaterThan(20);
    expect(withSwirl.errorDeg[iS]).toBeLessThan(noSwirl.errorDeg[iS] - 1);
  });
});
