// The compass behaviours every pilot is taught (common practice; DEVELOPERS.md list; FAA IFH FAA-H-8083-15B ch. 7
// and PHAK ch. 8 for the NH mnemonics), shown by the whole simulated card with the default (realistic) profile.
import { describe, expect, it } from 'vitest';
import { simulateCompass } from '../../src/compass/simulateCompass.js';
import { DEFAULT_COMPASS_PROFILE } from '../../src/compass/compassProfile.js';
import { G, coordinatedTurnAccel, diff180, makeState, uniformField, type Sample } from './compassFixtures.js';

const DEG = Math.PI / 180;

/** Full 360° steady coordinated level turn at `bank` (right +) from heading 000 true, 1 Hz; no variation. */
function fullTurn(bank: number, tasMs = 50): Sample[] {
  const rate = ((G * Math.tan(Math.abs(bank) * DEG)) / tasMs / DEG) * Math.sign(bank);
  const out: Sample[] = [];
  for (let i = 0; i * Math.abs(rate) <= 400; i++) {
    const h = rate * i;
    const a = coordinatedTurnAccel(h, bank);
    out.push({ t: 1.7e9 + i, headingDegTrue: h, bankDeg: bank, accN: a.accN, accE: a.accE, turnRateDps: rate });
  }
  return out;
}

/** Static turning error (errDipTurnDeg) at the sample whose heading is closest to `hdg`. */
function turnErrorNear(samples: Sample[], err: Float64Array, hdg: number): number {
  let k = 0;
  for (let i = 0; i < samples.length; i++) {
    if (Math.abs(diff180(samples[i].headingDegTrue, hdg)) < Math.abs(diff180(samples[k].headingDegTrue, hdg))) k = i;
  }
  return err[k];
}

/** Straight level leg on a true heading with a speed change of accG·g (+ faster, − slower) from 10 s to 25 s. */
function speedChange(headingDegTrue: number, accG: number): Sample[] {
  const out: Sample[] = [];
  const p = headingDegTrue * DEG;
  for (let i = 0; i <= 300; i++) {
    const s = i / 10;
    const a = s >= 10 && s < 25 ? accG * G : 0;
    out.push({ t: 1.7e9 + s, headingDegTrue, accN: a * Math.cos(p), accE: a * Math.sin(p) });
  }
  return out;
}

/** Simulated compass error (reading − magnetic) at the end of the speed change, card settled. */
function accelError(headingDegTrue: number, accG: number, dip: number): number {
  const s = speedChange(headingDegTrue, accG);
  const tr = simulateCompass(makeState(s), uniformField(s.length, 20000, dip, 0), DEFAULT_COMPASS_PROFILE);
  return tr.errorDeg[249];
}

describe('turning errors (common practice; swirl and card lag aside: the static turning part of the error)', () => {
  it('are largest turning through north or south and vanish through east or west', () => {
    for (const bank of [15, -15]) {
      const s = fullTurn(bank);
      const tr = simulateCompass(makeState(s), uniformField(s.length, 20000, 65, 0), DEFAULT_COMPASS_PROFILE);
      const n = Math.abs(turnErrorNear(s, tr.errDipTurnDeg, 0)), so = Math.abs(turnErrorNear(s, tr.errDipTurnDeg, 180));
      const e = Math.abs(turnErrorNear(s, tr.errDipTurnDeg, 90)), w = Math.abs(turnErrorNear(s, tr.errDipTurnDeg, 270));
      expect(Math.min(n, so)).toBeGreaterThan(20);
      expect(Math.max(e, w)).toBeLessThan(1); // within a degree or two of E/W the heading sample itself is off
    }
  });

  it('NH: turning through north the compass lags (undershoot north), through south it leads (overshoot south) (IFH ch. 7)', () => {
    const right = fullTurn(15);
    const tr = simulateCompass(makeState(right), uniformField(right.length, 20000, 65, 0), DEFAULT_COMPASS_PROFILE);
    expect(turnErrorNear(right, tr.errDipTurnDeg, 0)).toBeLessThan(-20); // right turn: reads behind (west of N)
    expect(turnErrorNear(right, tr.errDipTurnDeg, 180)).toBeGreaterThan(20); // reads ahead (west of S)
    // the whole simulated card shows it too: through north it reads well short of north
    expect(turnErrorNear(right, tr.errorDeg, 0)).toBeLessThan(-20);
  });

  it('grow with magnetic latitude (dip) and vanish at the magnetic equator; reversed in the southern hemisphere', () => {
    const s = fullTurn(15);
    const errN = (dip: number) => {
      const tr = simulateCompass(makeState(s), uniformField(s.length, 25000, dip, 0), DEFAULT_COMPASS_PROFILE);
      return turnErrorNear(s, tr.errDipTurnDeg, 0);
    };
    const dips = [0, 20, 40, 55, 65, 72];
    const mags = dips.map((d) => -errN(d));
    for (let i = 1; i < mags.length; i++) expect(mags[i]).toBeGreaterThan(mags[i - 1] + 1);
    expect(Math.abs(mags[0])).toBeLessThan(0.05);
    expect(errN(-55)).toBeCloseTo(-errN(55), 1); // SH: through north the compass leads
    expect(errN(-55)).toBeGreaterThan(15);
  });
});

describe('acceleration errors (common practice; ANDS in the NH, IFH ch. 7 / PHAK ch. 8)', () => {
  it('accelerating shows an apparent turn toward the nearer magnetic pole, decelerating toward the equator', () => {
    // NH (dip +65), east: accelerate → reads less than 090 (toward N); decelerate → more (toward S, the equator side)
    expect(accelError(90, 0.1, 65)).toBeLessThan(-8);
    expect(accelError(90, -0.1, 65)).toBeGreaterThan(8);
    // SH (dip −60), east: accelerate → toward S (reads more than 090); decelerate → toward N
    expect(accelError(90, 0.1, -60)).toBeGreaterThan(6);
    expect(accelError(90, -0.1, -60)).toBeLessThan(-6);
  });

  it('there is no acceleration error on north or south headings', () => {
    for (const h of [0, 180]) {
      for (const a of [0.1, -0.1]) {
        expect(Math.abs(accelError(h, a, 65))).toBeLessThan(0.01);
        expect(Math.abs(accelError(h, a, -60))).toBeLessThan(0.01);
      }
    }
  });

  it('accelerating on west in the northern hemisphere shows an apparent turn to the right; southern hemisphere reversed', () => {
    expect(accelError(270, 0.1, 65)).toBeGreaterThan(8); // reads more than 270: toward N, a turn to the right
    expect(accelError(270, 0.1, -60)).toBeLessThan(-6); // SH: toward S, a turn to the left
  });

  it('no acceleration error at the magnetic equator on the cardinal headings', () => {
    for (const h of [0, 90, 180, 270]) expect(Math.abs(accelError(h, 0.1, 0))).toBeLessThan(0.01);
  });
});
