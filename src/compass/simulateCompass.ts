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
import { clampCardAxisToStop, freeCardAxis, magnetPerPendulosityFromResidualDip, newCardEquilibrium, readCardAxis } from './cardEquilibrium.js';
import { integrateCardDynamics, wrapPiRad, type CardInputs } from './cardDynamics.js';

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

/** The trace's columns, all of length n (allocated once per run). */
type TraceColumns = Required<Omit<CompassTrace, 'warnings'>>;

// The passes below run over whole columns. The card helpers they call per sample are inlined by the JIT only while
// a loop calls few of them, and a call that is not inlined boxes every number argument; so each loop calls one
// or two helpers and keeps its per-sample values in typed arrays.

/**
 * Pass 1: per sample, validity, magnetic heading, body axes x_b and z_b, apparent gravity G for the full and the
 * turn-only card (kinematic acceleration reduced to its lateral part a_lat = (a·p) p, p = (−sin ψ, cos ψ, 0) the
 * horizontal right-hand normal of the true heading), |B|, zone flags, the unwrapped heading and the bowl rate.
 * Invalid samples get NaN everywhere and COMPASS_FLAG_NO_INPUT. Returns the number of invalid samples.
 */
function inputsPass(state: FlightState, field: FieldAlongPath, inp: CardInputs, gTurn: Float64Array, tr: TraceColumns): number {
  const { n, t, headingDegTrue, bankDeg, accN, accE, accD, turnRateDps, segment } = state;
  // The lubber line's axes: cardPitchDeg where the state gives it (wind axes or logged attitude), else pitch.
  const pitchDeg = state.cardPitchDeg ?? state.pitchDeg;
  const { xNt, yNt, zNt, variationDeg, zone } = field;
  const { valid, xb, zb, gapp, bNt, psiU, rate } = inp;
  const { flags, headingMagDeg } = tr;
  let missing = 0;
  for (let i = 0; i < n; i++) {
    const h = headingDegTrue[i], th = pitchDeg[i], ph = bankDeg[i];
    const aN = accN[i], aE = accE[i], aD = accD[i];
    const bx = xNt[i], by = yNt[i], bz = zNt[i];
    const ok = Number.isFinite(h + th + ph + aN + aE + aD + bx + by + bz + variationDeg[i] + t[i]);
    const z = zone[i];
    const fl = z >= ZONE_BLACKOUT ? COMPASS_FLAG_BLACKOUT : z === ZONE_CAUTION ? COMPASS_FLAG_CAUTION : 0;
    if (!ok) {
      valid[i] = 0;
      missing++;
      tr.staticDeg[i] = tr.dynamicDeg[i] = tr.readingDeg[i] = tr.errorDeg[i] = NaN;
      tr.errDipTurnDeg[i] = tr.errDipAccelDeg[i] = tr.errLagSwirlDeg[i] = tr.errDeviationDeg[i] = NaN;
      tr.tiltDeg[i] = tr.directiveRatio[i] = headingMagDeg[i] = psiU[i] = rate[i] = NaN;
      flags[i] = fl | COMPASS_FLAG_NO_INPUT;
      tr.unreliable[i] = 1;
      continue;
    }
    valid[i] = 1;
    flags[i] = fl;
    headingMagDeg[i] = wrap360(h - variationDeg[i]);
    const ps = h * DEG, thr = th * DEG, phr = ph * DEG;
    const cps = Math.cos(ps), sps = Math.sin(ps), cth = Math.cos(thr), sth = Math.sin(thr), cph = Math.cos(phr), sph = Math.sin(phr);
    // Body axes in NED from (heading, pitch, bank), aerospace z-y-x Euler sequence (as in cardEquilibrium).
    const i3 = 3 * i;
    xb[i3] = cth * cps; xb[i3 + 1] = cth * sps; xb[i3 + 2] = -sth;
    zb[i3] = cps * sth * cph + sps * sph; zb[i3 + 1] = sps * sth * cph - cps * sph; zb[i3 + 2] = cth * cph;
    // G = g e_z − a; turn-only: a → a_lat.
    gapp[i3] = -aN; gapp[i3 + 1] = -aE; gapp[i3 + 2] = G0_MS2 - aD;
    const aLat = -aN * sps + aE * cps;
    gTurn[i3] = aLat * sps; gTurn[i3 + 1] = -(aLat * cps); gTurn[i3 + 2] = G0_MS2;
    bNt[i] = Math.sqrt(bx * bx + by * by + bz * bz);
    // Unwrapped heading and bowl yaw rate.
    const prevOk = i > 0 && valid[i - 1] === 1 && segment[i - 1] === segment[i];
    psiU[i] = prevOk ? psiU[i - 1] + wrapPiRad(ps - headingDegTrue[i - 1] * DEG) : ps;
    rate[i] = turnRateDps[i] * DEG;
  }
  // Bowl rate where the turn rate is missing: central difference of the unwrapped heading within the segment.
  for (let i = 0; i < n; i++) {
    if (valid[i] === 0 || Number.isFinite(rate[i])) continue;
    const a = i > 0 && valid[i - 1] === 1 && segment[i - 1] === segment[i] ? i - 1 : i;
    const b = i + 1 < n && valid[i + 1] === 1 && segment[i + 1] === segment[i] ? i + 1 : i;
    rate[i] = b > a && t[b] > t[a] ? (psiU[b] - psiU[a]) / (t[b] - t[a]) : 0;
  }
  return missing;
}

/**
 * Free card axis (freeCardAxis: finite pendulosity, no stop) at each valid sample for apparent gravity g (NED,
 * interleaved by 3) and the sample's field; written to kOut (NaN where G is zero). kOut may be g itself.
 */
function freeAxesPass(inp: CardInputs, g: Float64Array, kOut: Float64Array): void {
  const { n, valid, xNt, yNt, zNt, eps } = inp;
  const eq = newCardEquilibrium();
  for (let i = 0; i < n; i++) {
    if (valid[i] === 0) continue;
    const i3 = 3 * i;
    freeCardAxis(g[i3], g[i3 + 1], g[i3 + 2], xNt[i], yNt[i], zNt[i], eps, eq);
    kOut[i3] = eq.kN; kOut[i3 + 1] = eq.kE; kOut[i3 + 2] = eq.kD;
  }
}

/**
 * Static reading at each valid sample of the card whose free axis is k (NED, interleaved by 3): tilt stop, then
 * reading (as cardEquilibrium; NaN where k is NaN), into readingDeg. With flags: COMPASS_FLAG_ON_STOP and
 * COMPASS_FLAG_WEAK_DIRECTIVE (|B_p|/H below minDirective) are or-ed in.
 */
function stopAndReadPass(inp: CardInputs, k: Float64Array, readingDeg: Float64Array, flags: Uint8Array | null, minDirective: number): void {
  const { n, valid, xb, zb, xNt, yNt, zNt, cosLim, sinLim } = inp;
  const eq = newCardEquilibrium();
  for (let i = 0; i < n; i++) {
    if (valid[i] === 0) continue;
    const i3 = 3 * i;
    eq.kN = k[i3]; eq.kE = k[i3 + 1]; eq.kD = k[i3 + 2];
    let r = NaN, onStop = false, directive = NaN;
    if (!Number.isNaN(eq.kN)) { // a free axis exists (G not zero)
      clampCardAxisToStop(zb[i3], zb[i3 + 1], zb[i3 + 2], cosLim, sinLim, eq, false);
      readCardAxis(xb[i3], xb[i3 + 1], xb[i3 + 2], xNt[i], yNt[i], zNt[i], eq);
      r = eq.readingDeg; onStop = eq.onStop; directive = eq.directiveRatio;
    }
    readingDeg[i] = r;
    if (flags !== null) {
      if (onStop) flags[i] |= COMPASS_FLAG_ON_STOP;
      if (!(directive >= minDirective)) flags[i] |= COMPASS_FLAG_WEAK_DIRECTIVE;
    }
  }
}

/**
 * Pass 3, per valid sample: the dynamic reading (gauge heading − χ), its flags (stop, weak directive force, swinging)
 * and `unreliable`; the reading with deviation; the error and its split (static part from the turn-only reading
 * sTurnDeg, see the file comment). Returns the number of samples where the deviation card gave no usable value.
 */
function errorSplitPass(
  inp: CardInputs, chi: Float64Array, onStop: Uint8Array, sTurnDeg: Float64Array, profile: CompassProfile,
  deviation: ((compassDeg: number) => number) | undefined, tr: TraceColumns,
): number {
  const { n, valid, psiU } = inp;
  const { staticDeg, dynamicDeg, readingDeg, errorDeg, errDipTurnDeg, errDipAccelDeg, errLagSwirlDeg, errDeviationDeg } = tr;
  const { directiveRatio, unreliable, headingMagDeg, flags } = tr;
  const minDirective = profile.unreliableDirectiveRatio;
  const unreliableMask = COMPASS_FLAG_WEAK_DIRECTIVE | COMPASS_FLAG_ON_STOP | COMPASS_FLAG_BLACKOUT | COMPASS_FLAG_NO_INPUT
    | COMPASS_FLAG_SWINGING | (profile.cautionZoneUnreliable ? COMPASS_FLAG_CAUTION : 0);
  let badDeviation = 0;
  for (let i = 0; i < n; i++) {
    if (valid[i] === 0) continue;
    const hMag = headingMagDeg[i], sDeg = staticDeg[i], sTurn = sTurnDeg[i];
    const dipTurn = wrap180(sTurn - hMag), dipAccel = wrap180(sDeg - sTurn);
    errDipTurnDeg[i] = dipTurn;
    errDipAccelDeg[i] = dipAccel;
    const dyn = wrap360((psiU[i] - chi[i]) * RAD);
    dynamicDeg[i] = dyn;
    let fl = flags[i];
    if (onStop[i] === 1) fl |= COMPASS_FLAG_ON_STOP;
    if (!(directiveRatio[i] >= minDirective)) fl |= COMPASS_FLAG_WEAK_DIRECTIVE;
    if (Math.abs(wrap180(dyn - sDeg)) > SWINGING_CARD_DEG) fl |= COMPASS_FLAG_SWINGING;
    flags[i] = fl;
    unreliable[i] = (fl & unreliableMask) !== 0 ? 1 : 0;
    const rd = deviation ? applyDeviationDeg(dyn, deviation) : dyn;
    if (deviation && !Number.isFinite(rd)) badDeviation++;
    readingDeg[i] = rd;
    const e = wrap180(rd - hMag);
    const eDev = wrap180(rd - dyn);
    errorDeg[i] = e;
    errDeviationDeg[i] = eDev;
    errLagSwirlDeg[i] = e - dipTurn - dipAccel - eDev;
  }
  return badDeviation;
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

  const tr: TraceColumns = {
    n,
    staticDeg: new Float64Array(n), dynamicDeg: new Float64Array(n), readingDeg: new Float64Array(n), errorDeg: new Float64Array(n),
    errDipTurnDeg: new Float64Array(n), errDipAccelDeg: new Float64Array(n), errLagSwirlDeg: new Float64Array(n),
    errDeviationDeg: new Float64Array(n), tiltDeg: new Float64Array(n), directiveRatio: new Float64Array(n),
    unreliable: new Uint8Array(n), headingMagDeg: new Float64Array(n), flags: new Uint8Array(n),
  };
  const { staticDeg, tiltDeg, directiveRatio, flags } = tr;
  const inp: CardInputs = {
    n, t: state.t, segment: state.segment, valid: new Uint8Array(n),
    xb: new Float64Array(3 * n), zb: new Float64Array(3 * n), gapp: new Float64Array(3 * n), kFree: new Float64Array(3 * n),
    xNt: field.xNt, yNt: field.yNt, zNt: field.zNt, bNt: new Float64Array(n), psiU: new Float64Array(n), rate: new Float64Array(n),
    eps: magnetPerPendulosityFromResidualDip(profile.residualDipDeg, profile.refHorizontalNt, profile.refVerticalNt),
    cosLim: Math.cos(profile.tiltLimitDeg * DEG), sinLim: Math.sin(profile.tiltLimitDeg * DEG),
  };
  const minDirective = profile.unreliableDirectiveRatio;
  const chi = new Float64Array(n), onStop = new Uint8Array(n); // outputs of the dynamic pass

  // ---- pass 1: inputs, static readings, turn-only readings ----
  const gTurn = new Float64Array(3 * n); // apparent gravity of the turn-only card, then its free axis, in place
  const missing = inputsPass(state, field, inp, gTurn, tr);
  freeAxesPass(inp, inp.gapp, inp.kFree);
  stopAndReadPass(inp, inp.kFree, staticDeg, flags, minDirective);
  freeAxesPass(inp, gTurn, gTurn);
  const sTurnDeg = new Float64Array(n);
  stopAndReadPass(inp, gTurn, sTurnDeg, null, minDirective);

  // ---- pass 2: card dynamics ----
  integrateCardDynamics(inp, profile, maxStepS, { chi, tiltDeg, directiveRatio, onStop });

  // ---- pass 3: dynamic reading, its flags, deviation and the error split ----
  const badDeviation = errorSplitPass(inp, chi, onStop, sTurnDeg, profile, deviation, tr);

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
  const { dynamicDeg, readingDeg, errorDeg, errDipTurnDeg, errDipAccelDeg, errLagSwirlDeg, errDeviationDeg, unreliable, headingMagDeg } = tr;
  return {
    n, staticDeg, dynamicDeg, readingDeg, errorDeg, errDipTurnDeg, errDipAccelDeg, errLagSwirlDeg, errDeviationDeg,
    tiltDeg, directiveRatio, unreliable, headingMagDeg, flags, warnings,
  };
}
