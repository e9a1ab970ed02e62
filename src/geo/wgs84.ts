// WGS-84 geodetic ↔ ECEF and each point's local north-east-down (NED) frame.
import { DEG, RAD, WGS84_A_M, WGS84_E2 } from '../constants.js';

export interface Vec3 {
  x: number;
  y: number;
  z: number;
}

/** Geodetic (lat, lon [deg], ellipsoidal height [m]) to ECEF [m]. Source: NIMA TR8350.2 eq. 4-14. */
export function geodeticToEcef(latDeg: number, lonDeg: number, hM: number): Vec3 {
  const lat = latDeg * DEG;
  const lon = lonDeg * DEG;
  const sLat = Math.sin(lat);
  const cLat = Math.cos(lat);
  const n = WGS84_A_M / Math.sqrt(1 - WGS84_E2 * sLat * sLat);
  return {
    x: (n + hM) * cLat * Math.cos(lon),
    y: (n + hM) * cLat * Math.sin(lon),
    z: (n * (1 - WGS84_E2) + hM) * sLat,
  };
}

/**
 * ECEF [m] to geodetic (lat, lon [deg], height [m]) by Bowring's iteration (converges to < 1e-9 deg in
 * three steps for aircraft heights). Source: B. R. Bowring, Survey Review 23(181), 1976.
 */
export function ecefToGeodetic(p: Vec3): { latDeg: number; lonDeg: number; hM: number } {
  const lon = Math.atan2(p.y, p.x);
  const r = Math.hypot(p.x, p.y);
  let lat = Math.atan2(p.z, r * (1 - WGS84_E2));
  let n = WGS84_A_M;
  for (let k = 0; k < 5; k++) {
    const s = Math.sin(lat);
    n = WGS84_A_M / Math.sqrt(1 - WGS84_E2 * s * s);
    lat = Math.atan2(p.z + WGS84_E2 * n * s, r);
  }
  const s = Math.sin(lat);
  const c = Math.cos(lat);
  n = WGS84_A_M / Math.sqrt(1 - WGS84_E2 * s * s);
  const hM = Math.abs(c) > 1e-9 ? r / c - n : Math.abs(p.z) - n * (1 - WGS84_E2);
  return { latDeg: lat * RAD, lonDeg: lon * RAD, hM };
}

/** Rotates an ECEF vector (difference) into the NED frame at (lat, lon). Source: standard ECEF→NED rotation. */
export function ecefToNed(v: Vec3, latDeg: number, lonDeg: number): Vec3 {
  const lat = latDeg * DEG;
  const lon = lonDeg * DEG;
  const sL = Math.sin(lat);
  const cL = Math.cos(lat);
  const sO = Math.sin(lon);
  const cO = Math.cos(lon);
  return {
    x: -sL * cO * v.x - sL * sO * v.y + cL * v.z,
    y: -sO * v.x + cO * v.y,
    z: -cL * cO * v.x - cL * sO * v.y - sL * v.z,
  };
}

/** Rotates a NED vector at (lat, lon) into ECEF axes (the transpose of ecefToNed). */
export function nedToEcef(v: Vec3, latDeg: number, lonDeg: number): Vec3 {
  const lat = latDeg * DEG;
  const lon = lonDeg * DEG;
  const sL = Math.sin(lat);
  const cL = Math.cos(lat);
  const sO = Math.sin(lon);
  const cO = Math.cos(lon);
  return {
    x: -sL * cO * v.x - sO * v.y - cL * cO * v.z,
    y: -sL * sO * v.x + cO * v.y - cL * sO * v.z,
    z: cL * v.x - sL * v.z,
  };
}

/** Meridian and prime-vertical radii of curvature [m] at a latitude. Source: NIMA TR8350.2 eq. 4-1, 4-2. */
export function radiiOfCurvatureM(latDeg: number): { meridianM: number; primeVerticalM: number } {
  const s = Math.sin(latDeg * DEG);
  const w = Math.sqrt(1 - WGS84_E2 * s * s);
  return { meridianM: (WGS84_A_M * (1 - WGS84_E2)) / (w * w * w), primeVerticalM: WGS84_A_M / w };
}
