// Declination uncertainty of the WMM2025 as a function of the horizontal intensity.

/** Uncertainty constants of δD = √(a² + (b/H)²): a [deg], b [deg·nT]. Source: WMM2025 Technical Report sec. 3.4 eq. 43, as transcribed in PHYSICS.md §4 (not re-checked against the report). */
export const WMM2025_DECLINATION_UNCERTAINTY_FLOOR_DEG = 0.26;
export const WMM2025_DECLINATION_UNCERTAINTY_H_DEG_NT = 5417;

/**
 * One-sigma uncertainty of the WMM2025 declination [deg] where the horizontal intensity is hNt [nT]:
 * δD = √(0.26² + (5417 / H)²). It grows without bound as H → 0 (near the magnetic poles); local crustal
 * anomalies and magnetic storms add to it and are not included.
 * NaN for a non-finite or negative H; +∞ for H = 0.
 * Example: declinationUncertaintyDeg(20_000) ≈ 0.375.
 */
export function declinationUncertaintyDeg(hNt: number): number {
  if (!Number.isFinite(hNt) || hNt < 0) return NaN;
  // WMM2025 report eq. 43 (see the constants above).
  const a = WMM2025_DECLINATION_UNCERTAINTY_FLOOR_DEG;
  const b = WMM2025_DECLINATION_UNCERTAINTY_H_DEG_NT / hNt;
  return Math.sqrt(a * a + b * b);
}
