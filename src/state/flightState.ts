// FlightState: the reconstructed flight, one row per kept sample, in each sample's own local NED frame.
import type { LogWarning } from '../log/flightLog.js';

/** Where the wind used for a sample came from. */
export type WindSource = 'given' | 'table' | 'log-air-data' | 'turn-fit' | 'calm';

/** One wind estimate (from direction true, speed) with its validity window and 1-sigma uncertainty. */
export interface WindEstimate {
  fromDegTrue: number;
  speedMs: number;
  source: WindSource;
  /** Window of samples (UTC seconds) the estimate rests on; NaN for a given wind. */
  t0: number;
  t1: number;
  altM: number;
  sigmaMs: number;
  /** Estimated true airspeed from the same fit (turn fits), NaN otherwise. */
  tasMs: number;
  /** Degrees of air-vector turn covered by a turn fit, NaN otherwise. */
  arcDeg: number;
  /** Added (optional): the same wind as an air-mass velocity (blowing TO), north and east [m/s]. */
  windN?: number;
  windE?: number;
  /** Added (optional): covariance of (windN, windE) [m²/s²] as [NN, NE, EE]. */
  covNeMs2?: [number, number, number];
  /** Added (optional): RMS orthogonal residual of a turn fit [m/s]. */
  rmsResidualMs?: number;
}

/**
 * Columns, all of length n. Velocities and accelerations are NED at each sample [m/s, m/s²].
 * Angles in degrees: track/heading true in [0, 360), bank right wing down +, pitch nose up +,
 * turn rate right +. accelLongMs2 is along the nose, forward +.
 */
export interface FlightState {
  n: number;
  t: Float64Array;
  lat: Float64Array;
  lon: Float64Array;
  altM: Float64Array;
  velN: Float64Array;
  velE: Float64Array;
  velD: Float64Array;
  accN: Float64Array;
  accE: Float64Array;
  accD: Float64Array;
  /** 1-sigma of the horizontal acceleration estimate [m/s²]. */
  accSigmaMs2: Float64Array;
  gsMs: Float64Array;
  trackDegTrue: Float64Array;
  /** Wind used at each sample as the air-mass velocity (the way it blows TO), north/east [m/s]. */
  windN: Float64Array;
  windE: Float64Array;
  tasMs: Float64Array;
  headingDegTrue: Float64Array;
  bankDeg: Float64Array;
  pitchDeg: Float64Array;
  /**
   * Pitch of the axes the compass stage builds the lubber line from [deg]: the flight-path angle where the
   * attitude is reconstructed (body axes = wind axes), the logged pitch where the log has one. Optional:
   * without it the compass uses pitchDeg.
   */
  cardPitchDeg?: Float64Array;
  turnRateDps: Float64Array;
  accelLongMs2: Float64Array;
  /** Segment id per sample: a new segment starts after each gap. */
  segment: Int32Array;
  /** Index of the FlightLog row each sample came from. */
  logRow: Int32Array;
  winds: WindEstimate[];
  warnings: LogWarning[];
  /** Added (optional): 1-sigma of headingDegTrue [deg] from the wind and velocity uncertainty (or the logged heading's). */
  headingSigmaDeg?: Float64Array;
  /** Added (optional): 1 where the wind used was extrapolated beyond the times/heights of the estimates. */
  windExtrapolated?: Uint8Array;
  /** Added (optional): where the wind used at each sample came from. */
  windSource?: WindSource;
}
