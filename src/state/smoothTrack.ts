// Smoothing a track segment by segment: positions into the segment's tangent frame, RTS smoother per
// axis there, then positions back to WGS-84 and velocities/accelerations re-expressed in EACH sample's
// own NED frame (a tangent plane far from its origin turns north).
import { ecefToGeodeticInto, ecefToGeodeticNedInto, geodeticToEcefInto, geodeticToEcefNedInto, nedRotationInto, rotateNedBetweenInto } from '../geo/localFrame.js';
import { DEG } from '../constants.js';
import { rtsSmoothWhiteJerk, type WhiteJerkAxis } from './rtsSmoother.js';

/** Measurement and model parameters of the track smoother (all SI). */
export interface TrackSmootherParams {
  /** Horizontal position 1-sigma per axis [m] when the log has no accuracy column. */
  hSigmaM: number;
  /** Vertical position 1-sigma [m] when the log has no accuracy column. */
  vSigmaM: number;
  /** 1-sigma per horizontal axis of a logged ground velocity (Doppler) [m/s]. */
  velSigmaMs: number;
  /** Jerk PSD, horizontal axes and vertical axis [m²/s⁵]. */
  jerkPsdH: number;
  jerkPsdV: number;
  /** Use logged ground speed and track as velocity measurements. */
  useLogVelocity: boolean;
  /** Innovation gating on/off. */
  gate: boolean;
}

/** Input columns, one row per kept sample (time non-decreasing). NaN where a value is missing. */
export interface TrackColumns {
  t: Float64Array;
  lat: Float64Array;
  lon: Float64Array;
  altM: Float64Array;
  hAccM?: Float64Array;
  gsMs?: Float64Array;
  trackDegTrue?: Float64Array;
}

export interface SmoothedTrack {
  lat: Float64Array;
  lon: Float64Array;
  altM: Float64Array;
  velN: Float64Array;
  velE: Float64Array;
  velD: Float64Array;
  accN: Float64Array;
  accE: Float64Array;
  accD: Float64Array;
  /** Per-axis horizontal acceleration 1-sigma, sqrt((σ²_N + σ²_E)/2) [m/s²]. */
  accSigmaMs2: Float64Array;
  /** Horizontal velocity 1-sigma per axis [m/s], the same way. */
  velSigmaMs: Float64Array;
  /** Fixes skipped by the 99 % gate; of those, the ones far off the smoothed track (spikes). */
  posRejected: Uint8Array;
  posSpike: Uint8Array;
  posInflated: Uint8Array;
  velRejected: Uint8Array;
  /** Segments (ids) with fewer than two altitudes: vertical taken level, altM NaN. */
  noAltitudeSegments: number[];
  /** Segments (ids) with fewer than three fixes: velocity and acceleration NaN. */
  shortSegments: number[];
}

/** Least fixes in a segment for a velocity and acceleration estimate. */
export const MIN_SEGMENT_FIXES = 3;

/**
 * Smooths each segment [starts[k], starts[k+1]) on its own (nothing is carried across a gap): see
 * `rtsSmoothWhiteJerk` for the filter. Position noise: hAccM (clamped to 0.5–100 m) per horizontal
 * axis and 1.5·hAccM vertically where the log has it (VDOP ≈ 1.5 HDOP, from memory), else hSigmaM /
 * vSigmaM. Logged ground speed/track enter as velocity measurements in the sample's NED frame,
 * rotated into the segment frame (their vertical part unknown, taken 0: error below 0.1 m/s within
 * 100 km of the segment's reference point).
 */
export function smoothTrackInSegments(c: TrackColumns, starts: Int32Array, p: TrackSmootherParams): SmoothedTrack {
  const n = c.t.length;
  const f = (): Float64Array => new Float64Array(n).fill(NaN);
  const out: SmoothedTrack = {
    lat: f(), lon: f(), altM: f(), velN: f(), velE: f(), velD: f(), accN: f(), accE: f(), accD: f(),
    accSigmaMs2: f(), velSigmaMs: f(),
    posRejected: new Uint8Array(n), posSpike: new Uint8Array(n), posInflated: new Uint8Array(n), velRejected: new Uint8Array(n),
    noAltitudeSegments: [], shortSegments: [],
  };
  for (let k = 0; k < starts.length; k++) {
    const s0 = starts[k];
    const s1 = k + 1 < starts.length ? starts[k + 1] : n;
    smoothOneSegment(c, s0, s1, k, p, out);
  }
  return out;
}

function smoothOneSegment(c: TrackColumns, s0: number, s1: number, id: number, p: TrackSmootherParams, out: SmoothedTrack): void {
  const m = s1 - s0;
  const ref = s0 + (m >> 1);
  // Reference height and a fill-in height for fixes without altitude (horizontal conversion only).
  let nAlt = 0;
  let hRef = NaN;
  for (let i = s0; i < s1; i++) if (Number.isFinite(c.altM[i])) { nAlt++; if (!Number.isFinite(hRef) || i <= ref) hRef = c.altM[i]; }
  if (!Number.isFinite(hRef)) hRef = 0;
  const vertical = nAlt >= 2;
  if (!vertical) out.noAltitudeSegments.push(id);

  const rRef = new Float64Array(9);
  const oRef = new Float64Array(3);
  nedRotationInto(c.lat[ref], c.lon[ref], rRef, 0);
  geodeticToEcefInto(c.lat[ref], c.lon[ref], hRef, oRef, 0);

  const t = new Float64Array(m);
  const pN = new Float64Array(m), pE = new Float64Array(m), pD = new Float64Array(m), pDfill = new Float64Array(m);
  const varH = new Float64Array(m), varV = new Float64Array(m);
  const useVel = p.useLogVelocity && c.gsMs !== undefined && c.trackDegTrue !== undefined;
  const vN = useVel ? new Float64Array(m).fill(NaN) : undefined;
  const vE = useVel ? new Float64Array(m).fill(NaN) : undefined;
  const velVar = useVel ? new Float64Array(m).fill(p.velSigmaMs * p.velSigmaMs) : undefined;
  const e = new Float64Array(3);
  const ri = new Float64Array(9);
  const tmp = new Float64Array(3);
  let hFill = hRef;
  for (let j = 0; j < m; j++) {
    const i = s0 + j;
    t[j] = c.t[i] - c.t[s0];
    const hasAlt = Number.isFinite(c.altM[i]);
    if (hasAlt) hFill = c.altM[i];
    const gs = useVel ? c.gsMs![i] : NaN, tr = useVel ? c.trackDegTrue![i] : NaN;
    const hasVel = Number.isFinite(gs) && Number.isFinite(tr) && gs >= 0;
    if (hasVel) geodeticToEcefNedInto(c.lat[i], c.lon[i], hFill, e, 0, ri, 0);
    else geodeticToEcefInto(c.lat[i], c.lon[i], hFill, e, 0);
    const dx = e[0] - oRef[0], dy = e[1] - oRef[1], dz = e[2] - oRef[2];
    pN[j] = rRef[0] * dx + rRef[1] * dy + rRef[2] * dz;
    pE[j] = rRef[3] * dx + rRef[4] * dy + rRef[5] * dz;
    pDfill[j] = rRef[6] * dx + rRef[7] * dy + rRef[8] * dz;
    pD[j] = hasAlt ? pDfill[j] : NaN;
    const acc = c.hAccM ? c.hAccM[i] : NaN;
    const sh = Number.isFinite(acc) && acc > 0 ? Math.min(100, Math.max(0.5, acc)) : NaN;
    varH[j] = Number.isFinite(sh) ? sh * sh : p.hSigmaM * p.hSigmaM;
    varV[j] = Number.isFinite(sh) ? 2.25 * sh * sh : p.vSigmaM * p.vSigmaM;
    if (hasVel) {
      rotateNedBetweenInto(ri, 0, rRef, 0, gs * Math.cos(tr * DEG), gs * Math.sin(tr * DEG), 0, tmp, 0);
      vN![j] = tmp[0];
      vE![j] = tmp[1];
    }
  }
  const axes: WhiteJerkAxis[] = [
    { pos: pN, posVar: varH, vel: vN, velVar, jerkPsd: p.jerkPsdH },
    { pos: pE, posVar: varH, vel: vE, velVar, jerkPsd: p.jerkPsdH },
  ];
  if (vertical) axes.push({ pos: pD, posVar: varV, jerkPsd: p.jerkPsdV });
  const r = rtsSmoothWhiteJerk(t, axes, { gate: p.gate });
  const [ax, ay] = r.axes;
  const az = vertical ? r.axes[2] : undefined;
  const short = m < MIN_SEGMENT_FIXES;
  if (short) out.shortSegments.push(id);
  out.posRejected.set(r.posRejected, s0);
  out.posSpike.set(r.posSpike, s0);
  out.posInflated.set(r.posInflated, s0);
  out.velRejected.set(r.velRejected, s0);
  const g = new Float64Array(3);
  const { lat, lon, altM, velN, velE, velD, accN, accE, accD, accSigmaMs2, velSigmaMs } = out;
  const xp = ax.p, yp = ay.p, zp = az ? az.p : pDfill;
  const xv = ax.v, yv = ay.v, xa = ax.a, ya = ay.a;
  const [r0, r1, r2, r3, r4, r5, r6, r7, r8] = rRef;
  const [ox, oy, oz] = oRef;
  for (let j = 0; j < m; j++) {
    const i = s0 + j;
    const qN = xp[j], qE = yp[j], qD = zp[j];
    // ECEF = origin + Rrefᵀ · p.
    const x = ox + r0 * qN + r3 * qE + r6 * qD;
    const y = oy + r1 * qN + r4 * qE + r7 * qD;
    const z = oz + r2 * qN + r5 * qE + r8 * qD;
    if (short) {
      ecefToGeodeticInto(x, y, z, g, 0);
    } else {
      ecefToGeodeticNedInto(x, y, z, g, 0, ri, 0);
    }
    lat[i] = g[0];
    lon[i] = g[1];
    altM[i] = vertical ? g[2] : NaN;
    if (short) continue;
    rotateNedBetweenInto(rRef, 0, ri, 0, xv[j], yv[j], az ? az.v[j] : 0, tmp, 0);
    velN[i] = tmp[0];
    velE[i] = tmp[1];
    velD[i] = tmp[2];
    rotateNedBetweenInto(rRef, 0, ri, 0, xa[j], ya[j], az ? az.a[j] : 0, tmp, 0);
    accN[i] = tmp[0];
    accE[i] = tmp[1];
    accD[i] = tmp[2];
    accSigmaMs2[i] = Math.sqrt(0.5 * (ax.aVar[j] + ay.aVar[j]));
    velSigmaMs[i] = Math.sqrt(0.5 * (ax.vVar[j] + ay.vVar[j]));
  }
}
