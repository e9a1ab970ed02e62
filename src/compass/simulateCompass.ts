// simulateCompass: what a direct-reading compass showed along a reconstructed flight (PHYSICS.md §1, §3).
//
// Per sample, the static card (cardEquilibrium: apparent gravity, finite pendulosity, tilt stop). Between samples,
// inputs are interpolated linearly onto sub-steps of at most `maxStepS` (default 0.05 s, i.e. ≥ 20 Hz) and the card
// is integrated by classical Runge–Kutta (RK4):
//
//   card tilt    k' = (k_target − k) / τ_tilt, then clamped onto the tilt cone      (τ_tilt = 0: k = k_target)
//   azimuth      χ'' = −ω_n² sin(χ − χ_eq) − c (χ' − Ω_f)                            (PHYSICS §1.6, divided by I)
//   liquid       Ω_f' = (κ ω_bowl − Ω_f) / τ_s
//
// χ is the card's north azimuth in an earth-fixed gauge: χ = ψ − reading, ψ the true heading unwrapped, so in level
// unaccelerated flight χ_eq = variation. χ_eq = ψ − (equilibrium reading of the lagged card); ω_n² = (2π/T0)²·|B_p|/H_ref;
// c = 2 ζ_ref 2π/T0 (so ζ = ζ_ref·sqrt(H_ref/|B_p|), PHYSICS §1.6); ω_bowl = turn rate (right +); κ = swirlCoupling.
// χ, χ_eq are kept continuous (unwrapped). At the first sample of each segment (state.segment changes, or after a
// sample with a missing input) the card restarts at its steady state for that sample: k = k_target, Ω_f = κ ω_bowl,
// χ = χ_eq + asin(c Ω_f / ω_n²), χ' = 0.
//
// Error split (all [deg], (−180, 180] except errLagSwirlDeg, which closes the sum):
//   errDipTurnDeg  = S_turn − ψm, S_turn = static reading with the kinematic acceleration reduced to its lateral
//                    part a_lat = (a·p) p, p = (−sin ψ, cos ψ, 0) the horizontal right-hand normal of the true heading
//                    (centripetal acceleration of a turn flown with zero sideslip, wind or not). With a = 0 it still
//                    holds the attitude-only effects (tilt stop from pitch/bank, residual dip projection).
//   errDipAccelDeg = static − S_turn (along-heading and vertical acceleration: speed and climb changes).
//   errDeviationDeg = reading − dynamic = −δ(reading) (deviation δ east +, compass + δ = magnetic).
//   errLagSwirlDeg = errorDeg − the three above ≡ dynamic − static (mod 360): card lag, overshoot, swirl, tilt lag.
// So errDipTurnDeg + errDipAccelDeg + errLagSwirlDeg + errDeviationDeg = errorDeg up to rounding (~1e-13°).
import { wrap180, wrap360 } from '../geo/angles.js';
import { G0_MS2 } from '../constants.js';
import type { FlightState } from '../state/flightState.js';
import type { FieldAlongPath } from '../magnetic/fieldAlongPath.js';
import type { LogWarning } from '../log/flightLog.js';
import { OptionError } from '../errors.js';
import {
  COMPASS_FLAG_BLACKOUT, COMPASS_FLAG_CAUTION, COMPASS_FLAG_NO_INPUT, COMPASS_FLAG_ON_STOP, COMPASS_FLAG_SWINGING, COMPASS_FLAG_WEAK_DIRECTIVE,
  type CompassTrace,
} from './compassTrace.js';
import { validateCompassProfile, type CompassProfile } from './compassProfile.js';
import {
  cardEquilibrium, clampCardAxisToStop, freeCardAxis, magnetPerPendulosityFromResidualDip, newCardEquilibrium,
  readCardAxis, type CardOptions,
} from './cardEquilibrium.js';

const DEG = Math.PI / 180;
const RAD = 180 / Math.PI;
// FieldAlongPath.zone codes (fieldAlongPath.ts): 1 caution (2000 ≤ H < 6000 nT), 2 blackout (H < 2000 nT). Repeated
// here so the compass stage does not load the field model at run time.
const ZONE_CAUTION = 1;
const ZONE_BLACKOUT = 2;

/**
 * Farther than this from its static equilibrium [deg] the simulated card is not lagging but swinging round,
 * as after the card lost its directive force near reversal (PHYSICS.md §1.4; PHAK: "erratic and
 * unpredictable"): such samples are flagged unreliable. Ordinary lag and swirl in rate-one turns stay well
 * under 30° in our model [derived estimate].
 */
export const SWINGING_CARD_DEG = 60;

/** Options of the integration. maxStepS: largest sub-step [s], (0, 0.05]; default 0.05 (20 Hz). */
export interface SimulateCompassOptions {
  maxStepS?: number;
}

/** Wraps a radian difference to (−π, π]. */
function wrapPi(x: number): number {
  return x - 2 * Math.PI * Math.ceil((x - Math.PI) / (2 * Math.PI));
}

/**
 * Reading that satisfies reading + δ(reading) = card (compass + deviation = magnetic-equivalent card), by the
 * fixed-point iteration h ← card − δ(h) (PHYSICS §3, converges for legal cards). NaN if δ gives NaN.
 */
// Method: fixed-point inversion of the deviation card (PHYSICS.md §3 "Inversion").
function applyDeviationDeg(cardDeg: number, deviation: (compassDeg: number) => number): number {
  let h = cardDeg;
  for (let it = 0; it < 12; it++) {
    const next = wrap360(cardDeg - deviation(h));
    if (!Number.isFinite(next)) return NaN;
    const d = Math.abs(wrap180(next - h));
    h = next;
    if (d < 1e-10) break;
  }
  return h;
}

/**
 * Simulates the compass card along a flight.
 *
 * @param state reconstructed flight (uses t, headingDegTrue, pitchDeg, bankDeg, accN/E/D, turnRateDps, segment)
 * @param field WMM field at each sample (xNt, yNt, zNt true NED; variationDeg east +; zone), same length as state
 * @param profile compass parameters (validated here; see compassProfile.ts)
 * @param deviation optional deviation card δ(compass heading) [deg], east +, compass + δ = magnetic
 * @param options integration sub-step
 * @returns a CompassTrace (readings [0, 360), errors reading − ψm in (−180, 180], the split, tilt, |B_p|/H, flags).
 *   Samples with a missing input are NaN, flagged COMPASS_FLAG_NO_INPUT and counted in trace.warnings.
 * @throws OptionError for a bad profile, a bad option, or columns of different lengths.
 */
// Method: static pendulous-card equilibrium + second-order azimuth dynamics with liquid swirl, RK4 (PHYSICS.md §1.1–1.6).
export function simulateCompass(
  state: FlightState,
  field: FieldAlongPath,
  profile: CompassProfile,
  deviation?: (compassDeg: number) => number,
  options: SimulateCompassOptions = {},
): CompassTrace {
  validateCompassProfile(profile);
  const maxStepS = options.maxStepS ?? 0.05;
  if (!(maxStepS > 0 && maxStepS <= 0.05)) throw new OptionError('maxStepS', `${maxStepS} is outside (0, 0.05] s`);
  const n = state.n;
  if (field.n !== n) throw new OptionError('field', `has ${field.n} samples, the flight state ${n}`);

  const { t, headingDegTrue, bankDeg, accN, accE, accD, turnRateDps, segment } = state;
  // The lubber line's axes: cardPitchDeg where the state gives it (wind axes or logged attitude), else pitch.
  const pitchDeg = state.cardPitchDeg ?? state.pitchDeg;
  const { xNt, yNt, zNt, variationDeg, zone } = field;

  const eps = magnetPerPendulosityFromResidualDip(profile.residualDipDeg, profile.refHorizontalNt, profile.refVerticalNt);
  const card: CardOptions = { tiltLimitDeg: profile.tiltLimitDeg, magnetPerPendulosityMs2PerNt: eps };
  const cosLim = Math.cos(profile.tiltLimitDeg * DEG), sinLim = Math.sin(profile.tiltLimitDeg * DEG);
  const w0 = (2 * Math.PI) / profile.periodS;
  const w0sqPerNt = (w0 * w0) / profile.refHorizontalNt; // ω_n² = w0sqPerNt · |B_p|
  const cDamp = 2 * profile.dampingRatio * w0;
  const kappa = profile.swirlCoupling;
  const tauS = profile.swirlTimeConstantS;
  const tauTilt = profile.tiltLagS;

  const staticDeg = new Float64Array(n);
  const dynamicDeg = new Float64Array(n);
  const readingDeg = new Float64Array(n);
  const errorDeg = new Float64Array(n);
  const errDipTurnDeg = new Float64Array(n);
  const errDipAccelDeg = new Float64Array(n);
  const errLagSwirlDeg = new Float64Array(n);
  const errDeviationDeg = new Float64Array(n);
  const tiltDeg = new Float64Array(n);
  const directiveRatio = new Float64Array(n);
  const unreliable = new Uint8Array(n);
  const flags = new Uint8Array(n);
  const headingMagDeg = new Float64Array(n);
  // Per-sample inputs of the dynamic pass: body axes, apparent gravity, unwrapped heading [rad], bowl rate [rad/s].
  const xb = new Float64Array(3 * n);
  const zb = new Float64Array(3 * n);
  const gapp = new Float64Array(3 * n);
  const psiU = new Float64Array(n);
  const rate = new Float64Array(n);
  const valid = new Uint8Array(n);

  const eq = newCardEquilibrium();
  let missing = 0;

  // ---- pass 1: inputs, static readings, turn-only readings ----
  for (let i = 0; i < n; i++) {
    const h = headingDegTrue[i], th = pitchDeg[i], ph = bankDeg[i];
    const aN = accN[i], aE = accE[i], aD = accD[i];
    const bx = xNt[i], by = yNt[i], bz = zNt[i];
    const ok = Number.isFinite(h + th + ph + aN + aE + aD + bx + by + bz + variationDeg[i] + t[i]);
    const z = zone[i];
    let fl = z >= ZONE_BLACKOUT ? COMPASS_FLAG_BLACKOUT : z === ZONE_CAUTION ? COMPASS_FLAG_CAUTION : 0;
    if (!ok) {
      valid[i] = 0;
      missing++;
      staticDeg[i] = dynamicDeg[i] = readingDeg[i] = errorDeg[i] = NaN;
      errDipTurnDeg[i] = errDipAccelDeg[i] = errLagSwirlDeg[i] = errDeviationDeg[i] = NaN;
      tiltDeg[i] = directiveRatio[i] = headingMagDeg[i] = psiU[i] = rate[i] = NaN;
      flags[i] = fl | COMPASS_FLAG_NO_INPUT;
      unreliable[i] = 1;
      continue;
    }
    valid[i] = 1;
    headingMagDeg[i] = wrap360(h - variationDeg[i]);
    const ps = h * DEG, tr = th * DEG, br = ph * DEG;
    const cps = Math.cos(ps), sps = Math.sin(ps), cth = Math.cos(tr), sth = Math.sin(tr), cph = Math.cos(br), sph = Math.sin(br);
    xb[3 * i] = cth * cps; xb[3 * i + 1] = cth * sps; xb[3 * i + 2] = -sth;
    zb[3 * i] = cps * sth * cph + sps * sph; zb[3 * i + 1] = sps * sth * cph - cps * sph; zb[3 * i + 2] = cth * cph;
    gapp[3 * i] = -aN; gapp[3 * i + 1] = -aE; gapp[3 * i + 2] = G0_MS2 - aD;
    // Static card (instant tilt) for the sample's condition.
    cardEquilibrium(h, th, ph, aN, aE, aD, bx, by, bz, eq, card);
    staticDeg[i] = eq.readingDeg;
    if (eq.onStop) fl |= COMPASS_FLAG_ON_STOP;
    if (!(eq.directiveRatio >= profile.unreliableDirectiveRatio)) fl |= COMPASS_FLAG_WEAK_DIRECTIVE;
    // Turn-only card: lateral part of the acceleration only.
    const aLat = -aN * sps + aE * cps;
    cardEquilibrium(h, th, ph, -aLat * sps, aLat * cps, 0, bx, by, bz, eq, card);
    const sTurn = eq.readingDeg;
    errDipTurnDeg[i] = wrap180(sTurn - headingMagDeg[i]);
    errDipAccelDeg[i] = wrap180(staticDeg[i] - sTurn);
    flags[i] = fl;
    // Unwrapped heading and bowl yaw rate.
    const prevOk = i > 0 && valid[i - 1] === 1 && segment[i - 1] === segment[i];
    psiU[i] = prevOk ? psiU[i - 1] + wrapPi(ps - headingDegTrue[i - 1] * DEG) : ps;
    rate[i] = turnRateDps[i] * DEG;
  }
  // Bowl rate where the turn rate is missing: central difference of the unwrapped heading within the segment.
  for (let i = 0; i < n; i++) {
    if (valid[i] === 0 || Number.isFinite(rate[i])) continue;
    const a = i > 0 && valid[i - 1] === 1 && segment[i - 1] === segment[i] ? i - 1 : i;
    const b = i + 1 < n && valid[i + 1] === 1 && segment[i + 1] === segment[i] ? i + 1 : i;
    rate[i] = b > a && t[b] > t[a] ? (psiU[b] - psiU[a]) / (t[b] - t[a]) : 0;
  }

  // ---- pass 2: card dynamics ----
  // Card state: k (tilt, NED unit), chi, chiDot, omegaF. Node values: chiEq (unwrapped), wn2 (ω_n²), target fluid rate.
  const kc = newCardEquilibrium();
  const kFree = newCardEquilibrium(); // free (unlagged) card axis at the previous node
  let lagH = NaN, lagE = 0, lagR = 0; // tilt-lag factors for the current sub-step length
  let chi = 0, chiDot = 0, omF = 0;
  let chiEqPrev = 0, wn2Prev = 0, tgtPrev = 0;
  let nodeReading = NaN, nodeBp = 0, nodeOnStop = false, nodeTilt = NaN;
  let nodePsi = 0;

  // Evaluates the card tilt and its equilibrium azimuth at an interpolated node (i, i+1, fraction f), advancing
  // the lagged tilt by hNode seconds (hNode < 0: reset tilt to its target). Sets node* and returns chi_eq
  // unwrapped against `chiRef` (or chiRef itself when the card has no directive force).
  const evalNode = (i: number, j: number, f: number, hNode: number, chiRef: number): number => {
    const g = 1 - f;
    const i3 = 3 * i, j3 = 3 * j;
    const bxn = g * xNt[i] + f * xNt[j], byn = g * yNt[i] + f * yNt[j], bzn = g * zNt[i] + f * zNt[j];
    freeCardAxis(
      g * gapp[i3] + f * gapp[j3], g * gapp[i3 + 1] + f * gapp[j3 + 1], g * gapp[i3 + 2] + f * gapp[j3 + 2],
      bxn, byn, bzn, eps, eq,
    );
    if (hNode < 0 || tauTilt === 0) {
      kc.kN = eq.kN; kc.kE = eq.kE; kc.kD = eq.kD;
      kFree.kN = eq.kN; kFree.kE = eq.kE; kFree.kD = eq.kD;
    } else if (hNode > 0) {
      // Exact solution of k' = (u − k)/τ over the sub-step for u linear between the previous and this node's
      // free axis (first-order-hold exponential integrator): k1 = u1 + e (k0 − u0) − (u1 − u0)(τ/h)(1 − e).
      if (hNode !== lagH) { lagH = hNode; lagE = Math.exp(-hNode / tauTilt); lagR = (tauTilt / hNode) * (1 - lagE); }
      const e = lagE, r = lagR;
      let kN = eq.kN + e * (kc.kN - kFree.kN) - (eq.kN - kFree.kN) * r;
      let kE = eq.kE + e * (kc.kE - kFree.kE) - (eq.kE - kFree.kE) * r;
      let kD = eq.kD + e * (kc.kD - kFree.kD) - (eq.kD - kFree.kD) * r;
      const l = Math.sqrt(kN * kN + kE * kE + kD * kD);
      kN /= l; kE /= l; kD /= l;
      kc.kN = kN; kc.kE = kE; kc.kD = kD;
      kFree.kN = eq.kN; kFree.kE = eq.kE; kFree.kD = eq.kD;
    }
    let zN = g * zb[i3] + f * zb[j3], zE = g * zb[i3 + 1] + f * zb[j3 + 1], zD = g * zb[i3 + 2] + f * zb[j3 + 2];
    const zl = Math.sqrt(zN * zN + zE * zE + zD * zD);
    zN /= zl; zE /= zl; zD /= zl;
    clampCardAxisToStop(zN, zE, zD, cosLim, sinLim, kc);
    const xN = g * xb[i3] + f * xb[j3], xE = g * xb[i3 + 1] + f * xb[j3 + 1];
    readCardAxis(xN, xE, g * xb[i3 + 2] + f * xb[j3 + 2], bxn, byn, bzn, kc);
    nodeReading = kc.readingDeg;
    nodeBp = kc.bpNt;
    nodeOnStop = kc.onStop;
    nodeTilt = kc.tiltDeg;
    // Gauge heading: azimuth of the interpolated nose axis itself (not the interpolated angle, which differs from
    // it by O(Δψ³) inside a sub-step and would shake χ_eq), continued from sample i.
    const cr = xb[i3] * xE - xb[i3 + 1] * xN, dt = xb[i3] * xN + xb[i3 + 1] * xE;
    nodePsi = f === 0 || !(cr * cr + dt * dt > 1e-20) ? g * psiU[i] + f * psiU[j] : psiU[i] + Math.atan2(cr, dt);
    if (!Number.isFinite(nodeReading)) return chiRef;
    const raw = nodePsi - nodeReading * DEG;
    return chiRef + wrapPi(raw - chiRef);
  };

  const recordSample = (i: number) => {
    const dyn = wrap360((nodePsi - chi) * RAD);
    dynamicDeg[i] = dyn;
    tiltDeg[i] = nodeTilt;
    directiveRatio[i] = kc.directiveRatio;
    let fl = flags[i];
    if (nodeOnStop) fl |= COMPASS_FLAG_ON_STOP;
    if (!(kc.directiveRatio >= profile.unreliableDirectiveRatio)) fl |= COMPASS_FLAG_WEAK_DIRECTIVE;
    if (Math.abs(wrap180(dyn - staticDeg[i])) > SWINGING_CARD_DEG) fl |= COMPASS_FLAG_SWINGING;
    flags[i] = fl;
    unreliable[i] = (fl & (COMPASS_FLAG_WEAK_DIRECTIVE | COMPASS_FLAG_ON_STOP | COMPASS_FLAG_BLACKOUT | COMPASS_FLAG_NO_INPUT | COMPASS_FLAG_SWINGING)) !== 0
      || (profile.cautionZoneUnreliable && (fl & COMPASS_FLAG_CAUTION) !== 0) ? 1 : 0;
  };

  for (let i = 0; i < n; i++) {
    if (valid[i] === 0) continue;
    const restart = i === 0 || valid[i - 1] === 0 || segment[i - 1] !== segment[i];
    if (restart) {
      const ce = evalNode(i, i, 0, -1, 0);
      const wn2 = w0sqPerNt * nodeBp;
      omF = kappa * rate[i];
      const s = wn2 > 0 ? (cDamp * omF) / wn2 : 0;
      chi = (Number.isFinite(nodeReading) ? ce : nodePsi) + Math.asin(Math.max(-1, Math.min(1, s)));
      chiDot = 0;
      chiEqPrev = Number.isFinite(nodeReading) ? ce : chi;
      wn2Prev = wn2;
      tgtPrev = kappa * rate[i];
      recordSample(i);
      continue;
    }
    // Integrate from sample i−1 to i.
    const p = i - 1;
    const dt = t[i] - t[p];
    let hMax = maxStepS;
    const wn2Est = w0sqPerNt * Math.max(Math.hypot(xNt[p], yNt[p], zNt[p]), Math.hypot(xNt[i], yNt[i], zNt[i]));
    hMax = Math.min(hMax, 0.5 / Math.sqrt(wn2Est), 1 / cDamp, tauS / 4);
    const nSub = dt > 0 ? Math.max(1, Math.ceil(dt / hMax - 1e-9)) : 0;
    const h = nSub > 0 ? dt / nSub : 0;
    for (let s = 1; s <= nSub; s++) {
      const ceNew = evalNode(p, i, s / nSub, h, chiEqPrev);
      const wn2New = w0sqPerNt * nodeBp;
      const tgtNew = kappa * (((nSub - s) * rate[p] + s * rate[i]) / nSub);
      // RK4 on (chi, chiDot, omF) with chi_eq, ω_n², fluid target linear over the sub-step.
      const ceMid = 0.5 * (chiEqPrev + ceNew), wMid = 0.5 * (wn2Prev + wn2New), tMid = 0.5 * (tgtPrev + tgtNew);
      const a1 = -wn2Prev * Math.sin(chi - chiEqPrev) - cDamp * (chiDot - omF);
      const f1 = (tgtPrev - omF) / tauS;
      const x2 = chi + 0.5 * h * chiDot, v2 = chiDot + 0.5 * h * a1, o2 = omF + 0.5 * h * f1;
      const a2 = -wMid * Math.sin(x2 - ceMid) - cDamp * (v2 - o2);
      const f2 = (tMid - o2) / tauS;
      const x3 = chi + 0.5 * h * v2, v3 = chiDot + 0.5 * h * a2, o3 = omF + 0.5 * h * f2;
      const a3 = -wMid * Math.sin(x3 - ceMid) - cDamp * (v3 - o3);
      const f3 = (tMid - o3) / tauS;
      const x4 = chi + h * v3, v4 = chiDot + h * a3, o4 = omF + h * f3;
      const a4 = -wn2New * Math.sin(x4 - ceNew) - cDamp * (v4 - o4);
      const f4 = (tgtNew - o4) / tauS;
      chi += (h / 6) * (chiDot + 2 * v2 + 2 * v3 + v4);
      chiDot += (h / 6) * (a1 + 2 * a2 + 2 * a3 + a4);
      omF += (h / 6) * (f1 + 2 * f2 + 2 * f3 + f4);
      chiEqPrev = ceNew; wn2Prev = wn2New; tgtPrev = tgtNew;
    }
    if (nSub === 0) evalNode(i, i, 0, 0, chiEqPrev);
    recordSample(i);
  }

  // ---- pass 3: deviation and the error split ----
  let badDeviation = 0;
  for (let i = 0; i < n; i++) {
    if (valid[i] === 0) continue;
    const dyn = dynamicDeg[i];
    const rd = deviation ? applyDeviationDeg(dyn, deviation) : dyn;
    if (deviation && !Number.isFinite(rd)) badDeviation++;
    readingDeg[i] = rd;
    const e = wrap180(rd - headingMagDeg[i]);
    errorDeg[i] = e;
    errDeviationDeg[i] = wrap180(rd - dyn);
    errLagSwirlDeg[i] = e - errDipTurnDeg[i] - errDipAccelDeg[i] - errDeviationDeg[i];
  }

  const warnings: LogWarning[] = [];
  if (missing > 0) {
    warnings.push({
      code: 'compass-input-missing',
      message: `The compass could not be simulated at ${missing} samples with a missing heading, attitude, acceleration or field value.`,
      count: missing,
    });
  }
  if (badDeviation > 0) {
    warnings.push({
      code: 'compass-deviation-invalid',
      message: `The deviation card gave no usable value at ${badDeviation} samples; their compass reading is blank.`,
      count: badDeviation,
    });
  }
  return {
    n, staticDeg, dynamicDeg, readingDeg, errorDeg, errDipTurnDeg, errDipAccelDeg, errLagSwirlDeg, errDeviationDeg,
    tiltDeg, directiveRatio, unreliable, headingMagDeg, flags, warnings,
  };
}
