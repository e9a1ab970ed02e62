// The pipeline: FlightLog → state → field → compass → analysis. Pure; each stage timed for progress and the bench.
import type { FlightLog, LogHealth, LogWarning } from './log/flightLog.js';
import { cleanLog } from './log/cleanLog.js';
import { reconstructState } from './state/reconstructState.js';
import type { WindOption } from './state/windOption.js';
import { computeFieldAlongPath } from './magnetic/fieldAlongPath.js';
import { simulateCompass } from './compass/simulateCompass.js';
import { DEFAULT_COMPASS_PROFILE, type CompassProfile } from './compass/compassProfile.js';
import type { Analysis } from './analysis/analysisTypes.js';
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
  const compass = timed(timingsMs, 'simulating the compass', onStage, () =>
    simulateCompass(state, field, options.compass ?? DEFAULT_COMPASS_PROFILE, options.deviation),
  );
  const analysis: Analysis = { turns: [], episodes: [], divergences: [], excursions: [] };
  const health2: LogHealth = { ...h };
  for (const w of state.warnings) {
    if (w.code === 'position-spikes' && w.count !== undefined) health2.positionSpikes += w.count;
    if (w.code === 'gaps' && w.count !== undefined) health2.gaps += w.count;
  }
  const compassWarnings: LogWarning[] = (compass as { warnings?: LogWarning[] }).warnings ?? [];
  const warnings: LogWarning[] = [...cleaned.source.warnings, ...state.warnings, ...fieldWarnings, ...compassWarnings];
  return { log: cleaned, health: health2, state, field, compass, analysis, warnings, timingsMs };
}
