// Turns found in a reconstructed flight by hysteresis on |turn rate|, with their roll-in, steady and roll-out phases.
import { wrap180, wrap360 } from '../geo/angles.js';
import type { FlightState } from '../state/flightState.js';
import { DEFAULT_TURN_DETECTION, type TurnDetectionOptions } from './debriefOptions.js';

/** Share of the steady rate that marks the end of the roll-in and the start of the roll-out. */
export const PHASE_RATE_SHARE = 0.9;

/**
 * One detected turn (geometry only; the compass, the target and the grade are added by debriefTurns).
 * Indices are FlightState rows; times UTC seconds (phase times interpolated between samples).
 * dir: +1 right, −1 left. Rates and banks are magnitudes toward the turn [°/s, deg].
 */
export interface TurnSpan {
  startIndex: number;
  endIndex: number;
  startT: number;
  endT: number;
  direction: 'left' | 'right';
  dir: 1 | -1;
  /** First / last sample with rate·dir ≥ 90 % of the steady rate, and the interpolated crossing times. */
  rollInEndIndex: number;
  rolloutStartIndex: number;
  rollInEndT: number;
  rolloutStartT: number;
  /** Interpolated times where rate·dir crosses half the steady rate going up / coming down. */
  halfInT: number;
  halfOutT: number;
  /** Median rate·dir of the samples at or above the entry threshold [°/s]. */
  steadyRateDps: number;
  /** Mean rate·dir over the steady phase [°/s]. */
  meanRateDps: number;
  peakBankDeg: number;
  meanBankDeg: number;
  /** Heading change in the turn's direction, start to end [deg, > 0, may exceed 360]. */
  headingChangeDeg: number;
  /** Heading change from rolloutStartT to the end [deg]. */
  rolloutLeadDeg: number;
  /** True heading at the start, at rolloutStartT and at the end [0, 360). */
  entryDegTrue: number;
  rolloutStartDegTrue: number;
  endDegTrue: number;
  /** false when the turn was cut short by a gap, unusable samples or the end of the log rather than a roll-out. */
  complete: boolean;
}

/** Time at which column c crosses `level` between rows a and b (linear interpolation; t[b] if c does not change). */
function crossingT(t: Float64Array, ca: number, cb: number, a: number, b: number, level: number): number {
  const d = cb - ca;
  if (!(Math.abs(d) > 0)) return t[b];
  const f = Math.min(1, Math.max(0, (level - ca) / d));
  return t[a] + f * (t[b] - t[a]);
}

/**
 * Finds the turns of a flight.
 *
 * Method (ours, hysteresis with hold times): a turn is confirmed once rate·dir ≥ enterRateDps has been held for
 * enterHoldS; it begins at the last sample before that run whose rate·dir was below exitRateDps (so the whole
 * roll-in is inside) and ends at the first sample of a run of rate·dir < exitRateDps lasting exitHoldS (a
 * reversal ends the turn too, since rate·dir goes negative). Both ends are then pushed outward while rate·dir
 * stays positive and keeps falling (the tails of the roll-in and roll-out below the exit rate), which stops at
 * the first noise wiggle, so noise cannot drag a turn along a straight leg. Samples with a NaN heading or rate, TAS below
 * minAirspeedMs (ground, taxi) or a new segment end a turn and never start one. Turns whose heading change is
 * below minHeadingChangeDeg are dropped.
 * Phases: steady rate = median rate·dir of the samples ≥ enterRateDps; the roll-in ends where rate·dir first
 * reaches 90 % of it, the roll-out starts where it last is ≥ 90 % (crossings interpolated). Heading change is
 * the sum of wrapped sample-to-sample differences (unwrapped), so a 360° orbit reads 360.
 * Columns used: t, headingDegTrue, turnRateDps, bankDeg, tasMs (gsMs where TAS is NaN), segment. No per-sample objects.
 * @param state reconstructed flight; @param opts thresholds (defaults DEFAULT_TURN_DETECTION, see debriefOptions.ts)
 * @returns turns in time order, non-overlapping (consecutive turns may share a boundary sample).
 * @example a 90° right standard-rate turn flown at 1 Hz → one TurnSpan, direction 'right', headingChangeDeg ≈ 90.
 */
// Method: hysteresis thresholding with hold times on the turn-rate column (ours; thresholds in debriefOptions.ts).
export function detectTurns(state: FlightState, opts: TurnDetectionOptions = DEFAULT_TURN_DETECTION): TurnSpan[] {
  const { n, t, headingDegTrue: hdg, turnRateDps: rate, bankDeg: bank, tasMs: tas, gsMs: gs, segment: seg } = state;
  const { enterRateDps: enter, enterHoldS, exitRateDps: exit, exitHoldS, minHeadingChangeDeg, minAirspeedMs } = opts;
  const usable = (i: number): boolean => {
    if (!(Number.isFinite(rate[i]) && Number.isFinite(hdg[i]) && Number.isFinite(t[i]))) return false;
    const v = Number.isFinite(tas[i]) ? tas[i] : gs[i];
    return v >= minAirspeedMs;
  };
  const turns: TurnSpan[] = [];
  let prevEnd = -1;
  let i = 0;
  while (i < n) {
    if (!(Math.abs(rate[i]) >= enter) || !usable(i)) { // the cheap rate test first: most rows are not turning
      i++;
      continue;
    }
    const dir: 1 | -1 = rate[i] > 0 ? 1 : -1;
    const runStart = i;
    let j = i;
    while (j + 1 < n && seg[j + 1] === seg[i] && usable(j + 1) && dir * rate[j + 1] >= enter) j++;
    if (t[j] - t[runStart] < enterHoldS) {
      i = j + 1;
      continue;
    }
    // Back to the last quiet sample before the run (inclusive), not past the previous turn's end.
    let s = runStart;
    while (s - 1 > prevEnd && seg[s - 1] === seg[s] && usable(s - 1) && dir * rate[s - 1] >= exit) s--;
    if (s - 1 >= Math.max(0, prevEnd) && seg[s - 1] === seg[s] && usable(s - 1)) s--;
    // Forward to the first sample of a quiet run lasting exitHoldS.
    let end = -1;
    let complete = true;
    let below = -1;
    for (let k = j + 1; k < n; k++) {
      if (seg[k] !== seg[s] || !usable(k)) {
        end = below >= 0 ? below : k - 1;
        complete = below >= 0;
        break;
      }
      if (dir * rate[k] < exit) {
        if (below < 0) below = k;
        if (t[k] - t[below] >= exitHoldS) {
          end = below;
          break;
        }
      } else below = -1;
    }
    if (end < 0) {
      end = below >= 0 ? below : n - 1;
      complete = below >= 0;
    }
    // Take in the tails below the exit rate while the rate keeps falling toward zero (stops at the first noise
    // wiggle, a reversal, a gap, or the previous turn's end).
    const inward = (k: number, from: number): boolean => seg[k] === seg[from] && usable(k) && dir * rate[k] <= dir * rate[from];
    while (s - 1 >= Math.max(0, prevEnd) && inward(s - 1, s) && dir * rate[s - 1] > 0) s--;
    if (s - 1 >= Math.max(0, prevEnd) && inward(s - 1, s) && dir * rate[s - 1] <= 0 && dir * rate[s] > 0) s--; // the sample where it reached zero
    if (complete) {
      while (end + 1 < n && inward(end + 1, end) && dir * rate[end + 1] > 0) end++;
      if (end + 1 < n && inward(end + 1, end) && dir * rate[end + 1] <= 0 && dir * rate[end] > 0) end++;
    }
    const span = measureTurn(state, s, end, dir, enter, complete);
    if (span && span.headingChangeDeg >= minHeadingChangeDeg) turns.push(span);
    prevEnd = end;
    i = Math.max(end, j + 1);
  }
  return turns;
}

/** Phases and measures of a turn between rows s and e (inclusive) in direction dir. Undefined if it has no core. */
function measureTurn(state: FlightState, s: number, e: number, dir: 1 | -1, enter: number, complete: boolean): TurnSpan | undefined {
  const { t, headingDegTrue: hdg, turnRateDps: rate, bankDeg: bank } = state;
  const m = e - s + 1;
  const core = new Float64Array(m);
  let nc = 0;
  for (let k = s; k <= e; k++) if (dir * rate[k] >= enter) core[nc++] = dir * rate[k];
  if (nc === 0) return undefined;
  const sorted = core.subarray(0, nc).sort();
  const steady = nc % 2 === 1 ? sorted[(nc - 1) / 2] : 0.5 * (sorted[nc / 2 - 1] + sorted[nc / 2]);
  const lvl = PHASE_RATE_SHARE * steady;
  const half = 0.5 * steady;
  let inEnd = s;
  while (inEnd < e && !(dir * rate[inEnd] >= lvl)) inEnd++;
  let outStart = e;
  while (outStart > s && !(dir * rate[outStart] >= lvl)) outStart--;
  if (outStart < inEnd) outStart = inEnd;
  const rollInEndT = inEnd > s ? crossingT(t, dir * rate[inEnd - 1], dir * rate[inEnd], inEnd - 1, inEnd, lvl) : t[s];
  const rolloutStartT = outStart < e ? crossingT(t, dir * rate[outStart], dir * rate[outStart + 1], outStart, outStart + 1, lvl) : t[e];
  let hi = s;
  while (hi < e && !(dir * rate[hi] >= half)) hi++;
  const halfInT = hi > s ? crossingT(t, dir * rate[hi - 1], dir * rate[hi], hi - 1, hi, half) : t[s];
  let ho = e;
  while (ho > s && !(dir * rate[ho] >= half)) ho--;
  const halfOutT = ho < e ? crossingT(t, dir * rate[ho], dir * rate[ho + 1], ho, ho + 1, half) : t[e];

  // Unwrapped heading relative to the start, and measures over the steady phase.
  const u = new Float64Array(m);
  for (let k = 1; k < m; k++) u[k] = u[k - 1] + wrap180(hdg[s + k] - hdg[s + k - 1]);
  let rateSum = 0;
  let bankSum = 0;
  let cnt = 0;
  let bankCnt = 0;
  for (let k = inEnd; k <= outStart; k++) {
    rateSum += dir * rate[k];
    cnt++;
    if (Number.isFinite(bank[k])) {
      bankSum += dir * bank[k];
      bankCnt++;
    }
  }
  let peakBank = NaN;
  for (let k = s; k <= e; k++) {
    const b = dir * bank[k];
    if (Number.isFinite(b) && !(b <= peakBank)) peakBank = b;
  }
  // Unwrapped heading at the interpolated roll-out start.
  const ro = outStart - s;
  let uRo = u[ro];
  if (outStart < e && t[outStart + 1] > t[outStart]) {
    const f = (rolloutStartT - t[outStart]) / (t[outStart + 1] - t[outStart]);
    uRo = u[ro] + f * (u[ro + 1] - u[ro]);
  }
  const total = dir * u[m - 1];
  return {
    startIndex: s,
    endIndex: e,
    startT: t[s],
    endT: t[e],
    direction: dir > 0 ? 'right' : 'left',
    dir,
    rollInEndIndex: inEnd,
    rolloutStartIndex: outStart,
    rollInEndT,
    rolloutStartT,
    halfInT,
    halfOutT,
    steadyRateDps: steady,
    meanRateDps: cnt > 0 ? rateSum / cnt : steady,
    peakBankDeg: peakBank,
    meanBankDeg: bankCnt > 0 ? bankSum / bankCnt : NaN,
    headingChangeDeg: total,
    rolloutLeadDeg: dir * (u[m - 1] - uRo),
    entryDegTrue: wrap360(hdg[s]),
    rolloutStartDegTrue: wrap360(hdg[s] + uRo),
    endDegTrue: wrap360(hdg[e]),
    complete,
  };
}
