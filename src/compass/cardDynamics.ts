// cardDynamics: the dynamic pass of simulateCompass, the card integrated from sample to sample (PHYSICS.md §1.6).
//
// Between samples, inputs are interpolated linearly onto nSub sub-steps of at most hMax and the card is integrated
// by classical Runge–Kutta (RK4):
//
//   card tilt    k' = (k_target − k) / τ_tilt, then clamped onto the tilt cone      (τ_tilt = 0: k = k_target)
//   azimuth      χ'' = −ω_n² sin(χ − χ_eq) − c (χ' − Ω_f)                            (PHYSICS §1.6, divided by I)
//   liquid       Ω_f' = (κ ω_bowl − Ω_f) / τ_s
//
// χ = ψ − reading in an earth-fixed gauge (ψ the true heading unwrapped), ω_n² = (2π/T0)²·|B_p|/H_ref,
// c = 2 ζ_ref 2π/T0. See simulateCompass.ts for the restart rule and the error split.
//
// Everything in the loop is scalar: per-sample inputs come precomputed in typed arrays, the card at the latest
// node lives in one object updated in place.
import type { CompassProfile } from './compassProfile.js';
import { clampCardAxisToStop, freeCardAxis, newCardEquilibrium, readCardAxisParts, type CardEquilibrium } from './cardEquilibrium.js';

/** Wraps a radian difference to (−π, π]. */
export function wrapPiRad(x: number): number {
  return x - 2 * Math.PI * Math.ceil((x - Math.PI) / (2 * Math.PI));
}

/**
 * Per-sample inputs of the card dynamics, from the static pass: unit body axes x_b (nose) and z_b (floor), apparent
 * gravity G [m/s²] and the free (unlagged, unclamped) card axis, NED, interleaved by 3; the field columns [nT] and
 * |B| [nT]; the unwrapped true heading [rad]; the bowl (turn) rate [rad/s]; t [s]; valid (1: every input finite);
 * segment ids; ε = magnetPerPendulosity [m s⁻² per nT] and the tilt cone's cos/sin.
 */
export interface CardInputs {
  n: number;
  t: Float64Array;
  segment: Int32Array;
  valid: Uint8Array;
  xb: Float64Array;
  zb: Float64Array;
  gapp: Float64Array;
  kFree: Float64Array;
  xNt: Float64Array;
  yNt: Float64Array;
  zNt: Float64Array;
  bNt: Float64Array;
  psiU: Float64Array;
  rate: Float64Array;
  eps: number;
  cosLim: number;
  sinLim: number;
}

/** What the dynamic pass writes per sample (valid samples only): χ [rad], tilt [deg], |B_p|/H [-], on-stop (1/0). */
export interface CardDynamicsOutput {
  chi: Float64Array;
  tiltDeg: Float64Array;
  directiveRatio: Float64Array;
  onStop: Uint8Array;
}

/**
 * The card at the latest node of the integration, updated in place. card: lagged, clamped axis k with |B_p|,
 * |B_p|/H, stop flag and (at samples) tilt; free: scratch for the free axis between samples; fN/fE/fD: free axis at
 * the previous node; lagH/lagE/lagR: tilt-lag factors for the sub-step length lagH; chiEq: equilibrium azimuth χ_eq
 * [rad], unwrapped; directive: the card has a directive force (χ_eq defined).
 */
interface CardNode {
  card: CardEquilibrium;
  free: CardEquilibrium;
  fN: number;
  fE: number;
  fD: number;
  lagH: number;
  lagE: number;
  lagR: number;
  chiEq: number;
  directive: boolean;
}

// The node is advanced by two functions that take only integers and flags, so that calling them boxes no numbers
// even where the JIT does not inline them; each inlines its own card helpers.

/**
 * Moves the lagged card axis to node s of nSub from sample i to sample j (inputs interpolated linearly at
 * f = s/nSub): reset to the free axis when reset is true (or without a tilt lag), else advanced by the sub-step
 * (t[j] − t[i])/nSub with the lag tauTiltS (kept when nSub is 0). At f = 0 and f = 1 the sample's free axis is
 * reused (interpolation is exact there); between samples it is freeCardAxis of the interpolated G and B.
 */
// Method: first-order-hold exponential integrator for the tilt lag (PHYSICS.md §1.6).
function advanceCardTilt(inp: CardInputs, tauTiltS: number, i: number, j: number, s: number, nSub: number, reset: boolean, node: CardNode): void {
  const { gapp, kFree, xNt, yNt, zNt } = inp;
  const kc = node.card;
  const f = nSub > 0 ? s / nSub : 0;
  const g = 1 - f;
  const i3 = 3 * i, j3 = 3 * j;
  let uN: number, uE: number, uD: number; // free card axis at this node
  if (f === 0 || f === 1) {
    const s3 = f === 0 ? i3 : j3;
    uN = kFree[s3]; uE = kFree[s3 + 1]; uD = kFree[s3 + 2];
  } else {
    const fr = node.free;
    freeCardAxis(
      g * gapp[i3] + f * gapp[j3], g * gapp[i3 + 1] + f * gapp[j3 + 1], g * gapp[i3 + 2] + f * gapp[j3 + 2],
      g * xNt[i] + f * xNt[j], g * yNt[i] + f * yNt[j], g * zNt[i] + f * zNt[j], inp.eps, fr,
    );
    uN = fr.kN; uE = fr.kE; uD = fr.kD;
  }
  if (reset || tauTiltS === 0) {
    kc.kN = uN; kc.kE = uE; kc.kD = uD;
    node.fN = uN; node.fE = uE; node.fD = uD;
  } else if (nSub > 0) {
    // Exact solution of k' = (u − k)/τ over the sub-step for u linear between the previous and this node's
    // free axis (first-order-hold exponential integrator): k1 = u1 + e (k0 − u0) − (u1 − u0)(τ/h)(1 − e).
    const h = (inp.t[j] - inp.t[i]) / nSub;
    if (h !== node.lagH) { node.lagH = h; node.lagE = Math.exp(-h / tauTiltS); node.lagR = (tauTiltS / h) * (1 - node.lagE); }
    const e = node.lagE, r = node.lagR;
    let kN = uN + e * (kc.kN - node.fN) - (uN - node.fN) * r;
    let kE = uE + e * (kc.kE - node.fE) - (uE - node.fE) * r;
    let kD = uD + e * (kc.kD - node.fD) - (uD - node.fD) * r;
    const l = Math.sqrt(kN * kN + kE * kE + kD * kD);
    kN /= l; kE /= l; kD /= l;
    kc.kN = kN; kc.kE = kE; kc.kD = kD;
    node.fN = uN; node.fE = uE; node.fD = uD;
  }
}

/**
 * Clamps the lagged axis at node s of nSub from sample i to j onto the tilt stop and reads the card there: sets
 * |B_p|, |B_p|/H, the stop flag, (withTiltDeg: the tilt) in node.card, node.directive, and node.chiEq = χ_eq
 * unwrapped against the node's previous χ_eq (against 0 when reset; left unchanged without a directive force).
 */
// Method: tilt stop and card-plane reading (PHYSICS.md §1.1, §1.5), χ_eq = gauge heading − reading (§1.6).
function readCardNode(inp: CardInputs, i: number, j: number, s: number, nSub: number, reset: boolean, withTiltDeg: boolean, node: CardNode): void {
  const { xb, zb, xNt, yNt, zNt, psiU } = inp;
  const kc = node.card;
  const f = nSub > 0 ? s / nSub : 0;
  const g = 1 - f;
  const i3 = 3 * i, j3 = 3 * j;
  let zN = g * zb[i3] + f * zb[j3], zE = g * zb[i3 + 1] + f * zb[j3 + 1], zD = g * zb[i3 + 2] + f * zb[j3 + 2];
  const zl = Math.sqrt(zN * zN + zE * zE + zD * zD);
  zN /= zl; zE /= zl; zD /= zl;
  clampCardAxisToStop(zN, zE, zD, inp.cosLim, inp.sinLim, kc, withTiltDeg);
  const xN = g * xb[i3] + f * xb[j3], xE = g * xb[i3 + 1] + f * xb[j3 + 1];
  node.directive = readCardAxisParts(
    xN, xE, g * xb[i3 + 2] + f * xb[j3 + 2], g * xNt[i] + f * xNt[j], g * yNt[i] + f * yNt[j], g * zNt[i] + f * zNt[j], kc,
  );
  const chiRef = reset ? 0 : node.chiEq;
  if (!node.directive) { node.chiEq = chiRef; return; }
  // χ_eq = gauge heading − reading. The gauge heading is the unwrapped heading at a sample and, between samples,
  // that of sample i plus the azimuth of the interpolated nose axis itself from sample i's (not the interpolated
  // angle, which differs from it by O(Δψ³) inside a sub-step and would shake χ_eq). The two angles are subtracted
  // as one atan2 of the complex quotient (dt + i cr)/(readCos + i readSin).
  const sr = kc.readSin, cr0 = kc.readCos;
  let raw: number;
  if (f === 0 || f === 1) raw = psiU[f === 0 ? i : j] - Math.atan2(sr, cr0);
  else {
    const cr = xb[i3] * xE - xb[i3 + 1] * xN, dt = xb[i3] * xN + xb[i3 + 1] * xE;
    raw = cr * cr + dt * dt > 1e-20
      ? psiU[i] + Math.atan2(cr * cr0 - dt * sr, dt * cr0 + cr * sr)
      : g * psiU[i] + f * psiU[j] - Math.atan2(sr, cr0); // nose (nearly) vertical: interpolated heading
  }
  node.chiEq = chiRef + wrapPiRad(raw - chiRef);
}

/** Both halves of a node: {@link advanceCardTilt} then {@link readCardNode}. */
function advanceCardNode(
  inp: CardInputs, tauTiltS: number, i: number, j: number, s: number, nSub: number, reset: boolean, withTiltDeg: boolean, node: CardNode,
): void {
  advanceCardTilt(inp, tauTiltS, i, j, s, nSub, reset, node);
  readCardNode(inp, i, j, s, nSub, reset, withTiltDeg, node);
}

/**
 * Integrates the card azimuth χ along the flight (see the file header) and writes, at each valid sample, χ [rad],
 * the card's tilt, |B_p|/H and whether it is on its stop. At the first sample of each segment (segment id changes,
 * or after an invalid sample) the card restarts at its steady state: k = k_target, Ω_f = κ ω_bowl,
 * χ = χ_eq + asin(c Ω_f / ω_n²), χ' = 0 (without a directive force χ_eq is taken as the heading).
 * maxStepS: largest sub-step [s]. Invalid samples are left untouched.
 */
// Method: second-order azimuth dynamics with liquid swirl, classical RK4 on sub-steps (PHYSICS.md §1.6).
export function integrateCardDynamics(inp: CardInputs, profile: CompassProfile, maxStepS: number, out: CardDynamicsOutput): void {
  const { n, t, segment, valid, bNt, psiU, rate } = inp;
  const w0 = (2 * Math.PI) / profile.periodS;
  const w0sqPerNt = (w0 * w0) / profile.refHorizontalNt; // ω_n² = w0sqPerNt · |B_p|
  const cDamp = 2 * profile.dampingRatio * w0;
  const kappa = profile.swirlCoupling;
  const tauS = profile.swirlTimeConstantS;
  const tauTilt = profile.tiltLagS;
  const hMaxConst = Math.min(maxStepS, 1 / cDamp, tauS / 4);
  const node: CardNode = {
    card: newCardEquilibrium(), free: newCardEquilibrium(), fN: 0, fE: 0, fD: 0, lagH: NaN, lagE: 0, lagR: 0, chiEq: 0, directive: false,
  };
  const kc = node.card;
  // Card state chi, chiDot, omF; node values at the start of the sub-step: chi_eq (unwrapped), ω_n², fluid target.
  let chi = 0, chiDot = 0, omF = 0;
  let chiEqPrev = 0, wn2Prev = 0, tgtPrev = 0;

  for (let i = 0; i < n; i++) {
    if (valid[i] === 0) continue;
    const restart = i === 0 || valid[i - 1] === 0 || segment[i - 1] !== segment[i];
    if (restart) {
      advanceCardNode(inp, tauTilt, i, i, 0, 0, true, true, node);
      const wn2 = w0sqPerNt * kc.bpNt;
      omF = kappa * rate[i];
      const s = wn2 > 0 ? (cDamp * omF) / wn2 : 0;
      chi = (node.directive ? node.chiEq : psiU[i]) + Math.asin(Math.max(-1, Math.min(1, s)));
      chiDot = 0;
      chiEqPrev = node.directive ? node.chiEq : chi;
      node.chiEq = chiEqPrev;
      wn2Prev = wn2;
      tgtPrev = kappa * rate[i];
    } else {
      // Integrate from sample i−1 to i.
      const p = i - 1;
      const dt = t[i] - t[p];
      const wn2Est = w0sqPerNt * Math.max(bNt[p], bNt[i]);
      const hMax = Math.min(hMaxConst, 0.5 / Math.sqrt(wn2Est));
      const nSub = dt > 0 ? Math.max(1, Math.ceil(dt / hMax - 1e-9)) : 0;
      const h = nSub > 0 ? dt / nSub : 0;
      const h2 = 0.5 * h, h6 = h / 6;
      for (let s = 1; s <= nSub; s++) {
        advanceCardNode(inp, tauTilt, p, i, s, nSub, false, s === nSub, node);
        const ceNew = node.chiEq;
        const wn2New = w0sqPerNt * kc.bpNt;
        const tgtNew = kappa * (((nSub - s) * rate[p] + s * rate[i]) / nSub);
        // RK4 on (chi, chiDot, omF) with chi_eq, ω_n², fluid target linear over the sub-step.
        const ceMid = 0.5 * (chiEqPrev + ceNew), wMid = 0.5 * (wn2Prev + wn2New), tMid = 0.5 * (tgtPrev + tgtNew);
        const a1 = -wn2Prev * Math.sin(chi - chiEqPrev) - cDamp * (chiDot - omF);
        const f1 = (tgtPrev - omF) / tauS;
        const x2 = chi + h2 * chiDot, v2 = chiDot + h2 * a1, o2 = omF + h2 * f1;
        const a2 = -wMid * Math.sin(x2 - ceMid) - cDamp * (v2 - o2);
        const f2 = (tMid - o2) / tauS;
        const x3 = chi + h2 * v2, v3 = chiDot + h2 * a2, o3 = omF + h2 * f2;
        const a3 = -wMid * Math.sin(x3 - ceMid) - cDamp * (v3 - o3);
        const f3 = (tMid - o3) / tauS;
        const x4 = chi + h * v3, v4 = chiDot + h * a3, o4 = omF + h * f3;
        const a4 = -wn2New * Math.sin(x4 - ceNew) - cDamp * (v4 - o4);
        const f4 = (tgtNew - o4) / tauS;
        chi += h6 * (chiDot + 2 * v2 + 2 * v3 + v4);
        chiDot += h6 * (a1 + 2 * a2 + 2 * a3 + a4);
        omF += h6 * (f1 + 2 * f2 + 2 * f3 + f4);
        chiEqPrev = ceNew; wn2Prev = wn2New; tgtPrev = tgtNew;
      }
      if (nSub === 0) advanceCardNode(inp, tauTilt, i, i, 0, 0, false, true, node);
    }
    out.chi[i] = chi;
    out.tiltDeg[i] = kc.tiltDeg;
    out.directiveRatio[i] = kc.directiveRatio;
    out.onStop[i] = kc.onStop ? 1 : 0;
  }
}
