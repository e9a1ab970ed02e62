// Scripted pilots for compass-turn lessons: turns "to a magnetic heading" ended from what the compass shows.
import { DEG } from '../constants.js';
import { OptionError } from '../errors.js';
import { wrap180, wrap360 } from '../geo/angles.js';
import { levelTurnReadingDeg } from '../compass/turningError.js';
import type { FieldEvaluator } from '../magnetic/wmm2025.js';
import type { FlightScript, RolloutDecisionView, ScriptLeg, TurnLeg, TurnStyle } from './flightScript.js';
import { modelCompassReading, type CompassReadingFn } from './perceivedCompass.js';
import { pilotFieldEvaluator, type PilotMagnetics } from './pilotMagnetics.js';
import { simulateFlight } from './simulateFlight.js';
import type { SynthTruth } from './synthTruth.js';

/**
 * How the pilot decides to roll out of a compass turn:
 *  - 'rolls-out-on-reading': starts the roll-out when the compass shows the target (the naive pilot);
 *  - 'uses-model-cue': starts it when the compass shows the model's cue: the static level-turn reading
 *    (Williams eq. 2) at the heading from which the roll-out (and the pilot's reaction) ends on the target;
 *  - 'rule-of-thumb': the handbook rule, lead or lag ≈ latitude at 15–18° bank (FAA-H-8083-15B ch. 7 "Compass
 *    turns"): northern magnetic hemisphere undershoot north by latitude + normal lead, overshoot south by
 *    latitude − normal lead, only the normal lead on east/west; southern hemisphere reversed; in between the
 *    latitude term scales with cos(target) (common practice: the turning error goes as cos ψm, PHYSICS.md §1.2).
 */
export type RolloutTechnique = 'rolls-out-on-reading' | 'uses-model-cue' | 'rule-of-thumb';

/** A level coordinated turn flown onto a magnetic heading [deg] judged on the compass. */
export interface CompassTurnLeg extends TurnStyle {
  kind: 'compass-turn';
  toMagDeg: number;
  /** Default: one full circle plus the roll time and 10 s (a pilot who misses the cue that long gives up). */
  maxDurationS?: number;
  label?: string;
}

export type PilotLeg = ScriptLeg | CompassTurnLeg;

/** A flight script whose legs may include compass turns. */
export interface PilotScript extends Omit<FlightScript, 'legs'> {
  legs: PilotLeg[];
}

/**
 * The pilot. compassReadingFn: the reading the pilot sees (default: the dynamic card model of src/compass in
 * `magnetics`, see modelCompassReading). magnetics: the field the pilot's cues use (dip, variation; default
 * WMM2025). reactionS: delay from the decision to the start of the roll-out [s, ≥ 0], default 0.3.
 * normalLeadDeg: the roll-out lead the pilot uses on a heading indicator [deg, ≥ 0]; default the heading change
 * of the reaction plus the roll-out, ω·(reactionS + rollTimeS / 2).
 */
export interface ScriptedPilot {
  technique: RolloutTechnique;
  compassReadingFn?: CompassReadingFn;
  magnetics?: PilotMagnetics;
  reactionS?: number;
  normalLeadDeg?: number;
}

/** What happened in one compass turn. Headings magnetic [deg]; errors in the turn's direction, + = overshoot. */
export interface PilotTurnRecord {
  legIndex: number;
  label?: string;
  technique: RolloutTechnique;
  direction: 'left' | 'right';
  targetMagDeg: number;
  /** Compass reading the technique waited for, at the decision (NaN if never decided). */
  cueCompassDeg: number;
  /** Compass reading the pilot saw when deciding (NaN if never decided). */
  compassAtDecisionDeg: number;
  /** UTC s of the decision and of the start of the roll-out. */
  decisionT: number;
  rolloutStartT: number;
  /** Magnetic heading once the wings are level (true heading − variation at that point). */
  rolloutMagDeg: number;
  /** dir × (rollout − target), wrapped: > 0 overshoot, < 0 undershoot. */
  rolloutErrorDeg: number;
  timedOut: boolean;
}

/** Default reaction delay [s] from deciding to roll out to moving the controls (common practice, from memory). */
const DEFAULT_REACTION_S = 0.3;
const DEFAULT_ROLL_S = 2;

/** Cue reading [0, 360) for a technique. ω [deg/s] and bank [deg] are magnitudes; dip down +; dir +1 right. */
function cueDeg(
  technique: RolloutTechnique, targetMagDeg: number, dir: 1 | -1, bankDeg: number, dipDeg: number, latDeg: number,
  normalLeadDeg: number,
): number {
  switch (technique) {
    case 'rolls-out-on-reading':
      return wrap360(targetMagDeg);
    case 'uses-model-cue':
      // Static level-turn card at the heading the roll-out must start from: Williams eq. 2 (PHYSICS.md §1.2).
      return levelTurnReadingDeg(wrap360(targetMagDeg - dir * normalLeadDeg), dir * bankDeg, dipDeg);
    case 'rule-of-thumb': {
      const hemi = dipDeg > 0 ? 1 : dipDeg < 0 ? -1 : 0;
      return wrap360(targetMagDeg - dir * (normalLeadDeg + hemi * Math.abs(latDeg) * Math.cos(targetMagDeg * DEG)));
    }
  }
}

interface TurnWatch {
  legIndex: number;
  leg: CompassTurnLeg;
  dir: 1 | -1;
  /** Change the pilot means to make, as read on the compass before rolling in [deg, [0, 360)]. */
  intendedDeg: number;
  /** Turn the compass has shown since the roll-in, in the turn direction, unwrapped [deg]. */
  shownDeg: number;
  lastReading: number;
  cue: number;
  reading: number;
  decisionT: number;
}

/**
 * Flies a pilot script with a scripted pilot and reports each compass turn. Each compass turn becomes a turn
 * whose roll-out the pilot decides at every output sample once established. Before rolling in the pilot reads
 * the compass (straight and level, so it reads true apart from deviation) and takes the change to make,
 * intended = dir × (target − that reading) in [0, 360). In the turn the pilot follows how far the card has
 * turned (the reading's change in the turn direction, accumulated sample to sample, so the first swing the
 * wrong way and turns beyond 180° are counted right) and decides once the card has shown intended − x, where
 * x = dir × (target − cue) is how far before the target the technique's cue lies (x < 0: past it). The roll-out
 * begins reactionS later. Decisions are made at the output rate: fly at 10 Hz (the card moves about 0.3° per
 * sample) rather than 1 Hz (3°), and decimate if a 1 Hz log is wanted.
 * Deterministic for a deterministic compassReadingFn. Throws OptionError for bad pilot options or a bad script.
 */
export function flyScriptedPilot(script: PilotScript, pilot: ScriptedPilot): { truth: SynthTruth; turns: PilotTurnRecord[] } {
  const technique = pilot.technique;
  if (!['rolls-out-on-reading', 'uses-model-cue', 'rule-of-thumb'].includes(technique)) {
    throw new OptionError('technique', `unknown technique ${String(technique)}`);
  }
  const reactionS = pilot.reactionS ?? DEFAULT_REACTION_S;
  if (!(reactionS >= 0 && reactionS <= 10)) throw new OptionError('reactionS', `must be in [0, 10] s, got ${reactionS}`);
  if (pilot.normalLeadDeg !== undefined && !(pilot.normalLeadDeg >= 0 && pilot.normalLeadDeg <= 90)) {
    throw new OptionError('normalLeadDeg', `must be in [0, 90]°, got ${pilot.normalLeadDeg}`);
  }
  const magnetics = pilot.magnetics ?? { kind: 'wmm2025' };
  const field: FieldEvaluator = pilotFieldEvaluator(magnetics, script.start.t0);
  const compass = pilot.compassReadingFn ?? modelCompassReading({ magnetics });

  const watches: TurnWatch[] = [];
  const legs: ScriptLeg[] = script.legs.map((leg, legIndex) => {
    if (leg.kind !== 'compass-turn') return leg;
    if (!Number.isFinite(leg.toMagDeg)) throw new OptionError(`legs[${legIndex}].toMagDeg`, `must be finite, got ${leg.toMagDeg}`);
    const dir: 1 | -1 = leg.direction === 'right' ? 1 : -1;
    const w: TurnWatch = {
      legIndex, leg, dir, intendedDeg: NaN, shownDeg: 0, lastReading: NaN, cue: NaN, reading: NaN, decisionT: NaN,
    };
    watches.push(w);
    const rollS = leg.rollTimeS ?? DEFAULT_ROLL_S;
    const decide = (view: RolloutDecisionView): boolean => {
      const tr = view.truth;
      const i = view.index;
      if (!Number.isFinite(w.intendedDeg)) {
        // First look once established: what the card showed as the roll-in began.
        let first = i;
        while (first > 0 && tr.leg[first - 1] === tr.leg[i]) first--;
        const before = compass({ truth: tr, index: first });
        w.intendedDeg = wrap360(dir * (leg.toMagDeg - before));
        w.lastReading = before;
      }
      const f = field(tr.lat[i], tr.lon[i], tr.altM[i]);
      const rateDps = Math.abs(tr.turnRateDps[i]);
      const normalLead = pilot.normalLeadDeg ?? rateDps * (reactionS + rollS / 2);
      const cue = cueDeg(technique, leg.toMagDeg, dir, Math.abs(tr.bankDeg[i]), f.dipDeg, tr.lat[i], normalLead);
      const reading = compass(view);
      if (Number.isFinite(reading)) {
        w.shownDeg += dir * wrap180(reading - w.lastReading);
        w.lastReading = reading;
      }
      const x = dir * wrap180(leg.toMagDeg - cue);
      const reached = w.shownDeg >= w.intendedDeg - x;
      if (reached) {
        w.cue = cue;
        w.reading = reading;
        w.decisionT = tr.t[i];
      }
      return reached;
    };
    const rateDps = leg.bankDeg === undefined ? (leg.rateDps ?? 3) : undefined;
    const turn: TurnLeg = {
      kind: 'turn',
      direction: leg.direction,
      rolloutWhen: decide,
      reactionS,
      maxDurationS: leg.maxDurationS ?? 360 / (rateDps ?? 3) + rollS + 10,
      ...(leg.rateDps !== undefined ? { rateDps: leg.rateDps } : {}),
      ...(leg.bankDeg !== undefined ? { bankDeg: leg.bankDeg } : {}),
      ...(leg.rollTimeS !== undefined ? { rollTimeS: leg.rollTimeS } : {}),
      ...(leg.label !== undefined ? { label: leg.label } : {}),
    };
    return turn;
  });
  const truth = simulateFlight({ ...script, legs });
  const turns = watches.map((w): PilotTurnRecord => {
    const rec = truth.legs[w.legIndex];
    // Magnetic heading at the end of the turn, with the variation where the wings came level.
    const i = Math.max(0, rec.endIndex);
    const variation = field(truth.lat[i], truth.lon[i], truth.altM[i]).variationDeg;
    const rolloutMag = wrap360(rec.headingEndDegTrue - variation);
    return {
      legIndex: w.legIndex,
      ...(w.leg.label !== undefined ? { label: w.leg.label } : {}),
      technique,
      direction: w.leg.direction,
      targetMagDeg: wrap360(w.leg.toMagDeg),
      cueCompassDeg: w.cue,
      compassAtDecisionDeg: w.reading,
      decisionT: w.decisionT,
      rolloutStartT: rec.rolloutStartT ?? NaN,
      rolloutMagDeg: rolloutMag,
      rolloutErrorDeg: w.dir * wrap180(rolloutMag - w.leg.toMagDeg),
      timedOut: rec.timedOut === true,
    };
  });
  return { truth, turns };
}

