// Which samples to draw: min/max of the compass error per bucket, plus forced rows (segment ends, events).

/**
 * Picks the rows to draw from a long flight so that every compass-error extreme survives.
 * Min/max decimation per bucket, the two-extremes core of M4 (U. Jugel et al., "M4: A
 * Visualization-Oriented Time Series Data Aggregation", PVLDB 7(10), 2014), here with the compass
 * error as the column whose extremes are kept: the rows are cut into B equal-count buckets and in each
 * bucket the rows of lowest and highest finite `errorDeg` are kept (the first row when none is finite).
 * The first and last row and `forcedRows` (segment starts/ends, event times) are always kept.
 *
 * @param errorDeg compass error per row [deg]; NaN allowed
 * @param maxPoints upper bound on the result length (≥ 2); all rows are returned when n ≤ maxPoints
 * @param forcedRows rows that must be drawn (any order, duplicates and out-of-range values ignored)
 * @returns sorted, distinct row indices, length ≤ maxPoints while the forced rows take at most
 *   maxPoints − 2 (beyond that, forced rows + 2)
 */
export function downsampleForDrawing(errorDeg: Float64Array, maxPoints: number, forcedRows: ArrayLike<number>): Int32Array {
  const n = errorDeg.length;
  if (n <= maxPoints) {
    const all = new Int32Array(n);
    for (let i = 0; i < n; i++) all[i] = i;
    return all;
  }
  const keep = new Uint8Array(n);
  keep[0] = 1;
  keep[n - 1] = 1;
  let forced = 2;
  for (let k = 0; k < forcedRows.length; k++) {
    const r = forcedRows[k];
    if (Number.isInteger(r) && r >= 0 && r < n && keep[r] === 0) {
      keep[r] = 1;
      forced++;
    }
  }
  const buckets = Math.max(1, Math.floor((maxPoints - forced) / 2));
  for (let b = 0; b < buckets; b++) {
    const i0 = Math.floor((b * n) / buckets);
    const i1 = Math.floor(((b + 1) * n) / buckets);
    let iMin = -1;
    let iMax = -1;
    for (let i = i0; i < i1; i++) {
      const e = errorDeg[i];
      if (!Number.isFinite(e)) continue;
      if (iMin < 0 || e < errorDeg[iMin]) iMin = i;
      if (iMax < 0 || e > errorDeg[iMax]) iMax = i;
    }
    if (iMin < 0) keep[i0] = 1;
    else {
      keep[iMin] = 1;
      keep[iMax] = 1;
    }
  }
  let m = 0;
  for (let i = 0; i < n; i++) m += keep[i];
  const rows = new Int32Array(m);
  for (let i = 0, j = 0; i < n; i++) if (keep[i] === 1) rows[j++] = i;
  return rows;
}
