// Wind at every sample from a set of local estimates (turn fits, log air-data windows), weighted by how
// near each estimate is in time and height and how certain it is.
import type { WindEstimate } from './flightState.js';
import { windVectorNe } from './windOption.js';

/** Assumed change of the wind with time [m/s per s]: about 1 m/s in 30 minutes [practice]. */
export const WIND_DRIFT_MS_PER_S = 1 / 1800;
/** Assumed change of the wind with height [m/s per m]: about 1 m/s per 150 m (~4 kt per 1000 ft) [practice, from memory]. */
export const WIND_SHEAR_MS_PER_M = 1 / 150;
/** Heights this far [m] beyond the highest or lowest estimate count as extrapolated [practice]. */
export const ALT_EXTRAPOLATION_M = 150;
/** Times this far [s] before the first or after the last estimate count as extrapolated (~0.3 m/s of drift at the rate above) [practice]. */
export const TIME_EXTRAPOLATION_S = 600;

export interface BlendedWind {
  windN: Float64Array;
  windE: Float64Array;
  /** Covariance of the wind used [m²/s²]. */
  covNN: Float64Array;
  covNE: Float64Array;
  covEE: Float64Array;
  /** 1 where the sample lies more than 10 min outside the time span, or 150 m outside the height band, of the estimates. */
  extrapolated: Uint8Array;
}

/**
 * Inverse-variance blend of wind estimates at each sample (t [UTC s], altM [m]). Estimate k has
 * covariance C_k (covNeMs2, else sigmaMs² isotropic) and is "farther" from a sample by
 * d_k² = (Δt · 1/1800)² + (Δh · 1/150)² [m²/s²] (Δt: time outside the estimate's window; Δh: height
 * difference); weight w_k = 1/(tr C_k / 2 + d_k²); wind = Σ w_k w⃗_k / Σ w_k;
 * covariance Σ w_k² (C_k + d_k² I) / (Σ w_k)². Empty estimates → zero wind with NaN covariance.
 */
export function blendWindEstimates(estimates: WindEstimate[], t: Float64Array, altM: Float64Array): BlendedWind {
  const n = t.length;
  const out: BlendedWind = {
    windN: new Float64Array(n), windE: new Float64Array(n),
    covNN: new Float64Array(n).fill(NaN), covNE: new Float64Array(n).fill(NaN), covEE: new Float64Array(n).fill(NaN),
    extrapolated: new Uint8Array(n),
  };
  const m = estimates.length;
  if (m === 0) return out;
  const wn = new Float64Array(m), we = new Float64Array(m), cnn = new Float64Array(m), cne = new Float64Array(m), cee = new Float64Array(m);
  const t0 = new Float64Array(m), t1 = new Float64Array(m), h = new Float64Array(m);
  let tMin = Infinity, tMax = -Infinity, hMin = Infinity, hMax = -Infinity;
  estimates.forEach((e, k) => {
    const v = e.windN !== undefined && e.windE !== undefined ? { windN: e.windN, windE: e.windE } : windVectorNe(e.fromDegTrue, e.speedMs);
    wn[k] = v.windN;
    we[k] = v.windE;
    const s2 = Number.isFinite(e.sigmaMs) ? e.sigmaMs * e.sigmaMs : 1;
    [cnn[k], cne[k], cee[k]] = e.covNeMs2 ?? [s2, 0, s2];
    t0[k] = Number.isFinite(e.t0) ? e.t0 : -Infinity;
    t1[k] = Number.isFinite(e.t1) ? e.t1 : Infinity;
    h[k] = e.altM;
    tMin = Math.min(tMin, t0[k]);
    tMax = Math.max(tMax, t1[k]);
    if (Number.isFinite(e.altM)) { hMin = Math.min(hMin, e.altM); hMax = Math.max(hMax, e.altM); }
  });
  // Per estimate, one row of 9: t0, t1, height (NaN unless finite), the sample-free part of the weight's denominator
  // (tr C / 2), wind N, E, covariance NN, NE, EE.
  const P = new Float64Array(9 * m);
  for (let k = 0; k < m; k++) {
    const b = 9 * k;
    P[b] = t0[k]; P[b + 1] = t1[k]; P[b + 2] = Number.isFinite(h[k]) ? h[k] : NaN; P[b + 3] = 0.5 * (cnn[k] + cee[k]);
    P[b + 4] = wn[k]; P[b + 5] = we[k]; P[b + 6] = cnn[k]; P[b + 7] = cne[k]; P[b + 8] = cee[k];
  }
  const { windN, windE, covNN, covNE, covEE, extrapolated } = out;
  const hasBand = Number.isFinite(hMin);
  const aLo = hMin - ALT_EXTRAPOLATION_M, aHi = hMax + ALT_EXTRAPOLATION_M;
  const tLo = tMin - TIME_EXTRAPOLATION_S, tHi = tMax + TIME_EXTRAPOLATION_S;
  const end = 9 * m;
  for (let i = 0; i < n; i++) {
    const ti = t[i];
    const a = altM[i];
    const finiteAlt = Number.isFinite(a);
    let sw = 0, sn = 0, se = 0, qnn = 0, qne = 0, qee = 0;
    for (let b = 0; b < end; b += 9) {
      const t0k = P[b], t1k = P[b + 1], hk = P[b + 2];
      const dt = ti < t0k ? t0k - ti : ti > t1k ? ti - t1k : 0;
      const dh = finiteAlt && hk === hk ? a - hk : 0; // hk === hk: a finite height (set NaN above otherwise)
      const x = dt * WIND_DRIFT_MS_PER_S, y = dh * WIND_SHEAR_MS_PER_M;
      const d2 = x * x + y * y;
      const w = 1 / (P[b + 3] + d2 + 1e-12);
      const ww = w * w;
      sw += w;
      sn += w * P[b + 4];
      se += w * P[b + 5];
      qnn += ww * (P[b + 6] + d2);
      qne += ww * P[b + 7];
      qee += ww * (P[b + 8] + d2);
    }
    const sw2 = sw * sw;
    windN[i] = sn / sw;
    windE[i] = se / sw;
    covNN[i] = qnn / sw2;
    covNE[i] = qne / sw2;
    covEE[i] = qee / sw2;
    const outsideAlt = finiteAlt && hasBand && (a < aLo || a > aHi);
    extrapolated[i] = ti < tLo || ti > tHi || outsideAlt ? 1 : 0;
  }
  return out;
}
