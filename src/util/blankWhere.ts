// A column with the samples of a mask left out as NaN (the unreliable card readings, say).

/** A copy of `col` with NaN where `mask` is set. */
export function blankWhere(col: Float64Array, mask: Uint8Array): Float64Array {
  const out = new Float64Array(col.length);
  for (let i = 0; i < out.length; i++) out[i] = mask[i] ? NaN : col[i];
  return out;
}
