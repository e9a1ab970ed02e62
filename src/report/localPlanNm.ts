// East/north of a reference fix [NM] on the tangent plane at that fix, for the plan view.
import { NM_M } from '../constants.js';
import { nedOffsetM } from '../geo/localFrame.js';

/**
 * Local tangent-plane coordinates of each fix relative to (lat0Deg, lon0Deg): the ECEF difference
 * rotated into the reference point's north-east-down frame (geo/localFrame nedOffsetM), heights taken as
 * 0 so the plan view is a map, not a slant view. The flat-map distance differs from the geodesic by
 * under 0.1 % within 100 NM of the reference.
 *
 * @returns eastNm, northNm: NaN where lat or lon is NaN
 */
export function localPlanNm(latDeg: Float64Array, lonDeg: Float64Array, lat0Deg: number, lon0Deg: number): { eastNm: Float64Array; northNm: Float64Array } {
  const n = latDeg.length;
  const eastNm = new Float64Array(n);
  const northNm = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(latDeg[i]) || !Number.isFinite(lonDeg[i])) {
      eastNm[i] = NaN;
      northNm[i] = NaN;
      continue;
    }
    const [north, east] = nedOffsetM(lat0Deg, lon0Deg, 0, latDeg[i], lonDeg[i], 0);
    eastNm[i] = east / NM_M;
    northNm[i] = north / NM_M;
  }
  return { eastNm, northNm };
}
