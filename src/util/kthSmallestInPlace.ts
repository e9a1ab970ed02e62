// The k-th smallest of a column without sorting it: Hoare's FIND (quickselect), for percentiles of long flights.

/**
 * The value that would stand at index k of `values` sorted ascending, in O(n) expected time: C. A. R. Hoare,
 * "Algorithm 65: Find", Comm. ACM 4(7), 1961, with the middle of three as the pivot. Reorders `values`
 * (a scratch copy, not the caller's column) so that afterwards values[i] ≤ values[k] for i < k and
 * values[i] ≥ values[k] for i > k.
 *
 * @param values finite numbers (no NaN; −0 and 0 count as equal), length ≥ 1
 * @param k index 0 ≤ k < values.length
 * @returns the k-th smallest value
 */
export function kthSmallestInPlace(values: Float64Array, k: number): number {
  let lo = 0;
  let hi = values.length - 1;
  while (hi > lo) {
    const mid = (lo + hi) >> 1;
    // Middle of three: values[lo] ≤ values[mid] ≤ values[hi] afterwards.
    if (values[mid] < values[lo]) swap(values, mid, lo);
    if (values[hi] < values[lo]) swap(values, hi, lo);
    if (values[hi] < values[mid]) swap(values, hi, mid);
    const pivot = values[mid];
    let i = lo;
    let j = hi;
    while (i <= j) {
      while (values[i] < pivot) i++;
      while (values[j] > pivot) j--;
      if (i <= j) {
        swap(values, i, j);
        i++;
        j--;
      }
    }
    // Now values[lo..j] ≤ pivot ≤ values[i..hi], and every value between j and i equals the pivot.
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else return values[k];
  }
  return values[k];
}

function swap(a: Float64Array, i: number, j: number): void {
  const t = a[i];
  a[i] = a[j];
  a[j] = t;
}
