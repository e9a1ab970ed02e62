// Rounded copies of columns at chosen rows, for a compact JSON payload (NaN → null).

/** x rounded to `decimals` places; null when x is not finite. */
export function roundOrNull(x: number, decimals: number): number | null {
  if (!Number.isFinite(x)) return null;
  const f = 10 ** decimals;
  const r = Math.round(x * f) / f;
  return r === 0 ? 0 : r; // no "-0" in the JSON
}

/** col[rows[k]] · scale, rounded to `decimals` places; null for NaN. */
export function compactAtRows(col: ArrayLike<number>, rows: Int32Array, decimals: number, scale = 1): (number | null)[] {
  const out = new Array<number | null>(rows.length);
  for (let k = 0; k < rows.length; k++) out[k] = roundOrNull(col[rows[k]] * scale, decimals);
  return out;
}

/** Like compactAtRows for a direction in [0, 360): a value rounding up to 360 is written as 0. */
export function compactDirectionAtRows(col: ArrayLike<number>, rows: Int32Array, decimals: number): (number | null)[] {
  const out = compactAtRows(col, rows, decimals);
  for (let k = 0; k < out.length; k++) {
    const v = out[k];
    if (v !== null && v >= 360) out[k] = roundOrNull(v - 360, decimals);
  }
  return out;
}
