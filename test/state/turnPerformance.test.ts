// Handbook turn relations. Sources: FAA Pilot's Handbook of Aeronautical Knowledge (FAA-H-8083-25) ch. 5
// load-factor chart (30° → 1.15, 45° → 1.41, 60° → 2.0); PHYSICS.md check values 16–19 and 31 (derived
// from R = V²/(g tan φ), tan φ = V ω / g); FAA Instrument Flying Handbook (FAA-H-8083-15B) ch. 7 rule
// of thumb "standard-rate bank ≈ TAS/10 + 7" [rule, within 3.6° from 60 to 200 kt per PHYSICS.md 16].
import { describe, expect, it } from 'vitest';
import { bankDegForRate, loadFactor, standardRateBankDeg, turnRadiusM, turnRateDpsFromBank } from '../../src/state/turnPerformance.js';

const KT = 1852 / 3600;

describe('loadFactor = 1/cos(bank) (PHAK load-factor chart; PHYSICS.md check 19)', () => {
  it('is 1.155, 1.414, 2.000, 2.924, 5.759 at 30, 45, 60, 70, 80°', () => {
    expect(loadFactor(30)).toBeCloseTo(1.155, 3);
    expect(loadFactor(45)).toBeCloseTo(1.414, 3);
    expect(loadFactor(60)).toBeCloseTo(2.0, 3);
    expect(loadFactor(70)).toBeCloseTo(2.924, 3);
    expect(loadFactor(80)).toBeCloseTo(5.759, 3);
  });
  it('is symmetric in bank sign and NaN at or beyond 90°', () => {
    expect(loadFactor(-60)).toBeCloseTo(2.0, 12);
    expect(loadFactor(90)).toBeNaN();
    expect(loadFactor(NaN)).toBeNaN();
  });
});

describe('turnRadiusM = V²/(g tan φ) (PHYSICS.md checks 17, 18)', () => {
  it('100 kt at 30° bank → 467 m (±0.5 %)', () => {
    expect(Math.abs(turnRadiusM(100 * KT, 30) / 467 - 1)).toBeLessThan(0.005);
  });
  it('standard-rate radius at 100 kt → 983 m, at 120 kt → 0.637 nm; R_nm = V/(60π) (±0.5 %)', () => {
    expect(Math.abs(turnRadiusM(100 * KT, standardRateBankDeg(100 * KT)) / 983 - 1)).toBeLessThan(0.005);
    expect(Math.abs(turnRadiusM(120 * KT, standardRateBankDeg(120 * KT)) / 1852 / 0.637 - 1)).toBeLessThan(0.005);
    expect(Math.abs(turnRadiusM(150 * KT, standardRateBankDeg(150 * KT)) / 1852 / (150 / (60 * Math.PI)) - 1)).toBeLessThan(0.005);
  });
  it('is Infinity wings level and NaN for a negative speed', () => {
    expect(turnRadiusM(50, 0)).toBe(Infinity);
    expect(turnRadiusM(-1, 20)).toBeNaN();
  });
});

describe('standard-rate bank (PHYSICS.md check 16, 31)', () => {
  it('is 13.9, 15.4, 18.2, 22.4° at 90, 100, 120, 150 kt (±0.1°)', () => {
    expect(standardRateBankDeg(90 * KT)).toBeCloseTo(13.9, 1);
    expect(standardRateBankDeg(100 * KT)).toBeCloseTo(15.4, 1);
    expect(standardRateBankDeg(120 * KT)).toBeCloseTo(18.2, 1);
    expect(standardRateBankDeg(150 * KT)).toBeCloseTo(22.4, 1);
  });
  it('stays within 4° of the TAS/10 + 7 rule of thumb from 60 to 200 kt (IFH ch. 7)', () => {
    for (let kt = 60; kt <= 200; kt += 5) expect(Math.abs(standardRateBankDeg(kt * KT) - (kt / 10 + 7))).toBeLessThan(4);
  });
});

describe('rate and bank are inverse relations (level 100 kt at 30° → 6.31°/s, PHYSICS.md check 18)', () => {
  it('gives 6.31°/s and back 30°', () => {
    const r = turnRateDpsFromBank(100 * KT, 30);
    expect(r).toBeCloseTo(6.31, 2);
    expect(bankDegForRate(100 * KT, r)).toBeCloseTo(30, 10);
    expect(turnRateDpsFromBank(100 * KT, -30)).toBeCloseTo(-6.31, 2);
  });
});
