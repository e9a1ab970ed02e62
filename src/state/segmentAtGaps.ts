// Splitting a time column into segments at gaps. Nothing is invented inside a gap: each segment is
// smoothed on its own and the state restarts after it.
import { OptionError } from '../errors.js';
import { kthSmallestInPlace } from '../util/kthSmallestInPlace.js';

/** Least gap threshold [s] whatever the sampling rate [practice]. */
export const MIN_GAP_S = 5;

/** A gap is longer than this many median sampling intervals [practice]. */
export const GAP_MEDIAN_FACTOR = 5;

export interface Segmentation {
  /** Segment id per sample, 0, 1, 2, … in time order. */
  segment: Int32Array;
  /** First sample index of each segment; `starts.length` segments; segment k ends at starts[k+1] − 1. */
  starts: Int32Array;
  /** The threshold used [s]: a step dt > thresholdS starts a new segment. */
  thresholdS: number;
  /** The median sampling interval [s] (of positive steps); NaN for fewer than two samples. */
  medianDtS: number;
  /** Each gap: last time before it and first time after it [UTC s]. */
  gaps: { t0: number; t1: number }[];
}

/** Median of the positive steps of a non-decreasing time column [s]; NaN when there are none. */
export function medianPositiveStepS(t: Float64Array): number {
  const steps = new Float64Array(Math.max(0, t.length - 1));
  let k = 0;
  for (let i = 1; i < t.length; i++) {
    const d = t[i] - t[i - 1];
    if (d > 0) steps[k++] = d;
  }
  if (k === 0) return NaN;
  const s = steps.subarray(0, k);
  const m = k >> 1;
  const hi = kthSmallestInPlace(s, m);
  if (k % 2 === 1) return hi;
  // After the selection everything left of m is ≤ s[m]: the lower middle is their maximum.
  let lo = s[0];
  for (let i = 1; i < m; i++) if (s[i] > lo) lo = s[i];
  return 0.5 * (lo + hi);
}

/**
 * Splits a non-decreasing time column [UTC s] at steps longer than the gap threshold:
 * `gapS` when given, else max(5 s, 5 × median step) [practice]. Throws OptionError for a gapS that
 * is not a positive finite number of seconds.
 * Example: t = [0, 1, 2, 30, 31] → segment [0, 0, 0, 1, 1], one gap {t0: 2, t1: 30}.
 */
export function segmentAtGaps(t: Float64Array, gapS?: number): Segmentation {
  if (gapS !== undefined && !(Number.isFinite(gapS) && gapS > 0)) {
    throw new OptionError('gapS', `gap threshold must be a positive number of seconds, got ${gapS}`);
  }
  const medianDtS = medianPositiveStepS(t);
  const thresholdS = gapS ?? Math.max(MIN_GAP_S, Number.isFinite(medianDtS) ? GAP_MEDIAN_FACTOR * medianDtS : MIN_GAP_S);
  const segment = new Int32Array(t.length);
  const starts: number[] = t.length > 0 ? [0] : [];
  const gaps: { t0: number; t1: number }[] = [];
  let id = 0;
  for (let i = 1; i < t.length; i++) {
    if (t[i] - t[i - 1] > thresholdS) {
      id++;
      starts.push(i);
      gaps.push({ t0: t[i - 1], t1: t[i] });
    }
    segment[i] = id;
  }
  return { segment, starts: Int32Array.from(starts), thresholdS, medianDtS, gaps };
}
