// Static (equilibrium) reading of a pendulous compass card, general vector form (PHYSICS.md §1.1, §1.3, §1.5).
//
// Frames: earth NED (x north, y east, z down); body x nose, y right wing, z floor. The field B is given in
// true NED [nT], so the reading comes out magnetic (declination drops out of the projection).
//
//   apparent gravity   G = g e_z − a                              (a = kinematic acceleration, NED)
//   card axis          k = unit(G)                                 (infinitely pendulous card)
//                      k ∥ G − ε (B·k) n,  n = unit(B_p)           (finite pendulosity, ε = M / (m l), §1.3; closed form below)
//   tilt stop          angle(k, z_b) ≤ tiltLimit, else k is put on the cone about z_b toward G   (§1.5)
//   card-plane field   B_p = B − (B·k) k
//   lubber line        x_p = x_b − (x_b·k) k
//   reading            ψc = atan2( (B_p × x_p)·k , B_p·x_p )  (clockwise about the down-pointing k)
//
// Because B_p ⊥ k, (B_p × x_p)·k = k·(B × x_b) and B_p·x_p = B·x_b − (B·k)(k·x_b): no projection is formed.
import { G0_MS2 } from '../constants.js';

const DEG = Math.PI / 180;
const RAD = 180 / Math.PI;

/**
 * Reusable result of one equilibrium evaluation (pass the same object every call; nothing is allocated).
 * readingDeg in [0, 360) (NaN when the card has no directive force or an input is not finite);
 * bpNt = |B_p| [nT]; directiveRatio = |B_p| / H [-] (H = horizontal intensity of B);
 * tiltDeg = angle between the card axis k and the body (bowl) z axis [deg, 0..180];
 * onStop = the free card axis lay outside the tilt cone and was clamped onto it;
 * kN/kE/kD = unit card axis (pivot → centre of gravity, "card down") in NED.
 */
export interface CardEquilibrium {
  readingDeg: number;
  bpNt: number;
  directiveRatio: number;
  tiltDeg: number;
  onStop: boolean;
  kN: number;
  kE: number;
  kD: number;
  /** The reading's two atan2 arguments from {@link readCardAxisParts}: ψc = atan2(readSin, readCos). */
  readSin: number;
  readCos: number;
}

/** A fresh result holder for {@link cardEquilibrium} (allocate once, outside loops). */
export function newCardEquilibrium(): CardEquilibrium {
  return { readingDeg: NaN, bpNt: NaN, directiveRatio: NaN, tiltDeg: NaN, onStop: false, kN: NaN, kE: NaN, kD: NaN, readSin: NaN, readCos: NaN };
}

/**
 * Card options. tiltLimitDeg: half-angle of the tilt cone about the bowl axis [deg], Infinity (or ≥ 180) = no stop.
 * magnetPerPendulosityMs2PerNt: ε = M / (m l) [m s⁻² per nT], the magnet moment over the pendulosity; 0 = infinitely
 * pendulous card (k exactly along apparent gravity). See {@link magnetPerPendulosityFromResidualDip}.
 */
export interface CardOptions {
  tiltLimitDeg: number;
  magnetPerPendulosityMs2PerNt: number;
}

/** Infinitely pendulous card with no tilt stop: the pure §1.1 model. */
export const IDEAL_CARD: Readonly<CardOptions> = { tiltLimitDeg: Infinity, magnetPerPendulosityMs2PerNt: 0 };

/**
 * ε = M/(m l) from a residual dip d [deg] observed in level unaccelerated flight at a field (H, Z) [nT].
 * Torque balance about the card's E–W axis (PHYSICS §1.3): tan d = ε Z / (g + ε H)  ⇒  ε = g tan d / (Z − H tan d).
 * |Z| is used (the sign of Z only says which end dips). Returns 0 for d = 0; throws RangeError if d is so large that
 * no positive ε gives it (tan d ≥ |Z|/H, i.e. d ≥ dip).
 */
export function magnetPerPendulosityFromResidualDip(residualDipDeg: number, hNt: number, zNt: number): number {
  const td = Math.tan(residualDipDeg * DEG);
  if (td === 0) return 0;
  const den = Math.abs(zNt) - hNt * td;
  if (!(den > 0) || !(td > 0)) throw new RangeError(`residual dip ${residualDipDeg}° not reachable at H ${hNt} nT, Z ${zNt} nT`);
  return (G0_MS2 * td) / den;
}

/**
 * Card axis k (unit, NED) for apparent gravity G = (gN, gE, gD) [m/s²] and field B [nT], before any tilt stop.
 * Torque balance of the pendulous magnet (PHYSICS §1.3): M n × B + m l k × G = 0 with n = unit(B_p) the magnet
 * direction, i.e. k ∥ G − ε (B·k) n, ε = M/(m l). The solution lies in the plane of G and B: with ĝ = unit(G),
 * b_g = B·ĝ, B_⊥ = B − b_g ĝ, b_e = |B_⊥|, k = cos α ĝ + sin α B_⊥/b_e where
 *   tan α = −ε b_g / (|G| + ε b_e)
 * (level flight: ĝ = down, b_g = Z, b_e = H, so the card tilts north end down by d, tan d = ε Z/(g + ε H)).
 * ε = 0 gives k = ĝ. Writes kN/kE/kD into `out`; returns false if G is zero or not finite.
 */
// Method: torque balance of a pendulous magnet (PHYSICS.md §1.3), solved in closed form in the plane of G and B.
export function freeCardAxis(
  gN: number, gE: number, gD: number,
  xNt: number, yNt: number, zNt: number,
  eps: number,
  out: CardEquilibrium,
): boolean {
  const gl = Math.sqrt(gN * gN + gE * gE + gD * gD);
  if (!(gl > 0 && gl < Infinity)) {
    out.kN = out.kE = out.kD = NaN;
    return false;
  }
  const uN = gN / gl, uE = gE / gl, uD = gD / gl;
  let kN = uN, kE = uE, kD = uD;
  if (eps > 0) {
    const bg = xNt * uN + yNt * uE + zNt * uD;
    const pN = xNt - bg * uN, pE = yNt - bg * uE, pD = zNt - bg * uD;
    const be = Math.sqrt(pN * pN + pE * pE + pD * pD);
    // Unless the field lies along apparent gravity (then the magnet has no preferred azimuth and no tilting couple
    // is defined, and k = ĝ):
    if (be > 1e-9 * Math.abs(bg)) {
      const ta = (-eps * bg) / (gl + eps * be); // tan α; |α| < 90° since the denominator is positive
      const ca = 1 / Math.sqrt(1 + ta * ta), sa = (ta * ca) / be;
      kN = ca * uN + sa * pN; kE = ca * uE + sa * pE; kD = ca * uD + sa * pD;
    }
  }
  out.kN = kN; out.kE = kE; out.kD = kD;
  return true;
}

/**
 * Puts the card axis in `out` onto the cone of half-angle tiltLimitDeg about the unit bowl axis z_b if it lies
 * outside it, keeping its direction of tilt (PHYSICS §1.5: "clamp k onto the cone ... toward g_app").
 * Sets out.onStop and, unless withTiltDeg is false (callers that need only the axis skip the atan2), out.tiltDeg
 * (angle between the resulting k and z_b).
 */
// Method: tilt-stop clamp onto a cone (PHYSICS.md §1.5).
export function clampCardAxisToStop(
  zbN: number, zbE: number, zbD: number, cosLimit: number, sinLimit: number, out: CardEquilibrium, withTiltDeg = true,
): void {
  const kN = out.kN, kE = out.kE, kD = out.kD;
  const c = kN * zbN + kE * zbE + kD * zbD;
  // Perpendicular part of k relative to z_b: its length is sin(tilt).
  const qN = kN - c * zbN, qE = kE - c * zbE, qD = kD - c * zbD;
  const ql = Math.sqrt(qN * qN + qE * qE + qD * qD);
  const onStop = c < cosLimit;
  out.onStop = onStop;
  if (onStop && ql > 0) {
    out.kN = cosLimit * zbN + (sinLimit * qN) / ql;
    out.kE = cosLimit * zbE + (sinLimit * qE) / ql;
    out.kD = cosLimit * zbD + (sinLimit * qD) / ql;
    if (withTiltDeg) out.tiltDeg = Math.atan2(sinLimit, cosLimit) * RAD;
  } else if (withTiltDeg) {
    // (On the stop here only with apparent gravity exactly along −z_b, inverted: no direction to clamp toward, k is left.)
    out.tiltDeg = Math.atan2(ql, c) * RAD;
  }
}

/**
 * The reading of the card whose axis is out.kN/kE/kD, for lubber (nose) axis x_b (any length) and field B [nT], as
 * its two atan2 arguments: ψc = atan2(readSin, readCos), readSin = k·(B × x_b), readCos = B·x_b − (B·k)(k·x_b)
 * (PHYSICS §1.1), for callers that combine ψc with another angle algebraically. Sets out.readSin, out.readCos,
 * out.bpNt and out.directiveRatio = |B_p| / H; returns false when the card has no directive force
 * (|B_p| ≤ 1e-9 |B|: the reading is undefined).
 */
// Method: projection of B and of the lubber line on the card plane (PHYSICS.md §1.1).
export function readCardAxisParts(
  xbN: number, xbE: number, xbD: number, xNt: number, yNt: number, zNt: number, out: CardEquilibrium,
): boolean {
  const kN = out.kN, kE = out.kE, kD = out.kD;
  const bk = xNt * kN + yNt * kE + zNt * kD;
  const b2 = xNt * xNt + yNt * yNt + zNt * zNt;
  const bp = Math.sqrt(Math.max(0, b2 - bk * bk));
  // k · (B × x_b)
  const cN = yNt * xbD - zNt * xbE;
  const cE = zNt * xbN - xNt * xbD;
  const cD = xNt * xbE - yNt * xbN;
  out.readSin = kN * cN + kE * cE + kD * cD;
  out.readCos = xNt * xbN + yNt * xbE + zNt * xbD - bk * (kN * xbN + kE * xbE + kD * xbD);
  out.bpNt = bp;
  out.directiveRatio = bp / Math.sqrt(xNt * xNt + yNt * yNt);
  return bp > 1e-9 * Math.sqrt(b2);
}

/**
 * Reading of the card whose axis is out.kN/kE/kD, for lubber (nose) axis x_b (any length) and field B [nT]:
 * ψc = atan2(k·(B × x_b), B·x_b − (B·k)(k·x_b)) (PHYSICS §1.1). Sets out.readingDeg [0, 360), out.bpNt,
 * out.directiveRatio = |B_p| / H. A card with |B_p| ≤ 1e-9 |B| reads NaN.
 */
// Method: projection of B and of the lubber line on the card plane (PHYSICS.md §1.1).
export function readCardAxis(xbN: number, xbE: number, xbD: number, xNt: number, yNt: number, zNt: number, out: CardEquilibrium): void {
  if (!readCardAxisParts(xbN, xbE, xbD, xNt, yNt, zNt, out)) {
    out.readingDeg = NaN;
    return;
  }
  let r = Math.atan2(out.readSin, out.readCos) * RAD;
  if (r < 0) r += 360;
  out.readingDeg = r >= 360 ? 0 : r + 0;
}

/**
 * Static reading of a pendulous compass card for given body axes (the core of {@link cardEquilibrium}, for callers
 * that have the axes already): x_b, z_b unit nose and floor axes in NED, G = (gN, gE, gD) apparent gravity [m/s²],
 * field B [nT] true NED, ε = magnetPerPendulosity, tilt cone cos/sin of its half-angle (cosLimit −2: no stop).
 * withTiltDeg false skips out.tiltDeg. Any non-finite input gives NaN results and onStop false; returns out.
 */
// Method: static equilibrium of a pendulous magnet card, general vector form (PHYSICS.md §1.1).
export function cardEquilibriumOfAxes(
  xbN: number, xbE: number, xbD: number, zbN: number, zbE: number, zbD: number,
  gN: number, gE: number, gD: number,
  xNt: number, yNt: number, zNt: number,
  eps: number, cosLimit: number, sinLimit: number,
  out: CardEquilibrium, withTiltDeg = true,
): CardEquilibrium {
  out.onStop = false;
  if (!freeCardAxis(gN, gE, gD, xNt, yNt, zNt, eps, out) || !Number.isFinite(xbN + zbN + xNt + yNt + zNt)) {
    out.readingDeg = NaN; out.bpNt = NaN; out.directiveRatio = NaN; out.tiltDeg = NaN;
    return out;
  }
  clampCardAxisToStop(zbN, zbE, zbD, cosLimit, sinLimit, out, withTiltDeg);
  readCardAxis(xbN, xbE, xbD, xNt, yNt, zNt, out);
  return out;
}

/**
 * Static reading of a pendulous compass card for one sample (PHYSICS §1.1 with §1.3 and §1.5 options).
 *
 * @param headingDegTrue nose azimuth, true [deg]
 * @param pitchDeg nose up + [deg]
 * @param bankDeg right wing down + [deg]
 * @param accNMs2 kinematic acceleration, NED [m/s²] (not specific force: level unaccelerated flight is a = 0)
 * @param xNt field, true NED [nT]: north, east, down
 * @param out reusable result holder ({@link newCardEquilibrium}); returned
 * @param opts tilt stop and pendulosity; default the ideal card (no stop, infinite pendulosity)
 * @returns out, with readingDeg in [0, 360) (magnetic, no deviation), |B_p|, |B_p|/H, tilt, stop flag, k.
 *   Any non-finite input gives NaN results and onStop false.
 * @example level, unaccelerated, heading 045 true, variation 0: readingDeg 45.
 */
// Method: static equilibrium of a pendulous magnet card, general vector form (PHYSICS.md §1.1).
export function cardEquilibrium(
  headingDegTrue: number, pitchDeg: number, bankDeg: number,
  accNMs2: number, accEMs2: number, accDMs2: number,
  xNt: number, yNt: number, zNt: number,
  out: CardEquilibrium,
  opts: Readonly<CardOptions> = IDEAL_CARD,
): CardEquilibrium {
  const ps = headingDegTrue * DEG, th = pitchDeg * DEG, ph = bankDeg * DEG;
  const cps = Math.cos(ps), sps = Math.sin(ps), cth = Math.cos(th), sth = Math.sin(th), cph = Math.cos(ph), sph = Math.sin(ph);
  // Body axes in NED from (heading, pitch, bank), aerospace z-y-x Euler sequence.
  const lim = opts.tiltLimitDeg;
  return cardEquilibriumOfAxes(
    cth * cps, cth * sps, -sth, cps * sth * cph + sps * sph, sps * sth * cph - cps * sph, cth * cph,
    -accNMs2, -accEMs2, G0_MS2 - accDMs2, xNt, yNt, zNt, opts.magnetPerPendulosityMs2PerNt,
    lim < 180 ? Math.cos(lim * DEG) : -2, lim < 180 ? Math.sin(lim * DEG) : 0, out, // cos −2: never clamps, computes the tilt
  );
}
