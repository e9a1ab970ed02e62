// Test flights for the end-to-end checks: the same lesson pattern placed at several latitudes, both
// hemispheres and the magnetic equator, with wind. Invented data; positions are open country or sea.
import type { FlightScript, ScriptLeg } from '../../src/synth/flightScript.js';
import { KT_MS } from '../../src/constants.js';

export interface LessonPlace {
  name: string;
  latDeg: number;
  lonDeg: number;
  windFromDeg: number;
  windKt: number;
}

/** Places chosen for the spread of dip: mid-north, high-north, equatorial, mid-south, high-south. */
export const LESSON_PLACES: LessonPlace[] = [
  { name: 'mid-north', latDeg: 47.3, lonDeg: -101.2, windFromDeg: 280, windKt: 18 },
  { name: 'high-north', latDeg: 63.8, lonDeg: 22.5, windFromDeg: 40, windKt: 25 },
  { name: 'near-magnetic-equator', latDeg: 9.5, lonDeg: -73.2, windFromDeg: 120, windKt: 10 },
  { name: 'mid-south', latDeg: -34.7, lonDeg: 146.1, windFromDeg: 200, windKt: 22 },
  { name: 'high-south', latDeg: -46.1, lonDeg: 169.2, windFromDeg: 310, windKt: 30 },
];

/** A 20-minute lesson at 1 Hz: straight legs, standard-rate turns through all quadrants, a 30° bank turn, a speed change. */
export function lessonScript(p: LessonPlace, sampleRateHz = 1): FlightScript {
  const turn = (direction: 'left' | 'right', byDeg: number, bankDeg?: number): ScriptLeg =>
    bankDeg !== undefined ? { kind: 'turn', direction, byDeg, bankDeg } : { kind: 'turn', direction, byDeg };
  const straight = (s: number): ScriptLeg => ({ kind: 'straight', durationS: s });
  return {
    name: `lesson ${p.name}`,
    start: { t0: Date.UTC(2026, 6, 14, 9, 0, 0) / 1000, latDeg: p.latDeg, lonDeg: p.lonDeg, altM: 900, headingDegTrue: 10, tasMs: 100 * KT_MS },
    wind: { fromDegTrue: p.windFromDeg, speedMs: p.windKt * KT_MS },
    sampleRateHz,
    legs: [
      straight(60),
      turn('right', 90),
      straight(45),
      turn('right', 180),
      straight(45),
      turn('left', 270),
      straight(45),
      turn('right', 360),
      straight(40),
      turn('left', 120, 30),
      straight(45),
      { kind: 'speed', toTasMs: 120 * KT_MS, accelMs2: 0.5 },
      straight(30),
      { kind: 'speed', toTasMs: 95 * KT_MS, accelMs2: 0.5 },
      straight(40),
      { kind: 'climb', toAltM: 1500, rateMs: 3 },
      straight(30),
      turn('left', 200),
      straight(60),
    ],
  };
}
