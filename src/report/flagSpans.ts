// Runs of a per-sample flag as time spans, for shading (unreliable card readings, log gaps).
import type { ReportSpan } from './reportModelTypes.js';

/**
 * Maximal runs of rows where flag[i] !== 0, as [t of first row, t of last row] spans [UTC s].
 * Runs broken by a change of segment are split there (a gap is not part of a run).
 */
export function flagSpans(tUtc: Float64Array, flag: ArrayLike<number>, segment: ArrayLike<number>): ReportSpan[] {
  const spans: ReportSpan[] = [];
  let start = -1;
  for (let i = 0; i <= tUtc.length; i++) {
    const on = i < tUtc.length && flag[i] !== 0 && (start < 0 || segment[i] === segment[start]);
    if (on && start < 0) start = i;
    if (!on && start >= 0) {
      spans.push({ t0Utc: tUtc[start], t1Utc: tUtc[i - 1] });
      start = i < tUtc.length && flag[i] !== 0 ? i : -1;
    }
  }
  return spans;
}

/** Gaps between consecutive segments: [last t of one segment, first t of the next] [UTC s]. */
export function segmentGaps(tUtc: Float64Array, segment: ArrayLike<number>): ReportSpan[] {
  const gaps: ReportSpan[] = [];
  for (let i = 1; i < tUtc.length; i++) if (segment[i] !== segment[i - 1]) gaps.push({ t0Utc: tUtc[i - 1], t1Utc: tUtc[i] });
  return gaps;
}

/**
 * Joins spans separated by at most maxGapS seconds (spans sorted by time, non-overlapping). With
 * maxGapS = flight duration / K the result has at most K + 1 spans, which bounds the shapes a chart draws.
 */
export function mergeCloseSpans(spans: ReportSpan[], maxGapS: number): ReportSpan[] {
  const out: ReportSpan[] = [];
  for (const sp of spans) {
    const last = out[out.length - 1];
    if (last !== undefined && sp.t0Utc - last.t1Utc <= maxGapS) last.t1Utc = Math.max(last.t1Utc, sp.t1Utc);
    else out.push({ t0Utc: sp.t0Utc, t1Utc: sp.t1Utc });
  }
  return out;
}
