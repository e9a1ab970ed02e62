// A leg flown on the compass: how far compass error and wind drift took the aircraft across its believed track.
//
// Geometry. The pilot holds a compass reading ψc and believes the aircraft heads magnetic ψc, i.e. true
// ψb = ψc + D (D variation, east +). The compass error e = ψc − ψm, so the nose actually points ψ = ψm + D =
// ψb − e. The ground velocity is v = V u(ψ) + w (V horizontal airspeed, u(·) the unit vector of an azimuth,
// w the wind). Across a reference line of true azimuth α (right normal n = (−sin α, cos α) in north/east):
//
//   v·n = V sin(ψ − α) + w·n
//       = V [sin(ψ − α) − sin(ψb − α)]   compass part  (= −V sin e when ψb = α: reading high → aircraft left)
//       + V sin(ψb − α)                  heading part  (the believed heading's own drift off α)
//       + w·n                            wind part
//
// Integrated over the span (trapezoid, each sample in its own local north-east frame, which is what a rhumb
// line's constant local azimuth needs for small offsets), the three parts add up to ∫ v·n dt. The observed
// cross-track is measured independently from the positions (rhumbOffsetM); observed − (compass + heading + wind)
// is the closure error (smoother inconsistency, heading not along the air vector, position noise), which must stay
// within closureToleranceM = max(25 m, 0.5 % of the along-track distance) (team choice; the test measures it).
// Without a route, α = the held reading + variation at the start: the track the pilot believed they flew.
// Residual (the contract field) = observed − compass − wind, i.e. heading part + closure error.
import { DEG, RAD, WGS84_A_M, WGS84_E2 } from '../constants.js';
import { wrap180, wrap360 } from '../geo/angles.js';
import type { CompassTrace } from '../compass/compassTrace.js';
import type { FieldAlongPath } from '../magnetic/fieldAlongPath.js';
import type { FlightState } from '../state/flightState.js';
import type { ExcursionResult, RouteCrossTrack } from './analysisTypes.js';
import type { PlannedRoute } from './debriefOptions.js';
import { rhumbAzimuthDeg, rhumbOffsetM } from './rhumbOffset.js';

/** Closure tolerance: the larger of this [m] … */
export const CLOSURE_MIN_M = 25;
/** … and this share of the along-track distance. */
export const CLOSURE_SHARE = 0.005;

/** The three integrated cross-track parts against azimuth α [m]. */
interface Parts {
  compassM: number;
  headingM: number;
  windM: number;
  alongM: number;
}

/** Trapezoidal integrals of the compass, heading and wind parts of v·n over rows i0…i1 against true azimuth azDeg. */
function integrateParts(state: FlightState, field: FieldAlongPath, compass: CompassTrace, i0: number, i1: number, azDeg: number): Parts {
  const { t, velN, velE, windN, windE, headingDegTrue } = state;
  const a = azDeg * DEG;
  const sa = Math.sin(a);
  const ca = Math.cos(a);
  let compassM = 0;
  let headingM = 0;
  let windM = 0;
  let alongM = 0;
  let pc = NaN;
  let ph = NaN;
  let pw = NaN;
  let pa = NaN;
  for (let k = i0; k <= i1; k++) {
    const wn = Number.isFinite(windN[k]) ? windN[k] : 0;
    const we = Number.isFinite(windE[k]) ? windE[k] : 0;
    const an = velN[k] - wn;
    const ae = velE[k] - we;
    const V = Math.sqrt(an * an + ae * ae);
    const psi = headingDegTrue[k] * DEG;
    const psiB = (compass.readingDeg[k] + field.variationDeg[k]) * DEG;
    const c = V * (Math.sin(psi - a) - Math.sin(psiB - a));
    const h = V * Math.sin(psiB - a);
    const w = -wn * sa + we * ca;
    const al = velN[k] * ca + velE[k] * sa;
    if (k > i0) {
      const dt = t[k] - t[k - 1];
      if (Number.isFinite(c) && Number.isFinite(pc) && dt > 0) {
        compassM += 0.5 * dt * (c + pc);
        headingM += 0.5 * dt * (h + ph);
        windM += 0.5 * dt * (w + pw);
        alongM += 0.5 * dt * (al + pa);
      }
    }
    pc = c;
    ph = h;
    pw = w;
    pa = al;
  }
  return { compassM, headingM, windM, alongM };
}

/**
 * The believed track: from the start position, ∫ (V u(ψb) + w) dt on the ellipsoid (ψb = reading + variation):
 * where the aircraft would have gone had the compass been right. Trapezoid in velocity; φ' = v_N/(M+h),
 * λ' = v_E/((N+h) cos φ) (NIMA TR8350.2 eq. 4-1, 4-2 radii). Rows i0…i1.
 */
// Method: dead reckoning on the WGS-84 ellipsoid with the believed heading (ours), radii from NIMA TR8350.2.
export function believedTrack(
  state: FlightState, field: FieldAlongPath, compass: CompassTrace, i0: number, i1: number,
): { latDeg: Float64Array; lonDeg: Float64Array } {
  const { t, lat, lon, altM, velN, velE, windN, windE } = state;
  const m = i1 - i0 + 1;
  const la = new Float64Array(m);
  const lo = new Float64Array(m);
  la[0] = lat[i0];
  lo[0] = lon[i0];
  let pn = NaN;
  let pe = NaN;
  for (let q = 0; q < m; q++) {
    const k = i0 + q;
    const wn = Number.isFinite(windN[k]) ? windN[k] : 0;
    const we = Number.isFinite(windE[k]) ? windE[k] : 0;
    const an = velN[k] - wn;
    const ae = velE[k] - we;
    const V = Math.sqrt(an * an + ae * ae);
    const psiB = (compass.readingDeg[k] + field.variationDeg[k]) * DEG;
    let vn = V * Math.cos(psiB) + wn;
    let ve = V * Math.sin(psiB) + we;
    if (!Number.isFinite(vn) || !Number.isFinite(ve)) {
      vn = pn;
      ve = pe;
    }
    if (q > 0) {
      const dt = t[k] - t[k - 1];
      const h = Number.isFinite(altM[k]) ? altM[k] : 0;
      // Meridian and prime-vertical radii (NIMA TR8350.2 eq. 4-1, 4-2), inline: no object per sample.
      const sl = Math.sin(la[q - 1] * DEG);
      const w = Math.sqrt(1 - WGS84_E2 * sl * sl);
      const primeVerticalM = WGS84_A_M / w;
      const meridianM = (WGS84_A_M * (1 - WGS84_E2)) / (w * w * w);
      const mn = Number.isFinite(vn + pn) ? 0.5 * (vn + pn) : 0;
      const me = Number.isFinite(ve + pe) ? 0.5 * (ve + pe) : 0;
      la[q] = la[q - 1] + ((mn * dt) / (meridianM + h)) * RAD;
      lo[q] = wrap180(lo[q - 1] + ((me * dt) / ((primeVerticalM + h) * Math.cos(la[q - 1] * DEG))) * RAD);
    }
    pn = vn;
    pe = ve;
  }
  return { latDeg: la, lonDeg: lo };
}

/** Circular mean of a column over rows i0…i1 [0, 360); NaN if none finite. */
function circularMean(col: Float64Array, i0: number, i1: number): number {
  let s = 0;
  let c = 0;
  for (let k = i0; k <= i1; k++) {
    const v = col[k];
    if (!Number.isFinite(v)) continue;
    s += Math.sin(v * DEG);
    c += Math.cos(v * DEG);
  }
  return s === 0 && c === 0 ? NaN : wrap360(Math.atan2(s, c) * RAD);
}

/** Route leg nearest a point (Mercator distance to the leg segment), with the point's along/cross offsets. */
function nearestRouteLeg(route: PlannedRoute, latDeg: number, lonDeg: number): number {
  let best = 0;
  let bestD = Infinity;
  for (let k = 0; k + 1 < route.lat.length; k++) {
    const az = rhumbAzimuthDeg(route.lat[k], route.lon[k], route.lat[k + 1], route.lon[k + 1]);
    const len = rhumbOffsetM(route.lat[k], route.lon[k], az, route.lat[k + 1], route.lon[k + 1]).alongM;
    const p = rhumbOffsetM(route.lat[k], route.lon[k], az, latDeg, lonDeg);
    const beyond = p.alongM < 0 ? -p.alongM : p.alongM > len ? p.alongM - len : 0;
    const d = Math.hypot(p.crossM, beyond);
    if (d < bestD) {
      bestD = d;
      best = k;
    }
  }
  return best;
}

/**
 * Analyses rows i0…i1 as a leg flown on the compass (see the file comment for the geometry and tolerances).
 * @param source 'option' (span given by the user) or 'detected'
 * @param route optional planned route: cross-track against its leg nearest the span's middle, with the same split
 *   against that leg's azimuth (heading part = the heading chosen, e.g. a wind correction, vs the leg).
 * @returns the excursion; all cross-tracks right of the reference +, in metres.
 */
// Method: cross-track decomposition of the ground velocity (file comment); observed from positions by rhumbOffsetM.
export function analyseExcursion(
  state: FlightState, field: FieldAlongPath, compass: CompassTrace, i0: number, i1: number,
  source: 'option' | 'detected', route?: PlannedRoute,
): Required<Omit<ExcursionResult, 'route'>> & { route?: RouteCrossTrack } {
  const { t, lat, lon } = state;
  const held = circularMean(compass.readingDeg, i0, i1);
  const refTrackDegTrue = wrap360(held + field.variationDeg[i0]);
  const parts = integrateParts(state, field, compass, i0, i1, refTrackDegTrue);
  const observed = rhumbOffsetM(lat[i0], lon[i0], refTrackDegTrue, lat[i1], lon[i1]).crossM;
  const attributed = parts.compassM + parts.headingM + parts.windM;
  const closureErrorM = observed - attributed;
  const closureToleranceM = Math.max(CLOSURE_MIN_M, CLOSURE_SHARE * Math.abs(parts.alongM));
  let errSum = 0;
  let errN = 0;
  for (let k = i0; k <= i1; k++) {
    const e = compass.errorDeg[k];
    if (Number.isFinite(e)) {
      errSum += e;
      errN++;
    }
  }
  const result: Required<Omit<ExcursionResult, 'route'>> & { route?: RouteCrossTrack } = {
    startIndex: i0,
    endIndex: i1,
    startT: t[i0],
    endT: t[i1],
    heldCompassDeg: held,
    observedCrossTrackM: observed,
    compassCrossTrackM: parts.compassM,
    windCrossTrackM: parts.windM,
    residualCrossTrackM: observed - parts.compassM - parts.windM,
    source,
    refTrackDegTrue,
    alongTrackM: parts.alongM,
    headingCrossTrackM: parts.headingM,
    closureErrorM,
    closureToleranceM,
    closes: Math.abs(closureErrorM) <= closureToleranceM,
    meanCompassErrorDeg: errN > 0 ? errSum / errN : NaN,
    believedTrack: believedTrack(state, field, compass, i0, i1),
  };
  if (route) {
    const mid = (i0 + i1) >> 1;
    const k = nearestRouteLeg(route, lat[mid], lon[mid]);
    const az = rhumbAzimuthDeg(route.lat[k], route.lon[k], route.lat[k + 1], route.lon[k + 1]);
    const a = rhumbOffsetM(route.lat[k], route.lon[k], az, lat[i0], lon[i0]).crossM;
    const b = rhumbOffsetM(route.lat[k], route.lon[k], az, lat[i1], lon[i1]).crossM;
    const rp = integrateParts(state, field, compass, i0, i1, az);
    result.route = {
      legIndex: k,
      legTrackDegTrue: az,
      startCrossTrackM: a,
      endCrossTrackM: b,
      changeM: b - a,
      compassM: rp.compassM,
      windM: rp.windM,
      headingM: rp.headingM,
      residualM: b - a - rp.compassM - rp.windM - rp.headingM,
    };
  }
  return result;
}
