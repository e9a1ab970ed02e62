// Magnetic heading of one row: ψm = true heading − variation (variation east +), as the compass stage defines it.
import { wrap360 } from '../geo/angles.js';
import type { CompassTrace } from '../compass/compassTrace.js';
import type { FieldAlongPath } from '../magnetic/fieldAlongPath.js';
import type { FlightState } from '../state/flightState.js';

/**
 * ψm [0, 360) of row k: the compass stage's headingMagDeg column when it has one, else true heading − variation
 * ("true = magnetic + variation, east +", PHYSICS.md §0). NaN when an input is missing.
 */
// Convention: PHYSICS.md §0 (psi_m = psi − D).
export function magneticHeadingAt(state: FlightState, field: FieldAlongPath, compass: CompassTrace, k: number): number {
  const col = compass.headingMagDeg;
  if (col !== undefined) return col[k];
  return wrap360(state.headingDegTrue[k] - field.variationDeg[k]);
}
