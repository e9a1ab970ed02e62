// Least-squares circle fits to points (x_i, y_i): Kasa's algebraic fit as a start, then the geometric
// (orthogonal-distance) fit by Levenberg–Marquardt, with a covariance from residuals and geometry.

/** A fitted circle: centre (cx, cy), radius r, in the units of the points. */
export interface Circle {
  cx: number;
  cy: number;
  r: number;
}

export interface GeometricCircleFit extends Circle {
  /** Covariance of (cx, cy, r), row-major 3×3, = s² (JᵀJ)⁻¹ at the solution, s² = Σe²/(n − 3) unless given. */
  cov: Float64Array;
  /** RMS of the orthogonal residuals e_i = |p_i − c| − r. */
  rmsResidual: number;
  iterations: number;
  converged: boolean;
}

/**
 * Kasa's algebraic circle fit: I. Kasa, "A circle fitting procedure and its error analysis", IEEE Trans.
 * Instrum. Meas. IM-25(1):8-14, 1976. Linear least squares of x² + y² + D x + E y + F = 0 over the points
 * (centred on their mean for conditioning); centre (−D/2, −E/2), r = √(D²/4 + E²/4 − F).
 * Fast and fine on long arcs; on short arcs it is biased toward small radii (Chernov). Uses points
 * i0 ≤ i < i1 with finite coordinates. NaN circle for fewer than 3 points or collinear points.
 */
export function kasaCircleFit(x: ArrayLike<number>, y: ArrayLike<number>, i0 = 0, i1 = x.length): Circle {
  let n = 0, mx = 0, my = 0;
  for (let i = i0; i < i1; i++) if (Number.isFinite(x[i]) && Number.isFinite(y[i])) { n++; mx += x[i]; my += y[i]; }
  if (n < 3) return { cx: NaN, cy: NaN, r: NaN };
  mx /= n;
  my /= n;
  let sxx = 0, sxy = 0, syy = 0, sxz = 0, syz = 0, sz = 0;
  for (let i = i0; i < i1; i++) {
    if (!(Number.isFinite(x[i]) && Number.isFinite(y[i]))) continue;
    const u = x[i] - mx, v = y[i] - my;
    const z = u * u + v * v;
    sxx += u * u; sxy += u * v; syy += v * v; sxz += u * z; syz += v * z; sz += z;
  }
  // Centred data: Σu = Σv = 0, so the normal equations decouple into a 2×2 for (D, E) and F = −Σz/n.
  const det = sxx * syy - sxy * sxy;
  if (!(Math.abs(det) > 1e-12 * (sxx * syy + 1e-300))) return { cx: NaN, cy: NaN, r: NaN };
  const D = -(syy * sxz - sxy * syz) / det;
  const E = -(sxx * syz - sxy * sxz) / det;
  const F = -sz / n;
  const r2 = (D * D + E * E) / 4 - F;
  return { cx: mx - D / 2, cy: my - E / 2, r: r2 > 0 ? Math.sqrt(r2) : NaN };
}

/** Σ (distance to (a, b) − rr)² over the finite points i0 ≤ i < i1: the cost that the geometric fit minimises. */
function radialCost(x: ArrayLike<number>, y: ArrayLike<number>, i0: number, i1: number, a: number, b: number, rr: number): number {
  let s = 0;
  for (let i = i0; i < i1; i++) {
    if (!(Number.isFinite(x[i]) && Number.isFinite(y[i]))) continue;
    const dx = x[i] - a, dy = y[i] - b;
    const e = Math.sqrt(dx * dx + dy * dy) - rr;
    s += e * e;
  }
  return s;
}

/**
 * Geometric circle fit: minimises Σ (|p_i − c| − r)² by Levenberg–Marquardt from `start` (e.g. Kasa's
 * fit), as in N. Chernov & C. Lesort, "Least squares fitting of circles", J. Math. Imaging Vis.
 * 23:239-251, 2005 (also Gander, Golub & Strebel, BIT 34, 1994). Jacobian rows
 * (−(x_i − cx)/d_i, −(y_i − cy)/d_i, −1). Covariance s² (JᵀJ)⁻¹ with s² the residual variance
 * Σe²/(n − 3), or `sigma2` when given (e.g. a known measurement variance). Points i0 ≤ i < i1.
 */
export function geometricCircleFit(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  start: Circle,
  i0 = 0,
  i1 = x.length,
  sigma2?: number,
): GeometricCircleFit {
  let cx = start.cx, cy = start.cy, r = start.r;
  const bad: GeometricCircleFit = { cx: NaN, cy: NaN, r: NaN, cov: new Float64Array(9).fill(NaN), rmsResidual: NaN, iterations: 0, converged: false };
  if (!(Number.isFinite(cx) && Number.isFinite(cy) && Number.isFinite(r))) return bad;
  let lambda = 1e-3;
  let c0 = radialCost(x, y, i0, i1, cx, cy, r);
  let it = 0;
  let converged = false;
  const N = new Float64Array(6); // JᵀJ, symmetric: 00 01 02 11 12 22
  const g = new Float64Array(3); // Jᵀe
  for (; it < 100; it++) {
    normalEquations(x, y, i0, i1, cx, cy, r, N, g);
    let stepped = false;
    for (let k = 0; k < 12; k++) {
      const d = solveSym3(N[0] * (1 + lambda), N[1], N[2], N[3] * (1 + lambda), N[4], N[5] * (1 + lambda), -g[0], -g[1], -g[2]);
      const na = cx + d[0], nb = cy + d[1], nr = r + d[2];
      const c1 = radialCost(x, y, i0, i1, na, nb, nr);
      if (c1 <= c0) {
        const size = Math.abs(d[0]) + Math.abs(d[1]) + Math.abs(d[2]);
        cx = na; cy = nb; r = nr;
        c0 = c1;
        lambda = Math.max(lambda / 10, 1e-12);
        stepped = true;
        if (size < 1e-10 * (1 + Math.abs(r))) converged = true;
        break;
      }
      lambda *= 10;
    }
    if (!stepped) { converged = true; break; } // no descent direction left: at the minimum
    if (converged) break;
  }
  normalEquations(x, y, i0, i1, cx, cy, r, N, g);
  let n = 0;
  for (let i = i0; i < i1; i++) if (Number.isFinite(x[i]) && Number.isFinite(y[i])) n++;
  const s2 = sigma2 ?? (n > 3 ? c0 / (n - 3) : NaN);
  const cov = invSym3(N[0], N[1], N[2], N[3], N[4], N[5]);
  for (let k = 0; k < 9; k++) cov[k] *= s2;
  return { cx, cy, r: Math.abs(r), cov, rmsResidual: n > 0 ? Math.sqrt(c0 / n) : NaN, iterations: it, converged };
}

function normalEquations(
  x: ArrayLike<number>, y: ArrayLike<number>, i0: number, i1: number,
  cx: number, cy: number, r: number, N: Float64Array, g: Float64Array,
): void {
  N.fill(0);
  g.fill(0);
  for (let i = i0; i < i1; i++) {
    if (!(Number.isFinite(x[i]) && Number.isFinite(y[i]))) continue;
    const dx = x[i] - cx, dy = y[i] - cy;
    const d = Math.sqrt(dx * dx + dy * dy);
    if (!(d > 0)) continue;
    const j0 = -dx / d, j1 = -dy / d, j2 = -1;
    const e = d - r;
    N[0] += j0 * j0; N[1] += j0 * j1; N[2] += j0 * j2; N[3] += j1 * j1; N[4] += j1 * j2; N[5] += j2 * j2;
    g[0] += j0 * e; g[1] += j1 * e; g[2] += j2 * e;
  }
}

/** Inverse of the symmetric 3×3 [[a b c][b d e][c e f]] by cofactors, row-major 9 entries. */
function invSym3(a: number, b: number, c: number, d: number, e: number, f: number): Float64Array {
  const i00 = d * f - e * e, i01 = c * e - b * f, i02 = b * e - c * d;
  const i11 = a * f - c * c, i12 = b * c - a * e, i22 = a * d - b * b;
  const det = a * i00 + b * i01 + c * i02;
  const k = 1 / det;
  return Float64Array.from([i00 * k, i01 * k, i02 * k, i01 * k, i11 * k, i12 * k, i02 * k, i12 * k, i22 * k]);
}

/** Solves the symmetric 3×3 system [[a b c][b d e][c e f]] x = (p, q, s). */
function solveSym3(a: number, b: number, c: number, d: number, e: number, f: number, p: number, q: number, s: number): [number, number, number] {
  const m = invSym3(a, b, c, d, e, f);
  return [m[0] * p + m[1] * q + m[2] * s, m[3] * p + m[4] * q + m[5] * s, m[6] * p + m[7] * q + m[8] * s];
}
