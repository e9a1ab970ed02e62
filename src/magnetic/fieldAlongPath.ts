// FieldAlongPath: the World Magnetic Model field at each sample of a flight.

/** Zone of the WMM's weak horizontal field: 0 none, 1 caution (2000 ≤ H < 6000 nT), 2 blackout (H < 2000 nT). */
export const ZONE_NONE = 0;
export const ZONE_CAUTION = 1;
export const ZONE_BLACKOUT = 2;

/**
 * Columns of length n. Geodetic NED components [nT]: xNt north, yNt east, zNt down.
 * variationDeg = declination, east +; dipDeg = inclination, down +; hNt horizontal intensity.
 */
export interface FieldAlongPath {
  n: number;
  xNt: Float64Array;
  yNt: Float64Array;
  zNt: Float64Array;
  hNt: Float64Array;
  variationDeg: Float64Array;
  dipDeg: Float64Array;
  zone: Uint8Array;
  /** Model name and decimal year used, for the report. */
  model: string;
  decimalYear: number;
}
