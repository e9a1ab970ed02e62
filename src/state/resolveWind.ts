// The wind used at each sample, from the option: given, calm, or auto (phase 1: auto falls back to calm).
import type { LogWarning } from '../log/flightLog.js';
import type { WindEstimate } from './flightState.js';
import { checkWindOption, windVectorNe, type WindOption } from './windOption.js';

export interface ResolvedWind {
  /** Air-mass velocity (wind blowing TO) per sample, north and east [m/s]. */
  windN: Float64Array;
  windE: Float64Array;
  winds: WindEstimate[];
  warnings: LogWarning[];
}

/** Warning text when no wind is known. */
export const NO_WIND_MESSAGE = 'no wind: heading taken equal to track';

/**
 * Fills the per-sample wind columns for `n` samples from the option. Throws OptionError for a bad option.
 * calm → zero wind and the warning "no wind: heading taken equal to track"; given → one constant wind;
 * auto → (until the estimator lands) calm with a warning that says so.
 */
export function resolveWind(option: WindOption, n: number): ResolvedWind {
  checkWindOption(option);
  const windN = new Float64Array(n);
  const windE = new Float64Array(n);
  const warnings: LogWarning[] = [];
  const winds: WindEstimate[] = [];
  if (option.kind === 'given') {
    const { windN: wn, windE: we } = windVectorNe(option.fromDegTrue, option.speedMs);
    windN.fill(wn);
    windE.fill(we);
    winds.push(constantEstimate(option.fromDegTrue, option.speedMs, 'given'));
    return { windN, windE, winds, warnings };
  }
  if (option.kind === 'auto') {
    warnings.push({ code: 'wind-auto-unavailable', message: 'wind could not be estimated from this log; calm assumed' });
  }
  warnings.push({ code: 'no-wind', message: NO_WIND_MESSAGE, count: n });
  winds.push(constantEstimate(0, 0, 'calm'));
  return { windN, windE, winds, warnings };
}

function constantEstimate(fromDegTrue: number, speedMs: number, source: 'given' | 'calm'): WindEstimate {
  return { fromDegTrue, speedMs, source, t0: NaN, t1: NaN, altM: NaN, sigmaMs: NaN, tasMs: NaN, arcDeg: NaN };
}
