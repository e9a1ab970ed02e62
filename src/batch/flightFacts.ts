// The few numbers of one analysed flight that the batch catalogue keeps and the overview compares.
import type { FlightAnalysis } from '../flightAnalysis.js';

/**
 * Catalogue facts of one flight. Times are UTC seconds; angles in degrees; NaN where there is no value
 * (no finite compass error, no graded turn).
 */
export interface FlightFacts {
  format: string;
  /** Tags after the overrides (options > side file > the log's own meta); '' when none. */
  aircraft: string;
  pilot: string;
  /** First and last sample of the reconstructed flight [UTC s]. */
  startT: number;
  durationS: number;
  samples: number;
  /** Largest |compass_error_deg| over the flight [deg, ≥ 0] and when [UTC s]. */
  maxAbsErrorDeg: number;
  maxErrorT: number;
  /** Root mean square of the finite compass errors [deg, ≥ 0]. */
  rmsErrorDeg: number;
  /** Turns detected, turns with a graded roll-out (finite roll-out error), and how many of those were within tolerance. */
  turnsFlown: number;
  turnsGraded: number;
  turnsWithinTolerance: number;
  /** Mean |rollout_error_deg| over the graded turns [deg, ≥ 0]. */
  meanAbsRolloutErrorDeg: number;
  warnings: number;
}

/**
 * Reduces a FlightAnalysis to its catalogue facts. Pure. RMS over the finite samples of
 * CompassTrace.errorDeg (equal weight per sample); max |error| picks the first of equal maxima, as the
 * summary JSON does.
 */
export function flightFacts(a: FlightAnalysis): FlightFacts {
  const s = a.state;
  const err = a.compass.errorDeg;
  let iMax = -1;
  let sumSq = 0;
  let nErr = 0;
  for (let i = 0; i < err.length; i++) {
    const e = err[i];
    if (!Number.isFinite(e)) continue;
    sumSq += e * e;
    nErr++;
    if (iMax < 0 || Math.abs(e) > Math.abs(err[iMax])) iMax = i;
  }
  let graded = 0;
  let within = 0;
  let sumAbsRollout = 0;
  for (const t of a.analysis.turns) {
    if (!Number.isFinite(t.rolloutErrorDeg)) continue;
    graded++;
    sumAbsRollout += Math.abs(t.rolloutErrorDeg);
    if (t.withinTolerance) within++;
  }
  const n = s.n;
  return {
    format: a.log.source.format,
    aircraft: a.log.source.meta.aircraft ?? '',
    pilot: a.log.source.meta.pilot ?? '',
    startT: n > 0 ? s.t[0] : NaN,
    durationS: n > 0 ? s.t[n - 1] - s.t[0] : 0,
    samples: n,
    maxAbsErrorDeg: iMax >= 0 ? Math.abs(err[iMax]) : NaN,
    maxErrorT: iMax >= 0 ? s.t[iMax] : NaN,
    rmsErrorDeg: nErr > 0 ? Math.sqrt(sumSq / nErr) : NaN,
    turnsFlown: a.analysis.turns.length,
    turnsGraded: graded,
    turnsWithinTolerance: within,
    meanAbsRolloutErrorDeg: graded > 0 ? sumAbsRollout / graded : NaN,
    warnings: a.warnings.length,
  };
}
