// The debrief: turns graded, speed-change episodes, divergence windows and compass-flown legs, from the pipeline's columns.
import { OptionError } from '../errors.js';
import type { LogWarning } from '../log/flightLog.js';
import type { CompassTrace } from '../compass/compassTrace.js';
import type { FieldAlongPath } from '../magnetic/fieldAlongPath.js';
import type { FlightState } from '../state/flightState.js';
import type { Analysis, ExcursionResult } from './analysisTypes.js';
import { findSteadyCompassSpans } from './compassSpans.js';
import { resolveDebriefOptions, type DebriefOptions } from './debriefOptions.js';
import { detectTurns } from './detectTurns.js';
import { findDivergenceWindows } from './divergenceWindows.js';
import { analyseExcursion } from './excursion.js';
import { gradeTurns } from './gradeTurns.js';
import { detectSpeedEpisodes } from './speedEpisodes.js';
import { parsePlanCsv } from './turnPlan.js';

export type { DebriefOptions } from './debriefOptions.js';

/** UTC ISO time for messages. */
function iso(t: number): string {
  return Number.isFinite(t) ? new Date(Math.round(t * 1000)).toISOString() : 'unknown time';
}

/**
 * Analyses a reconstructed flight for the debrief. Pure: columns in, results out; nothing is modified.
 *
 * Steps: detectTurns (hysteresis on |turn rate|) → gradeTurns (target from the plan or inferred, roll-out error,
 * compass at roll-out and settled, model and rule-of-thumb cues, timed-turn check) → detectSpeedEpisodes (straight
 * legs) → findDivergenceWindows (|error| > threshold, cause from the error split) → analyseExcursion for the span in
 * opts.excursion, or for every steady-compass span found (findSteadyCompassSpans) when detectExcursions is on.
 * All rows are FlightState rows; field and compass must have the same length.
 * @param state reconstructed flight; @param field WMM field along it; @param compass simulated compass trace
 * @param opts see DebriefOptions (defaults and their origins in debriefOptions.ts)
 * @returns { analysis, warnings } — warnings: plan-rows-unmatched, turns-not-in-plan, turns-cut-short,
 *   excursion-empty, excursion-does-not-close, route-unusable (a route with < 2 usable waypoints is set aside).
 * @throws OptionError for a bad option or columns of different lengths; ParseError (with the line) for a bad plan.
 * @example analyseDebrief(state, field, compass, { planCsvText: 'target_mag_deg\n090\n', toleranceDeg: 10 })
 */
// Method: see each step's module (src/analysis/*), each citing its source.
export function analyseDebrief(
  state: FlightState, field: FieldAlongPath, compass: CompassTrace, opts: DebriefOptions = {},
): { analysis: Analysis; warnings: LogWarning[] } {
  const o = resolveDebriefOptions(opts);
  const n = state.n;
  if (field.n !== n) throw new OptionError('field', `has ${field.n} samples, the flight state ${n}`);
  if (compass.n !== n) throw new OptionError('compass', `has ${compass.n} samples, the flight state ${n}`);
  const plan = o.planCsvText !== undefined ? parsePlanCsv(o.planCsvText) : undefined;
  const warnings: LogWarning[] = [];
  if (o.routeProblem !== undefined) {
    warnings.push({ code: 'route-unusable', message: `The planned route was not used for cross-track: ${o.routeProblem}.` });
  }

  const spans = detectTurns(state, o.turns);
  const graded = gradeTurns(state, field, compass, spans, plan, o);
  warnings.push(...graded.warnings);
  const episodes = detectSpeedEpisodes(state, field, compass, spans, o.episodes);
  const divergences = findDivergenceWindows(state.t, state.segment, compass, {
    thresholdDeg: o.divergenceThresholdDeg,
    minS: o.divergenceMinS,
    hysteresisDeg: o.divergenceHysteresisDeg,
  });

  const excursions: ExcursionResult[] = [];
  if (o.excursion) {
    const { startT, endT } = o.excursion;
    let i0 = 0;
    while (i0 < n && !(state.t[i0] >= startT)) i0++;
    let i1 = n - 1;
    while (i1 >= 0 && !(state.t[i1] <= endT)) i1--;
    if (i1 - i0 >= 1) excursions.push(analyseExcursion(state, field, compass, i0, i1, 'option', o.route));
    else {
      warnings.push({
        code: 'excursion-empty',
        message: `The span given for the compass leg (${iso(startT)} to ${iso(endT)}) holds fewer than two samples of the flight, so it was not analysed.`,
      });
    }
  } else if (o.detectExcursions) {
    for (const sp of findSteadyCompassSpans(state.t, compass.readingDeg, state.segment, spans, o.compassSpans)) {
      excursions.push(analyseExcursion(state, field, compass, sp.i0, sp.i1, 'detected', o.route));
    }
  }
  const open = excursions.filter((x) => x.closes === false);
  if (open.length > 0) {
    warnings.push({
      code: 'excursion-does-not-close',
      message:
        `On ${open.length} compass leg${open.length === 1 ? '' : 's'} the observed cross-track and the sum of its causes differ by more than the tolerance ` +
        `(first from ${iso(open[0].startT)}: ${Math.round(open[0].closureErrorM ?? NaN)} m); the heading or wind used may not match the track.`,
      count: open.length,
    });
  }
  return { analysis: { turns: graded.turns, episodes, divergences, excursions }, warnings };
}
