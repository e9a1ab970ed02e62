// A wind table (by height or by time) evaluated at each sample.
import { windVectorNe, type WindTableRow } from './windOption.js';

/**
 * Wind at each sample from a table keyed by height [m] (every row altM) or time [UTC s] (every row t):
 * linear in the north/east components between the rows (sorted by key), held beyond the first and last
 * row. A sample with NaN key (e.g. no altitude) gets the table's first row. Rows are assumed checked
 * (checkWindOption). Returns air-mass velocity columns (blowing TO) [m/s].
 */
export function windFromTable(rows: WindTableRow[], t: Float64Array, altM: Float64Array): { windN: Float64Array; windE: Float64Array } {
  const byAlt = rows[0].altM !== undefined;
  const sorted = rows
    .map((r) => ({ key: (byAlt ? r.altM : r.t) as number, ...windVectorNe(r.fromDegTrue, r.speedMs) }))
    .sort((a, b) => a.key - b.key);
  const n = t.length;
  const windN = new Float64Array(n);
  const windE = new Float64Array(n);
  const keys = byAlt ? altM : t;
  for (let i = 0; i < n; i++) {
    const k = keys[i];
    let j = 0;
    if (!Number.isFinite(k) || k <= sorted[0].key) j = -1;
    else while (j + 1 < sorted.length && sorted[j + 1].key < k) j++;
    if (j < 0 || j === sorted.length - 1) {
      const r = j < 0 ? sorted[0] : sorted[j];
      windN[i] = r.windN;
      windE[i] = r.windE;
      continue;
    }
    const a = sorted[j], b = sorted[j + 1];
    const f = (k - a.key) / (b.key - a.key);
    windN[i] = a.windN + f * (b.windN - a.windN);
    windE[i] = a.windE + f * (b.windE - a.windE);
  }
  return { windN, windE };
}
