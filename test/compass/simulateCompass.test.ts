// simulateCompass: card dynamics, error split, segments, flags (PHYSICS.md §1.6; control relations after Ogata).
import { describe, expect, it } from 'vitest';
import { simulateCompass } from '../../src/compass/simulateCompass.js';
import { DEFAULT_COMPASS_PROFILE, TEXTBOOK_COMPASS_PROFILE, type CompassProfile } from '../../src/compass/compassProfile.js';
import {
  COMPASS_FLAG_BLACKOUT, COMPASS_FLAG_CAUTION, COMPASS_FLAG_NO_INPUT, COMPASS_FLAG_ON_STOP, COMPASS_FLAG_WEAK_DIRECTIVE,
} from '../../src/compass/compassTrace.js';
import { levelTurnReadingDeg } from '../../src/compass/turningError.js';
import { coordinatedTurnAccel, diff180, makeState, setField, uniformField, type Sample } from './compassFixtures.js';

const DEG = Math.PI / 180;

/** Straight, level, unaccelerated flight on a constant true heading. */
function straight(durS: number, hz: number, headingDegTrue: number): Sample[] {
  const out: Sample[] = [];
  for (let i = 0; i <= durS * hz; i++) out.push({ t: 1.7e9 + i / hz, headingDegTrue });
  return out;
}

/** Straight leg, then a steady coordinated level turn of `turnDeg` at `bank` (right +), then straight again. */
function legTurnLeg(hz: number, h0: number, bank: number, turnDeg: number, tasMs = 50, legS = 20): Sample[] {
  const rateDps = (9.80665 * Math.tan(Math.abs(bank) * DEG)) / tasMs / DEG * Math.sign(bank);
  const turnS = Math.abs(turnDeg / rateDps);
  const out: Sample[] = [];
  const total = 2 * legS + turnS;
  for (let i = 0; i <= total * hz; i++) {
    const s = i / hz;
    let h = h0, b = 0, r = 0;
    if (s > legS && s < legS + turnS) { h = h0 + rateDps * (s - legS); b = bank; r = rateDps; }
    if (s >= legS + turnS) h = h0 + Math.sign(bank) * turnDeg;
    const a = b !== 0 ? coordinatedTurnAccel(h, b) : { accN: 0, accE: 0 };
    out.push({ t: 1.7e9 + s, headingDegTrue: h, bankDeg: b, accN: a.accN, accE: a.accE, turnRateDps: r });
  }
  return out;
}

/**
 * A smooth coordinated level turn sampled at `hz`: bank rolls in and out over 4 s (raised cosine), heading rate
 * tan φ·g/V integrated at the sample rate by the trapezoid rule (use a high rate and subsample for fair comparisons).
 */
function smoothTurn(hz: number, h0: number, bank: number, turnDeg: number, tasMs = 50): Sample[] {
  const roll = 4, lead = 20;
  const rate = (b: number) => (9.80665 * Math.tan(b * DEG)) / tasMs / DEG;
  const hold = Math.abs(turnDeg / rate(bank)) - roll; // approximately; the turn ends where it ends
  const bankAt = (s: number) => {
    const u = s - lead;
    if (u <= 0 || u >= 2 * roll + hold) return 0;
    if (u < roll) return bank * 0.5 * (1 - Math.cos((Math.PI * u) / roll));
    if (u < roll + hold) return bank;
    return bank * 0.5 * (1 + Math.cos((Math.PI * (u - roll - hold)) / roll));
  };
  const out: Sample[] = [];
  let h = h0;
  const total = 2 * lead + 2 * roll + hold;
  for (let i = 0; i <= total * hz; i++) {
    const s = i / hz;
    if (i > 0) h += (0.5 * (rate(bankAt(s - 1 / hz)) + rate(bankAt(s)))) / hz;
    const b = bankAt(s);
    const a = coordinatedTurnAccel(h, b);
    out.push({ t: 1.7e9 + s, headingDegTrue: h, bankDeg: b, accN: a.accN, accE: a.accE, turnRateDps: rate(b) });
  }
  return out;
}

describe('card dynamics: second-order step response (Ogata, Modern Control Engineering, ch. 5 — chapter from memory)', () => {
  // Step of the field direction by 1° (card linear regime): y(t) = normalised reading change.
  function stepResponse(periodS: number, zeta: number) {
    const hz = 100;
    const s = straight(20, hz, 0);
    const f = uniformField(s.length, 20000, 60, 0);
    s.forEach((p, i) => { if (p.t - s[0].t >= 1) setField(f, i, 20000, 60, 1); });
    const prof: CompassProfile = { ...TEXTBOOK_COMPASS_PROFILE, periodS, dampingRatio: zeta, refHorizontalNt: 20000 };
    const tr = simulateCompass(makeState(s), f, prof);
    const t = s.map((p) => p.t - s[0].t - 1);
    const y = Array.from(tr.dynamicDeg, (d) => -diff180(d, 0)); // reading goes 000 → 359: normalised 0 → 1
    return { t, y, tr };
  }

  it('overshoot = exp(−ζπ/√(1−ζ²)) and peak time = π/(ω_n√(1−ζ²)) for T0 4 s, ζ 0.4', () => {
    const zeta = 0.4, wn = (2 * Math.PI) / 4;
    const { t, y } = stepResponse(4, zeta);
    let k = 0;
    for (let i = 0; i < y.length; i++) if (y[i] > y[k]) k = i;
    expect(y[k] - 1).toBeCloseTo(Math.exp((-zeta * Math.PI) / Math.sqrt(1 - zeta * zeta)), 2);
    expect(Math.abs(t[k] - Math.PI / (wn * Math.sqrt(1 - zeta * zeta)))).toBeLessThan(0.02);
  });

  it('2 % settling time ≈ 4/(ζ ω_n) for T0 3 s, ζ 0.6 (±15 %, the relation is an envelope estimate)', () => {
    const zeta = 0.6, wn = (2 * Math.PI) / 3;
    const { t, y } = stepResponse(3, zeta);
    let last = 0;
    for (let i = 0; i < y.length; i++) if (t[i] > 0 && Math.abs(y[i] - 1) > 0.02) last = t[i];
    expect(Math.abs(last - 4 / (zeta * wn)) / (4 / (zeta * wn))).toBeLessThan(0.15);
    // never later than the exact envelope bound e^{−ζω_n t}/√(1−ζ²) = 0.02
    expect(last).toBeLessThan(Math.log(1 / (0.02 * Math.sqrt(1 - zeta * zeta))) / (zeta * wn));
  });

  it('a dead-beat card (ζ ≥ 1) does not overshoot', () => {
    const { y } = stepResponse(4, 1.2);
    expect(Math.max(...y)).toBeLessThan(1 + 1e-6);
    expect(y[y.length - 1]).toBeCloseTo(1, 4);
  });

  it('weaker horizontal field slows the card: ω_n ∝ √(|B_p|/H_ref) (PHYSICS §1.6)', () => {
    const hz = 100;
    const s = straight(20, hz, 0);
    const f = uniformField(s.length, 5000, 60, 0);
    s.forEach((p, i) => { if (p.t - s[0].t >= 1) setField(f, i, 5000, 60, 1); });
    const prof: CompassProfile = { ...TEXTBOOK_COMPASS_PROFILE, periodS: 2, dampingRatio: 0.2, refHorizontalNt: 20000 };
    const tr = simulateCompass(makeState(s), f, prof);
    const y = Array.from(tr.dynamicDeg, (d) => -diff180(d, 0));
    let k = 0;
    for (let i = 0; i < y.length; i++) if (y[i] > y[k]) k = i;
    // ω_n = π·√(1/4) = π/2, ζ = 0.2·√4 = 0.4 (damping per inertia constant) → peak 2.18 s, overshoot 0.254
    const wn = Math.PI / 2, zeta = 0.4;
    expect(Math.abs(s[k].t - s[0].t - 1 - Math.PI / (wn * Math.sqrt(1 - zeta * zeta)))).toBeLessThan(0.02);
    expect(y[k] - 1).toBeCloseTo(Math.exp((-zeta * Math.PI) / Math.sqrt(1 - zeta * zeta)), 2);
  });
});

describe('simulateCompass: contract', () => {
  it('straight, level, unaccelerated flight reads the magnetic heading (textbook card)', () => {
    const s = straight(60, 1, 123);
    const tr = simulateCompass(makeState(s), uniformField(s.length, 18000, 66, -7), TEXTBOOK_COMPASS_PROFILE);
    for (let i = 0; i < tr.n; i++) {
      expect(tr.readingDeg[i]).toBeCloseTo(130, 6);
      expect(Math.abs(tr.errorDeg[i])).toBeLessThan(1e-6);
      expect(tr.unreliable[i]).toBe(0);
    }
  });

  it('the four error columns add up to errorDeg (turns, swirl, tilt lag, finite pendulosity, deviation)', () => {
    const s = [...legTurnLeg(2, 10, 25, 200), ...legTurnLeg(2, 210, -15, 270).map((p) => ({ ...p, t: p.t + 500 }))];
    // add a speed change on the last leg
    s.forEach((p) => { if (p.t > 1.7e9 + 560) { p.accN = 1.2 * Math.cos(p.headingDegTrue * DEG); p.accE = 1.2 * Math.sin(p.headingDegTrue * DEG); } });
    const dev = (h: number) => 1 + 4 * Math.sin(h * DEG) - 3 * Math.cos(h * DEG) + 1.5 * Math.sin(2 * h * DEG);
    const tr = simulateCompass(makeState(s), uniformField(s.length, 17000, 68, 3), DEFAULT_COMPASS_PROFILE, dev);
    let checked = 0;
    for (let i = 0; i < tr.n; i++) {
      const sum = tr.errDipTurnDeg[i] + tr.errDipAccelDeg[i] + tr.errLagSwirlDeg[i] + tr.errDeviationDeg[i];
      expect(Math.abs(sum - tr.errorDeg[i])).toBeLessThan(1e-9);
      expect(Math.abs(diff180(tr.errLagSwirlDeg[i], tr.dynamicDeg[i] - tr.staticDeg[i]))).toBeLessThan(1e-9);
      expect(Math.abs(diff180(tr.readingDeg[i] + dev(tr.readingDeg[i]), tr.dynamicDeg[i]))).toBeLessThan(1e-8);
      expect(tr.errorDeg[i]).toBeGreaterThan(-180);
      expect(tr.errorDeg[i]).toBeLessThanOrEqual(180);
      checked++;
    }
    expect(checked).toBe(s.length);
    // the split is not trivial: turning and acceleration parts both appear
    expect(Math.max(...Array.from(tr.errDipTurnDeg, Math.abs))).toBeGreaterThan(10);
    expect(Math.max(...Array.from(tr.errDipAccelDeg, Math.abs))).toBeGreaterThan(3);
  });

  it('in a steady turn the turning part is the whole static error and the acceleration part is zero', () => {
    const s = legTurnLeg(1, 0, 15, 360);
    const tr = simulateCompass(makeState(s), uniformField(s.length, 20000, 65, 0), TEXTBOOK_COMPASS_PROFILE);
    for (let i = 0; i < tr.n; i++) {
      if (s[i].bankDeg === 0) continue;
      const want = diff180(levelTurnReadingDeg(s[i].headingDegTrue, 15, 65), s[i].headingDegTrue);
      expect(tr.errDipTurnDeg[i]).toBeCloseTo(want, 9);
      expect(Math.abs(tr.errDipAccelDeg[i])).toBeLessThan(1e-9);
    }
  });

  it('deviation: an easterly deviation of 2° makes the compass read 2° low (compass + deviation = magnetic)', () => {
    const s = straight(10, 1, 90);
    const tr = simulateCompass(makeState(s), uniformField(s.length, 20000, 60, 0), DEFAULT_COMPASS_PROFILE, () => 2);
    expect(tr.readingDeg[5]).toBeCloseTo(88, 9);
    expect(tr.errDeviationDeg[5]).toBeCloseTo(-2, 9);
    expect(tr.errorDeg[5]).toBeCloseTo(-2, 9);
  });

  it('the card restarts at its equilibrium at each new segment', () => {
    const s = legTurnLeg(1, 0, 20, 90);
    const mid = Math.floor(s.length / 2); // inside the turn
    s.forEach((p, i) => { p.segment = i >= mid ? 1 : 0; });
    const tr = simulateCompass(makeState(s), uniformField(s.length, 20000, 65, 0), TEXTBOOK_COMPASS_PROFILE);
    expect(tr.dynamicDeg[mid]).toBeCloseTo(tr.staticDeg[mid], 9);
    expect(Math.abs(diff180(tr.dynamicDeg[mid - 1], tr.staticDeg[mid - 1]))).toBeGreaterThan(0.1); // lagging before
  });

  it('the 20 Hz sub-steps are converged: maxStepS 0.05 and 0.005 on the same 1 Hz log agree within 0.01°', () => {
    const a = smoothTurn(100, 30, 20, 180).filter((_, i) => i % 100 === 0);
    const f = uniformField(a.length, 19000, 67, 2);
    const coarse = simulateCompass(makeState(a), f, DEFAULT_COMPASS_PROFILE);
    const fine = simulateCompass(makeState(a), f, DEFAULT_COMPASS_PROFILE, undefined, { maxStepS: 0.005 });
    let worst = 0, moved = 0;
    for (let i = 0; i < a.length; i++) {
      worst = Math.max(worst, Math.abs(diff180(coarse.readingDeg[i], fine.readingDeg[i])));
      moved = Math.max(moved, Math.abs(coarse.errLagSwirlDeg[i]));
    }
    expect(worst).toBeLessThan(0.01);
    expect(moved).toBeGreaterThan(5); // the dynamics matter in this flight, so the comparison means something
  });

  it('the result does not depend on the log rate once the inputs are resolved (10 Hz vs 50 Hz log, within 0.05°)', () => {
    const fine = smoothTurn(100, 30, 20, 180);
    const a = fine.filter((_, i) => i % 10 === 0);
    const b = fine.filter((_, i) => i % 2 === 0);
    const ta = simulateCompass(makeState(a), uniformField(a.length, 19000, 67, 2), DEFAULT_COMPASS_PROFILE);
    const tb = simulateCompass(makeState(b), uniformField(b.length, 19000, 67, 2), DEFAULT_COMPASS_PROFILE);
    let worst = 0;
    for (let i = 0; i < a.length; i++) worst = Math.max(worst, Math.abs(diff180(ta.readingDeg[i], tb.readingDeg[5 * i])));
    expect(worst).toBeLessThan(0.05);
  });

  it('flags: blackout zone and missing inputs are unreliable; caution only if the profile says so; NaN never throws', () => {
    const s = straight(20, 1, 0);
    const f = uniformField(s.length, 20000, 60, 0);
    setField(f, 3, 1500, 88, 0, 2);
    setField(f, 4, 4000, 85, 0, 1);
    const st = makeState(s);
    st.headingDegTrue[8] = NaN;
    const tr = simulateCompass(st, f, DEFAULT_COMPASS_PROFILE);
    expect(tr.unreliable[3]).toBe(1);
    expect(tr.flags![3] & COMPASS_FLAG_BLACKOUT).toBeTruthy();
    expect(tr.unreliable[4]).toBe(0);
    expect(tr.flags![4] & COMPASS_FLAG_CAUTION).toBeTruthy();
    expect(tr.unreliable[8]).toBe(1);
    expect(tr.flags![8] & COMPASS_FLAG_NO_INPUT).toBeTruthy();
    expect(Number.isNaN(tr.readingDeg[8])).toBe(true);
    expect(tr.readingDeg[9]).toBeCloseTo(0, 6);
    expect(tr.warnings).toEqual([expect.objectContaining({ code: 'compass-input-missing', count: 1 })]);
    const tr2 = simulateCompass(st, f, { ...DEFAULT_COMPASS_PROFILE, cautionZoneUnreliable: true });
    expect(tr2.unreliable[4]).toBe(1);
  });

  it('flags: weak directive force near the card-reversal bank (dip 65, bank 25, heading east), and the tilt stop', () => {
    const a = coordinatedTurnAccel(90, 25);
    const s: Sample[] = [];
    for (let i = 0; i < 5; i++) s.push({ t: 1.7e9 + i, headingDegTrue: 90, bankDeg: 25, accN: a.accN, accE: a.accE });
    s.push({ t: 1.7e9 + 5, headingDegTrue: 90, pitchDeg: 25 }); // steep nose-up, unaccelerated: beyond the 18° stop
    const tr = simulateCompass(makeState(s), uniformField(s.length, 20000, 65, 0), TEXTBOOK_COMPASS_PROFILE);
    expect(tr.directiveRatio[2]).toBeLessThan(0.3);
    expect(tr.flags![2] & COMPASS_FLAG_WEAK_DIRECTIVE).toBeTruthy();
    expect(tr.unreliable[2]).toBe(1);
    const tr2 = simulateCompass(makeState(s), uniformField(s.length, 20000, 65, 0), DEFAULT_COMPASS_PROFILE);
    expect(tr2.flags![5] & COMPASS_FLAG_ON_STOP).toBeTruthy();
    expect(tr2.unreliable[5]).toBe(1);
  });

  it('rejects a bad profile and mismatched columns with OptionError', () => {
    const s = straight(3, 1, 0);
    expect(() => simulateCompass(makeState(s), uniformField(s.length, 20000, 60), { ...DEFAULT_COMPASS_PROFILE, periodS: -1 }))
      .toThrow(/periodS/);
    expect(() => simulateCompass(makeState(s), uniformField(2, 20000, 60), DEFAULT_COMPASS_PROFILE)).toThrow(/samples/);
  });
});
