// Allocation-free WGS-84 frame helpers for hot loops: geodetic ↔ ECEF into typed arrays, the NED rotation
// matrix of a point, re-expressing a NED vector from one point's frame in another's, and flat-frame
// azimuth/distance of a small NED offset.
import { DEG, RAD, WGS84_A_M, WGS84_E2 } from '../constants.js';

/** The ECEF→NED rotation (rows north, east, down in ECEF axes) from the sines and cosines of latitude and longitude, into out[o..o+8]. */
function rotationFromSinCos(out: Float64Array, o: number, sL: number, cL: number, sO: number, cO: number): void {
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
 * As `geodeticToEcefInto`, and also writes the ECEF→NED rotation of that point into rot[ro..ro+8] (as
 * `nedRotationInto` would), from the same sines and cosines.
 */
export function geodeticToEcefNedInto(latDeg: number, lonDeg: number, hM: number, out: Float64Array, o: number, rot: Float64Array, ro: number): void {
  const lat = latDeg * DEG;
  const lon = lonDeg * DEG;
  const sL = Math.sin(lat);
  const cL = Math.cos(lat);
  const sO = Math.sin(lon);
  const cO = Math.cos(lon);
  const nM = WGS84_A_M / Math.sqrt(1 - WGS84_E2 * sL * sL);
  out[o] = (nM + hM) * cL * cO;
  out[o + 1] = (nM + hM) * cL * sO;
  out[o + 2] = (nM * (1 - WGS84_E2) + hM) * sL;
  rotationFromSinCos(rot, ro, sL, cL, sO, cO);
}

/** Semi-minor axis b = a(1 − f) [m] and second eccentricity squared e'² = e²/(1 − e²) (NIMA TR8350.2 table 3.3). */
const WGS84_B_M = WGS84_A_M * Math.sqrt(1 - WGS84_E2);
const WGS84_EP2 = WGS84_E2 / (1 - WGS84_E2);

/**
 * Writes geodetic latitude [deg, −90..90], longitude [deg, (−180, 180]] and ellipsoidal height [m] of an
 * ECEF point into out[o], out[o+1], out[o+2]. Bowring's method (B. R. Bowring, Survey Review 23(181), 1976)
 * with two steps through the parametric latitude, without trigonometric calls: below 1e-13° and 1e-8 m
 * for −1 km to 20 km height (checked against the fixed-point iteration run to convergence).
 */
export function ecefToGeodeticInto(x: number, y: number, z: number, out: Float64Array, o: number): void {
  geodeticOfEcef(x, y, z, out, o, undefined, 0);
}

/**
 * As `ecefToGeodeticInto`, and also writes the ECEF→NED rotation of that point into rot[ro..ro+8] (as
 * `nedRotationInto` would), from the same sines and cosines.
 */
export function ecefToGeodeticNedInto(x: number, y: number, z: number, out: Float64Array, o: number, rot: Float64Array, ro: number): void {
  geodeticOfEcef(x, y, z, out, o, rot, ro);
}

function geodeticOfEcef(x: number, y: number, z: number, out: Float64Array, o: number, rot: Float64Array | undefined, ro: number): void {
  const p = Math.sqrt(x * x + y * y);
  // tan u = (a/b)·z/p for the parametric latitude u, then tan φ = (z + e'² b sin³u)/(p − e² a cos³u) and
  // tan u = (b/a)·tan φ again; sines and cosines as unnormalised pairs (sφ, cφ), so the poles need no case.
  let su = z * WGS84_A_M, cu = p * WGS84_B_M;
  let sf = 0, cf = 1;
  for (let k = 0; k < 2; k++) {
    const ru = 1 / Math.sqrt(su * su + cu * cu);
    const s = su * ru, c = cu * ru;
    sf = z + WGS84_EP2 * WGS84_B_M * s * s * s;
    cf = p - WGS84_E2 * WGS84_A_M * c * c * c;
    su = WGS84_B_M * sf;
    cu = WGS84_A_M * cf;
  }
  const rf = 1 / Math.sqrt(sf * sf + cf * cf);
  const sL = sf * rf, cL = cf * rf;
  const lon = Math.atan2(y, x);
  out[o] = Math.atan2(sf, cf) * RAD;
  out[o + 1] = lon * RAD;
  // Height along the normal: p cos φ + z sin φ − a √(1 − e² sin²φ), well conditioned at every latitude.
  out[o + 2] = p * cL + z * sL - WGS84_A_M * Math.sqrt(1 - WGS84_E2 * sL * sL);
  if (rot === undefined) return;
  const sO = p > 0 ? y / p : Math.sin(lon);
  const cO = p > 0 ? x / p : Math.cos(lon);
  rotationFromSinCos(rot, ro, sL, cL, sO, cO);
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
  rotationFromSinCos(out, o, sL, cL, sO, cO);
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

/** The reference point of the last nedOffsetM call: its sines and cosines and its ECEF position [m]. */
const frameA = { latDeg: NaN, lonDeg: NaN, hM: NaN, sL: 0, cL: 1, sO: 0, cO: 1, x: 0, y: 0, z: 0 };

function setFrameA(latDeg: number, lonDeg: number, hM: number): void {
  const lat = latDeg * DEG, lon = lonDeg * DEG;
  const sL = Math.sin(lat), cL = Math.cos(lat), sO = Math.sin(lon), cO = Math.cos(lon);
  // As in geodeticToEcefInto.
  const nM = WGS84_A_M / Math.sqrt(1 - WGS84_E2 * sL * sL);
  frameA.latDeg = latDeg; frameA.lonDeg = lonDeg; frameA.hM = hM;
  frameA.sL = sL; frameA.cL = cL; frameA.sO = sO; frameA.cO = cO;
  frameA.x = (nM + hM) * cL * cO;
  frameA.y = (nM + hM) * cL * sO;
  frameA.z = (nM * (1 - WGS84_E2) + hM) * sL;
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
  // A's sines, cosines and ECEF position are kept from the previous call when A is the same point (callers
  // measure many points from one reference).
  if (!(latADeg === frameA.latDeg && lonADeg === frameA.lonDeg && hAM === frameA.hM)) setFrameA(latADeg, lonADeg, hAM);
  const { sL, cL, sO, cO } = frameA;
  const latB = latBDeg * DEG, lonB = lonBDeg * DEG;
  const sLB = Math.sin(latB), cLB = Math.cos(latB);
  // ECEF of A and B as in geodeticToEcefInto.
  const nB = WGS84_A_M / Math.sqrt(1 - WGS84_E2 * sLB * sLB);
  const dx = (nB + hBM) * cLB * Math.cos(lonB) - frameA.x;
  const dy = (nB + hBM) * cLB * Math.sin(lonB) - frameA.y;
  const dz = (nB * (1 - WGS84_E2) + hBM) * sLB - frameA.z;
  // Rows of A's NED rotation as in nedRotationInto.
  return [
    -sL * cO * dx + -sL * sO * dy + cL * dz,
    -sO * dx + cO * dy + 0 * dz,
    -cL * cO * dx + -cL * sO * dy + -sL * dz,
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
