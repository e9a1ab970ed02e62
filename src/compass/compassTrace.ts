// CompassTrace: what the simulated compass showed at each sample, and why.

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
}
