// When the compass card has settled after a roll-out, and what it read then.

/** Where the card was read: row, time [UTC s], reading [0, 360) and whether it was quiet or time ran out. */
export interface SettledReading {
  index: number;
  t: number;
  deg: number;
  how: 'quiet' | 'timeout';
}

/**
 * First moment after row `from` at which the reading has changed by no more than rateDps (|Δψc/Δt| between
 * consecutive rows) for quietS, read at the end of that quiet stretch; if that does not happen by untilT, the
 * reading of the last row at or before untilT ('timeout'). NaN readings interrupt a quiet stretch.
 * "Read the compass only in straight, level, unaccelerated flight" and average the swings (FAA PHAK ch. 8) —
 * waiting for a quiet card is the debrief's version of that. Defaults of the callers: 0.5 °/s for 2 s, at most 10 s.
 * @param t times [UTC s], ascending; @param readingDeg compass reading [deg]; @param from row of the roll-out
 */
// Method: ours (quiet-window test on the reading's rate); practice from FAA PHAK ch. 8 "Compass errors".
export function settledReading(
  t: Float64Array, readingDeg: Float64Array, from: number, untilT: number, rateDps: number, quietS: number,
): SettledReading {
  const n = t.length;
  let last = from;
  let quietFrom = Number.isFinite(readingDeg[from]) ? from : -1;
  if (quietS <= 0 && quietFrom >= 0) return { index: from, t: t[from], deg: readingDeg[from], how: 'quiet' };
  for (let k = from + 1; k < n && t[k] <= untilT; k++) {
    last = k;
    const a = readingDeg[k - 1];
    const b = readingDeg[k];
    const dt = t[k] - t[k - 1];
    if (!(Number.isFinite(a) && Number.isFinite(b) && dt > 0)) {
      quietFrom = Number.isFinite(b) ? k : -1;
      continue;
    }
    let d = (b - a) % 360;
    if (d > 180) d -= 360;
    else if (d <= -180) d += 360;
    if (Math.abs(d) / dt <= rateDps) {
      if (quietFrom < 0) quietFrom = k - 1;
      if (t[k] - t[quietFrom] >= quietS) return { index: k, t: t[k], deg: b, how: 'quiet' };
    } else quietFrom = -1;
  }
  return { index: last, t: t[last], deg: readingDeg[last], how: 'timeout' };
}
