// Options of the debrief analyses: each with its unit, allowed range, default and where the default comes from.
import { OptionError } from '../errors.js';

/** A planned route: waypoints in order, lat/lon WGS-84 degrees (FlightLog.route, a LogRoute, fits as it is). */
export interface PlannedRoute {
  lat: ArrayLike<number>;
  lon: ArrayLike<number>;
  names?: string[];
  name?: string;
}

/** Everything analyseDebrief can be told. Every field is optional. */
export interface DebriefOptions {
  /** Plan CSV text (see turnPlan.ts): one row per intended turn, column target_mag_deg. */
  planCsvText?: string;
  /** A span flown on the compass [UTC s]; when given, only this span is analysed as an excursion. */
  excursion?: { startT: number; endT: number };
  /** Planned route, for cross-track against the plan (optional; pass FlightLog.route). */
  route?: PlannedRoute;
  /** Roll-out tolerance ± [deg], (0, 90]. Default 10: FAA Instrument Rating ACS heading ±10° (from memory, PHYSICS.md §2). */
  toleranceDeg?: number;
  /** |compass error| above which a divergence window opens [deg], (0, 90]. Default 10 (team choice, common practice). */
  divergenceThresholdDeg?: number;
  /** Shortest divergence window kept [s], ≥ 0. Default 5 (team choice). */
  divergenceMinS?: number;
  /** A divergence window closes when |error| falls below threshold − this [deg], ≥ 0. Default 2 (team choice). */
  divergenceHysteresisDeg?: number;
  /** Turn detection thresholds; see TurnDetectionOptions. */
  turns?: Partial<TurnDetectionOptions>;
  /** Speed-episode detection; see EpisodeOptions. */
  episodes?: Partial<EpisodeOptions>;
  /** Detection of spans flown on the compass when `excursion` is not given; see CompassSpanOptions. */
  compassSpans?: Partial<CompassSpanOptions>;
  /** Look for compass-flown spans when no `excursion` is given. Default true. */
  detectExcursions?: boolean;
  /** Candidate target headings for inference [deg magnetic]. Default multiples of 30° and of 45° (see inferTarget.ts). */
  inferCandidatesDeg?: number[];
  /** Which turns get a timed-turn check: 'plan' (plan rows with timed_s), 'near-standard' (also any turn whose steady
   *  rate is within ±timedRateShare of 3 °/s), 'none'. Default 'near-standard'. */
  timedTurns?: 'plan' | 'near-standard' | 'none';
  /** Share of standard rate a turn's steady rate may be off and still count as a rate-one (timed) turn, (0, 1). Default 0.15 (team choice). */
  timedRateShare?: number;
  /** Roll rate used when a roll-out cannot be measured [°/s], (0, 90]. Default 10 (from memory: light aircraft roll in and out of a rate-one turn in 1–2 s). */
  defaultRollRateDps?: number;
  /** Compass settling: quiet when |dψc/dt| ≤ settleRateDps for settleQuietS; read at most settleMaxS after roll-out. Defaults 0.5 °/s, 2 s, 10 s (team choice). */
  settleRateDps?: number;
  settleQuietS?: number;
  settleMaxS?: number;
}

/**
 * Turn detection by hysteresis on |turn rate| (right + in the column; both directions alike).
 * A turn begins once |rate| ≥ enterRateDps (same sign) has been held for enterHoldS, and extends back to the last
 * sample below exitRateDps; it ends at the first sample from which rate·direction < exitRateDps holds for exitHoldS.
 * Defaults (team choice, common practice): enter 1.2 °/s (40 % of standard rate) held 3 s, exit 0.5 °/s held 1 s,
 * turns of less than 10° dropped, samples with TAS below 15 m/s (≈ 29 kt, the state stage's own attitude floor)
 * or a NaN heading/rate treated as not flying (ground, taxi, gaps).
 */
export interface TurnDetectionOptions {
  enterRateDps: number;
  enterHoldS: number;
  exitRateDps: number;
  exitHoldS: number;
  minHeadingChangeDeg: number;
  minAirspeedMs: number;
}

export const DEFAULT_TURN_DETECTION: Readonly<TurnDetectionOptions> = Object.freeze({
  enterRateDps: 1.2,
  enterHoldS: 3,
  exitRateDps: 0.5,
  exitHoldS: 1,
  minHeadingChangeDeg: 10,
  minAirspeedMs: 15,
});

/**
 * Speed-change episodes on straight legs: |accel_long| ≥ thresholdMs2 held for minS, closing below half of it;
 * every sample of the episode must have |turn rate| ≤ straightMaxRateDps and lie outside detected turns.
 * The swing is searched up to tailS after the episode (the card lags). 'none' below noneDeg.
 * Defaults (team choice): 0.3 m/s² (≈ 0.03 g, a brisk power change), 3 s, 1 °/s, tail 3 s, none below 1°.
 */
export interface EpisodeOptions {
  thresholdMs2: number;
  minS: number;
  straightMaxRateDps: number;
  tailS: number;
  noneDeg: number;
}

export const DEFAULT_EPISODES: Readonly<EpisodeOptions> = Object.freeze({
  thresholdMs2: 0.3,
  minS: 3,
  straightMaxRateDps: 1,
  tailS: 3,
  noneDeg: 1,
});

/**
 * Spans flown on the compass, detected when not given: outside turns, the simulated reading stays within
 * ±bandDeg of its running centre for at least minS. Defaults (team choice): ±3°, 60 s.
 */
export interface CompassSpanOptions {
  bandDeg: number;
  minS: number;
}

export const DEFAULT_COMPASS_SPANS: Readonly<CompassSpanOptions> = Object.freeze({ bandDeg: 3, minS: 60 });

/** Default roll-out tolerance [deg]. Origin: FAA Instrument Rating ACS heading ±10° (from memory, PHYSICS.md §2). */
export const DEFAULT_TOLERANCE_DEG = 10;
/** Default divergence threshold [deg]. Team choice (common practice); the 10° of 14 CFR 25.1327 is a deviation limit, not this. */
export const DEFAULT_DIVERGENCE_THRESHOLD_DEG = 10;
export const DEFAULT_DIVERGENCE_MIN_S = 5;
export const DEFAULT_DIVERGENCE_HYSTERESIS_DEG = 2;

/** Options with every default filled in and checked. */
export interface ResolvedDebriefOptions {
  planCsvText: string | undefined;
  excursion: { startT: number; endT: number } | undefined;
  route: PlannedRoute | undefined;
  /** Why a given route was set aside (fewer than two usable waypoints), for a warning; undefined when fine or absent. */
  routeProblem: string | undefined;
  toleranceDeg: number;
  divergenceThresholdDeg: number;
  divergenceMinS: number;
  divergenceHysteresisDeg: number;
  turns: TurnDetectionOptions;
  episodes: EpisodeOptions;
  compassSpans: CompassSpanOptions;
  detectExcursions: boolean;
  inferCandidatesDeg: number[] | undefined;
  timedTurns: 'plan' | 'near-standard' | 'none';
  timedRateShare: number;
  defaultRollRateDps: number;
  settleRateDps: number;
  settleQuietS: number;
  settleMaxS: number;
}

function num(name: string, v: number | undefined, dflt: number, lo: number, hi: number, loOpen: boolean, unit: string): number {
  if (v === undefined) return dflt;
  const ok = typeof v === 'number' && Number.isFinite(v) && (loOpen ? v > lo : v >= lo) && v <= hi;
  if (!ok) throw new OptionError(name, `must be a number in ${loOpen ? '(' : '['}${lo}, ${hi}] ${unit}, got ${String(v)}`);
  return v;
}

/** Fills in the defaults and checks every option; throws OptionError naming the first bad one and its range. */
// Method: STYLE.md habit 8 (parameters throw a typed error naming the parameter and the allowed range).
export function resolveDebriefOptions(o: DebriefOptions = {}): ResolvedDebriefOptions {
  const t = o.turns ?? {};
  const d = DEFAULT_TURN_DETECTION;
  const turns: TurnDetectionOptions = {
    enterRateDps: num('turns.enterRateDps', t.enterRateDps, d.enterRateDps, 0, 30, true, '°/s'),
    enterHoldS: num('turns.enterHoldS', t.enterHoldS, d.enterHoldS, 0, 60, false, 's'),
    exitRateDps: num('turns.exitRateDps', t.exitRateDps, d.exitRateDps, 0, 30, true, '°/s'),
    exitHoldS: num('turns.exitHoldS', t.exitHoldS, d.exitHoldS, 0, 60, false, 's'),
    minHeadingChangeDeg: num('turns.minHeadingChangeDeg', t.minHeadingChangeDeg, d.minHeadingChangeDeg, 0, 360, false, '°'),
    minAirspeedMs: num('turns.minAirspeedMs', t.minAirspeedMs, d.minAirspeedMs, 0, 200, false, 'm/s'),
  };
  if (!(turns.exitRateDps <= turns.enterRateDps)) {
    throw new OptionError('turns.exitRateDps', `must not exceed turns.enterRateDps (${turns.enterRateDps} °/s), got ${turns.exitRateDps}`);
  }
  const e = o.episodes ?? {};
  const de = DEFAULT_EPISODES;
  const episodes: EpisodeOptions = {
    thresholdMs2: num('episodes.thresholdMs2', e.thresholdMs2, de.thresholdMs2, 0, 20, true, 'm/s²'),
    minS: num('episodes.minS', e.minS, de.minS, 0, 600, false, 's'),
    straightMaxRateDps: num('episodes.straightMaxRateDps', e.straightMaxRateDps, de.straightMaxRateDps, 0, 30, true, '°/s'),
    tailS: num('episodes.tailS', e.tailS, de.tailS, 0, 60, false, 's'),
    noneDeg: num('episodes.noneDeg', e.noneDeg, de.noneDeg, 0, 45, false, '°'),
  };
  const c = o.compassSpans ?? {};
  const compassSpans: CompassSpanOptions = {
    bandDeg: num('compassSpans.bandDeg', c.bandDeg, DEFAULT_COMPASS_SPANS.bandDeg, 0, 45, true, '°'),
    minS: num('compassSpans.minS', c.minS, DEFAULT_COMPASS_SPANS.minS, 0, 86400, true, 's'),
  };
  let excursion = o.excursion;
  if (excursion !== undefined) {
    if (!(Number.isFinite(excursion.startT) && Number.isFinite(excursion.endT) && excursion.endT > excursion.startT)) {
      throw new OptionError('excursion', `needs finite startT < endT (UTC seconds), got ${String(excursion.startT)} … ${String(excursion.endT)}`);
    }
    excursion = { startT: excursion.startT, endT: excursion.endT };
  }
  // A route usually comes from the log file itself, so a bad one is set aside with a warning, never thrown.
  let route = o.route;
  let routeProblem: string | undefined;
  if (route !== undefined) {
    const r = route;
    if (!r.lat || !r.lon || r.lat.length !== r.lon.length || r.lat.length < 2) {
      routeProblem = 'it needs at least two waypoints with as many latitudes as longitudes';
    } else {
      for (let i = 0; i < r.lat.length && routeProblem === undefined; i++) {
        if (!(Math.abs(r.lat[i]) <= 90 && Number.isFinite(r.lon[i]))) routeProblem = `waypoint ${i + 1} has no valid position`;
      }
    }
    if (routeProblem !== undefined) route = undefined;
  }
  if (o.inferCandidatesDeg !== undefined) {
    const cs = o.inferCandidatesDeg;
    if (!Array.isArray(cs) || cs.length === 0 || cs.some((x) => !Number.isFinite(x))) {
      throw new OptionError('inferCandidatesDeg', 'must be a non-empty list of finite headings [deg]');
    }
  }
  const timedTurns = o.timedTurns ?? 'near-standard';
  if (timedTurns !== 'plan' && timedTurns !== 'near-standard' && timedTurns !== 'none') {
    throw new OptionError('timedTurns', `must be 'plan', 'near-standard' or 'none', got ${String(timedTurns)}`);
  }
  if (o.detectExcursions !== undefined && typeof o.detectExcursions !== 'boolean') {
    throw new OptionError('detectExcursions', `must be true or false, got ${String(o.detectExcursions)}`);
  }
  if (o.planCsvText !== undefined && typeof o.planCsvText !== 'string') {
    throw new OptionError('planCsvText', 'must be the text of the plan file');
  }
  const divergenceThresholdDeg = num('divergenceThresholdDeg', o.divergenceThresholdDeg, DEFAULT_DIVERGENCE_THRESHOLD_DEG, 0, 90, true, '°');
  const divergenceHysteresisDeg = num('divergenceHysteresisDeg', o.divergenceHysteresisDeg, DEFAULT_DIVERGENCE_HYSTERESIS_DEG, 0, 90, false, '°');
  if (!(divergenceHysteresisDeg < divergenceThresholdDeg)) {
    throw new OptionError('divergenceHysteresisDeg', `must be below divergenceThresholdDeg (${divergenceThresholdDeg}°), got ${divergenceHysteresisDeg}`);
  }
  return {
    planCsvText: o.planCsvText,
    excursion,
    route,
    routeProblem,
    toleranceDeg: num('toleranceDeg', o.toleranceDeg, DEFAULT_TOLERANCE_DEG, 0, 90, true, '°'),
    divergenceThresholdDeg,
    divergenceMinS: num('divergenceMinS', o.divergenceMinS, DEFAULT_DIVERGENCE_MIN_S, 0, 3600, false, 's'),
    divergenceHysteresisDeg,
    turns,
    episodes,
    compassSpans,
    detectExcursions: o.detectExcursions ?? true,
    inferCandidatesDeg: o.inferCandidatesDeg,
    timedTurns,
    timedRateShare: num('timedRateShare', o.timedRateShare, 0.15, 0, 1, true, ''),
    defaultRollRateDps: num('defaultRollRateDps', o.defaultRollRateDps, 10, 0, 90, true, '°/s'),
    settleRateDps: num('settleRateDps', o.settleRateDps, 0.5, 0, 30, true, '°/s'),
    settleQuietS: num('settleQuietS', o.settleQuietS, 2, 0, 60, false, 's'),
    settleMaxS: num('settleMaxS', o.settleMaxS, 10, 0, 120, false, 's'),
  };
}
