// Handbook relations of a level, coordinated turn: load factor, radius, rate and standard-rate bank.
import { DEG, G0_MS2, RAD, STANDARD_RATE_DPS } from '../constants.js';

// All from L cos φ = W and L sin φ = m V ω (level coordinated turn): n = 1/cos φ, tan φ = V ω / g,
// R = V / ω = V² / (g tan φ). FAA Pilot's Handbook of Aeronautical Knowledge (FAA-H-8083-25) ch. 5
// load-factor chart; PHYSICS.md §7 and check values 16–19, 31. Inputs outside the stated ranges give NaN.

/** Load factor n = 1 / cos φ [-] for a bank φ [deg] in (−90, 90); NaN outside. 60° → 2.000. */
export function loadFactor(bankDeg: number): number {
  if (!(Math.abs(bankDeg) < 90)) return NaN;
  return 1 / Math.cos(bankDeg * DEG);
}

/** Turn radius R = V² / (g tan |φ|) [m] for TAS V [m/s] ≥ 0 and bank φ [deg] in (0, 90) in magnitude; NaN otherwise (Infinity wings level). */
export function turnRadiusM(tasMs: number, bankDeg: number): number {
  if (!(tasMs >= 0 && Math.abs(bankDeg) < 90)) return NaN;
  return (tasMs * tasMs) / (G0_MS2 * Math.tan(Math.abs(bankDeg) * DEG));
}

/** Turn rate ω = g tan φ / V [deg/s], right + for bank right +; TAS V [m/s] > 0, |φ| < 90°; NaN otherwise. */
export function turnRateDpsFromBank(tasMs: number, bankDeg: number): number {
  if (!(tasMs > 0 && Math.abs(bankDeg) < 90)) return NaN;
  return (G0_MS2 * Math.tan(bankDeg * DEG) / tasMs) * RAD;
}

/** Bank φ = atan(V ω / g) [deg] for TAS V [m/s] ≥ 0 and turn rate ω [deg/s] (sign carried). NaN for bad input. */
export function bankDegForRate(tasMs: number, rateDps: number): number {
  if (!(tasMs >= 0 && Number.isFinite(rateDps))) return NaN;
  return Math.atan((tasMs * rateDps * DEG) / G0_MS2) * RAD;
}

/** Bank [deg] of a standard-rate (3°/s) turn at TAS V [m/s]: 120 kt → 18.2°. */
export function standardRateBankDeg(tasMs: number): number {
  return bankDegForRate(tasMs, STANDARD_RATE_DPS);
}
