// Divergence windows: where the compass and the magnetic heading parted by more than a threshold, and why.
import type { CompassTrace } from '../compass/compassTrace.js';
import type { DivergenceWindow, ErrorSplitMeans } from './analysisTypes.js';

/** Thresholds of findDivergenceWindows. Defaults in debriefOptions.ts (10°, 5 s, 2°: team choice, common practice). */
export interface DivergenceOptions {
  thresholdDeg: number;
  minS: number;
  hysteresisDeg: number;
}

const CAUSES = ['turn', 'speed-change', 'lag-swirl', 'deviation'] as const;

/**
 * Spans where |compass error| (reading − ψm) exceeded thresholdDeg for at least minS.
 *
 * Method (ours, hysteresis): a window opens at the first row with |error| > thresholdDeg and stays open while
 * |error| > thresholdDeg − hysteresisDeg, within one segment, with finite errors; it is kept when it lasted ≥ minS
 * (endT − startT). Cause: the component of the error split with the largest mean |value| over the window —
 * errDipTurnDeg → 'turn', errDipAccelDeg → 'speed-change', errLagSwirlDeg → 'lag-swirl', errDeviationDeg →
 * 'deviation' (ties in that order). The threshold's default, 10°, is a team choice (common practice); the 10° of
 * 14 CFR 25.1327 is a limit on deviation, not on the dynamic error.
 * @param t times [UTC s]; @param segment segment id per row (a new segment closes a window)
 * @returns windows in time order.
 */
// Method: ours (hysteresis thresholding; cause = largest mean |component| of the error split, DESIGN.md samples CSV).
export function findDivergenceWindows(
  t: Float64Array, segment: Int32Array, compass: CompassTrace, opts: DivergenceOptions,
): Array<Required<DivergenceWindow>> {
  const err = compass.errorDeg;
  const n = err.length;
  const open = opts.thresholdDeg;
  const close = opts.thresholdDeg - opts.hysteresisDeg;
  const out: Array<Required<DivergenceWindow>> = [];
  let i = 0;
  while (i < n) {
    if (!(Math.abs(err[i]) > open)) {
      i++;
      continue;
    }
    let j = i;
    while (j + 1 < n && segment[j + 1] === segment[i] && Math.abs(err[j + 1]) > close) j++;
    if (t[j] - t[i] >= opts.minS) out.push(measureWindow(t, compass, i, j));
    i = j + 1;
  }
  return out;
}

function meanAbs(col: Float64Array, i: number, j: number): number {
  let s = 0;
  let c = 0;
  for (let k = i; k <= j; k++) {
    const v = col[k];
    if (Number.isFinite(v)) {
      s += Math.abs(v);
      c++;
    }
  }
  return c > 0 ? s / c : 0;
}

function measureWindow(t: Float64Array, c: CompassTrace, i: number, j: number): Required<DivergenceWindow> {
  let peak = i;
  for (let k = i + 1; k <= j; k++) if (Math.abs(c.errorDeg[k]) > Math.abs(c.errorDeg[peak])) peak = k;
  const means: ErrorSplitMeans = {
    turn: meanAbs(c.errDipTurnDeg, i, j),
    speedChange: meanAbs(c.errDipAccelDeg, i, j),
    lagSwirl: meanAbs(c.errLagSwirlDeg, i, j),
    deviation: meanAbs(c.errDeviationDeg, i, j),
  };
  const vals = [means.turn, means.speedChange, means.lagSwirl, means.deviation];
  let best = 0;
  for (let k = 1; k < 4; k++) if (vals[k] > vals[best]) best = k;
  return {
    startIndex: i,
    endIndex: j,
    startT: t[i],
    endT: t[j],
    peakErrorDeg: c.errorDeg[peak],
    peakT: t[peak],
    cause: CAUSES[best],
    durationS: t[j] - t[i],
    meanAbsSplitDeg: means,
  };
}
