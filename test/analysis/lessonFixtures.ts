// Test helper (not a test): column builders for the analysis tests. Compass traces here come from closed forms
// (Williams eq. 2 via levelTurnReadingDeg) or from explicit formulas, never from the code under test.
import { levelTurnReadingDeg } from '../../src/compass/turningError.js';
import type { CompassTrace } from '../../src/compass/compassTrace.js';
import type { FieldAlongPath } from '../../src/magnetic/fieldAlongPath.js';
import type { FlightState } from '../../src/state/flightState.js';

export const DEG = Math.PI / 180;
export const G = 9.80665; // standard gravity, BIPM SI Brochure

export function wrap360(d: number): number {
  return ((d % 360) + 360) % 360;
}

export function wrap180(d: number): number {
  const w = wrap360(d);
  return w > 180 ? w - 360 : w;
}

/** A field with the same horizontal intensity, dip and variation at every row (true NED components). */
export function uniformField(n: number, hNt: number, dipDeg: number, variationDeg = 0): FieldAlongPath {
  return {
    n,
    xNt: new Float64Array(n).fill(hNt * Math.cos(variationDeg * DEG)),
    yNt: new Float64Array(n).fill(hNt * Math.sin(variationDeg * DEG)),
    zNt: new Float64Array(n).fill(hNt * Math.tan(dipDeg * DEG)),
    hNt: new Float64Array(n).fill(hNt),
    variationDeg: new Float64Array(n).fill(variationDeg),
    dipDeg: new Float64Array(n).fill(dipDeg),
    zone: new Uint8Array(n),
    model: 'uniform test field',
    decimalYear: 2026,
  };
}

/** A compass trace whose reading is given per row (errors split as told; defaults: all error in errDipTurnDeg). */
export function traceFromReadings(
  headingMagDeg: Float64Array, readingDeg: Float64Array,
  split: Partial<Record<'errDipTurnDeg' | 'errDipAccelDeg' | 'errLagSwirlDeg' | 'errDeviationDeg', Float64Array>> = {},
): CompassTrace {
  const n = readingDeg.length;
  const errorDeg = new Float64Array(n);
  for (let i = 0; i < n; i++) errorDeg[i] = wrap180(readingDeg[i] - headingMagDeg[i]);
  const zero = () => new Float64Array(n);
  const staticDeg = new Float64Array(n);
  // static = reading minus the dynamic and deviation parts given.
  for (let i = 0; i < n; i++) staticDeg[i] = wrap360(readingDeg[i] - (split.errLagSwirlDeg?.[i] ?? 0) - (split.errDeviationDeg?.[i] ?? 0));
  return {
    n,
    staticDeg,
    dynamicDeg: Float64Array.from(readingDeg, (r, i) => wrap360(r - (split.errDeviationDeg?.[i] ?? 0))),
    readingDeg,
    errorDeg,
    errDipTurnDeg: split.errDipTurnDeg ?? (split.errDipAccelDeg || split.errLagSwirlDeg || split.errDeviationDeg ? zero() : Float64Array.from(errorDeg)),
    errDipAccelDeg: split.errDipAccelDeg ?? zero(),
    errLagSwirlDeg: split.errLagSwirlDeg ?? zero(),
    errDeviationDeg: split.errDeviationDeg ?? zero(),
    tiltDeg: zero(),
    directiveRatio: new Float64Array(n).fill(1),
    unreliable: new Uint8Array(n),
    headingMagDeg,
  };
}

/**
 * The textbook static compass of a flight: reading = steady coordinated level-turn card at each row's magnetic
 * heading, bank and dip (Williams, "Compass Errors", eq. 2) — what the pilots of staticTurnCompassReading see.
 */
export function staticTurnTrace(state: FlightState, field: FieldAlongPath): CompassTrace {
  const n = state.n;
  const mag = new Float64Array(n);
  const reading = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    mag[i] = wrap360(state.headingDegTrue[i] - field.variationDeg[i]);
    reading[i] = levelTurnReadingDeg(mag[i], state.bankDeg[i], field.dipDeg[i]);
  }
  return traceFromReadings(mag, reading);
}

/** A FlightState from per-row formulas (columns the analysis does not read are zero). */
export function stateFromColumns(
  n: number, f: (i: number) => Partial<Record<'t' | 'lat' | 'lon' | 'altM' | 'velN' | 'velE' | 'windN' | 'windE' | 'tasMs' | 'headingDegTrue' | 'bankDeg' | 'turnRateDps' | 'accelLongMs2' | 'gsMs', number>>,
): FlightState {
  const col = () => new Float64Array(n);
  const s: FlightState = {
    n, t: col(), lat: col(), lon: col(), altM: col(), velN: col(), velE: col(), velD: col(), accN: col(), accE: col(), accD: col(),
    accSigmaMs2: col(), gsMs: col(), trackDegTrue: col(), windN: col(), windE: col(), tasMs: col(), headingDegTrue: col(),
    bankDeg: col(), pitchDeg: col(), turnRateDps: col(), accelLongMs2: col(), segment: new Int32Array(n), logRow: new Int32Array(n),
    winds: [], warnings: [],
  };
  for (let i = 0; i < n; i++) {
    const r = f(i);
    for (const [k, v] of Object.entries(r)) (s as unknown as Record<string, Float64Array>)[k][i] = v as number;
    s.logRow[i] = i;
  }
  return s;
}
