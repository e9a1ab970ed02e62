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
