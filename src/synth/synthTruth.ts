// SynthTruth: the exact flight a script produced, at the output rate, plus a record of every leg.

/** What one leg of the script became: times (UTC s), output rows, and the state at both ends. */
export interface SynthLegRecord {
  index: number;
  kind: 'straight' | 'turn' | 'orbit' | 'speed' | 'climb';
  label?: string;
  /** UTC seconds of the leg's start and end. */
  startT: number;
  endT: number;
  /** First and last output rows inside [startT, endT] (−1 when no row falls inside). */
  startIndex: number;
  endIndex: number;
  headingStartDegTrue: number;
  headingEndDegTrue: number;
  tasStartMs: number;
  tasEndMs: number;
  altStartM: number;
  altEndM: number;
  /** Turns and orbits only: direction, heading change flown [deg, > 0], established rate [deg/s] and bank [deg]. */
  direction?: 'left' | 'right';
  headingChangeDeg?: number;
  rateDps?: number;
  bankDeg?: number;
  /** Turns and orbits only: UTC seconds when the roll-out began. */
  rolloutStartT?: number;
  /** Decided turns only: true when rolloutWhen never answered true and maxDurationS ended the turn. */
  timedOut?: boolean;
}

/**
 * The true flight, one row per output sample (t = t0 + k / sampleRateHz). Columns of length n, SI:
 * t UTC seconds; lat/lon WGS-84 degrees; altM height above the ellipsoid; velN/E/D ground velocity and
 * accN/E/D its time derivative, both in each row's local NED frame [m/s, m/s²] (the derivative of the
 * NED components; the rotation of the NED frame along the path, ~V²/R ≈ 1e-3 m/s², is left out);
 * gsMs, trackDegTrue [0, 360); headingDegTrue [0, 360) where the nose points (zero sideslip);
 * tasMs; bankDeg right wing down + from tan φ = V ω / g; pitchDeg nose up +; turnRateDps heading rate,
 * right +; accelLongMs2 kinematic acceleration along the nose, forward +; windN/E air-mass velocity [m/s].
 */
export interface SynthTruth {
  n: number;
  name: string;
  sampleRateHz: number;
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
  gsMs: Float64Array;
  trackDegTrue: Float64Array;
  headingDegTrue: Float64Array;
  tasMs: Float64Array;
  bankDeg: Float64Array;
  pitchDeg: Float64Array;
  turnRateDps: Float64Array;
  accelLongMs2: Float64Array;
  windN: Float64Array;
  windE: Float64Array;
  /** Leg index (into the script's legs) each row belongs to; a row on a boundary belongs to the later leg. */
  leg: Int32Array;
  legs: SynthLegRecord[];
}

/** Names of the Float64Array columns of a SynthTruth, in a fixed order. */
export const TRUTH_COLUMNS = [
  't', 'lat', 'lon', 'altM', 'velN', 'velE', 'velD', 'accN', 'accE', 'accD', 'gsMs', 'trackDegTrue',
  'headingDegTrue', 'tasMs', 'bankDeg', 'pitchDeg', 'turnRateDps', 'accelLongMs2', 'windN', 'windE',
] as const;
export type TruthColumn = (typeof TRUTH_COLUMNS)[number];
