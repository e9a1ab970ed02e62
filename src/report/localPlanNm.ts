// East/north of a reference fix [NM] on the tangent plane at that fix, for the plan view.
import { NM_M } from '../constants.js';
import { geodeticToEcefInto, nedRotationInto } from '../geo/localFrame.js';

/**
 * Local tangent-plane coordinates of each fix relative to (lat0Deg, lon0Deg): the ECEF difference
 * rotated into the reference point's north-east-down frame (the same steps as geo/localFrame nedOffsetM,
 * with the reference point's ECEF position and rotation made once instead of once a fix), heights taken as
 * 0 so the plan view is a map, not a slant view. The flat-map distance differs from the geodesic by
 * under 0.1 % within 100 NM of the reference.
 *
 * @returns eastNm, northNm: NaN where lat or lon is NaN
 */
export function localPlanNm(latDeg: Float64Array, lonDeg: Float64Array, lat0Deg: number, lon0Deg: number): { eastNm: Float64Array; northNm: Float64Array } {
  const n = latDeg.length;
  const eastNm = new Float64Array(n);
  const northNm = new Float64Array(n);
  // buf[0..2]: reference ECEF [m]; buf[3..5]: the fix's ECEF [m]; buf[6..14]: the reference's ECEF→NED rotation.
  const buf = new Float64Array(15);
  geodeticToEcefInto(lat0Deg, lon0Deg, 0, buf, 0);
  nedRotationInto(lat0Deg, lon0Deg, buf, 6);
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(latDeg[i]) || !Number.isFinite(lonDeg[i])) {
      eastNm[i] = NaN;
      northNm[i] = NaN;
      continue;
    }
    geodeticToEcefInto(latDeg[i], lonDeg[i], 0, buf, 3);
    const dx = buf[3] - buf[0];
    const dy = buf[4] - buf[1];
    const dz = buf[5] - buf[2];
    eastNm[i] = (buf[9] * dx + buf[10] * dy + buf[11] * dz) / NM_M;
    northNm[i] = (buf[6] * dx + buf[7] * dy + buf[8] * dz) / NM_M;
  }
  return { eastNm, northNm };
}
