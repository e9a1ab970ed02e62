// Turning per-sample flags into time spans for warnings a pilot can read.

/** A closed time span [UTC s]. */
export interface TimeSpan {
  t0: number;
  t1: number;
}

/**
 * Runs of consecutive flagged samples (flag[i] !== 0) as time spans; a new span starts when the flag
 * stops or when consecutive flagged samples are more than `joinS` seconds apart (default: never split).
 */
export function flaggedSpans(flag: ArrayLike<number>, t: Float64Array, joinS = Infinity): TimeSpan[] {
  const spans: TimeSpan[] = [];
  let start = -1;
  let last = -1;
  for (let i = 0; i < flag.length; i++) {
    if (flag[i] !== 0) {
      if (start >= 0 && t[i] - t[last] > joinS) {
        spans.push({ t0: t[start], t1: t[last] });
        start = i;
      } else if (start < 0) start = i;
      last = i;
    } else if (start >= 0) {
      spans.push({ t0: t[start], t1: t[last] });
      start = -1;
    }
  }
  if (start >= 0) spans.push({ t0: t[start], t1: t[last] });
  return spans;
}

/** UTC time as ISO 8601 with whole seconds, e.g. 2026-05-04T10:11:12Z; "?" for a non-finite time. */
export function utcIso(t: number): string {
  if (!Number.isFinite(t)) return '?';
  return new Date(Math.round(t) * 1000).toISOString().replace('.000Z', 'Z');
}

/** "10:11:12Z–10:12:40Z, …" listing at most `max` spans (ISO times), then "and N more". */
export function describeSpans(spans: TimeSpan[], max = 5): string {
  const shown = spans.slice(0, max).map((s) => (s.t1 > s.t0 ? `${utcIso(s.t0)} to ${utcIso(s.t1)}` : utcIso(s.t0)));
  const more = spans.length > max ? `, and ${spans.length - max} more` : '';
  return shown.join(', ') + more;
}
