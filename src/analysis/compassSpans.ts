// Spans of straight flight on which the compass reading held steady: candidates for "flown on the compass".
import { wrap180 } from '../geo/angles.js';
import type { CompassSpanOptions } from './debriefOptions.js';

/**
 * Rows i0…i1 (inclusive) outside turns where the reading stayed within ±bandDeg of a steady value for ≥ minS.
 * Method (ours, greedy in one pass): from a starting row, extend while the spread (max − min of the reading's
 * offsets from the first row, wrapped) stays ≤ 2·bandDeg, the row is outside every turn, in the same segment and
 * has a finite reading; keep the run if it lasted ≥ minS; restart at the row that broke it.
 * @param t times [UTC s]; @param readingDeg compass reading [deg]; @param segment segment ids
 * @param turns detected turns (their rows are excluded)
 */
// Method: ours (greedy band test; the reading is the simulated compass, since a pilot on the compass holds its reading).
export function findSteadyCompassSpans(
  t: Float64Array, readingDeg: Float64Array, segment: Int32Array,
  turns: ReadonlyArray<{ startIndex: number; endIndex: number }>, opts: CompassSpanOptions,
): Array<{ i0: number; i1: number }> {
  const n = t.length;
  const inTurn = new Uint8Array(n);
  for (const tr of turns) inTurn.fill(1, Math.max(0, tr.startIndex), Math.min(n, tr.endIndex + 1));
  const out: Array<{ i0: number; i1: number }> = [];
  const width = 2 * opts.bandDeg;
  let i = 0;
  while (i < n) {
    if (inTurn[i] === 1 || !Number.isFinite(readingDeg[i])) {
      i++;
      continue;
    }
    let lo = 0;
    let hi = 0;
    let j = i + 1;
    for (; j < n; j++) {
      if (inTurn[j] === 1 || segment[j] !== segment[i] || !Number.isFinite(readingDeg[j])) break;
      const d = wrap180(readingDeg[j] - readingDeg[i]);
      const nlo = d < lo ? d : lo;
      const nhi = d > hi ? d : hi;
      if (nhi - nlo > width) break;
      lo = nlo;
      hi = nhi;
    }
    if (t[j - 1] - t[i] >= opts.minS) out.push({ i0: i, i1: j - 1 });
    i = j > i + 1 ? j : i + 1;
  }
  return out;
}
