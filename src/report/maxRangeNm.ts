// The plan view's largest distance from the reference fix, with Math.hypot only where it can matter.

/**
 * Largest finite hypot(eastNm[i], northNm[i]) [NM], 0 when there is none; the same value as the plain scan
 * with Math.hypot at every row. sqrt(e² + n²) and Math.hypot agree to a few ulps, so a row whose e² + n²
 * lies below (1 − 1e-9)·max² cannot reach the largest so far and is skipped; the bound is kept off while
 * max² could underflow.
 */
export function maxRangeNm(eastNm: Float64Array, northNm: Float64Array): number {
  let maxNm = 0;
  let skipBelowSq = 0;
  for (let i = 0; i < eastNm.length; i++) {
    const e = eastNm[i];
    const n = northNm[i];
    if (e * e + n * n < skipBelowSq) continue;
    const r = Math.hypot(e, n);
    if (Number.isFinite(r) && r > maxNm) {
      maxNm = r;
      skipBelowSq = r > 1e-100 ? r * r * (1 - 1e-9) : 0;
    }
  }
  return maxNm;
}
