// Smallest and largest finite value of a column.

/** { min, max } over the finite values; both NaN when there is none. */
export function finiteRange(col: ArrayLike<number>): { min: number; max: number } {
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i < col.length; i++) {
    const v = col[i];
    if (!Number.isFinite(v)) continue;
    if (v < min) min = v;
    if (v > max) max = v;
  }
  return min <= max ? { min, max } : { min: NaN, max: NaN };
}
