// The [0, 360) and (−180, 180] wraps of geo/angles, bit for bit, for the per-sample loops of the report.

/**
 * wrap360 of geo/angles, bit for bit, without the floating-point remainder when |deg| < 360 (there
 * deg % 360 is deg exactly, ECMA-262 §6.1.6.1.6), which is nearly every angle of a flight.
 */
export function wrap360Fast(deg: number): number {
  const r = deg < 360 && deg > -360 ? deg : deg % 360;
  const w = r < 0 ? r + 360 : r;
  return w === 360 ? 0 : w + 0; // + 0 turns -0 into 0
}

/** wrap180 of geo/angles, bit for bit (by way of wrap360Fast). */
export function wrap180Fast(deg: number): number {
  const w = wrap360Fast(deg);
  return w > 180 ? w - 360 : w;
}
