// The pipeline: FlightLog → state → field → compass → analysis. Pure; each stage timed for progress and the bench.
import type { FlightLog, LogHealth, LogWarning } from './log/flightLog.js';
import { cleanLog } from './log/cleanLog.js';
import { reconstructState } from './state/reconstructState.js';
import type { WindOption } from './state/windOption.js';
import { computeFieldAlongPath } from './magnetic/fieldAlongPath.js';
import { simulateCompass } from './compass/simulateCompass.js';
import { DEFAULT_COMPASS_PROFILE, type CompassProfile } from './compass/compassProfile.js';
import { calibrateProfile, type CompassObservations } from './compass/calibrateProfile.js';
import { analyseDebrief, type DebriefOptions } from './analysis/analyseDebrief.js';
import type { FlightAnalysis } from './flightAnalysis.js';

export interface AnalyseOptions {
  /** Wind: calm, given (from, true, m/s) or auto (default). */
  wind?: WindOption;
  /** Assumed angle of attack for pitch [deg]; default that of the state stage. */
  aoaDeg?: number;
  /** Compass parameters; default DEFAULT_COMPASS_PROFILE (origins documented in compassProfile.ts). */
  compass?: CompassProfile;
  /** Deviation card δ(compass heading) [deg], easterly +, compass + δ = magnetic. Default none. */
  deviation?: (compassDeg: number) => number;
  /** Debrief analyses: plan text, excursion span, tolerances (defaults and origins in src/analysis/debriefOptions.ts). */
  debrief?: DebriefOptions;
  /**
   * A span flown on the compass, for the excursion analysis: UTC seconds, or (timeOfDay) seconds after
   * midnight UTC of the log's first day, a time before the log's start taken on the next day.
   */
  excursion?: { startT: number; endT: number; timeOfDay?: boolean };
  /**
   * Compass readings noted in flight (time, reading): the profile's period, damping, swirl and pendulosity
   * are fitted to them by nonlinear least squares (calibrateProfile) and the compass is simulated with the
   * fitted profile. The fit and its residuals are in FlightAnalysis.calibration.
   */
  observed?: CompassObservations;
  /** Called as each stage starts, for progress. */
  onStage?: (name: string) => void;
}

function timed<T>(timings: Record<string, number>, name: string, onStage: ((n: string) => void) | undefined, f: () => T): T {
  onStage?.(name);
  const t0 = performance.now();
  const r = f();
  timings[name] = performance.now() - t0;
  return r;
}

/** Turns a time-of-day excursion into UTC seconds on the log's first day (next day if before the start). */
function resolveExcursion(x: NonNullable<AnalyseOptions['excursion']>, t0: number): { startT: number; endT: number } {
  if (!x.timeOfDay) return { startT: x.startT, endT: x.endT };
  const day0 = Math.floor(t0 / 86400) * 86400;
  const at = (s: number) => (day0 + s < t0 - 60 ? day0 + s + 86400 : day0 + s);
  const startT = at(x.startT);
  let endT = at(x.endT);
  if (endT <= startT) endT += 86400;
  return { startT, endT };
}

/**
 * Analyses one flight. `health` is what reading and cleaning found (readLogFile returns it); without it
 * the log is cleaned here (sorted, duplicate times dropped, repairs counted). The log is not modified.
 * Throws OptionError for bad options; bad samples become NaN and warnings.
 * Example: analyseFlight(log, { wind: { kind: 'given', fromDegTrue: 250, speedMs: 10 } }, health).
 */
export function analyseFlight(log: FlightLog, options: AnalyseOptions = {}, health?: LogHealth): FlightAnalysis {
  const timingsMs: Record<string, number> = {};
  const onStage = options.onStage;
  let cleaned = log;
  let h = health;
  if (!h) {
    const c = timed(timingsMs, 'cleaning the log', onStage, () => cleanLog(log));
    cleaned = c.log;
    h = c.health;
  }
  const state = timed(timingsMs, 'reconstructing the flight', onStage, () =>
    reconstructState(cleaned, { wind: options.wind ?? { kind: 'auto' }, aoaDeg: options.aoaDeg }),
  );
  const { field, warnings: fieldWarnings } = timed(timingsMs, 'magnetic field along the path', onStage, () =>
    computeFieldAlongPath(state.t, state.lat, state.lon, state.altM),
  );
  let profile = options.compass ?? DEFAULT_COMPASS_PROFILE;
  let calibration: FlightAnalysis['calibration'];
  if (options.observed) {
    const observed = options.observed;
    calibration = timed(timingsMs, 'fitting the compass to the observed readings', onStage, () =>
      calibrateProfile(state, field, observed, profile, { deviation: options.deviation }),
    );
    profile = calibration.profile;
  }
  const compass = timed(timingsMs, 'simulating the compass', onStage, () => simulateCompass(state, field, profile, options.deviation));
  const debriefOptions: DebriefOptions = { ...(cleaned.route && !options.debrief?.route ? { route: cleaned.route } : {}), ...options.debrief };
  if (options.excursion) debriefOptions.excursion = resolveExcursion(options.excursion, state.n > 0 ? state.t[0] : NaN);
  const { analysis, warnings: debriefWarnings } = timed(timingsMs, 'debrief analyses', onStage, () =>
    analyseDebrief(state, field, compass, debriefOptions),
  );
  const health2: LogHealth = { ...h };
  for (const w of state.warnings) {
    if (w.code === 'state-position-spike' && w.count !== undefined) health2.positionSpikes += w.count;
    if (w.code === 'state-gap' && w.count !== undefined) health2.gaps += w.count;
    if (w.code === 'state-time-backwards' && w.count !== undefined) health2.outOfOrder += w.count;
    if (w.code === 'state-no-position' && w.count !== undefined) health2.invalidValues += w.count;
  }
  const compassWarnings: LogWarning[] = compass.warnings ?? [];
  const warnings: LogWarning[] = [...cleaned.source.warnings, ...state.warnings, ...fieldWarnings, ...compassWarnings, ...debriefWarnings];
  return { log: cleaned, health: health2, state, field, compass, analysis, warnings, timingsMs, profile, ...(calibration ? { calibration } : {}) };
}
