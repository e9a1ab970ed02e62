// Archibald Smith's approximate deviation coefficients A–E: evaluation, inversion, 8-point closed forms and
// the least-squares fit to any compass swing.
import { multiply, qr, transpose, usolve } from 'mathjs';
import { DEG } from '../constants.js';
import { OptionError } from '../errors.js';
import { wrap180, wrap360 } from '../geo/angles.js';

/**
 * Smith's coefficients [deg] of δ(h) = A + B sin h + C cos h + D sin 2h + E cos 2h, h the compass heading,
 * δ the deviation, easterly + (compass + deviation = magnetic). A constant, B and C semicircular,
 * D and E quadrantal. Source: NGA Handbook of Magnetic Compass Adjustment (2004) ch. V; Bowditch (NGA Pub. 9) ch. 6.
 */
export interface SmithCoefficients {
  aDeg: number;
  bDeg: number;
  cDeg: number;
  dDeg: number;
  eDeg: number;
}

/** Deviations [deg, easterly +] observed on the eight compass headings N, NE, E, SE, S, SW, W, NW. */
export interface EightPointDeviations {
  n: number;
  ne: number;
  e: number;
  se: number;
  s: number;
  sw: number;
  w: number;
  nw: number;
}

/** Iteration limit and tolerance [deg] of compassForMagneticDeg. */
const INVERSION_MAX_STEPS = 200;
const INVERSION_TOL_DEG = 1e-10;
/** Smallest |R_ii| / max |R_jj| of the QR factor accepted as full rank in fitSmithCoefficients. */
const MIN_RELATIVE_PIVOT = 1e-8;

/**
 * Deviation [deg, easterly +, in (−180, 180]] on compass heading compassDeg [deg, any value; wrapped].
 * δ(h) = A + B sin h + C cos h + D sin 2h + E cos 2h. Source: NGA Handbook of Magnetic Compass Adjustment ch. V.
 * NaN for a non-finite heading. Example: with A..E = 1, 12, 8, 5, 1.5, deviationAtDeg(c, 0) = 10.5.
 */
export function deviationAtDeg(c: SmithCoefficients, compassDeg: number): number {
  const h = compassDeg * DEG;
  // Smith's approximate formula (NGA Handbook ch. V).
  return wrap180(c.aDeg + c.bDeg * Math.sin(h) + c.cDeg * Math.cos(h) + c.dDeg * Math.sin(2 * h) + c.eDeg * Math.cos(2 * h));
}

/** Magnetic heading [deg, [0, 360)] shown by compass heading compassDeg: compass + deviation = magnetic. */
export function magneticForCompassDeg(c: SmithCoefficients, compassDeg: number): number {
  return wrap360(compassDeg + deviationAtDeg(c, compassDeg));
}

/**
 * Compass heading [deg, [0, 360)] to steer to make good magnetic heading magDeg: the solution h_c of
 * h_c + δ(h_c) = h_m by the fixed-point iteration h_c ← h_m − δ(h_c), started at h_m (ours, PHYSICS.md §3).
 * It contracts when |dδ/dh| < 1, i.e. when (|B| + |C| + 2|D| + 2|E|)·π/180 < 1 (any card within the 10° limit).
 * NaN when the iteration does not settle (coefficients so large that the card has no unique inverse) or for a
 * non-finite magDeg. Example (NGA art. 501 swing): to make good M100 steer C087.8.
 */
export function compassForMagneticDeg(c: SmithCoefficients, magDeg: number): number {
  if (!Number.isFinite(magDeg)) return NaN;
  let hc = magDeg;
  for (let k = 0; k < INVERSION_MAX_STEPS; k++) {
    const next = magDeg - deviationAtDeg(c, hc);
    const step = wrap180(next - hc);
    hc = next;
    if (Math.abs(step) < INVERSION_TOL_DEG) return wrap360(hc);
  }
  return NaN;
}

/**
 * Smith's coefficients from deviations on the eight cardinal and intercardinal compass headings, closed forms
 * A = Σ/8, B = (d_E − d_W)/2, C = (d_N − d_S)/2, D = [(d_NE + d_SW) − (d_SE + d_NW)]/4,
 * E = [(d_N + d_S) − (d_E + d_W)]/4. Source: NGA Handbook of Magnetic Compass Adjustment art. 501.
 * Inputs in degrees, easterly +. Example (art. 501): N 10.5, NE 20.0, E 11.5, SE −1.2, S −5.5, SW −8.0,
 * W −12.5, NW −6.8 → A 1.0, B 12.0, C 8.0, D 5.0, E 1.5.
 */
export function smithCoefficientsFromEightPoints(d: EightPointDeviations): SmithCoefficients {
  return {
    aDeg: (d.n + d.ne + d.e + d.se + d.s + d.sw + d.w + d.nw) / 8,
    bDeg: (d.e - d.w) / 2,
    cDeg: (d.n - d.s) / 2,
    dDeg: (d.ne + d.sw - (d.se + d.nw)) / 4,
    eDeg: (d.n + d.s - (d.e + d.w)) / 4,
  };
}

/**
 * Least-squares Smith's coefficients from a swing of any number m ≥ 5 of rows: compassDeg[i] the compass heading,
 * deviationDeg[i] the deviation observed there [deg, easterly +]. Minimises Σ (δ_i − row_i·[A B C D E])² over the
 * design rows [1, sin h, cos h, sin 2h, cos 2h], solved by QR decomposition (mathjs qr, usolve) rather than the
 * normal equations. On 8 equally spaced headings this equals the 8-point closed forms when the data follow the
 * 5-term model exactly (for other data B and C differ: the closed forms read them off the cardinals alone).
 * Throws OptionError when the columns differ in length, a value is not finite, there are fewer than 5 rows, or
 * the headings do not determine all five coefficients (fewer than 5 distinct headings, or nearly so).
 */
export function fitSmithCoefficients(compassDeg: ArrayLike<number>, deviationDeg: ArrayLike<number>): SmithCoefficients {
  const m = compassDeg.length;
  if (deviationDeg.length !== m) throw new OptionError('deviationDeg', `needs one value per heading (${m}), got ${deviationDeg.length}`);
  if (m < 5) throw new OptionError('headings', `a swing needs at least 5 headings to fit A–E, got ${m}`);
  const design: number[][] = [];
  const rhs: number[] = [];
  for (let i = 0; i < m; i++) {
    const h = compassDeg[i] * DEG;
    const d = deviationDeg[i];
    if (!Number.isFinite(h) || !Number.isFinite(d)) {
      throw new OptionError('headings', `row ${i + 1}: compass heading and deviation must be finite, got ${compassDeg[i]} and ${d}`);
    }
    design.push([1, Math.sin(h), Math.cos(h), Math.sin(2 * h), Math.cos(2 * h)]);
    rhs.push(d);
  }
  // Householder QR: A = Q R, then R[0:5, 0:5] x = (Qᵀ b)[0:5] by back substitution.
  const { Q, R } = qr(design) as unknown as { Q: number[][]; R: number[][] };
  const qtb = multiply(transpose(Q), rhs) as unknown as number[];
  const r5 = R.slice(0, 5).map((row) => row.slice(0, 5));
  const pivots = r5.map((row, i) => Math.abs(row[i]));
  const largest = Math.max(...pivots);
  if (!(largest > 0) || pivots.some((p) => p < MIN_RELATIVE_PIVOT * largest)) {
    throw new OptionError('headings', 'the swung headings do not determine all of A–E: swing at least 5 distinct headings spread round the card');
  }
  const x = usolve(r5, qtb.slice(0, 5)) as unknown as number[][];
  return { aDeg: x[0][0], bDeg: x[1][0], cDeg: x[2][0], dDeg: x[3][0], eDeg: x[4][0] };
}
