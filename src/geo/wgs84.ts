// WGS-84 geodetic ↔ ECEF and each point's local north-east-down (NED) frame.
import { DEG, WGS84_A_M, WGS84_E2 } from '../constants.js';
import { ecefToGeodeticInto, geodeticToEcefInto } from './localFrame.js';

export interface Vec3 {
  x: number;
  y: number;
  z: number;
}

/** Geodetic (lat, lon [deg], ellipsoidal height [m]) to ECEF [m]. Source: NIMA TR8350.2 eq. 4-14 (via geodeticToEcefInto). */
export function geodeticToEcef(latDeg: number, lonDeg: number, hM: number): Vec3 {
  const o = new Float64Array(3);
  geodeticToEcefInto(latDeg, lonDeg, hM, o, 0);
  return { x: o[0], y: o[1], z: o[2] };
}

/**
 * ECEF [m] to geodetic (lat, lon [deg], height [m]) by Bowring's iteration (via ecefToGeodeticInto; below
 * 1e-11° for aircraft heights). Source: B. R. Bowring, Survey Review 23(181), 1976.
 */
export function ecefToGeodetic(p: Vec3): { latDeg: number; lonDeg: number; hM: number } {
  const o = new Float64Array(3);
  ecefToGeodeticInto(p.x, p.y, p.z, o, 0);
  return { latDeg: o[0], lonDeg: o[1], hM: o[2] };
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
