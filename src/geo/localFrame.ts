// Allocation-free WGS-84 frame helpers for hot loops: geodetic ↔ ECEF into typed arrays, the NED rotation
// matrix of a point, re-expressing a NED vector from one point's frame in another's, and flat-frame
// azimuth/distance of a small NED offset.
import { DEG, RAD, WGS84_A_M, WGS84_E2 } from '../constants.js';

/**
 * Writes the ECEF position [m] of a geodetic point (lat, lon [deg], ellipsoidal height [m]) into
 * out[o], out[o+1], out[o+2]. Same formula as `geodeticToEcef` (NIMA TR8350.2 eq. 4-14), no object.
 */
export function geodeticToEcefInto(latDeg: number, lonDeg: number, hM: number, out: Float64Array, o: number): void {
  const lat = latDeg * DEG;
  const lon = lonDeg * DEG;
  const sLat = Math.sin(lat);
  const cLat = Math.cos(lat);
  const nM = WGS84_A_M / Math.sqrt(1 - WGS84_E2 * sLat * sLat);
  out[o] = (nM + hM) * cLat * Math.cos(lon);
  out[o + 1] = (nM + hM) * cLat * Math.sin(lon);
  out[o + 2] = (nM * (1 - WGS84_E2) + hM) * sLat;
}

/**
 * Writes geodetic latitude [deg, −90..90], longitude [deg, (−180, 180]] and ellipsoidal height [m] of an
 * ECEF point into out[o], out[o+1], out[o+2]. Bowring's iteration as in `ecefToGeodetic`
 * (B. R. Bowring, Survey Review 23(181), 1976), four steps: below 1e-11° for aircraft heights.
 */
export function ecefToGeodeticInto(x: number, y: number, z: number, out: Float64Array, o: number): void {
  const lon = Math.atan2(y, x);
  const r = Math.hypot(x, y);
  let lat = Math.atan2(z, r * (1 - WGS84_E2));
  for (let k = 0; k < 4; k++) {
    const s = Math.sin(lat);
    const nM = WGS84_A_M / Math.sqrt(1 - WGS84_E2 * s * s);
    lat = Math.atan2(z + WGS84_E2 * nM * s, r);
  }
  const s = Math.sin(lat);
  const c = Math.cos(lat);
  const nM = WGS84_A_M / Math.sqrt(1 - WGS84_E2 * s * s);
  out[o] = lat * RAD;
  out[o + 1] = lon * RAD;
  out[o + 2] = Math.abs(c) > 1e-9 ? r / c - nM : Math.abs(z) - nM * (1 - WGS84_E2);
}

/**
 * Writes the ECEF→NED rotation of the point (lat, lon [deg]) into out[o..o+8], row-major: row 0 is the
 * north unit vector in ECEF axes, row 1 east, row 2 down. ned = R·ecef; ecef = Rᵀ·ned.
 */
export function nedRotationInto(latDeg: number, lonDeg: number, out: Float64Array, o: number): void {
  const lat = latDeg * DEG;
  const lon = lonDeg * DEG;
  const sL = Math.sin(lat);
  const cL = Math.cos(lat);
  const sO = Math.sin(lon);
  const cO = Math.cos(lon);
  out[o] = -sL * cO;
  out[o + 1] = -sL * sO;
  out[o + 2] = cL;
  out[o + 3] = -sO;
  out[o + 4] = cO;
  out[o + 5] = 0;
  out[o + 6] = -cL * cO;
  out[o + 7] = -cL * sO;
  out[o + 8] = -sL;
}

/**
 * Re-expresses a vector given in the NED frame whose rotation is `ra` (at ra[oa..oa+8]) in the NED frame
 * whose rotation is `rb`: out = Rb·Raᵀ·v. Writes out[o], out[o+1], out[o+2] (N, E, D).
 * This is how a velocity smoothed in a segment's tangent plane becomes a velocity in the sample's own
 * frame (a tangent plane far from its origin turns north: the meridians converge).
 */
export function rotateNedBetweenInto(
  ra: Float64Array,
  oa: number,
  rb: Float64Array,
  ob: number,
  vN: number,
  vE: number,
  vD: number,
  out: Float64Array,
  o: number,
): void {
  // ECEF components: Raᵀ·v.
  const x = ra[oa] * vN + ra[oa + 3] * vE + ra[oa + 6] * vD;
  const y = ra[oa + 1] * vN + ra[oa + 4] * vE + ra[oa + 7] * vD;
  const z = ra[oa + 2] * vN + ra[oa + 5] * vE + ra[oa + 8] * vD;
  out[o] = rb[ob] * x + rb[ob + 1] * y + rb[ob + 2] * z;
  out[o + 1] = rb[ob + 3] * x + rb[ob + 4] * y + rb[ob + 5] * z;
  out[o + 2] = rb[ob + 6] * x + rb[ob + 7] * y + rb[ob + 8] * z;
}

/**
 * NED offset [m] of point B from point A, in A's NED frame (ECEF difference rotated at A). Exact, not an
 * approximation: a point far away lies below A's tangent plane (D grows as distance²/(2R)).
 * Returns [north, east, down].
 */
export function nedOffsetM(
  latADeg: number,
  lonADeg: number,
  hAM: number,
  latBDeg: number,
  lonBDeg: number,
  hBM: number,
): [number, number, number] {
  const buf = new Float64Array(15);
  geodeticToEcefInto(latADeg, lonADeg, hAM, buf, 0);
  geodeticToEcefInto(latBDeg, lonBDeg, hBM, buf, 3);
  nedRotationInto(latADeg, lonADeg, buf, 6);
  const dx = buf[3] - buf[0];
  const dy = buf[4] - buf[1];
  const dz = buf[5] - buf[2];
  return [
    buf[6] * dx + buf[7] * dy + buf[8] * dz,
    buf[9] * dx + buf[10] * dy + buf[11] * dz,
    buf[12] * dx + buf[13] * dy + buf[14] * dz,
  ];
}

/** Azimuth [deg, [0, 360)] of a horizontal NED vector (north, east), clockwise from north; NaN for zero. */
export function azimuthOfNedDeg(north: number, east: number): number {
  if (!(north !== 0 || east !== 0)) return NaN;
  const a = Math.atan2(east, north) * RAD;
  const w = a < 0 ? a + 360 : a;
  return w >= 360 ? 0 : w + 0;
}

/**
 * Flat-frame (tangent plane) azimuth [deg, [0, 360)] and horizontal distance [m] from A to B. Agrees with
 * the geodesic to ~1e-4 relative in distance and ~0.01° in azimuth within 20 km (tested against
 * GeographicLib); beyond that use a geodesic solver.
 */
export function localAzimuthDistance(
  latADeg: number,
  lonADeg: number,
  latBDeg: number,
  lonBDeg: number,
): { azimuthDeg: number; distanceM: number } {
  const [n, e] = nedOffsetM(latADeg, lonADeg, 0, latBDeg, lonBDeg, 0);
  return { azimuthDeg: azimuthOfNedDeg(n, e), distanceM: Math.hypot(n, e) };
}
