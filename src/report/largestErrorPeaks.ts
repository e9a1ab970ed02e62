// The biggest compass errors of a flight, one per episode: greedy selection of separated |error| peaks.

/**
 * Rows of the `count` largest |errorDeg| values such that no two picked rows lie closer than
 * `separationS` seconds (greedy non-maximum suppression: take the largest remaining, suppress its
 * neighbourhood, repeat). NaN errors are ignored.
 *
 * @param tS sample times [s], non-decreasing
 * @param errorDeg signed error [deg]
 * @param count how many peaks at most (≥ 0)
 * @param separationS minimum spacing of two peaks [s] (≥ 0)
 * @returns row indices, largest |error| first
 */
export function largestErrorPeaks(tS: Float64Array, errorDeg: Float64Array, count: number, separationS: number): number[] {
  // Same picks as sorting by |error| (ties: earlier row first) and walking down the list, but one scan per
  // pick: the largest |error| among rows not within separationS of a row already picked.
  const picked: number[] = [];
  while (picked.length < count) {
    let best = -1;
    let bestAbs = -1;
    for (let i = 0; i < errorDeg.length; i++) {
      const e = Math.abs(errorDeg[i]);
      if (!(e > bestAbs) || !Number.isFinite(e) || !Number.isFinite(tS[i])) continue;
      let free = true;
      for (let k = 0; k < picked.length; k++) if (picked[k] === i || Math.abs(tS[i] - tS[picked[k]]) < separationS) { free = false; break; }
      if (free) {
        best = i;
        bestAbs = e;
      }
    }
    if (best < 0) break;
    picked.push(best);
  }
  return picked;
}
