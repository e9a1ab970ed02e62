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
  const order: number[] = [];
  for (let i = 0; i < errorDeg.length; i++) if (Number.isFinite(errorDeg[i]) && Number.isFinite(tS[i])) order.push(i);
  order.sort((a, b) => Math.abs(errorDeg[b]) - Math.abs(errorDeg[a]) || a - b);
  const picked: number[] = [];
  for (const i of order) {
    if (picked.length >= count) break;
    if (picked.every((j) => Math.abs(tS[i] - tS[j]) >= separationS)) picked.push(i);
  }
  return picked;
}
