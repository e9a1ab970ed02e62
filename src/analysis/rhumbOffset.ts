// Offsets of a point from a rhumb line (constant true track) on the WGS-84 ellipsoid, via the Mercator projection.
import { DEG, WGS84_A_M, WGS84_E2 } from '../constants.js';

const E = Math.sqrt(WGS84_E2);

/** Isometric latitude q(φ) = atanh(sin φ) − e·atanh(e·sin φ) [rad] (ellipsoidal Mercator ordinate / a). */
// Source: Snyder, Map Projections — A Working Manual (USGS PP 1395, 1987) eq. 7-7 (Mercator on the ellipsoid), as q = ln tan(π/4+φ/2) − (e/2) ln((1+e sin φ)/(1−e sin φ)).
export function isometricLatitude(latDeg: number): number {
  const s = Math.sin(latDeg * DEG);
  return Math.atanh(s) - E * Math.atanh(E * s);
}

/** Ground metres per Mercator metre at a latitude: N(φ) cos φ / a (the inverse of the Mercator scale factor). */
function groundPerMercator(latDeg: number): number {
  const s = Math.sin(latDeg * DEG);
  return Math.cos(latDeg * DEG) / Math.sqrt(1 - WGS84_E2 * s * s);
}

/**
 * Offset of point P from the rhumb line through P0 with true azimuth azDeg.
 * Method: in ellipsoidal Mercator coordinates (x = a λ, y = a q) a rhumb line is straight and the projection is
 * conformal, so the perpendicular from P is a short straight segment; its Mercator length times the local scale
 * N cos φ / a at P gives the cross-track, good to second order in cross/R (≈ 1 m per 10 km of offset at 100 km
 * legs is the order of the neglected terms). Along-track uses the scale at the mean latitude of P0 and P.
 * @returns crossM [m, + = right of the line looking along azDeg], alongM [m, + ahead of P0].
 */
// Method: Mercator rhumb-line geometry (Snyder 1987 §7); small-offset approximation as stated above.
export function rhumbOffsetM(lat0Deg: number, lon0Deg: number, azDeg: number, latDeg: number, lonDeg: number): { crossM: number; alongM: number } {
  let dLon = (lonDeg - lon0Deg) % 360;
  if (dLon > 180) dLon -= 360;
  else if (dLon < -180) dLon += 360;
  const x = WGS84_A_M * dLon * DEG;
  const y = WGS84_A_M * (isometricLatitude(latDeg) - isometricLatitude(lat0Deg));
  const a = azDeg * DEG;
  const crossMerc = x * Math.cos(a) - y * Math.sin(a);
  const alongMerc = x * Math.sin(a) + y * Math.cos(a);
  return {
    crossM: crossMerc * groundPerMercator(latDeg),
    alongM: alongMerc * groundPerMercator((lat0Deg + latDeg) / 2),
  };
}

/** Azimuth [0, 360) of the rhumb line from P0 to P1 (true), from their Mercator coordinates. */
// Method: Mercator rhumb-line geometry (Snyder 1987 §7).
export function rhumbAzimuthDeg(lat0Deg: number, lon0Deg: number, lat1Deg: number, lon1Deg: number): number {
  let dLon = (lon1Deg - lon0Deg) % 360;
  if (dLon > 180) dLon -= 360;
  else if (dLon < -180) dLon += 360;
  const x = dLon * DEG;
  const y = isometricLatitude(lat1Deg) - isometricLatitude(lat0Deg);
  const az = (Math.atan2(x, y) * 180) / Math.PI;
  return az < 0 ? az + 360 : az;
}
