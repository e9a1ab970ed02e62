// Simulated truth as a FlightState, so later stages (compass, analysis) can run on the exact flight.
import type { FlightState } from '../state/flightState.js';
import type { SynthTruth } from './synthTruth.js';

/**
 * The truth rows [start, end) as a FlightState: the same columns (views, not copies, so no allocation per
 * row), acceleration sigma 0, one segment, logRow = truth row, the script's wind recorded as source 'given'
 * only through the windN / windE columns (winds[] stays empty). Throws RangeError for rows outside the truth.
 */
export function truthToFlightState(truth: SynthTruth, start = 0, end = truth.n): FlightState {
  if (!(start >= 0 && end <= truth.n && start <= end)) throw new RangeError(`rows [${start}, ${end}) outside 0…${truth.n}`);
  const v = (a: Float64Array): Float64Array => a.subarray(start, end);
  const n = end - start;
  const logRow = new Int32Array(n);
  for (let i = 0; i < n; i++) logRow[i] = start + i;
  return {
    n,
    t: v(truth.t),
    lat: v(truth.lat),
    lon: v(truth.lon),
    altM: v(truth.altM),
    velN: v(truth.velN),
    velE: v(truth.velE),
    velD: v(truth.velD),
    accN: v(truth.accN),
    accE: v(truth.accE),
    accD: v(truth.accD),
    accSigmaMs2: new Float64Array(n),
    gsMs: v(truth.gsMs),
    trackDegTrue: v(truth.trackDegTrue),
    windN: v(truth.windN),
    windE: v(truth.windE),
    tasMs: v(truth.tasMs),
    headingDegTrue: v(truth.headingDegTrue),
    bankDeg: v(truth.bankDeg),
    pitchDeg: v(truth.pitchDeg),
    turnRateDps: v(truth.turnRateDps),
    accelLongMs2: v(truth.accelLongMs2),
    segment: new Int32Array(n),
    logRow,
    winds: [],
    warnings: [],
  };
}
