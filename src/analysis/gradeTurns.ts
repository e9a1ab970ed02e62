// Turns graded: target (plan or inferred), roll-out error, what the compass showed, and where the roll-out cue was.
import { G0_MS2, RAD } from '../constants.js';
import { wrap180, wrap360 } from '../geo/angles.js';
import type { LogWarning } from '../log/flightLog.js';
import type { CompassTrace } from '../compass/compassTrace.js';
import type { FieldAlongPath } from '../magnetic/fieldAlongPath.js';
import type { FlightState } from '../state/flightState.js';
import type { TurnResult } from './analysisTypes.js';
import { settledReading } from './compassSettling.js';
import type { ResolvedDebriefOptions } from './debriefOptions.js';
import type { TurnSpan } from './detectTurns.js';
import { DEFAULT_TARGET_CANDIDATES_DEG, inferTargetHeading } from './inferTarget.js';
import { magneticHeadingAt } from './magneticHeading.js';
import { cueHeadingMagDeg, modelCueCompassDeg, ruleOfThumbCueDeg } from './rolloutCue.js';
import { isNearStandardRate, timedTurnCheck } from './timedTurn.js';
import { matchPlanToTurns, type PlanRow } from './turnPlan.js';

const DEG = Math.PI / 180;

/** Inference looks at the heading held over this window [s] … */
export const INFER_WINDOW_S = 10;
/** … ending at the next turn, the end of the segment, or this long after the roll-out [s], whichever comes first. */
export const INFER_HORIZON_S = 120;

/** Circular mean of the magnetic heading over rows a…b (inclusive); NaN if none is finite. */
function meanMagDeg(state: FlightState, field: FieldAlongPath, compass: CompassTrace, a: number, b: number): number {
  let s = 0;
  let c = 0;
  for (let k = a; k <= b; k++) {
    const h = magneticHeadingAt(state, field, compass, k);
    if (!Number.isFinite(h)) continue;
    s += Math.sin(h * DEG);
    c += Math.cos(h * DEG);
  }
  return s === 0 && c === 0 ? NaN : wrap360(Math.atan2(s, c) * RAD);
}

/** Reading interpolated at time tq between rows k and k+1 (shortest way round). */
function readingAtT(t: Float64Array, r: Float64Array, k: number, tq: number): number {
  if (k + 1 >= t.length || !(t[k + 1] > t[k]) || !Number.isFinite(r[k + 1])) return r[k];
  const f = Math.min(1, Math.max(0, (tq - t[k]) / (t[k + 1] - t[k])));
  return wrap360(r[k] + f * wrap180(r[k + 1] - r[k]));
}

/**
 * Grades detected turns.
 *
 * Per turn: entry / roll-out magnetic heading ψm = true − variation (or compass.headingMagDeg); compass at the
 * roll-out and once settled (settledReading); target from the plan (matchPlanToTurns) or inferred from the
 * heading held afterwards (mean ψm over the last INFER_WINDOW_S before the next turn, the segment's end or
 * INFER_HORIZON_S after the roll-out; inferTargetHeading); rollout error = ψm at roll-out − target, wrapped; the
 * model's cue (modelCueCompassDeg at the steady phase's mean bank and the dip at the roll-out start, lead = the
 * measured roll-out heading change, or steady rate × (bank / defaultRollRateDps) / 2 when the roll-out was cut
 * short), plus the dynamic card's offset (reading − static, i.e. lag/swirl and deviation) at the steady-phase row
 * whose ψm is nearest the cue heading; the rule-of-thumb cue (ruleOfThumbCueDeg) with the same normal lead;
 * a timed-turn check where the plan gives timed_s or (timedTurns 'near-standard') the steady rate is near 3 °/s.
 * Warnings: `plan-rows-unmatched` (plan rows with no turn left), `turns-not-in-plan` (turns given inferred targets
 * although a plan was given), `turns-cut-short` (turns ended by a gap or the end of the log).
 */
// Method: ours (see the list above); closed forms from src/compass/turningError.ts (Williams 2001 eq. 2).
export function gradeTurns(
  state: FlightState, field: FieldAlongPath, compass: CompassTrace, spans: readonly TurnSpan[],
  plan: readonly PlanRow[] | undefined, o: ResolvedDebriefOptions,
): { turns: TurnResult[]; warnings: LogWarning[] } {
  const { t, lat, segment, tasMs } = state;
  const reading = compass.readingDeg;
  const n = state.n;
  const warnings: LogWarning[] = [];
  const match = plan ? matchPlanToTurns(plan, spans.map((s) => s.startT)) : undefined;
  const candidates = o.inferCandidatesDeg ?? DEFAULT_TARGET_CANDIDATES_DEG;
  const turns: TurnResult[] = [];
  let inferredWithPlan = 0;
  let cutShort = 0;
  spans.forEach((sp, k) => {
    const { startIndex: s, endIndex: e, dir } = sp;
    const next = k + 1 < spans.length ? spans[k + 1] : undefined;
    // Last row of the straight that follows: before the next turn and within the segment.
    let straightEnd = next ? next.startIndex : n - 1;
    while (straightEnd > e && segment[straightEnd] !== segment[e]) straightEnd--;
    const settleUntil = Math.min(t[e] + o.settleMaxS, t[straightEnd]);
    const settled = settledReading(t, reading, e, settleUntil, o.settleRateDps, o.settleQuietS);

    const entryMag = magneticHeadingAt(state, field, compass, s);
    const rolloutMag = magneticHeadingAt(state, field, compass, e);

    // Target.
    const r = match ? match.rowOfTurn[k] : -1;
    let targetMagDeg: number;
    let targetSource: 'plan' | 'inferred';
    let targetConfidence: number;
    let planLine = NaN;
    let plannedTimedS = NaN;
    if (plan && r >= 0) {
      targetMagDeg = plan[r].targetMagDeg;
      targetSource = 'plan';
      targetConfidence = 1;
      planLine = plan[r].line;
      plannedTimedS = plan[r].timedS;
    } else {
      const horizonT = Math.min(t[straightEnd], t[e] + INFER_HORIZON_S);
      let b = e;
      while (b + 1 <= straightEnd && t[b + 1] <= horizonT) b++;
      let a = b;
      while (a - 1 >= Math.max(e, settled.index) && t[b] - t[a - 1] <= INFER_WINDOW_S) a--;
      const held = b > e ? meanMagDeg(state, field, compass, Math.max(a, e), b) : rolloutMag;
      const inf = inferTargetHeading(Number.isFinite(held) ? held : rolloutMag, candidates);
      targetMagDeg = inf.targetMagDeg;
      targetSource = 'inferred';
      targetConfidence = inf.confidence;
      if (plan) inferredWithPlan++;
    }
    const rolloutErrorDeg = wrap180(rolloutMag - targetMagDeg);

    // Roll-out lead and the cues.
    let bank = sp.meanBankDeg;
    if (!Number.isFinite(bank)) bank = Math.atan((tasMs[sp.rolloutStartIndex] * sp.steadyRateDps * DEG) / G0_MS2) * RAD;
    const measuredDur = sp.endT - sp.rolloutStartT;
    let lead = sp.rolloutLeadDeg;
    let rolloutDurationS = measuredDur;
    let rolloutDurationSource: 'measured' | 'default' = 'measured';
    if (!sp.complete || !Number.isFinite(lead) || !(measuredDur > 0)) {
      rolloutDurationS = Math.abs(bank) / o.defaultRollRateDps;
      lead = (sp.steadyRateDps * rolloutDurationS) / 2;
      rolloutDurationSource = 'default';
      cutShort++;
    }
    const ro = sp.rolloutStartIndex;
    const dipDeg = field.dipDeg[ro];
    const latDeg = lat[ro];
    const cueMagDeg = cueHeadingMagDeg(targetMagDeg, dir, lead);
    const cueStatic = modelCueCompassDeg(targetMagDeg, dir, bank, dipDeg, lead);
    // Dynamic offset at the steady-phase row nearest the cue heading.
    let kBest = ro;
    let dBest = Infinity;
    for (let q = sp.rollInEndIndex; q <= ro; q++) {
      const d = Math.abs(wrap180(magneticHeadingAt(state, field, compass, q) - cueMagDeg));
      if (d < dBest) {
        dBest = d;
        kBest = q;
      }
    }
    const offset = wrap180(reading[kBest] - compass.staticDeg[kBest]);
    const cueCompassDeg = Number.isFinite(offset) ? wrap360(cueStatic + offset) : cueStatic;
    const ruleCue = ruleOfThumbCueDeg(targetMagDeg, dir, latDeg, dipDeg, lead);

    let timed: TurnResult['timed'];
    if (Number.isFinite(plannedTimedS)) {
      timed = timedTurnCheck(sp.halfOutT - sp.halfInT, sp.headingChangeDeg, o.toleranceDeg, plannedTimedS, 'plan');
    } else if (o.timedTurns === 'near-standard' && isNearStandardRate(sp.steadyRateDps, o.timedRateShare)) {
      timed = timedTurnCheck(sp.halfOutT - sp.halfInT, sp.headingChangeDeg, o.toleranceDeg, NaN, 'near-standard-rate');
    }

    turns.push({
      startIndex: s,
      endIndex: e,
      startT: sp.startT,
      endT: sp.endT,
      direction: sp.direction,
      headingChangeDeg: sp.headingChangeDeg,
      meanRateDps: sp.meanRateDps,
      peakBankDeg: sp.peakBankDeg,
      meanBankDeg: sp.meanBankDeg,
      entryMagDeg: entryMag,
      rolloutMagDeg: rolloutMag,
      compassAtRolloutDeg: reading[e],
      compassSettledDeg: settled.deg,
      targetMagDeg,
      targetSource,
      targetConfidence,
      rolloutErrorDeg,
      withinTolerance: Math.abs(rolloutErrorDeg) <= o.toleranceDeg,
      cueCompassDeg,
      ruleOfThumbCueDeg: ruleCue,
      ...(timed ? { timed } : {}),
      rollInEndIndex: sp.rollInEndIndex,
      rolloutStartIndex: ro,
      rollInEndT: sp.rollInEndT,
      rolloutStartT: sp.rolloutStartT,
      steadyRateDps: sp.steadyRateDps,
      rolloutLeadDeg: lead,
      rolloutDurationS,
      rolloutDurationSource,
      compassAtRolloutStartDeg: readingAtT(t, reading, ro, sp.rolloutStartT),
      compassSettledT: settled.t,
      compassSettledHow: settled.how,
      cueMagDeg,
      cueStaticCompassDeg: cueStatic,
      cueDifferenceDeg: wrap180(ruleCue - cueCompassDeg),
      latDeg,
      dipDeg,
      toleranceDeg: o.toleranceDeg,
      planLine,
    });
  });
  if (match && match.unmatchedRows.length > 0) {
    const lines = match.unmatchedRows.map((p) => p.line);
    warnings.push({
      code: 'plan-rows-unmatched',
      message: `${lines.length} plan row${lines.length === 1 ? ' has' : 's have'} no turn left to match (the flight has fewer turns than the plan, or an anchor time lies after the last turn).`,
      lines: lines.slice(0, 20),
      count: lines.length,
    });
  }
  if (inferredWithPlan > 0) {
    warnings.push({
      code: 'turns-not-in-plan',
      message: `${inferredWithPlan} turn${inferredWithPlan === 1 ? ' was' : 's were'} not covered by the plan; their targets were inferred from the heading held afterwards.`,
      count: inferredWithPlan,
    });
  }
  if (cutShort > 0) {
    warnings.push({
      code: 'turns-cut-short',
      message: `${cutShort} turn${cutShort === 1 ? ' was' : 's were'} cut short by a gap or the end of the log; the roll-out cue assumed a roll-out at ${o.defaultRollRateDps} °/s of roll.`,
      count: cutShort,
    });
  }
  return { turns, warnings };
}
