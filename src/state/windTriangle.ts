// The wind triangle: ground velocity = air velocity + wind (PHYSICS.md §5; the navigation computer's
// relation). Degrees true and m/s at the interface; wind direction is where it blows FROM.
import { DEG, RAD } from '../constants.js';
import { windVectorNe } from './windOption.js';

function deg360(rad: number): number {
  const d = rad * RAD;
  const w = d < 0 ? d + 360 : d;
  return w >= 360 ? 0 : w + 0;
}

/**
 * Heading to fly and ground speed made good on a wanted track: with the wind's cross-track component
 * w_x (right of track +) and along-track component w_a, the wind correction angle is
 * WCA = asin(−w_x / V) and GS = V cos WCA + w_a. NaN when the crosswind exceeds the TAS.
 * Example (PHYSICS.md check 28): TAS 100 kt, wind from 045 at 30 kt, track 000 → GS 76.5 kt, heading 012.2.
 */
export function headingForTrack(tasMs: number, trackDegTrue: number, windFromDegTrue: number, windSpeedMs: number): { headingDegTrue: number; gsMs: number; wcaDeg: number } {
  const { windN, windE } = windVectorNe(windFromDegTrue, windSpeedMs);
  const th = trackDegTrue * DEG;
  const across = -windN * Math.sin(th) + windE * Math.cos(th);
  const along = windN * Math.cos(th) + windE * Math.sin(th);
  if (!(tasMs > 0) || Math.abs(across) > tasMs) return { headingDegTrue: NaN, gsMs: NaN, wcaDeg: NaN };
  const wca = Math.asin(-across / tasMs);
  const gs = tasMs * Math.cos(wca) + along;
  return { headingDegTrue: deg360(th + wca), gsMs: gs, wcaDeg: wca * RAD };
}

/**
 * Track made good and ground speed for a heading flown: v_g = V (cos ψ, sin ψ) + w; drift = track − heading
 * in (−180, 180]. Example (PHYSICS.md check 29, KITPLANES): TAS 100 kt, wind from 270 at 20 kt, heading
 * 090 → GS 120 kt.
 */
export function trackForHeading(tasMs: number, headingDegTrue: number, windFromDegTrue: number, windSpeedMs: number): { trackDegTrue: number; gsMs: number; driftDeg: number } {
  const { windN, windE } = windVectorNe(windFromDegTrue, windSpeedMs);
  const psi = headingDegTrue * DEG;
  const vN = tasMs * Math.cos(psi) + windN;
  const vE = tasMs * Math.sin(psi) + windE;
  const gs = Math.hypot(vN, vE);
  const track = gs > 0 ? deg360(Math.atan2(vE, vN)) : NaN;
  let drift = track - headingDegTrue;
  drift -= 360 * Math.round(drift / 360);
  if (drift === -180) drift = 180;
  return { trackDegTrue: track, gsMs: gs, driftDeg: drift };
}
