// Air data and pseudo-attitude from the smoothed ground velocity and acceleration and a wind, assuming
// coordinated flight with no sideslip. Everything per sample, in the sample's own NED frame.
import { DEG, G0_MS2, RAD } from '../constants.js';
import { OptionError } from '../errors.js';

/** Assumed angle of attack [deg] when nothing better is known: cruise 2–5° [memory, PHYSICS.md §7]. */
export const DEFAULT_AOA_DEG = 3;

/** Below this TAS [m/s] (~29 kt) heading, bank, pitch, turn rate are undefined (taxi, hover-like) [practice]. */
export const DEFAULT_MIN_AIRSPEED_MS = 15;

/** Below this ground speed [m/s] the aircraft is taken to be stationary or taxiing: attitude undefined [practice]. */
export const DEFAULT_MIN_GROUND_SPEED_MS = 5;

/** Below this ground speed [m/s] the ground track is undefined (NaN) [practice]. */
export const MIN_TRACK_GROUND_SPEED_MS = 1;

export interface AirDataInput {
  velN: Float64Array;
  velE: Float64Array;
  velD: Float64Array;
  accN: Float64Array;
  accE: Float64Array;
  accD: Float64Array;
  /** Air-mass velocity (wind blowing TO) north/east per sample [m/s]. */
  windN: Float64Array;
  windE: Float64Array;
}

export interface AirDataOptions {
  /** Assumed angle of attack [deg], −5..20. Default 3 [memory]. */
  aoaDeg?: number;
  /** TAS [m/s] below which attitude is undefined. Default 15. */
  minAirspeedMs?: number;
  /** Ground speed [m/s] below which attitude is undefined. Default 5. */
  minGroundSpeedMs?: number;
}

export interface AirData {
  gsMs: Float64Array;
  trackDegTrue: Float64Array;
  tasMs: Float64Array;
  headingDegTrue: Float64Array;
  bankDeg: Float64Array;
  pitchDeg: Float64Array;
  /** Flight-path angle γ of the air vector [deg], climb +. */
  flightPathDeg: Float64Array;
  turnRateDps: Float64Array;
  accelLongMs2: Float64Array;
  /** 1 where the sample was too slow for attitude (heading, bank, pitch, turn rate, accelLong NaN). */
  lowSpeed: Uint8Array;
}

/** Throws OptionError for out-of-range air-data options; returns them with defaults filled. */
export function checkAirDataOptions(o: AirDataOptions): Required<AirDataOptions> {
  const aoaDeg = o.aoaDeg ?? DEFAULT_AOA_DEG;
  const minAirspeedMs = o.minAirspeedMs ?? DEFAULT_MIN_AIRSPEED_MS;
  const minGroundSpeedMs = o.minGroundSpeedMs ?? DEFAULT_MIN_GROUND_SPEED_MS;
  if (!(Number.isFinite(aoaDeg) && aoaDeg >= -5 && aoaDeg <= 20)) throw new OptionError('aoaDeg', `angle of attack must be −5 to 20 degrees, got ${aoaDeg}`);
  if (!(Number.isFinite(minAirspeedMs) && minAirspeedMs >= 0)) throw new OptionError('minAirspeedMs', `must be ≥ 0 m/s, got ${minAirspeedMs}`);
  if (!(Number.isFinite(minGroundSpeedMs) && minGroundSpeedMs >= 0)) throw new OptionError('minGroundSpeedMs', `must be ≥ 0 m/s, got ${minGroundSpeedMs}`);
  return { aoaDeg, minAirspeedMs, minGroundSpeedMs };
}

/**
 * Per sample, from ground velocity v and kinematic acceleration a (NED) and air-mass velocity w:
 * - ground speed |v_h| [m/s], track atan2(vE, vN) [deg true, [0, 360)], NaN below 1 m/s;
 * - air vector v_a = v − w; TAS = |v_a| [m/s]; true heading ψ = atan2(v_aE, v_aN) (no sideslip, PHYSICS.md §7);
 * - bank, pseudo-roll about the air velocity (Kornfeld, Hansman & Deyst, NAVIGATION 45(1), 1998; PHYSICS.md §7):
 *   x_w = unit(v_a), y_w = unit(e_z × x_w), z_w = x_w × y_w, f = a − g e_z, φ = atan2(f·y_w, −f·z_w),
 *   right wing down +; in a level coordinated turn this is tan φ = V ω / g;
 * - turn rate ω = (v_a × a)_z / |v_a,h|² (heading rate with a steady wind) [deg/s], right +;
 * - flight-path angle γ and pitch θ ≈ γ + α cos φ with γ = atan2(−v_aD, |v_a,h|) and α the assumed angle of attack (PHYSICS.md §7);
 * - accelLong = a · x_b, x_b = (cos θ cos ψ, cos θ sin ψ, −sin θ): kinematic acceleration along the nose,
 *   forward + [m/s²] (gravity not included).
 * Where TAS < minAirspeedMs or ground speed < minGroundSpeedMs, heading, bank, pitch, turn rate and
 * accelLong are NaN and `lowSpeed` is 1. Non-finite inputs give NaN outputs.
 */
export function computeAirData(inp: AirDataInput, opts: AirDataOptions = {}): AirData {
  const { aoaDeg, minAirspeedMs, minGroundSpeedMs } = checkAirDataOptions(opts);
  const n = inp.velN.length;
  const out: AirData = {
    gsMs: new Float64Array(n),
    trackDegTrue: new Float64Array(n),
    tasMs: new Float64Array(n),
    headingDegTrue: new Float64Array(n),
    bankDeg: new Float64Array(n),
    pitchDeg: new Float64Array(n),
    flightPathDeg: new Float64Array(n),
    turnRateDps: new Float64Array(n),
    accelLongMs2: new Float64Array(n),
    lowSpeed: new Uint8Array(n),
  };
  const alpha = aoaDeg * DEG;
  const g = G0_MS2;
  const { velN, velE, velD, accN, accE, accD, windN, windE } = inp;
  const { gsMs, trackDegTrue, tasMs, headingDegTrue, bankDeg, pitchDeg, flightPathDeg, turnRateDps, accelLongMs2, lowSpeed } = out;
  for (let i = 0; i < n; i++) {
    const vN = velN[i], vE = velE[i], vD = velD[i];
    const gs = Math.sqrt(vN * vN + vE * vE);
    gsMs[i] = gs;
    trackDegTrue[i] = gs >= MIN_TRACK_GROUND_SPEED_MS ? deg360(Math.atan2(vE, vN)) : NaN;
    const aN = accN[i], aE = accE[i], aD = accD[i];
    const uN = vN - windN[i], uE = vE - windE[i], uD = vD;
    const uh2 = uN * uN + uE * uE;
    const uh = Math.sqrt(uh2);
    const tas = Math.sqrt(uh2 + uD * uD);
    tasMs[i] = tas;
    if (!(tas >= minAirspeedMs && gs >= minGroundSpeedMs) || !(uh > 0)) {
      lowSpeed[i] = Number.isFinite(tas) && Number.isFinite(gs) ? 1 : 0;
      headingDegTrue[i] = NaN;
      bankDeg[i] = NaN;
      pitchDeg[i] = NaN;
      flightPathDeg[i] = NaN;
      turnRateDps[i] = NaN;
      accelLongMs2[i] = NaN;
      continue;
    }
    headingDegTrue[i] = deg360(Math.atan2(uE, uN));
    // Wind axes: x_w along v_a; y_w = unit(e_z × x_w) = (−uE, uN, 0)/|u_h|; z_w = x_w × y_w.
    const xN = uN / tas, xE = uE / tas, xD = uD / tas;
    const yN = -uE / uh, yE = uN / uh; // yD = 0
    const zN = -xD * yE, zE = xD * yN, zD = xN * yE - xE * yN;
    const fN = aN, fE = aE, fD = aD - g; // specific force f = a − g e_z
    const fy = fN * yN + fE * yE;
    const fz = fN * zN + fE * zE + fD * zD;
    bankDeg[i] = Math.atan2(fy, -fz) * RAD;
    turnRateDps[i] = ((uN * aE - uE * aN) / uh2) * RAD;
    const gamma = Math.atan2(-uD, uh);
    flightPathDeg[i] = gamma * RAD;
    // cos φ = −f_z/|(f_y, f_z)| and (cos ψ, sin ψ) = (u_N, u_E)/|u_h| without the angles' trigonometry;
    // a zero specific force (free fall) has φ = atan2(±0, ∓0): 0 or π by the sign of the zero, as atan2 has it.
    const fyz = Math.sqrt(fy * fy + fz * fz);
    const cosPhi = fyz > 0 ? -fz / fyz : fyz === 0 ? (Object.is(fz, 0) ? -1 : 1) : NaN;
    const theta = gamma + alpha * cosPhi;
    pitchDeg[i] = theta * RAD;
    const ct = Math.cos(theta);
    accelLongMs2[i] = aN * ct * (uN / uh) + aE * ct * (uE / uh) - aD * Math.sin(theta);
  }
  return out;
}

/** Radians to degrees in [0, 360). */
function deg360(rad: number): number {
  const d = rad * RAD;
  const w = d < 0 ? d + 360 : d;
  return w >= 360 ? 0 : w + 0;
}
