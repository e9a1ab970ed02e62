// buildReportModel: one FlightAnalysis → the debrief page's content in pilot units, thinned for drawing.
import { finiteRange } from '../util/finiteRange.js';
import { FT_M, KT_MS, NM_M } from '../constants.js';
import { OptionError } from '../errors.js';
import type { FlightAnalysis } from '../flightAnalysis.js';
import { ZONE_BLACKOUT, ZONE_CAUTION } from '../magnetic/fieldAlongPath.js';
import type { WindSource } from '../state/flightState.js';
import { compactAtRows, compactDirectionAtRows } from './compactColumn.js';
import { downsampleForDrawing } from './downsampleForDrawing.js';
import { flagSpans, mergeCloseSpans, segmentGaps } from './flagSpans.js';
import { largestErrorPeaks } from './largestErrorPeaks.js';
import { localPlanNm } from './localPlanNm.js';
import { maxRangeNm } from './maxRangeNm.js';
import { fmtCount } from './pilotFormat.js';
import { kthSmallestInPlace } from '../util/kthSmallestInPlace.js';
import { wrap360 } from '../geo/angles.js';
import { blankWhere } from '../util/blankWhere.js';
import type {
  ReportDivergenceRow,
  ReportErrorPeak,
  ReportGlance,
  ReportModel,
  ReportModelOptions,
  ReportSeries,
  ReportWind,
} from './reportModelTypes.js';

export type * from './reportModelTypes.js';

/** Default number of drawn points per series: keeps a 3-hour 10 Hz flight's page near 5.4 MB. */
export const DEFAULT_MAX_DRAWN_POINTS = 5000;

const WIND_SOURCE_TEXT: Record<WindSource, string> = {
  given: 'given as an option',
  table: 'from a wind table',
  'log-air-data': "from the log's own airspeed and heading",
  'turn-fit': 'fitted to the ground speed around a turn',
  calm: 'none available: calm assumed, heading taken as track',
};

/** Plain words for the divergence causes and for the four parts of the error split. */
export const CAUSE_TEXT = {
  turn: 'turning (dip)',
  'speed-change': 'speed change (acceleration)',
  'lag-swirl': 'card lag and swirl',
  deviation: 'deviation',
} as const;

/**
 * Converts one analysed flight into the report's content.
 *
 * Units out: knots, feet, degrees, NM, kt/s; times UTC seconds. Long flights are thinned for drawing by
 * min/max-of-compass-error buckets (downsampleForDrawing) to at most `opts.maxDrawnPoints` rows, with
 * segment ends and every event's start/end/peak kept; numbers are rounded (0.1° angles, 0.1 kt,
 * 1 ft, 0.001 NM, 0.01 kt/s, 0.1 s). Tables, the glance and the log health use full resolution.
 *
 * @param a the pipeline's result for one flight (state/field/compass columns of equal length n ≥ 1)
 * @param opts title, aircraft, pilot override the log's own text; generatedAt defaults to now
 * @throws OptionError when maxDrawnPoints is below 200 or not an integer; InputError never
 * @example buildReportModel(analysis, { pilot: 'P. Okonkwo-Lindqvist', aircraft: 'Fenbird 2' })
 */
export function buildReportModel(a: FlightAnalysis, opts: ReportModelOptions = {}): ReportModel {
  const maxPoints = opts.maxDrawnPoints ?? DEFAULT_MAX_DRAWN_POINTS;
  if (!Number.isInteger(maxPoints) || maxPoints < 200) throw new OptionError('maxDrawnPoints', `must be an integer ≥ 200, got ${maxPoints}`);
  const { state: s, field: f, compass: c, analysis: an } = a;
  const n = s.n;

  // The per-sample loops are in helpers, so that this function, run once per flight, is not compiled by
  // the JIT as a whole for their sake.
  const headingMagDeg = magneticHeadingsDeg(s.headingDegTrue, f.variationDeg);
  const first = firstFiniteFix(s.lat, s.lon);
  const plan = localPlanNm(s.lat, s.lon, s.lat[first] ?? 0, s.lon[first] ?? 0);

  // The headline errors are those of a card that still reads: samples flagged unreliable (card swinging,
  // on its stop, without directive force, weak-field zone) are left out of them and counted separately.
  const reliableErrorDeg = blankWhere(c.errorDeg, c.unreliable);
  const peakRows = largestErrorPeaks(s.t, reliableErrorDeg, 5, 60);
  const forced: number[] = [...peakRows];
  pushSegmentEnds(s.segment, forced);
  for (const e of [...an.turns, ...an.episodes, ...an.excursions]) forced.push(e.startIndex, e.endIndex);
  for (const d of an.divergences) forced.push(d.startIndex, d.endIndex, peakRow(s.t, d.peakT, d.startIndex, d.endIndex));
  const rows = downsampleForDrawing(c.errorDeg, maxPoints, forced);

  const t0Utc = n > 0 ? s.t[0] : NaN;
  const tRel = shifted(s.t, t0Utc);
  const series: ReportSeries = {
    n: rows.length,
    t0Utc,
    tS: compactAtRows(tRel, rows, 1),
    row: Array.from(rows),
    seg: Array.from(rows, (r) => s.segment[r]),
    eastNm: compactAtRows(plan.eastNm, rows, 3),
    northNm: compactAtRows(plan.northNm, rows, 3),
    altFt: compactAtRows(s.altM, rows, 0, 1 / FT_M),
    gsKt: compactAtRows(s.gsMs, rows, 1, 1 / KT_MS),
    trackTrueDeg: compactDirectionAtRows(s.trackDegTrue, rows, 1),
    headingTrueDeg: compactDirectionAtRows(s.headingDegTrue, rows, 1),
    headingMagDeg: compactDirectionAtRows(headingMagDeg, rows, 1),
    compassStaticDeg: compactDirectionAtRows(c.staticDeg, rows, 1),
    compassDeg: compactDirectionAtRows(c.readingDeg, rows, 1),
    compassSigmaDeg: s.headingSigmaDeg ? compactAtRows(s.headingSigmaDeg, rows, 2) : Array.from(rows, () => null),
    errorDeg: compactAtRows(c.errorDeg, rows, 1),
    bankDeg: compactAtRows(s.bankDeg, rows, 1),
    accelLongKtS: compactAtRows(s.accelLongMs2, rows, 2, 1 / KT_MS),
    unreliable: Array.from(rows, (r) => (c.unreliable[r] !== 0 ? 1 : 0)),
  };

  const meta = a.log.source.meta;
  const name = meta.name ?? baseName(a.log.source.file);
  const glance = buildGlance(a, headingMagDeg, plan, peakRows, first);
  return {
    modelVersion: 1,
    title: opts.title ?? (name !== '' ? name : 'Compass debrief'),
    generatedAtUtc: (opts.generatedAt ?? new Date()).toISOString(),
    source: { file: a.log.source.file, format: a.log.source.format },
    meta: {
      name,
      aircraft: opts.aircraft ?? meta.aircraft ?? '',
      pilot: opts.pilot ?? meta.pilot ?? '',
      device: meta.device ?? '',
      comment: meta.comment ?? '',
    },
    glance,
    series,
    downsample: {
      samples: n,
      drawn: rows.length,
      method:
        rows.length === n
          ? 'every sample is drawn'
          : `min/max thinning: in each of ${fmtCount(Math.floor((maxPoints - new Set(forced).size) / 2))} equal runs of samples the lowest and highest compass error are drawn (so no error peak is lost), plus every segment end and event time`,
    },
    // Runs closer than 5 s (or than 1/500 of the flight) are joined: at most ~500 shaded bands.
    unreliableSpans: mergeCloseSpans(flagSpans(s.t, c.unreliable, s.segment), Math.max(5, glance.durationS / 500)),
    turns: an.turns.map((t, k) => ({
      label: `T${k + 1}`,
      startUtc: t.startT,
      endUtc: t.endT,
      direction: t.direction,
      headingChangeDeg: t.headingChangeDeg,
      meanRateDps: t.meanRateDps,
      peakBankDeg: t.peakBankDeg,
      entryMagDeg: t.entryMagDeg,
      targetMagDeg: t.targetMagDeg,
      targetSource: t.targetSource,
      rolloutMagDeg: t.rolloutMagDeg,
      rolloutErrorDeg: t.rolloutErrorDeg,
      withinTolerance: t.withinTolerance,
      compassAtRolloutDeg: t.compassAtRolloutDeg,
      compassSettledDeg: t.compassSettledDeg,
      cueCompassDeg: t.cueCompassDeg,
      ruleOfThumbCueDeg: t.ruleOfThumbCueDeg,
      compassAtRolloutStartDeg: t.compassAtRolloutStartDeg ?? NaN,
      toleranceDeg: t.toleranceDeg ?? NaN,
      timedDurationS: t.timed?.durationS ?? NaN,
      timedExpectedChangeDeg: t.timed?.expectedChangeDeg ?? NaN,
      timedActualChangeDeg: t.timed?.actualChangeDeg ?? NaN,
      timedDifferenceDeg: t.timed?.differenceDeg ?? NaN,
      timedWithinTolerance: t.timed?.withinTolerance ?? null,
    })),
    episodes: an.episodes.map((e, k) => ({
      label: `S${k + 1}`,
      startUtc: e.startT,
      endUtc: e.endT,
      kind: e.kind,
      peakAccelKtS: e.peakAccelMs2 / KT_MS,
      headingMagDeg: e.headingMagDeg,
      peakSwingDeg: e.peakSwingDeg,
      swingDirection: e.swingDirection,
      expectedSwingDeg: e.expectedSwingDeg,
    })),
    divergences: an.divergences.map(
      (d, k): ReportDivergenceRow => ({
        label: `D${k + 1}`,
        startUtc: d.startT,
        endUtc: d.endT,
        peakUtc: d.peakT,
        peakErrorDeg: d.peakErrorDeg,
        cause: CAUSE_TEXT[d.cause],
      }),
    ),
    excursions: an.excursions.map((x, k) => ({
      label: `X${k + 1}`,
      startUtc: x.startT,
      endUtc: x.endT,
      heldCompassDeg: x.heldCompassDeg,
      observedCrossTrackNm: x.observedCrossTrackM / NM_M,
      compassCrossTrackNm: x.compassCrossTrackM / NM_M,
      windCrossTrackNm: x.windCrossTrackM / NM_M,
      residualCrossTrackNm: x.residualCrossTrackM / NM_M,
      source: x.source,
      ...believedTrackNm(x.believedTrack, s.lat[first], s.lon[first]),
    })),
    health: {
      ...a.health,
      gapSpans: segmentGaps(s.t, s.segment),
      medianStepS: medianStepS(s.t, s.segment),
      warnings: a.warnings.map((w) => ({
        code: w.code,
        message: w.message,
        lines: (w.lines ?? []).slice(0, 12),
        lineCount: w.lines?.length ?? 0,
        count: w.count ?? w.lines?.length ?? 1,
      })),
    },
    errorScaleDeg: errorColourScaleDeg(c.errorDeg),
  };
}

function buildGlance(
  a: FlightAnalysis,
  headingMagDeg: Float64Array,
  plan: { eastNm: Float64Array; northNm: Float64Array },
  peakRows: number[],
  first: number,
): ReportGlance {
  const { state: s, field: f, compass: c } = a;
  const n = s.n;
  let last = n - 1;
  while (last > 0 && !(Number.isFinite(s.lat[last]) && Number.isFinite(s.lon[last]))) last--;
  const maxRange = maxRangeNm(plan.eastNm, plan.northNm);
  const { sumSq, nErr, maxAbsErrorDeg, unreliable, caution, blackout } = errorTallies(c.errorDeg, c.unreliable, f.zone);
  const alt = finiteRange(s.altM);
  const variation = finiteRange(f.variationDeg);
  const dip = finiteRange(f.dipDeg);
  const biggestErrors: ReportErrorPeak[] = peakRows.map((i) => ({
    tUtc: s.t[i],
    errorDeg: c.errorDeg[i],
    compassDeg: c.readingDeg[i],
    headingMagDeg: headingMagDeg[i],
    bankDeg: s.bankDeg[i],
    mainCause: mainCauseAt(a, i),
  }));
  const winds: ReportWind[] = s.winds.map((w) => ({
    fromDegTrue: w.fromDegTrue,
    speedKt: w.speedMs / KT_MS,
    source: w.source,
    sourceText: WIND_SOURCE_TEXT[w.source] ?? w.source,
    sigmaKt: w.sigmaMs / KT_MS,
    t0Utc: w.t0,
    t1Utc: w.t1,
  }));
  return {
    startUtc: s.t[0],
    endUtc: s.t[n - 1],
    durationS: s.t[n - 1] - s.t[0],
    startLatDeg: s.lat[first],
    startLonDeg: s.lon[first],
    endLatDeg: s.lat[last],
    endLonDeg: s.lon[last],
    maxRangeNm: maxRange,
    altMinFt: alt.min / FT_M,
    altMaxFt: alt.max / FT_M,
    altDatum: a.log.source.altDatum,
    gsMaxKt: finiteRange(s.gsMs).max / KT_MS,
    winds,
    variationMinDeg: variation.min,
    variationMaxDeg: variation.max,
    dipMinDeg: dip.min,
    dipMaxDeg: dip.max,
    fieldModel: f.model,
    decimalYear: f.decimalYear,
    cautionZoneSamples: caution,
    blackoutZoneSamples: blackout,
    unreliableShare: n > 0 ? unreliable / n : 0,
    maxAbsErrorDeg,
    rmsErrorDeg: nErr > 0 ? Math.sqrt(sumSq / nErr) : NaN,
    biggestErrors,
  };
}

/** The part of the error split with the largest magnitude at row i, in words. */
function mainCauseAt(a: FlightAnalysis, i: number): string {
  const c = a.compass;
  const parts: [number, string][] = [
    [c.errDipTurnDeg[i], CAUSE_TEXT.turn],
    [c.errDipAccelDeg[i], CAUSE_TEXT['speed-change']],
    [c.errLagSwirlDeg[i], CAUSE_TEXT['lag-swirl']],
    [c.errDeviationDeg[i], CAUSE_TEXT.deviation],
  ];
  let best = '';
  let bestAbs = -1;
  for (const [v, label] of parts) {
    if (Number.isFinite(v) && Math.abs(v) > bestAbs) {
      bestAbs = Math.abs(v);
      best = label;
    }
  }
  return best;
}

/**
 * Over the whole flight: Σ error² and the count of finite errors, the largest |error| of a reliable card,
 * the counts of unreliable samples and of samples in the caution and blackout zones.
 */
function errorTallies(errorDeg: Float64Array, unreliableFlag: Uint8Array, zone: Uint8Array) {
  let sumSq = 0;
  let nErr = 0;
  let maxAbsErrorDeg = 0;
  let unreliable = 0;
  let caution = 0;
  let blackout = 0;
  for (let i = 0; i < errorDeg.length; i++) {
    const err = errorDeg[i];
    if (Number.isFinite(err)) {
      sumSq += err * err;
      nErr++;
      if (unreliableFlag[i] === 0 && Math.abs(err) > maxAbsErrorDeg) maxAbsErrorDeg = Math.abs(err);
    }
    if (unreliableFlag[i] !== 0) unreliable++;
    if (zone[i] === ZONE_CAUTION) caution++;
    if (zone[i] === ZONE_BLACKOUT) blackout++;
  }
  return { sumSq, nErr, maxAbsErrorDeg, unreliable, caution, blackout };
}

/** Magnetic heading at each sample, true heading − variation (east +), in [0, 360). */
function magneticHeadingsDeg(trueDeg: Float64Array, variationDeg: Float64Array): Float64Array {
  const out = new Float64Array(trueDeg.length);
  for (let i = 0; i < out.length; i++) out[i] = wrap360(trueDeg[i] - variationDeg[i]);
  return out;
}

/** Appends the first and last row and the first and last row of every segment. */
function pushSegmentEnds(segment: Int32Array, rows: number[]): void {
  const n = segment.length;
  for (let i = 0; i < n; i++) if (i === 0 || i === n - 1 || segment[i] !== segment[i - 1] || segment[i] !== segment[i + 1]) rows.push(i);
}

/** col − origin at each sample. */
function shifted(col: Float64Array, origin: number): Float64Array {
  const out = new Float64Array(col.length);
  for (let i = 0; i < out.length; i++) out[i] = col[i] - origin;
  return out;
}

/** An excursion's believed track on the plan view's frame, thinned to ≤ 400 points, rounded to 0.001 NM. */
function believedTrackNm(
  track: { latDeg: Float64Array; lonDeg: Float64Array } | undefined,
  lat0Deg: number,
  lon0Deg: number,
): { believedEastNm: (number | null)[]; believedNorthNm: (number | null)[] } {
  if (track === undefined || track.latDeg.length === 0) return { believedEastNm: [], believedNorthNm: [] };
  const m = track.latDeg.length;
  const step = Math.max(1, Math.ceil(m / 400));
  const rows: number[] = [];
  for (let i = 0; i < m; i += step) rows.push(i);
  if (rows[rows.length - 1] !== m - 1) rows.push(m - 1);
  const idx = Int32Array.from(rows);
  const p = localPlanNm(track.latDeg, track.lonDeg, lat0Deg, lon0Deg);
  return { believedEastNm: compactAtRows(p.eastNm, idx, 3), believedNorthNm: compactAtRows(p.northNm, idx, 3) };
}

function firstFiniteFix(lat: Float64Array, lon: Float64Array): number {
  for (let i = 0; i < lat.length; i++) if (Number.isFinite(lat[i]) && Number.isFinite(lon[i])) return i;
  return 0;
}

/** Row within [i0, i1] whose time is nearest tPeak (the divergence peak's row for forced drawing). */
function peakRow(t: Float64Array, tPeak: number, i0: number, i1: number): number {
  let best = i0;
  for (let i = i0; i <= i1 && i < t.length; i++) if (Math.abs(t[i] - tPeak) < Math.abs(t[best] - tPeak)) best = i;
  return best;
}


/** Median step between consecutive samples of the same segment [s]; NaN with fewer than two. */
function medianStepS(t: Float64Array, segment: Int32Array): number {
  const steps = new Float64Array(Math.max(0, t.length - 1));
  let k = 0;
  for (let i = 1; i < t.length; i++) if (segment[i] === segment[i - 1] && Number.isFinite(t[i] - t[i - 1])) steps[k++] = t[i] - t[i - 1];
  if (k === 0) return NaN;
  return kthSmallestInPlace(steps.subarray(0, k), Math.floor(k / 2));
}

/**
 * Half-range of the plan view's diverging colour scale [deg]: the 99th percentile of |error| rounded
 * up to 5°, at least 5° (a few reversal spikes must not wash the scale out; they saturate instead).
 */
function errorColourScaleDeg(errorDeg: Float64Array): number {
  let k = 0;
  const abs = new Float64Array(errorDeg.length);
  for (let i = 0; i < errorDeg.length; i++) if (Number.isFinite(errorDeg[i])) abs[k++] = Math.abs(errorDeg[i]);
  if (k === 0) return 5;
  const p99 = kthSmallestInPlace(abs.subarray(0, k), Math.min(k - 1, Math.floor(0.99 * k)));
  return Math.max(5, Math.ceil(p99 / 5) * 5);
}


function baseName(file: string): string {
  const parts = file.split(/[\\/]/);
  return parts[parts.length - 1] ?? '';
}
