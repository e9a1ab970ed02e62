// CompassTrace: what the simulated compass showed at each sample, and why.
import type { LogWarning } from '../log/flightLog.js';

/**
 * Columns of length n, degrees. staticDeg: the reading the card settles to if the instant's flight
 * condition were held; dynamicDeg: the simulated reading (card dynamics, swirl); readingDeg: dynamic
 * with deviation applied (what the pilot saw). Errors are signed, reading − magnetic heading, in
 * (−180, 180]: errDipTurnDeg + errDipAccelDeg + errLagSwirlDeg + errDeviationDeg = errorDeg.
 */
export interface CompassTrace {
  n: number;
  staticDeg: Float64Array;
  dynamicDeg: Float64Array;
  readingDeg: Float64Array;
  errorDeg: Float64Array;
  errDipTurnDeg: Float64Array;
  errDipAccelDeg: Float64Array;
  errLagSwirlDeg: Float64Array;
  errDeviationDeg: Float64Array;
  /** Angle between the card's axis and the bowl's (airframe) vertical [deg]. */
  tiltDeg: Float64Array;
  /** Directive field in the card plane over the horizontal field, |B_p| / H [-]. */
  directiveRatio: Float64Array;
  /** 1 where the reading is not to be trusted (card on its stop, weak directive force, weak-field zone). */
  unreliable: Uint8Array;
  /** Optional (added by the compass stage): magnetic heading ψm = true heading − variation [deg, 0..360). */
  headingMagDeg?: Float64Array;
  /** Optional: bit set of COMPASS_FLAG_* per sample, the reasons behind `unreliable` (and the caution zone). */
  flags?: Uint8Array;
  /** Optional: the compass stage's warnings (missing inputs, deviation function trouble), counted. */
  warnings?: LogWarning[];
}

/** Bits of CompassTrace.flags (why a sample is, or may be, unreliable). */
export const COMPASS_FLAG_WEAK_DIRECTIVE = 1; // |B_p| / H below the profile's threshold (card near losing its directive force)
export const COMPASS_FLAG_ON_STOP = 2; // card axis clamped on its tilt stop (static or simulated card)
export const COMPASS_FLAG_BLACKOUT = 4; // WMM blackout zone, H < 2000 nT
export const COMPASS_FLAG_CAUTION = 8; // WMM caution zone, 2000 ≤ H < 6000 nT (unreliable only if the profile says so)
export const COMPASS_FLAG_NO_INPUT = 16; // an input of this sample was missing: every output is NaN
export const COMPASS_FLAG_SWINGING = 32; // simulated card more than SWINGING_CARD_DEG from its equilibrium: swinging round after losing its directive force
