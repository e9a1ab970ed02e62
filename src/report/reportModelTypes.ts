// ReportModel: everything the debrief page shows, already in pilot units and compact enough to inline.
//
// Units on the page (and in this model): knots, feet, degrees, nautical miles, seconds, kt/s.
// Times are UTC seconds since the Unix epoch (absolute) or seconds since the first drawn sample (`tS`).
// Text fields (names, comments, warnings) are raw text: the renderer escapes them; never markup.

/** One signed compass error peak worth naming on the first screen. */
export interface ReportErrorPeak {
  tUtc: number;
  /** Compass error [deg], reading − magnetic heading, (−180, 180]. */
  errorDeg: number;
  compassDeg: number;
  headingMagDeg: number;
  /** Bank [deg], right wing down +. */
  bankDeg: number;
  /** The largest of the four error parts at that moment, in words ("turning (dip)", …). */
  mainCause: string;
}

/** One wind estimate as printed: from-direction true [deg], speed [kt], where it came from. */
export interface ReportWind {
  fromDegTrue: number;
  speedKt: number;
  source: string;
  /** Plain-words description of the source ("given on the command line", "fitted to a turn", …). */
  sourceText: string;
  /** 1-sigma [kt]; NaN when the wind was given. */
  sigmaKt: number;
  /** Validity window [UTC s]; NaN when the wind applies to the whole flight. */
  t0Utc: number;
  t1Utc: number;
}

/** The first screen: when, how long, where, with what, and the headline numbers. */
export interface ReportGlance {
  startUtc: number;
  endUtc: number;
  durationS: number;
  startLatDeg: number;
  startLonDeg: number;
  endLatDeg: number;
  endLonDeg: number;
  /** Greatest distance from the first fix [NM]. */
  maxRangeNm: number;
  altMinFt: number;
  altMaxFt: number;
  altDatum: string;
  gsMaxKt: number;
  winds: ReportWind[];
  /** Variation (east +) and dip (down +) range along the path [deg]. */
  variationMinDeg: number;
  variationMaxDeg: number;
  dipMinDeg: number;
  dipMaxDeg: number;
  fieldModel: string;
  decimalYear: number;
  /** Samples inside the WMM caution / blackout zones of weak horizontal field. */
  cautionZoneSamples: number;
  blackoutZoneSamples: number;
  /** Share of samples flagged unreliable (card on stop, weak directive force, weak field) [0..1]. */
  unreliableShare: number;
  /** Largest |compass error| where the card is not flagged unreliable [deg]. */
  maxAbsErrorDeg: number;
  /** Root-mean-square compass error over the flight [deg]. */
  rmsErrorDeg: number;
  /** The largest separated error peaks, biggest first. */
  biggestErrors: ReportErrorPeak[];
}

/**
 * Drawing columns, all of length `n` (the drawn points, not the log's samples). `null` stands for a
 * missing value. Angles in [0, 360) except signed ones; bank right wing down +; accel forward +.
 */
export interface ReportSeries {
  n: number;
  /** UTC seconds of tS = 0. */
  t0Utc: number;
  /** Seconds since t0Utc, 0.1 s resolution. */
  tS: (number | null)[];
  /** Row of the full-resolution FlightState each drawn point came from. */
  row: number[];
  /** Segment id (a new one after each gap in the log): lines are broken between segments. */
  seg: number[];
  eastNm: (number | null)[];
  northNm: (number | null)[];
  altFt: (number | null)[];
  gsKt: (number | null)[];
  trackTrueDeg: (number | null)[];
  headingTrueDeg: (number | null)[];
  headingMagDeg: (number | null)[];
  compassStaticDeg: (number | null)[];
  compassDeg: (number | null)[];
  /**
   * 1-sigma of the simulated reading carried from the heading's uncertainty (wind and velocity sigma) [deg],
   * taken one to one (the reading follows the heading at first order); null where unknown.
   */
  compassSigmaDeg: (number | null)[];
  errorDeg: (number | null)[];
  bankDeg: (number | null)[];
  accelLongKtS: (number | null)[];
  /** 1 where the simulated reading is not to be trusted. */
  unreliable: number[];
}

/** How the drawn series were thinned, for the page to say so. */
export interface ReportDownsample {
  samples: number;
  drawn: number;
  method: string;
}

/** A time span [UTC s] with a label, e.g. a run of unreliable card readings or a log gap. */
export interface ReportSpan {
  t0Utc: number;
  t1Utc: number;
}

export interface ReportTurnRow {
  label: string;
  startUtc: number;
  endUtc: number;
  direction: 'left' | 'right';
  headingChangeDeg: number;
  meanRateDps: number;
  peakBankDeg: number;
  entryMagDeg: number;
  targetMagDeg: number;
  targetSource: 'plan' | 'inferred';
  rolloutMagDeg: number;
  rolloutErrorDeg: number;
  withinTolerance: boolean;
  compassAtRolloutDeg: number;
  compassSettledDeg: number;
  cueCompassDeg: number;
  ruleOfThumbCueDeg: number;
  /** Compass reading when the roll-out actually began; NaN when the analysis did not say. */
  compassAtRolloutStartDeg: number;
  /** Tolerance the roll-out was graded against [deg]; NaN when not given. */
  toleranceDeg: number;
  /** Timed turn (flown on the clock): NaN / null where the turn was not timed or the field is absent. */
  timedDurationS: number;
  timedExpectedChangeDeg: number;
  timedActualChangeDeg: number;
  timedDifferenceDeg: number;
  timedWithinTolerance: boolean | null;
}

export interface ReportEpisodeRow {
  label: string;
  startUtc: number;
  endUtc: number;
  kind: 'accelerating' | 'decelerating';
  peakAccelKtS: number;
  headingMagDeg: number;
  peakSwingDeg: number;
  swingDirection: 'left' | 'right' | 'none';
  expectedSwingDeg: number;
}

export interface ReportDivergenceRow {
  label: string;
  startUtc: number;
  endUtc: number;
  peakUtc: number;
  peakErrorDeg: number;
  cause: string;
}

export interface ReportExcursionRow {
  label: string;
  startUtc: number;
  endUtc: number;
  heldCompassDeg: number;
  observedCrossTrackNm: number;
  compassCrossTrackNm: number;
  windCrossTrackNm: number;
  residualCrossTrackNm: number;
  source: 'option' | 'detected';
  /**
   * Where the aircraft would have gone on the heading the pilot believed, on the plan view's frame
   * [NM east/north of the first fix], thinned to at most 400 points; empty when the analysis gave none.
   */
  believedEastNm: (number | null)[];
  believedNorthNm: (number | null)[];
}

export interface ReportWarning {
  code: string;
  message: string;
  /** Up to the first 12 source lines or records concerned. */
  lines: number[];
  /** How many lines were concerned in all (≥ lines.length). */
  lineCount: number;
  count: number;
}

export interface ReportHealth {
  recordsRead: number;
  samplesKept: number;
  duplicateTimes: number;
  outOfOrder: number;
  positionSpikes: number;
  invalidValues: number;
  gaps: number;
  truncated: boolean;
  /** Gaps between segments [UTC s]. */
  gapSpans: ReportSpan[];
  /** Median time step between kept samples [s]. */
  medianStepS: number;
  warnings: ReportWarning[];
}

/** The whole page, in debrief order. Built by buildReportModel, drawn by renderReport. */
export interface ReportModel {
  modelVersion: 1;
  title: string;
  /** ISO 8601 UTC. */
  generatedAtUtc: string;
  source: { file: string; format: string };
  /** Names and comments from the log, overridden by the options where given. Raw text. */
  meta: { name: string; aircraft: string; pilot: string; device: string; comment: string };
  glance: ReportGlance;
  series: ReportSeries;
  downsample: ReportDownsample;
  unreliableSpans: ReportSpan[];
  turns: ReportTurnRow[];
  episodes: ReportEpisodeRow[];
  divergences: ReportDivergenceRow[];
  excursions: ReportExcursionRow[];
  health: ReportHealth;
  /** Symmetric colour range of the plan view [deg]: −errorScaleDeg … +errorScaleDeg. */
  errorScaleDeg: number;
}

/** Options of buildReportModel. Text options override what the log carries. */
export interface ReportModelOptions {
  title?: string;
  aircraft?: string;
  pilot?: string;
  /** When the report is made; defaults to now. */
  generatedAt?: Date;
  /** Most points drawn per series (default 5000, at least 200). Full resolution stays in the samples CSV. */
  maxDrawnPoints?: number;
}
