// The state stage: FlightLog → FlightState. Keep usable rows, split at gaps, smooth (RTS) per segment,
// choose the wind, derive air data and pseudo-attitude. Pure: the log is not modified.
import { OptionError } from '../errors.js';
import type { FlightLog, LogWarning } from '../log/flightLog.js';
import { RAD } from '../constants.js';
import { computeAirData } from './airData.js';
import { DEFAULT_SPEED_JERK_PSD, smoothAlongTrackAcceleration } from './alongTrackAcceleration.js';
import type { FlightState } from './flightState.js';
import { disagreement, loggedAttitude, LOGGED_HEADING_SIGMA_DEG, type VariationAt } from './loggedAttitude.js';
import { resolveWind } from './resolveWind.js';
import { segmentAtGaps } from './segmentAtGaps.js';
import { smoothTrackInSegments, type TrackColumns } from './smoothTrack.js';
import { describeSpans, flaggedSpans, utcIso } from './timeSpans.js';
import type { WindOption } from './windOption.js';

/** Options of the state stage. Every field is optional; defaults are stated beside each. */
export interface StateOptions {
  /** Wind: calm, given (from, true; m/s), table, or auto (log air data → turns → fallback → calm). Default auto. */
  wind?: WindOption;
  /** Least air-vector arc [deg] of a turn used for a wind fit, 60..360. Default 120. */
  minArcDeg?: number;
  /** Use the log's heading, roll, pitch and TAS where it has them. Default true. */
  useLoggedAttitude?: boolean;
  /** Variation (east +) at a place and time, to make a logged magnetic heading true. Without it a magnetic heading is not used. */
  variationAt?: VariationAt;
  /** Assumed angle of attack [deg] for pitch, −5..20. Default 3 [memory, PHYSICS.md §7]. */
  aoaDeg?: number;
  /** Gap threshold [s]. Default max(5 s, 5 × median sampling interval). */
  gapS?: number;
  /** Horizontal position 1-sigma per axis [m] where the log has no hAccM, 0.1..100. Default 3 [practice]. */
  hSigmaM?: number;
  /** Vertical position 1-sigma [m] where the log has no hAccM, 0.1..200. Default 5 [practice]. */
  vSigmaM?: number;
  /** 1-sigma of logged ground velocity per axis [m/s], 0.01..10. Default 0.3 (Doppler 0.05–0.2, PHYSICS.md §6, with margin). */
  velSigmaMs?: number;
  /**
   * Jerk PSD of the horizontal axes [m²/s⁵], 0.001..1000. Default 0.5 (PHYSICS.md §6 suggests 1–10 for light
   * aircraft; on the five end-to-end lessons, 2 m noise at 1 Hz, 0.5 takes the steady-flight bank error from
   * 1.3° to 1.1° (95th percentile) for 4.4° → 5.5° during the 2 s roll-ins and roll-outs) [derived on synthetic flights].
   */
  jerkPsdH?: number;
  /** Jerk PSD of the vertical axis [m²/s⁵], 0.001..1000. Default 0.5 [practice]. */
  jerkPsdV?: number;
  /** Jerk PSD of the airspeed model for the along-track acceleration [m²/s⁷], 1e-6..10. Default DEFAULT_SPEED_JERK_PSD (3e-4). */
  speedJerkPsd?: number;
  /** Use the log's ground speed/track as velocity measurements. Default true. */
  useLogVelocity?: boolean;
  /** Innovation gating of fixes (chi-square 99 %). Default true. */
  gate?: boolean;
  /** TAS [m/s] below which attitude is undefined. Default 15. */
  minAirspeedMs?: number;
  /** Ground speed [m/s] below which attitude is undefined. Default 5. */
  minGroundSpeedMs?: number;
}

function checkRange(name: string, v: number | undefined, lo: number, hi: number, dflt: number, unit: string): number {
  if (v === undefined) return dflt;
  if (!(Number.isFinite(v) && v >= lo && v <= hi)) throw new OptionError(name, `must be ${lo} to ${hi} ${unit}, got ${v}`);
  return v;
}

/**
 * Reconstructs the flight: one FlightState row per log row with finite time and position, in log order
 * (rows with a time earlier than the previous kept row are dropped and counted). Velocities and
 * accelerations are in each sample's NED frame. Throws OptionError for bad options; never throws for
 * bad samples (they are dropped or become NaN, and counted in `warnings`).
 * Example: reconstructState(log, { wind: { kind: 'given', fromDegTrue: 250, speedMs: 7.7 } }).
 */
export function reconstructState(log: FlightLog, opts: StateOptions = {}): FlightState {
  const params = {
    hSigmaM: checkRange('hSigmaM', opts.hSigmaM, 0.1, 100, 3, 'm'),
    vSigmaM: checkRange('vSigmaM', opts.vSigmaM, 0.1, 200, 5, 'm'),
    velSigmaMs: checkRange('velSigmaMs', opts.velSigmaMs, 0.01, 10, 0.3, 'm/s'),
    jerkPsdH: checkRange('jerkPsdH', opts.jerkPsdH, 0.001, 1000, 0.5, 'm²/s⁵'),
    jerkPsdV: checkRange('jerkPsdV', opts.jerkPsdV, 0.001, 1000, 0.5, 'm²/s⁵'),
    useLogVelocity: opts.useLogVelocity ?? true,
    gate: opts.gate ?? true,
  };
  const warnings: LogWarning[] = [];

  // 1. Rows with a usable time and position, in time order.
  const keepAll = new Int32Array(log.t.length);
  let nKeep = 0;
  const noPosLines: number[] = [];
  const backLines: number[] = [];
  let lastT = -Infinity;
  const logT = log.t, logLat = log.lat, logLon = log.lon;
  for (let i = 0; i < logT.length; i++) {
    const t = logT[i], la = logLat[i], lo = logLon[i];
    if (!(Number.isFinite(t) && Number.isFinite(la) && Number.isFinite(lo) && Math.abs(la) <= 90 && Math.abs(lo) <= 360)) {
      noPosLines.push(log.line[i]);
      continue;
    }
    if (t < lastT) {
      backLines.push(log.line[i]);
      continue;
    }
    lastT = t;
    keepAll[nKeep++] = i;
  }
  if (noPosLines.length > 0) warnings.push({ code: 'state-no-position', message: `${noPosLines.length} record(s) without a usable time or position were left out`, lines: noPosLines.slice(0, 100), count: noPosLines.length });
  if (backLines.length > 0) warnings.push({ code: 'state-time-backwards', message: `${backLines.length} record(s) earlier than the record before them were left out`, lines: backLines.slice(0, 100), count: backLines.length });
  const rows = keepAll.slice(0, nKeep);
  const n = rows.length;
  const everyRow = n === logT.length; // rows[j] === j: a column is copied as it is
  const pick = (col: Float64Array | undefined): Float64Array | undefined => {
    if (!col) return undefined;
    if (everyRow) return col.slice();
    const out = new Float64Array(n);
    for (let j = 0; j < n; j++) out[j] = col[rows[j]];
    return out;
  };
  const cols: TrackColumns = {
    t: pick(log.t)!, lat: pick(log.lat)!, lon: pick(log.lon)!, altM: pick(log.altM)!,
    hAccM: pick(log.hAccM), gsMs: pick(log.gsMs), trackDegTrue: pick(log.trackDegTrue),
  };
  const lineOf = (j: number): number => log.line[rows[j]];

  // 2. Segments at gaps; nothing is bridged.
  const seg = segmentAtGaps(cols.t, opts.gapS);
  if (seg.gaps.length > 0) {
    warnings.push({
      code: 'state-gap',
      message: `${seg.gaps.length} gap(s) longer than ${seg.thresholdS.toFixed(1)} s: the flight is split there and nothing is invented across (${describeSpans(seg.gaps)})`,
      count: seg.gaps.length,
      lines: Array.from(seg.starts.subarray(1), (j) => lineOf(j)),
    });
  }

  // 3. Smoothing.
  const sm = smoothTrackInSegments(cols, seg.starts, params);
  pushFlagWarning(warnings, sm.posSpike, cols.t, lineOf, 'state-position-spike', (k) => `${k} position fix(es) far off the smoothed track were skipped as spikes`);
  pushFlagWarning(warnings, sm.posRejected, cols.t, lineOf, 'state-fix-gated', (k) => `${k} position fix(es) outside the 99 % innovation gate were not used (about 1 % of good fixes fall outside by chance)`);
  pushFlagWarning(warnings, sm.posInflated, cols.t, lineOf, 'state-model-mismatch', (k) => `${k} fix(es) after runs of skipped fixes were used with inflated noise (the track jumped or the motion model did not fit)`);
  pushFlagWarning(warnings, sm.velRejected, cols.t, lineOf, 'state-velocity-spike', (k) => `${k} logged ground-speed/track value(s) disagreeing with the positions were skipped`);
  if (sm.noAltitudeSegments.length > 0) warnings.push({ code: 'state-no-altitude', message: `${sm.noAltitudeSegments.length} segment(s) without altitude: flight taken level there`, count: sm.noAltitudeSegments.length });
  if (sm.shortSegments.length > 0) warnings.push({ code: 'state-short-segment', message: `${sm.shortSegments.length} segment(s) with fewer than 3 fixes: no velocity there`, count: sm.shortSegments.length });

  // 4. The log's own attitude and air data, then the wind.
  const useLogged = opts.useLoggedAttitude ?? true;
  const logged = useLogged
    ? loggedAttitude(
        { headingDeg: pick(log.headingDeg), headingRef: log.headingRef, rollDeg: pick(log.rollDeg), pitchDeg: pick(log.pitchDeg), tasMs: pick(log.tasMs) },
        sm.lat, sm.lon, sm.altM, cols.t, opts.variationAt,
      )
    : { warnings: [] };
  warnings.push(...logged.warnings);
  const minArcDeg = checkRange('minArcDeg', opts.minArcDeg, 60, 360, 120, 'degrees');
  const wind = resolveWind(opts.wind ?? { kind: 'auto' }, {
    t: cols.t, altM: sm.altM, velN: sm.velN, velE: sm.velE, velD: sm.velD, accN: sm.accN, accE: sm.accE,
    velSigmaMs: sm.velSigmaMs, segment: seg.segment,
    loggedTasMs: logged.tasMs, loggedHeadingDegTrue: logged.tasMs ? logged.headingDegTrue : undefined, minArcDeg,
  });
  warnings.push(...wind.warnings);

  // 5. The along-track part of the acceleration on its own, slower time scale (speed changes are slow,
  // turns are not); without it, GPS noise in dV/dt shows as spurious acceleration error at high dip.
  const speedJerkPsd = checkRange('speedJerkPsd', opts.speedJerkPsd, 1e-6, 10, DEFAULT_SPEED_JERK_PSD, 'm²/s⁷');
  const acc = smoothAlongTrackAcceleration(
    { t: cols.t, segmentStarts: seg.starts, velN: sm.velN, velE: sm.velE, accN: sm.accN, accE: sm.accE, windN: wind.windN, windE: wind.windE, velSigmaMs: sm.velSigmaMs },
    speedJerkPsd,
  );

  // 6. Air data and pseudo-attitude from the track and the wind.
  const air = computeAirData(
    { velN: sm.velN, velE: sm.velE, velD: sm.velD, accN: acc.accN, accE: acc.accE, accD: sm.accD, windN: wind.windN, windE: wind.windE },
    { aoaDeg: opts.aoaDeg, minAirspeedMs: opts.minAirspeedMs, minGroundSpeedMs: opts.minGroundSpeedMs },
  );
  let nLow = 0;
  for (let j = 0; j < n; j++) nLow += air.lowSpeed[j];
  if (nLow > 0) {
    const spans = flaggedSpans(air.lowSpeed, cols.t, 2 * seg.thresholdS);
    warnings.push({ code: 'state-low-speed', message: `${nLow} sample(s) too slow for heading and bank (taxi or stationary): left undefined (${describeSpans(spans)})`, count: nLow });
  }

  // Heading 1-sigma from the wind covariance across the air vector and the velocity sigma.
  const headingSigmaDeg = new Float64Array(n);
  {
    const { velN, velE, velSigmaMs } = sm;
    const { windN, windE, covNN, covNE, covEE } = wind;
    const heading = air.headingDegTrue;
    for (let j = 0; j < n; j++) {
      const uN = velN[j] - windN[j], uE = velE[j] - windE[j];
      const vh2 = uN * uN + uE * uE;
      // Unit vector across the air vector: (−uE, uN)/|u|.
      const across = (uE * uE * covNN[j] - 2 * uN * uE * covNE[j] + uN * uN * covEE[j]) / vh2;
      const sv = velSigmaMs[j];
      headingSigmaDeg[j] = Number.isFinite(heading[j]) ? Math.sqrt((across + sv * sv) / vh2) * RAD : NaN;
    }
  }

  // The card's geometry: with no logged attitude the body axes are the wind axes (nose along the air
  // vector, pitch = flight-path angle, bank = pseudo-roll about the air vector). The lubber line lies in
  // the symmetry plane, which holds both the air vector and the lift, so the angle of attack does not move
  // the reading (PHYSICS.md §1.1); a logged pitch (nose attitude) replaces γ below.
  const cardPitchDeg = air.flightPathDeg.slice();
  if (logged.pitchDeg) for (let j = 0; j < n; j++) if (Number.isFinite(logged.pitchDeg[j])) cardPitchDeg[j] = logged.pitchDeg[j];

  // 7. Where the log has heading / attitude / TAS, they are used; how far they disagree is reported.
  mergeLogged(logged.headingDegTrue, air.headingDegTrue, true, 'heading', '°', warnings, (j) => { headingSigmaDeg[j] = LOGGED_HEADING_SIGMA_DEG; });
  mergeLogged(logged.rollDeg, air.bankDeg, false, 'bank', '°', warnings);
  mergeLogged(logged.pitchDeg, air.pitchDeg, false, 'pitch', '°', warnings);
  mergeLogged(logged.tasMs, air.tasMs, false, 'TAS', ' m/s', warnings);

  // Straight flight on a wind extrapolated beyond the estimates.
  if (wind.source === 'turn-fit' || wind.source === 'log-air-data') {
    const flag = new Uint8Array(n);
    let k = 0;
    for (let j = 0; j < n; j++) {
      if (wind.extrapolated[j] === 1 && air.lowSpeed[j] === 0 && Math.abs(air.turnRateDps[j]) < 1 && !Number.isFinite(logged.headingDegTrue?.[j] ?? NaN)) { flag[j] = 1; k++; }
    }
    if (k > 0) {
      warnings.push({
        code: 'wind-extrapolated',
        message: `on ${k} sample(s) of straight flight the heading rests on a wind extrapolated beyond the times or heights it was measured at (${describeSpans(flaggedSpans(flag, cols.t, 30))})`,
        count: k,
      });
    }
  }

  return {
    n,
    t: cols.t,
    lat: sm.lat,
    lon: sm.lon,
    altM: sm.altM,
    velN: sm.velN,
    velE: sm.velE,
    velD: sm.velD,
    accN: acc.accN,
    accE: acc.accE,
    accD: sm.accD,
    accSigmaMs2: sm.accSigmaMs2,
    gsMs: air.gsMs,
    trackDegTrue: air.trackDegTrue,
    windN: wind.windN,
    windE: wind.windE,
    tasMs: air.tasMs,
    headingDegTrue: air.headingDegTrue,
    bankDeg: air.bankDeg,
    pitchDeg: air.pitchDeg,
    cardPitchDeg,
    turnRateDps: air.turnRateDps,
    accelLongMs2: air.accelLongMs2,
    segment: seg.segment,
    logRow: rows,
    winds: wind.winds,
    warnings,
    headingSigmaDeg,
    windExtrapolated: wind.extrapolated,
    windSource: wind.source,
  };
}

/**
 * Puts logged values into the reconstructed column where they are finite and reports how far they
 * disagreed with the reconstruction (median and 95th percentile of |difference|).
 */
function mergeLogged(
  logged: Float64Array | undefined,
  derived: Float64Array,
  angular: boolean,
  name: string,
  unit: string,
  warnings: LogWarning[],
  onUse?: (j: number) => void,
): void {
  if (!logged) return;
  const d = disagreement(logged, derived, angular);
  let used = 0;
  for (let j = 0; j < derived.length; j++) {
    if (!Number.isFinite(logged[j])) continue;
    derived[j] = logged[j];
    used++;
    onUse?.(j);
  }
  if (used === 0) return;
  warnings.push({
    code: `state-logged-${name.toLowerCase()}-check`,
    message: d.n > 0
      ? `the log's ${name} was used on ${used} sample(s); it differs from the ${name} reconstructed from the track and wind by ${d.median.toFixed(1)}${unit} (median), ${d.p95.toFixed(1)}${unit} (95th percentile) over ${d.n} sample(s)`
      : `the log's ${name} was used on ${used} sample(s); no reconstructed ${name} to compare it with`,
    count: used,
  });
}

function pushFlagWarning(
  warnings: LogWarning[],
  flag: Uint8Array,
  t: Float64Array,
  lineOf: (j: number) => number,
  code: string,
  text: (k: number) => string,
): void {
  const lines: number[] = [];
  for (let j = 0; j < flag.length; j++) if (flag[j] !== 0) lines.push(lineOf(j));
  if (lines.length === 0) return;
  const first = t[flag.indexOf(1)];
  warnings.push({ code, message: `${text(lines.length)}, first at ${utcIso(first)}`, lines: lines.slice(0, 200), count: lines.length });
}
