// Angle helpers with stated interval contracts. Degrees in, degrees out.

/** Wraps an angle to [0, 360). NaN stays NaN. */
export function wrap360(deg: number): number {
  // No remainder where |deg| < 360, nearly every angle of a flight: there deg % 360 is deg exactly (ECMA-262 §6.1.6.1.6).
  const r = deg < 360 && deg > -360 ? deg : deg % 360;
  const w = r < 0 ? r + 360 : r;
  return w === 360 ? 0 : w + 0; // + 0 turns -0 into 0
}

/** Wraps an angle to (−180, 180]. NaN stays NaN. */
export function wrap180(deg: number): number {
  const w = wrap360(deg);
  return w > 180 ? w - 360 : w;
}

/** Signed smallest difference a − b in (−180, 180]: positive when a lies clockwise (right) of b. */
export function angleDiffDeg(a: number, b: number): number {
  return wrap180(a - b);
}

/** Circular mean of angles [deg] in [0, 360); NaN for an empty or fully cancelling set. NaN entries are skipped. */
export function circularMeanDeg(values: ArrayLike<number>): number {
  let s = 0;
  let c = 0;
  let n = 0;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (!Number.isFinite(v)) continue;
    s += Math.sin((v * Math.PI) / 180);
    c += Math.cos((v * Math.PI) / 180);
    n++;
  }
  if (n === 0 || Math.hypot(s, c) < 1e-12 * n) return NaN;
  return wrap360((Math.atan2(s, c) * 180) / Math.PI);
}

/**
 * Unwraps a column of angles [deg] in place so that consecutive finite values never jump by more
 * than 180°. NaN entries are kept and do not break the continuity of the finite ones around them.
 */
export function unwrapDegInPlace(values: Float64Array): Float64Array {
  let prev = NaN;
  let offset = 0;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (!Number.isFinite(v)) continue;
    if (Number.isFinite(prev)) {
      const d = v + offset - prev;
      offset -= 360 * Math.round(d / 360);
    }
    values[i] = v + offset;
    prev = values[i];
  }
  return values;
}

/** asin clamped to [−1, 1] so that rounding just past ±1 gives ±π/2 instead of NaN. */
export function asinClamped(x: number): number {
  return Math.asin(Math.max(-1, Math.min(1, x)));
}

/** acos clamped to [−1, 1] so that rounding just past ±1 gives 0 or π instead of NaN. */
export function acosClamped(x: number): number {
  return Math.acos(Math.max(-1, Math.min(1, x)));
}
