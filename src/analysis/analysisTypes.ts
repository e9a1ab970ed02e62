// Result types of the debrief analyses. All times are UTC seconds; indices are FlightState rows.
// Angles in degrees: headings in [0, 360); signed differences in (−180, 180]; magnitudes (bank, rate) ≥ 0.

/** A timed turn (flown on the clock at standard rate): what the clock promised and what was flown. */
export interface TimedTurnCheck {
  /** Roll-in start to roll-out start [s], measured between the half-rate points (see detectTurns). */
  durationS: number;
  /** Standard rate (3 °/s, FAA-H-8083-15B ch. 7) × durationS [deg]. */
  expectedChangeDeg: number;
  /** Heading change actually flown [deg, ≥ 0]. */
  actualChangeDeg?: number;
  /** actualChangeDeg − expectedChangeDeg [deg]; + = turned further than the clock promised (rate above standard). */
  differenceDeg?: number;
  /** |differenceDeg| ≤ the turn tolerance. */
  withinTolerance?: boolean;
  /** Planned time of the turn from the plan's `timed_s` column [s], NaN when not planned. */
  plannedDurationS?: number;
  /** Why the turn counts as timed: the plan says so, or its steady rate was close to standard. */
  basis?: 'plan' | 'near-standard-rate';
}

/** One turn: roll-in to roll-out, and how the compass and the pilot handled it. */
export interface TurnResult {
  startIndex: number;
  endIndex: number;
  startT: number;
  endT: number;
  direction: 'left' | 'right';
  /** Heading change flown in the turn's direction, start to end [deg, > 0; may exceed 360]. */
  headingChangeDeg: number;
  /** Mean |turn rate| over the steady phase [°/s]. */
  meanRateDps: number;
  /** Largest bank toward the turn [deg, ≥ 0]. */
  peakBankDeg: number;
  /** Mean bank toward the turn over the steady phase [deg]. */
  meanBankDeg: number;
  /** Magnetic heading ψm = true heading − variation at the start [0, 360). */
  entryMagDeg: number;
  /** Magnetic heading once rolled out (at endIndex) [0, 360). */
  rolloutMagDeg: number;
  /** Simulated compass reading at endIndex (what the pilot saw as the wings came level). */
  compassAtRolloutDeg: number;
  /** Compass reading once settled (quiet card, or settleMaxS after roll-out). */
  compassSettledDeg: number;
  targetMagDeg: number;
  targetSource: 'plan' | 'inferred';
  /** 1 for a plan target; for an inferred one 1 − distance/half-spacing of the candidate headings, in [0, 1]. */
  targetConfidence: number;
  /** rolloutMagDeg − targetMagDeg, wrapped to (−180, 180]; + = right of (clockwise from) the target. */
  rolloutErrorDeg: number;
  withinTolerance: boolean;
  /** Compass reading (model: static card at the turn's bank and dip, plus the dynamic card's offset) at which the roll-out should have begun. */
  cueCompassDeg: number;
  /** Compass reading the usual rule of thumb would have used as the roll-out cue. */
  ruleOfThumbCueDeg: number;
  timed?: TimedTurnCheck;

  // --- added by the analysis helper: optional in the type (older producers), always set by analyseDebrief ---
  /** Steady phase: from roll-in end (rate first ≥ 90 % of the steady rate) to roll-out start (rate last ≥ 90 %). */
  rollInEndIndex?: number;
  rolloutStartIndex?: number;
  rollInEndT?: number;
  rolloutStartT?: number;
  /** Median |turn rate| of the turn's core [°/s] (the "steady rate" the phases are measured against). */
  steadyRateDps?: number;
  /** Heading change during the roll-out, roll-out start to end [deg, ≥ 0]. */
  rolloutLeadDeg?: number;
  /** Roll-out duration used for the cue [s]: measured, or the default bank / roll rate. */
  rolloutDurationS?: number;
  rolloutDurationSource?: 'measured' | 'default';
  /** Compass reading when the roll-out began (compare with cueCompassDeg). */
  compassAtRolloutStartDeg?: number;
  /** When compassSettledDeg was read, and whether the card was quiet then ('quiet') or time ran out ('timeout'). */
  compassSettledT?: number;
  compassSettledHow?: 'quiet' | 'timeout';
  /** Magnetic heading at which the roll-out should have begun: target − direction × rolloutLeadDeg. */
  cueMagDeg?: number;
  /** Static card reading (closed form, steady level turn) at cueMagDeg, meanBank and the dip [0, 360). */
  cueStaticCompassDeg?: number;
  /** ruleOfThumbCueDeg − cueCompassDeg wrapped: where rule of thumb and model part company. */
  cueDifferenceDeg?: number;
  /** Latitude [deg] and dip [deg, down +] at the roll-out start (inputs of both cues). */
  latDeg?: number;
  dipDeg?: number;
  /** Tolerance the grade used [deg]. */
  toleranceDeg?: number;
  /** 1-based line of the plan row matched to this turn; NaN when the target was inferred. */
  planLine?: number;
}

/** A speed change on a straight leg and the apparent swing of the compass it caused. */
export interface SpeedEpisode {
  startIndex: number;
  endIndex: number;
  startT: number;
  endT: number;
  kind: 'accelerating' | 'decelerating';
  /** Largest |accel_long| with its sign, forward + [m/s²]. */
  peakAccelMs2: number;
  headingMagDeg: number;
  /** Largest apparent swing (reading − ψm, deviation removed) with its sign [deg]; + = the card shows a turn to the right. */
  peakSwingDeg: number;
  swingDirection: 'left' | 'right' | 'none';
  /** Static closed form (Williams eq. 3–4, wings level) at peakAccelMs2, headingMagDeg and the dip [deg, signed]. */
  expectedSwingDeg: number;
  // --- added by the analysis helper: optional in the type, always set by analyseDebrief ---
  durationS?: number;
  dipDeg?: number;
  /** peakSwingDeg / expectedSwingDeg (NaN when the model expects < 0.5°): < 1 where card lag ate part of the swing. */
  swingRatio?: number;
}

/** Mean |component| of the compass error split over a span [deg]. */
export interface ErrorSplitMeans {
  turn: number;
  speedChange: number;
  lagSwirl: number;
  deviation: number;
}

/** A span where |compass error| stayed above a threshold for a minimum time, with its main cause. */
export interface DivergenceWindow {
  startIndex: number;
  endIndex: number;
  startT: number;
  endT: number;
  /** Largest |error| with its sign (reading − ψm) [deg]. */
  peakErrorDeg: number;
  peakT: number;
  cause: 'turn' | 'speed-change' | 'lag-swirl' | 'deviation';
  // --- added by the analysis helper: optional in the type, always set by analyseDebrief ---
  durationS?: number;
  meanAbsSplitDeg?: ErrorSplitMeans;
}

/** Cross-track against a planned route leg (only when a route is given). */
export interface RouteCrossTrack {
  /** Index of the route leg (from waypoint legIndex to legIndex + 1) the span was measured against. */
  legIndex: number;
  legTrackDegTrue: number;
  /** Cross-track from the route leg at the span's start and end [m, right of the leg +]. */
  startCrossTrackM: number;
  endCrossTrackM: number;
  /** Change over the span (end − start) and its attribution [m]: compass error, wind, heading chosen (vs the leg). */
  changeM: number;
  compassM: number;
  windM: number;
  headingM: number;
  residualM: number;
}

/** A span flown on the compass and where compass error and wind drift took the aircraft. */
export interface ExcursionResult {
  startIndex: number;
  endIndex: number;
  startT: number;
  endT: number;
  heldCompassDeg: number;
  /**
   * Cross-track displacements [m], right +, perpendicular to the reference line: the rhumb line from the start
   * position along refTrackDegTrue (= held compass reading + variation at the start, the track the pilot believed).
   * observed (from the positions) ≈ compass + wind + heading (+ unexplained, see closureErrorM).
   */
  observedCrossTrackM: number;
  compassCrossTrackM: number;
  windCrossTrackM: number;
  /** observed − compass − wind (what neither compass error nor wind explains: the held reading's wander, variation change, sideslip). */
  residualCrossTrackM: number;
  source: 'option' | 'detected';
  // --- added by the analysis helper: optional in the type, always set by analyseDebrief ---
  refTrackDegTrue?: number;
  /** Distance along the reference line, start to end [m]. */
  alongTrackM?: number;
  /** Part from the believed heading itself drifting off the reference (reading wander, variation change) [m]. */
  headingCrossTrackM?: number;
  /** observed − (compass + wind + heading) [m], and the tolerance it must stay within (see excursion.ts). */
  closureErrorM?: number;
  closureToleranceM?: number;
  closes?: boolean;
  /** Mean compass error over the span (reading − ψm) [deg]. */
  meanCompassErrorDeg?: number;
  /** Where the aircraft would have gone on the heading the pilot believed (start + ∫ (TAS along reading + variation) + wind), rows startIndex…endIndex. */
  believedTrack?: { latDeg: Float64Array; lonDeg: Float64Array };
  route?: RouteCrossTrack;
}

export interface Analysis {
  turns: TurnResult[];
  episodes: SpeedEpisode[];
  divergences: DivergenceWindow[];
  excursions: ExcursionResult[];
}
