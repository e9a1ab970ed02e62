// The wind used at each sample: from the option, or (auto) from the log's air data, else from turns, else
// from the fallback, else calm; estimates from the log cross-check whatever is used.
import type { LogWarning } from '../log/flightLog.js';
import type { WindEstimate, WindSource } from './flightState.js';
import { describeSpans, utcIso } from './timeSpans.js';
import { blendWindEstimates } from './windBlend.js';
import { windFromAirData } from './windFromAirData.js';
import { DEFAULT_MIN_ARC_DEG, windFromTurns, type WindFromTurnsInput, type WindFromTurnsResult } from './windFromTurns.js';
import { checkWindOption, windFromVector, windVectorNe, type WindOption } from './windOption.js';
import { windFromTable } from './windTable.js';

/** Warning text when no wind is known. */
export const NO_WIND_MESSAGE = 'no wind: heading taken equal to track';
/** Assumed 1-sigma of a given or tabled wind [m/s] (a forecast wind is good to ~5 kt) [practice]. */
export const GIVEN_WIND_SIGMA_MS = 2.5;
/** Assumed 1-sigma of the wind when calm is assumed [m/s] [practice]. */
export const CALM_WIND_SIGMA_MS = 5;
/** Estimates disagreeing with the wind used by more than max(this, 3 σ) [m/s] are reported [practice]. */
export const WIND_DISAGREE_MS = 2.5;

export interface WindContext extends WindFromTurnsInput {
  /** Logged TAS [m/s] and true heading [deg], aligned with the samples, when the log has them. */
  loggedTasMs?: Float64Array;
  loggedHeadingDegTrue?: Float64Array;
  /** Least air-vector arc of a turn fit [deg]. Default 120. */
  minArcDeg?: number;
}

export interface ResolvedWind {
  /** Air-mass velocity (wind blowing TO) per sample, north and east [m/s], and its covariance [m²/s²]. */
  windN: Float64Array;
  windE: Float64Array;
  covNN: Float64Array;
  covNE: Float64Array;
  covEE: Float64Array;
  /** 1 where an estimated wind was extrapolated beyond the times/heights it was measured at. */
  extrapolated: Uint8Array;
  source: WindSource;
  /** The estimates the wind rests on (or the given / table / calm wind as one entry per row). */
  winds: WindEstimate[];
  warnings: LogWarning[];
  /** Every turn looked at, for diagnostics. */
  turns: WindFromTurnsResult;
  /** Air-data windows, when the log has TAS and heading. */
  airData: WindEstimate[];
}

const fmt = (e: { fromDegTrue: number; speedMs: number }): string => `from ${e.fromDegTrue.toFixed(0).padStart(3, '0')}° at ${e.speedMs.toFixed(1)} m/s`;

function constant(n: number, windN: number, windE: number, sigma: number): Pick<ResolvedWind, 'windN' | 'windE' | 'covNN' | 'covNE' | 'covEE' | 'extrapolated'> {
  return {
    windN: new Float64Array(n).fill(windN), windE: new Float64Array(n).fill(windE),
    covNN: new Float64Array(n).fill(sigma * sigma), covNE: new Float64Array(n), covEE: new Float64Array(n).fill(sigma * sigma),
    extrapolated: new Uint8Array(n),
  };
}

function fixedEstimate(fromDegTrue: number, speedMs: number, source: WindSource, sigmaMs: number, extra: Partial<WindEstimate> = {}): WindEstimate {
  const v = windVectorNe(fromDegTrue, speedMs);
  return { fromDegTrue, speedMs, source, t0: NaN, t1: NaN, altM: NaN, sigmaMs, tasMs: NaN, arcDeg: NaN, windN: v.windN, windE: v.windE, ...extra };
}

/**
 * Resolves the wind for every sample (see WindOption for the order of sources). Throws OptionError for a
 * bad option. Warnings: no wind; turn fits rejected (with reasons) or left out (not level); estimates
 * that disagree with the wind used; air-data winds that disagree with turn fits.
 */
export function resolveWind(option: WindOption, c: WindContext): ResolvedWind {
  checkWindOption(option);
  const n = c.t.length;
  const warnings: LogWarning[] = [];
  const minArc = c.minArcDeg ?? DEFAULT_MIN_ARC_DEG;
  const turns = windFromTurns(c, minArc);
  const airData = c.loggedTasMs && c.loggedHeadingDegTrue
    ? windFromAirData({ t: c.t, altM: c.altM, velN: c.velN, velE: c.velE, velD: c.velD, tasMs: c.loggedTasMs, headingDegTrue: c.loggedHeadingDegTrue, segment: c.segment })
    : [];
  reportTurnDiagnostics(turns, minArc, warnings);

  let res: Omit<ResolvedWind, 'warnings' | 'turns' | 'airData'>;
  if (option.kind === 'given') {
    const v = windVectorNe(option.fromDegTrue, option.speedMs);
    res = { ...constant(n, v.windN, v.windE, GIVEN_WIND_SIGMA_MS), source: 'given', winds: [fixedEstimate(option.fromDegTrue, option.speedMs, 'given', GIVEN_WIND_SIGMA_MS)] };
  } else if (option.kind === 'table') {
    const tw = windFromTable(option.rows, c.t, c.altM);
    const s2 = GIVEN_WIND_SIGMA_MS ** 2;
    res = {
      windN: tw.windN, windE: tw.windE,
      covNN: new Float64Array(n).fill(s2), covNE: new Float64Array(n), covEE: new Float64Array(n).fill(s2),
      extrapolated: new Uint8Array(n), source: 'table',
      winds: option.rows.map((r) => fixedEstimate(r.fromDegTrue, r.speedMs, 'table', GIVEN_WIND_SIGMA_MS, { altM: r.altM ?? NaN, t0: r.t ?? NaN, t1: r.t ?? NaN })),
    };
  } else if (option.kind === 'auto' && airData.length > 0) {
    res = { ...blendWindEstimates(airData, c.t, c.altM), source: 'log-air-data', winds: airData };
  } else if (option.kind === 'auto' && turns.estimates.length > 0) {
    res = { ...blendWindEstimates(turns.estimates, c.t, c.altM), source: 'turn-fit', winds: turns.estimates };
  } else if (option.kind === 'auto' && option.fallback) {
    const f = option.fallback;
    const v = windVectorNe(f.fromDegTrue, f.speedMs);
    warnings.push({ code: 'wind-fallback', message: `the wind could not be estimated from this log; the wind given (${fmt(f)}) was used` });
    res = { ...constant(n, v.windN, v.windE, GIVEN_WIND_SIGMA_MS), source: 'given', winds: [fixedEstimate(f.fromDegTrue, f.speedMs, 'given', GIVEN_WIND_SIGMA_MS)] };
  } else {
    if (option.kind === 'auto') {
      warnings.push({ code: 'wind-auto-unavailable', message: `the wind could not be estimated from this log (no logged airspeed and heading, no level turn of ${minArc}° or more that fits); calm assumed` });
    }
    warnings.push({ code: 'no-wind', message: NO_WIND_MESSAGE, count: n });
    res = { ...constant(n, 0, 0, CALM_WIND_SIGMA_MS), source: 'calm', winds: [fixedEstimate(0, 0, 'calm', CALM_WIND_SIGMA_MS)] };
  }

  // Cross-checks: every estimate not used against the wind used at its window.
  const others = [...(res.source === 'turn-fit' ? [] : turns.estimates), ...(res.source === 'log-air-data' ? [] : airData)];
  const off: string[] = [];
  const diffs: number[] = [];
  let offCount = 0;
  for (const e of others) {
    const i = nearestIndex(c.t, 0.5 * (e.t0 + e.t1));
    if (i < 0) continue;
    const dN = (e.windN ?? 0) - res.windN[i], dE = (e.windE ?? 0) - res.windE[i];
    const d = Math.hypot(dN, dE);
    if (e.source === 'turn-fit') diffs.push(d);
    if (d > Math.max(WIND_DISAGREE_MS, 3 * e.sigmaMs)) {
      offCount++;
      if (off.length < 5) off.push(`${e.source === 'turn-fit' ? 'turn' : 'air data'} ${utcIso(e.t0)} to ${utcIso(e.t1)}: ${fmt(e)} vs ${fmt(windFromVector(res.windN[i], res.windE[i]))}`);
    }
  }
  if (offCount > 0) {
    warnings.push({
      code: 'wind-estimates-disagree',
      message: `${offCount} wind estimate(s) from the log differ from the wind used (${res.source}) by more than ${WIND_DISAGREE_MS} m/s: ${off.join('; ')}${offCount > off.length ? '; …' : ''}`,
      count: offCount,
    });
  }
  if (res.source === 'log-air-data' && diffs.length > 0) {
    diffs.sort((a, b) => a - b);
    warnings.push({
      code: 'wind-crosscheck',
      message: `wind from the log's airspeed and heading checked against ${diffs.length} turn fit(s): they differ by ${diffs[diffs.length >> 1].toFixed(1)} m/s (median), ${diffs[diffs.length - 1].toFixed(1)} m/s at most`,
      count: diffs.length,
    });
  }
  return { ...res, warnings, turns, airData };
}

function reportTurnDiagnostics(turns: WindFromTurnsResult, minArc: number, warnings: LogWarning[]): void {
  if (turns.rejected.length > 0) {
    const shown = turns.rejected.slice(0, 5).map((r) => `${utcIso(r.t0)} to ${utcIso(r.t1)}: ${r.detail}`);
    warnings.push({
      code: 'wind-turn-rejected',
      message: `${turns.rejected.length} turn(s) not used for the wind: ${shown.join('; ')}${turns.rejected.length > 5 ? '; …' : ''}`,
      count: turns.rejected.length,
    });
  }
  if (turns.notLevel.length > 0) {
    warnings.push({
      code: 'wind-turn-not-level',
      message: `${turns.notLevel.length} turn(s) of ${minArc}° or more were climbing or descending and not used for the wind, in whole or in part (${describeSpans(turns.notLevel)})`,
      count: turns.notLevel.length,
    });
  }
  if (turns.estimates.length === 0) {
    warnings.push({ code: 'wind-no-turns', message: `no level turn of ${minArc}° or more at steady airspeed: the wind could not be found from turns` });
  }
}

function nearestIndex(t: Float64Array, x: number): number {
  if (t.length === 0 || !Number.isFinite(x)) return -1;
  let lo = 0, hi = t.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (t[mid] <= x) lo = mid; else hi = mid;
  }
  return Math.abs(t[hi] - x) < Math.abs(t[lo] - x) ? hi : lo;
}
