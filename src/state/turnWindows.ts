// Finding the stretches of a flight where the ground-velocity vector turns steadily one way in level
// flight: the raw material of a wind-from-turns circle fit.
import { RAD } from '../constants.js';

/** Track rate [deg/s] above which a sample counts as turning [practice: a 10° bank at 100 kt turns ~2°/s]. */
export const TURN_RATE_MIN_DPS = 0.4;
/** Vertical speed [m/s] (~500 ft/min) above which a sample is not level enough for a wind fit [practice]. */
export const LEVEL_MAX_VS_MS = 2.5;
/** Ground speed [m/s] below which a sample is not used (taxi, hover-like) [practice]. */
export const TURN_MIN_GS_MS = 10;
/** Breaks in turning shorter than this [s] are bridged (a wobble in the rate is not the end of a turn). */
export const TURN_BRIDGE_S = 4;
/** Windows longer than this much turn [deg] are cut into pieces of about 360° (wind may change over an orbit series). */
export const TURN_SPLIT_DEG = 540;

/** A window of samples [i0, i1) turning one way; trackChangeDeg is the (unsigned) ground-track change. */
export interface TurnWindow {
  i0: number;
  i1: number;
  /** +1 right, −1 left. */
  direction: 1 | -1;
  trackChangeDeg: number;
}

export interface TurnWindowSearch {
  windows: TurnWindow[];
  /** Turns of at least `minTrackChangeDeg` left out because the aircraft climbed or descended. */
  notLevel: TurnWindow[];
}

/**
 * Runs of samples, within one segment, whose ground-track rate ω_g = (v_N a_E − v_E a_N)/|v_h|² keeps
 * one sign with |ω_g| ≥ 0.4°/s (breaks under 4 s bridged), ground speed ≥ 10 m/s. Runs turning less
 * than `minTrackChangeDeg` are dropped; runs with any sample climbing or descending faster than
 * 2.5 m/s are returned apart (`notLevel`) and cut out of the windows. Runs beyond 540° are split into
 * pieces of ~360°.
 */
export function findTurnWindows(
  t: Float64Array,
  velN: Float64Array,
  velE: Float64Array,
  velD: Float64Array,
  accN: Float64Array,
  accE: Float64Array,
  segment: Int32Array,
  minTrackChangeDeg: number,
): TurnWindowSearch {
  const n = t.length;
  const rateDps = new Float64Array(n);
  const sign = new Int8Array(n);
  for (let i = 0; i < n; i++) {
    const vN = velN[i], vE = velE[i];
    const gs2 = vN * vN + vE * vE;
    const w = ((vN * accE[i] - vE * accN[i]) / gs2) * RAD;
    rateDps[i] = w;
    if (gs2 >= TURN_MIN_GS_MS * TURN_MIN_GS_MS && Math.abs(w) >= TURN_RATE_MIN_DPS) sign[i] = w > 0 ? 1 : -1;
  }
  // Bridge short breaks between samples of the same sign in one segment.
  let last = -1;
  for (let i = 0; i < n; i++) {
    if (sign[i] === 0) continue;
    if (last >= 0 && i - last > 1 && sign[last] === sign[i] && segment[last] === segment[i] && t[i] - t[last] <= TURN_BRIDGE_S) {
      for (let k = last + 1; k < i; k++) if (Math.hypot(velN[k], velE[k]) >= TURN_MIN_GS_MS) sign[k] = sign[i];
    }
    last = i;
  }
  const windows: TurnWindow[] = [];
  const notLevel: TurnWindow[] = [];
  let i = 0;
  while (i < n) {
    if (sign[i] === 0) { i++; continue; }
    let j = i + 1;
    while (j < n && sign[j] === sign[i] && segment[j] === segment[i]) j++;
    const run: TurnWindow = { i0: i, i1: j, direction: sign[i] as 1 | -1, trackChangeDeg: trackChange(t, rateDps, i, j) };
    if (run.trackChangeDeg >= minTrackChangeDeg) {
      let climbing = false;
      for (let k = i; k < j; k++) if (Math.abs(velD[k]) > LEVEL_MAX_VS_MS) { climbing = true; break; }
      if (climbing) notLevel.push(run);
      // The level parts of a run can still be windows.
      let k = i;
      while (k < j) {
        if (!(Math.abs(velD[k]) <= LEVEL_MAX_VS_MS)) { k++; continue; }
        let m = k + 1;
        while (m < j && Math.abs(velD[m]) <= LEVEL_MAX_VS_MS) m++;
        const change = trackChange(t, rateDps, k, m);
        if (change >= minTrackChangeDeg) splitWindow(t, rateDps, { i0: k, i1: m, direction: run.direction, trackChangeDeg: change }, windows);
        k = m;
      }
    }
    i = j;
  }
  return { windows, notLevel };
}

/** ∫|ω_g| dt over [i0, i1) by the trapezoid rule [deg]. */
function trackChange(t: Float64Array, rateDps: Float64Array, i0: number, i1: number): number {
  let s = 0;
  for (let k = i0 + 1; k < i1; k++) s += 0.5 * Math.abs(rateDps[k] + rateDps[k - 1]) * (t[k] - t[k - 1]);
  return s;
}

function splitWindow(t: Float64Array, rateDps: Float64Array, w: TurnWindow, out: TurnWindow[]): void {
  if (w.trackChangeDeg <= TURN_SPLIT_DEG) { out.push(w); return; }
  const pieces = Math.max(1, Math.round(w.trackChangeDeg / 360));
  const per = w.trackChangeDeg / pieces;
  let start = w.i0;
  let acc = 0;
  for (let k = w.i0 + 1; k < w.i1; k++) {
    acc += 0.5 * Math.abs(rateDps[k] + rateDps[k - 1]) * (t[k] - t[k - 1]);
    if (acc >= per && w.i1 - k > 2) {
      out.push({ i0: start, i1: k + 1, direction: w.direction, trackChangeDeg: acc });
      start = k;
      acc = 0;
    }
  }
  out.push({ i0: start, i1: w.i1, direction: w.direction, trackChangeDeg: acc });
}
