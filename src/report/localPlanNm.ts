// East/north of a reference fix [NM] on the tangent plane at that fix, for the plan view.
import { NM_M } from '../constants.js';
import { ecefToNed, geodeticToEcef } from '../geo/wgs84.js';

/**
 * Local tangent-plane coordinates of each fix relative to (lat0Deg, lon0Deg): the ECEF difference
 * rotated into the reference point's north-east-down frame (NIMA TR8350.2 frames, as in geo/wgs84),
 * heights ignored (all points put at height 0 so the plan view is a map, not a slant view).
 * Errors stay below 0.1 % of the distance within 50 NM of the reference (tangent-plane curvature drop).
 *
 * @returns eastNm, northNm: NaN where lat or lon is NaN
 */
export function localPlanNm(latDeg: Float64Array, lonDeg: Float64Array, lat0Deg: number, lon0Deg: number): { eastNm: Float64Array; northNm: Float64Array } {
  const n = latDeg.length;
  const eastNm = new Float64Array(n);
  const northNm = new Float64Array(n);
  const p0 = geodeticToEcef(lat0Deg, lon0Deg, 0);
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(latDeg[i]) || !Number.isFinite(lonDeg[i])) {
      eastNm[i] = NaN;
      northNm[i] = NaN;
      continue;
    }
    const p = geodeticToEcef(latDeg[i], lonDeg[i], 0);
    const ned = ecefToNed({ x: p.x - p0.x, y: p.y - p0.y, z: p.z - p0.z }, lat0Deg, lon0Deg);
    eastNm[i] = ned.y / NM_M;
    northNm[i] = ned.x / NM_M;
  }
  return { eastNm, northNm };
}
