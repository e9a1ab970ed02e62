// The summary JSON: wind, field, compass extremes, turns, episodes, divergences, excursions, warnings, UTC times.
import { KT_MS } from '../constants.js';
import { circularMeanDeg, wrap180, wrap360 } from '../geo/angles.js';
import type { FlightAnalysis } from '../flightAnalysis.js';
import { ZONE_BLACKOUT, ZONE_CAUTION } from '../magnetic/fieldAlongPath.js';

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

function minMax(col: Float64Array): { min: number; max: number } {
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i < col.length; i++) {
    const v = col[i];
    if (!Number.isFinite(v)) continue;
    if (v < min) min = v;
    if (v > max) max = v;
  }
  return { min, max };
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

/** Builds the summary object (plain JSON data) of one analysed flight. */
export function buildSummary(a: FlightAnalysis): Record<string, unknown> {
  const { state: s, field: f, compass: c, analysis: an } = a;
  const n = s.n;
  const wind = s.winds.length > 0 ? s.winds : [];
  const primary = wind[0];
  const variation = minMax(f.variationDeg);
  const dip = minMax(f.dipDeg);
  let worstZone = 0;
  for (let i = 0; i < f.n; i++) if (f.zone[i] > worstZone) worstZone = f.zone[i];
  const iMax = argMaxAbs(c.errorDeg);
  return {
    schema_version: SUMMARY_SCHEMA_VERSION,
    source: { file: a.log.source.file, format: a.log.source.format, meta: { ...a.log.source.meta } },
    start_utc: n > 0 ? utc(s.t[0]) : null,
    end_utc: n > 0 ? utc(s.t[n - 1]) : null,
    duration_s: n > 0 ? round(s.t[n - 1] - s.t[0], 1) : 0,
    samples: n,
    health: { ...a.health },
    wind: {
      from_deg: primary ? round(wrap360(primary.fromDegTrue), 1) : null,
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
    compass: {
      max_abs_error_deg: iMax >= 0 ? round(Math.abs(c.errorDeg[iMax]), 1) : null,
      max_error_utc: iMax >= 0 ? utc(s.t[iMax]) : null,
      unreliable_samples: c.unreliable.reduce((k, v) => k + (v ? 1 : 0), 0),
      deviation_sign_convention: 'deviation = magnetic − compass, easterly +; compass + deviation = magnetic',
    },
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
      ...(t.timed ? { timed: { duration_s: round(t.timed.durationS, 1), expected_change_deg: round(t.timed.expectedChangeDeg, 1) } } : {}),
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
    })),
    divergences: an.divergences.map((d) => ({
      start_utc: utc(d.startT),
      end_utc: utc(d.endT),
      peak_error_deg: round(d.peakErrorDeg, 1),
      peak_utc: utc(d.peakT),
      cause: d.cause,
    })),
    excursions: an.excursions.map((x) => ({
      start_utc: utc(x.startT),
      end_utc: utc(x.endT),
      held_compass_deg: round(x.heldCompassDeg, 1),
      observed_cross_track_m: round(x.observedCrossTrackM, 0),
      compass_cross_track_m: round(x.compassCrossTrackM, 0),
      wind_cross_track_m: round(x.windCrossTrackM, 0),
      residual_cross_track_m: round(x.residualCrossTrackM, 0),
      source: x.source,
    })),
    warnings: a.warnings.map((w) => ({ code: w.code, message: w.message, ...(w.lines ? { lines: w.lines } : {}), ...(w.count !== undefined ? { count: w.count } : {}) })),
  };
}

/** Summary JSON text (two-space indent, trailing newline). */
export function summaryJson(a: FlightAnalysis): string {
  return JSON.stringify(buildSummary(a), null, 2) + '\n';
}
