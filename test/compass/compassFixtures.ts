// Builders of FlightState / FieldAlongPath columns for the compass tests (hand-made inputs, no other stage used).
import type { FlightState } from '../../src/state/flightState.js';
import type { FieldAlongPath } from '../../src/magnetic/fieldAlongPath.js';

export const G = 9.80665;
const DEG = Math.PI / 180;

/** Per-sample description of the flight: true heading, pitch, bank [deg], NED kinematic acceleration [m/s²], turn rate [deg/s]. */
export interface Sample {
  t: number;
  headingDegTrue: number;
  pitchDeg?: number;
  bankDeg?: number;
  accN?: number;
  accE?: number;
  accD?: number;
  turnRateDps?: number;
  segment?: number;
}

/** A FlightState from samples (columns the compass does not read are zero). */
export function makeState(samples: Sample[]): FlightState {
  const n = samples.length;
  const col = () => new Float64Array(n);
  const s: FlightState = {
    n, t: col(), lat: col(), lon: col(), altM: col(), velN: col(), velE: col(), velD: col(),
    accN: col(), accE: col(), accD: col(), accSigmaMs2: col(), gsMs: col(), trackDegTrue: col(),
    windN: col(), windE: col(), tasMs: col(), headingDegTrue: col(), bankDeg: col(), pitchDeg: col(),
    turnRateDps: col(), accelLongMs2: col(), segment: new Int32Array(n), logRow: new Int32Array(n),
    winds: [], warnings: [],
  };
  samples.forEach((p, i) => {
    s.t[i] = p.t;
    s.headingDegTrue[i] = ((p.headingDegTrue % 360) + 360) % 360;
    s.pitchDeg[i] = p.pitchDeg ?? 0;
    s.bankDeg[i] = p.bankDeg ?? 0;
    s.accN[i] = p.accN ?? 0;
    s.accE[i] = p.accE ?? 0;
    s.accD[i] = p.accD ?? 0;
    s.turnRateDps[i] = p.turnRateDps ?? 0;
    s.segment[i] = p.segment ?? 0;
    s.logRow[i] = i;
  });
  return s;
}

/** A FieldAlongPath with the same field at every sample: horizontal H [nT], dip [deg, down +], variation [deg, east +]. */
export function uniformField(n: number, hNt: number, dipDeg: number, variationDeg = 0, zone = 0): FieldAlongPath {
  const f: FieldAlongPath = {
    n, xNt: new Float64Array(n), yNt: new Float64Array(n), zNt: new Float64Array(n), hNt: new Float64Array(n),
    variationDeg: new Float64Array(n), dipDeg: new Float64Array(n), zone: new Uint8Array(n), model: 'test', decimalYear: 2026,
  };
  for (let i = 0; i < n; i++) setField(f, i, hNt, dipDeg, variationDeg, zone);
  return f;
}

export function setField(f: FieldAlongPath, i: number, hNt: number, dipDeg: number, variationDeg: number, zone = 0): void {
  f.xNt[i] = hNt * Math.cos(variationDeg * DEG);
  f.yNt[i] = hNt * Math.sin(variationDeg * DEG);
  f.zNt[i] = hNt * Math.tan(dipDeg * DEG);
  f.hNt[i] = hNt;
  f.variationDeg[i] = variationDeg;
  f.dipDeg[i] = dipDeg;
  f.zone[i] = zone;
}

/** Field vector (true NED) [nT] for a horizontal intensity, dip and variation. */
export function fieldVector(hNt: number, dipDeg: number, variationDeg = 0): [number, number, number] {
  return [hNt * Math.cos(variationDeg * DEG), hNt * Math.sin(variationDeg * DEG), hNt * Math.tan(dipDeg * DEG)];
}

/**
 * Steady coordinated level turn sample: centripetal acceleration g·tan φ toward the turn centre (horizontal, normal to
 * the heading, to the right for φ > 0) and turn rate from tan φ = V ω / g.
 */
export function coordinatedTurnAccel(headingDegTrue: number, bankDeg: number): { accN: number; accE: number } {
  const a = G * Math.tan(bankDeg * DEG);
  const p = headingDegTrue * DEG;
  return { accN: -a * Math.sin(p), accE: a * Math.cos(p) };
}

/** Signed difference a − b wrapped to (−180, 180]. */
export function diff180(a: number, b: number): number {
  let d = (a - b) % 360;
  if (d > 180) d -= 360;
  if (d <= -180) d += 360;
  return d;
}
