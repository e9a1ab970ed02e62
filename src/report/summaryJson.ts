// The summary JSON: wind, field, compass extremes, turns, episodes, divergences, excursions, warnings, UTC times.
import { finiteRange } from '../util/finiteRange.js';
import { KT_MS } from '../constants.js';
import { circularMeanDeg, wrap180, wrap360 } from '../geo/angles.js';
import type { FlightAnalysis } from '../flightAnalysis.js';
import { ZONE_BLACKOUT, ZONE_CAUTION } from '../magnetic/fieldAlongPath.js';
import { kthSmallestInPlace } from '../util/kthSmallestInPlace.js';
import { blankWhere } from '../util/blankWhere.js';

/** Version of the summary layout; bump when a field changes meaning. The JSON Schema is summary.schema.json. */
export const SUMMARY_SCHEMA_VERSION = '1';

function utc(tS: number): string | null {
  return Number.isFinite(tS) ? new Date(Math.round(tS * 1000)).toISOString() : null;
}

function round(x: number, digits: number): number | null {
  if (!Number.isFinite(x)) return null;
  const k = 10 ** digits;
  return Math.round(x * k) / k;
}


/** An optional number rounded, or null when absent or not finite. */
function opt(x: number | undefined, digits: number): number | null {
  return x === undefined ? null : round(x, digits);
}

/**
 * The flight's representative wind: the inverse-variance weighted mean vector of the estimates (a given
 * or calm wind is its own single estimate). Source: the estimates' common source, or 'mixed'.
 */
function representativeWind(winds: FlightAnalysis['state']['winds']): { fromDeg: number; speedMs: number; source: string } | undefined {
  if (winds.length === 0) return undefined;
  if (winds.length === 1) return { fromDeg: winds[0].fromDegTrue, speedMs: winds[0].speedMs, source: winds[0].source };
  let wn = 0;
  let we = 0;
  let sw = 0;
  for (const w of winds) {
    const weight = Number.isFinite(w.sigmaMs) && w.sigmaMs > 0 ? 1 / (w.sigmaMs * w.sigmaMs) : 1;
    const r = (w.fromDegTrue * Math.PI) / 180;
    // From-direction vector: pointing where the wind comes from.
    wn += weight * w.speedMs * Math.cos(r);
    we += weight * w.speedMs * Math.sin(r);
    sw += weight;
  }
  const sources = new Set(winds.map((w) => w.source));
  return { fromDeg: wrap360((Math.atan2(we, wn) * 180) / Math.PI), speedMs: Math.hypot(wn, we) / sw, source: sources.size === 1 ? winds[0].source : 'mixed' };
}

/** The largest value of a flag column (0 for an empty one). */
function largestFlag(col: Uint8Array): number {
  let m = 0;
  for (let i = 0; i < col.length; i++) if (col[i] > m) m = col[i];
  return m;
}

/** How many entries of `mask` are set. */
function countSet(mask: Uint8Array): number {
  let k = 0;
  for (let i = 0; i < mask.length; i++) if (mask[i]) k++;
  return k;
}

/** Index of the largest |value| (NaN skipped), or −1 when there is none. */
function argMaxAbs(col: Float64Array): number {
  let best = -1;
  let bestAbs = -1;
  for (let i = 0; i < col.length; i++) {
    const v = Math.abs(col[i]);
    if (Number.isFinite(v) && v > bestAbs) {
      bestAbs = v;
      best = i;
    }
  }
  return best;
}

/** Root-mean-square of the finite values, rounded to 0.1, or null. */
function rmsOf(col: Float64Array): number | null {
  let s2 = 0;
  let k = 0;
  for (let i = 0; i < col.length; i++) if (Number.isFinite(col[i])) { s2 += col[i] * col[i]; k++; }
  return k > 0 ? round(Math.sqrt(s2 / k), 1) : null;
}

/** RMS and largest |value| of one error-split column [deg]. */
function splitStats(col: Float64Array): { rms_deg: number | null; max_abs_deg: number | null } {
  const i = argMaxAbs(col);
  return { rms_deg: rmsOf(col), max_abs_deg: i >= 0 ? round(Math.abs(col[i]), 1) : null };
}

/** Drift angle (track − heading, right +) along the flight: median, largest each way. */
function driftSummary(s: FlightAnalysis['state']): { median_deg: number | null; min_deg: number | null; max_deg: number | null } {
  // The sorted list's middle, first and last entries, by one selection and one scan instead of a sort.
  const d = new Float64Array(s.n);
  let k = 0;
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i < s.n; i++) {
    const v = wrap180(s.trackDegTrue[i] - s.headingDegTrue[i]);
    if (!Number.isFinite(v)) continue;
    d[k++] = v;
    if (v < min) min = v;
    if (v > max) max = v;
  }
  if (k === 0) return { median_deg: null, min_deg: null, max_deg: null };
  return { median_deg: round(kthSmallestInPlace(d.subarray(0, k), k >> 1), 1), min_deg: round(min, 1), max_deg: round(max, 1) };
}

/** Builds the summary object (plain JSON data) of one analysed flight. */
export function buildSummary(a: FlightAnalysis): Record<string, unknown> {
  const { state: s, field: f, compass: c, analysis: an } = a;
  const n = s.n;
  const wind = s.winds;
  const primary = representativeWind(wind);
  const variation = finiteRange(f.variationDeg);
  const dip = finiteRange(f.dipDeg);
  // The per-sample loops are in helpers: this function runs once per flight and, without loops of its
  // own, is not compiled by the JIT at all (it was, at some 100 ms of compiler time per batch worker).
  const worstZone = largestFlag(f.zone);
  const iMax = argMaxAbs(c.errorDeg);
  const iRel = argMaxAbs(blankWhere(c.errorDeg, c.unreliable));
  const unreliableSamples = countSet(c.unreliable);
  return {
    schema_version: SUMMARY_SCHEMA_VERSION,
    source: { file: a.log.source.file, format: a.log.source.format, meta: { ...a.log.source.meta } },
    start_utc: n > 0 ? utc(s.t[0]) : null,
    end_utc: n > 0 ? utc(s.t[n - 1]) : null,
    duration_s: n > 0 ? round(s.t[n - 1] - s.t[0], 1) : 0,
    samples: n,
    health: { ...a.health },
    wind: {
      from_deg: primary ? round(wrap360(primary.fromDeg), 1) : null,
      speed_kt: primary ? round(primary.speedMs / KT_MS, 1) : null,
      source: primary ? primary.source : 'calm',
      estimates: wind.map((w) => ({
        from_deg: round(wrap360(w.fromDegTrue), 1),
        speed_kt: round(w.speedMs / KT_MS, 1),
        source: w.source,
        start_utc: utc(w.t0),
        end_utc: utc(w.t1),
        alt_m: round(w.altM, 0),
        sigma_kt: round(w.sigmaMs / KT_MS, 2),
        tas_kt: round(w.tasMs / KT_MS, 1),
        arc_deg: round(w.arcDeg, 0),
      })),
    },
    field: {
      model: f.model,
      decimal_year: round(f.decimalYear, 3),
      variation_deg: round(wrap180(circularMeanDeg(f.variationDeg)), 2),
      variation_min_deg: round(variation.min, 2),
      variation_max_deg: round(variation.max, 2),
      dip_deg: round((dip.min + dip.max) / 2, 2),
      dip_min_deg: round(dip.min, 2),
      dip_max_deg: round(dip.max, 2),
      zone: worstZone === ZONE_BLACKOUT ? 'blackout' : worstZone === ZONE_CAUTION ? 'caution' : 'none',
    },
    drift: driftSummary(s),
    compass: {
      rms_error_deg: rmsOf(c.errorDeg),
      max_abs_error_deg: iMax >= 0 ? round(Math.abs(c.errorDeg[iMax]), 1) : null,
      max_error_utc: iMax >= 0 ? utc(s.t[iMax]) : null,
      max_abs_error_reliable_deg: iRel >= 0 ? round(Math.abs(c.errorDeg[iRel]), 1) : null,
      max_reliable_error_utc: iRel >= 0 ? utc(s.t[iRel]) : null,
      unreliable_samples: unreliableSamples,
      deviation_sign_convention: 'deviation = magnetic − compass, easterly +; compass + deviation = magnetic',
      // The error split over the flight (samples CSV err_* columns): RMS and largest |value| of each part.
      split: {
        dip_turn: splitStats(c.errDipTurnDeg),
        dip_accel: splitStats(c.errDipAccelDeg),
        lag_swirl: splitStats(c.errLagSwirlDeg),
        deviation: splitStats(c.errDeviationDeg),
      },
    },
    calibration: a.calibration
      ? {
          used: a.calibration.used,
          iterations: a.calibration.iterations,
          converged: a.calibration.converged,
          initial_rms_deg: round(a.calibration.initialRmsDeg, 2),
          rms_deg: round(a.calibration.rmsDeg, 2),
          params: a.calibration.params.map((p) => ({ name: p.name, initial: round(p.initial, 4), value: round(p.value, 4), sigma: round(p.sigma, 4), at_bound: p.atBound })),
          residuals_deg: Array.from(a.calibration.residualsDeg, (r) => round(r, 2)),
        }
      : null,
    compass_profile: { ...a.profile },
    turns: an.turns.map((t) => ({
      start_utc: utc(t.startT),
      end_utc: utc(t.endT),
      direction: t.direction,
      heading_change_deg: round(t.headingChangeDeg, 1),
      mean_rate_dps: round(t.meanRateDps, 2),
      peak_bank_deg: round(t.peakBankDeg, 1),
      mean_bank_deg: round(t.meanBankDeg, 1),
      entry_mag_deg: round(t.entryMagDeg, 1),
      rollout_mag_deg: round(t.rolloutMagDeg, 1),
      compass_at_rollout_deg: round(t.compassAtRolloutDeg, 1),
      compass_settled_deg: round(t.compassSettledDeg, 1),
      target_mag_deg: round(t.targetMagDeg, 1),
      target_source: t.targetSource,
      target_confidence: round(t.targetConfidence, 2),
      rollout_error_deg: round(t.rolloutErrorDeg, 1),
      within_tolerance: t.withinTolerance,
      cue_compass_deg: round(t.cueCompassDeg, 1),
      rule_of_thumb_cue_deg: round(t.ruleOfThumbCueDeg, 1),
      tolerance_deg: opt(t.toleranceDeg, 1),
      rollout_start_utc: t.rolloutStartT !== undefined ? utc(t.rolloutStartT) : null,
      compass_at_rollout_start_deg: opt(t.compassAtRolloutStartDeg, 1),
      cue_mag_deg: opt(t.cueMagDeg, 1),
      cue_difference_deg: opt(t.cueDifferenceDeg, 1),
      rollout_lead_deg: opt(t.rolloutLeadDeg, 1),
      lat_deg: opt(t.latDeg, 4),
      dip_deg: opt(t.dipDeg, 2),
      plan_line: t.planLine !== undefined && Number.isFinite(t.planLine) ? t.planLine : null,
      ...(t.timed
        ? {
            timed: {
              duration_s: round(t.timed.durationS, 1),
              expected_change_deg: round(t.timed.expectedChangeDeg, 1),
              actual_change_deg: opt(t.timed.actualChangeDeg, 1),
              difference_deg: opt(t.timed.differenceDeg, 1),
              within_tolerance: t.timed.withinTolerance ?? null,
              basis: t.timed.basis ?? null,
            },
          }
        : {}),
    })),
    episodes: an.episodes.map((e) => ({
      start_utc: utc(e.startT),
      end_utc: utc(e.endT),
      kind: e.kind,
      peak_accel_ms2: round(e.peakAccelMs2, 2),
      heading_mag_deg: round(e.headingMagDeg, 1),
      peak_swing_deg: round(e.peakSwingDeg, 1),
      swing_direction: e.swingDirection,
      expected_swing_deg: round(e.expectedSwingDeg, 1),
      swing_ratio: opt(e.swingRatio, 2),
    })),
    divergences: an.divergences.map((d) => ({
      start_utc: utc(d.startT),
      end_utc: utc(d.endT),
      peak_error_deg: round(d.peakErrorDeg, 1),
      peak_utc: utc(d.peakT),
      cause: d.cause,
      duration_s: opt(d.durationS, 1),
    })),
    excursions: an.excursions.map((x) => ({
      start_utc: utc(x.startT),
      end_utc: utc(x.endT),
      held_compass_deg: round(x.heldCompassDeg, 1),
      observed_cross_track_m: round(x.observedCrossTrackM, 0),
      compass_cross_track_m: round(x.compassCrossTrackM, 0),
      wind_cross_track_m: round(x.windCrossTrackM, 0),
      residual_cross_track_m: round(x.residualCrossTrackM, 0),
      heading_cross_track_m: opt(x.headingCrossTrackM, 0),
      along_track_m: opt(x.alongTrackM, 0),
      ref_track_true_deg: opt(x.refTrackDegTrue, 1),
      mean_compass_error_deg: opt(x.meanCompassErrorDeg, 1),
      closes: x.closes ?? null,
      source: x.source,
      ...(x.route
        ? {
            route: {
              leg_index: x.route.legIndex,
              leg_track_true_deg: round(x.route.legTrackDegTrue, 1),
              start_cross_track_m: round(x.route.startCrossTrackM, 0),
              end_cross_track_m: round(x.route.endCrossTrackM, 0),
              change_m: round(x.route.changeM, 0),
              compass_m: round(x.route.compassM, 0),
              wind_m: round(x.route.windM, 0),
              heading_m: round(x.route.headingM, 0),
              residual_m: round(x.route.residualM, 0),
            },
          }
        : {}),
    })),
    warnings: a.warnings.map((w) => ({ code: w.code, message: w.message, ...(w.lines ? { lines: w.lines } : {}), ...(w.count !== undefined ? { count: w.count } : {}) })),
  };
}

/** Summary JSON text (two-space indent, trailing newline). */
export function summaryJson(a: FlightAnalysis): string {
  return JSON.stringify(buildSummary(a), null, 2) + '\n';
}
