// Result types of the debrief analyses. All times are UTC seconds; indices are FlightState rows.

/** One turn: roll-in to roll-out, and how the compass and the pilot handled it. */
export interface TurnResult {
  startIndex: number;
  endIndex: number;
  startT: number;
  endT: number;
  direction: 'left' | 'right';
  headingChangeDeg: number;
  meanRateDps: number;
  peakBankDeg: number;
  meanBankDeg: number;
  entryMagDeg: number;
  rolloutMagDeg: number;
  compassAtRolloutDeg: number;
  compassSettledDeg: number;
  targetMagDeg: number;
  targetSource: 'plan' | 'inferred';
  targetConfidence: number;
  rolloutErrorDeg: number;
  withinTolerance: boolean;
  cueCompassDeg: number;
  /** Compass reading the usual rule of thumb would have used as the roll-out cue. */
  ruleOfThumbCueDeg: number;
  timed?: { durationS: number; expectedChangeDeg: number };
}

/** A speed change on a straight leg and the apparent swing of the compass it caused. */
export interface SpeedEpisode {
  startIndex: number;
  endIndex: number;
  startT: number;
  endT: number;
  kind: 'accelerating' | 'decelerating';
  peakAccelMs2: number;
  headingMagDeg: number;
  peakSwingDeg: number;
  swingDirection: 'left' | 'right' | 'none';
  expectedSwingDeg: number;
}

/** A span where |compass error| stayed above a threshold for a minimum time, with its main cause. */
export interface DivergenceWindow {
  startIndex: number;
  endIndex: number;
  startT: number;
  endT: number;
  peakErrorDeg: number;
  peakT: number;
  cause: 'turn' | 'speed-change' | 'lag-swirl' | 'deviation';
}

/** A span flown on the compass and where compass error and wind drift took the aircraft. */
export interface ExcursionResult {
  startIndex: number;
  endIndex: number;
  startT: number;
  endT: number;
  heldCompassDeg: number;
  observedCrossTrackM: number;
  compassCrossTrackM: number;
  windCrossTrackM: number;
  residualCrossTrackM: number;
  source: 'option' | 'detected';
}

export interface Analysis {
  turns: TurnResult[];
  episodes: SpeedEpisode[];
  divergences: DivergenceWindow[];
  excursions: ExcursionResult[];
}
