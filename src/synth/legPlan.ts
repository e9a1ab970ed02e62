// Turns a script leg into a smooth control pulse on one channel (heading rate, TAS rate or vertical speed).
import { DEG, G0_MS2, STANDARD_RATE_DPS } from '../constants.js';
import { OptionError } from '../errors.js';
import { wrap360 } from '../geo/angles.js';
import type { ScriptLeg, TurnLeg } from './flightScript.js';

/** The control channel a leg drives: heading rate ω [rad/s], TAS rate [m/s²] or vertical speed (up +) [m/s]. */
export type ControlChannel = 'none' | 'turnRate' | 'tasRate' | 'verticalSpeed';

/**
 * A smooth pulse: the channel ramps 0 → amp over rampS along the quintic smoothstep S(u) = 10u³ − 15u⁴ + 6u⁵
 * (the minimum-jerk point-to-point profile: T. Flash, N. Hogan, J. Neurosci. 5(7):1688-1703, 1985), holds amp
 * for holdS, and ramps back to 0 the same way. Value, first and second derivative are continuous, so the
 * acceleration and its rate (jerk) never jump. ∫₀¹ S du = 1/2, so the integral is amp·(holdS + rampS) exactly
 * and a leg reaches its target heading, speed or height whatever the ramp.
 * holdS may be provisional (decided turns) until `decided` is set.
 */
export interface LegPlan {
  channel: ControlChannel;
  amp: number;
  rampS: number;
  holdS: number;
  /** Straight legs only: the leg length [s]; other legs last 2·rampS + holdS. */
  straightS: number;
  /** Decided turns: the callback, the reaction delay [s], and whether the roll-out time is fixed yet. */
  decide?: TurnLeg['rolloutWhen'];
  reactionS: number;
  decided: boolean;
  timedOut: boolean;
  /** Turns: the established bank [deg] and rate [deg/s], signed right +. */
  bankDeg: number;
  rateDps: number;
}

/** Leg duration [s] under the current plan (a decided turn's provisional hold counts until it is decided). */
export function legDurationS(p: LegPlan): number {
  return p.channel === 'none' ? p.straightS : 2 * p.rampS + p.holdS;
}

/** Times within the leg [s] where a piece of the pulse ends (the integrator steps exactly onto them). */
export function legBreakpointsS(p: LegPlan): number[] {
  if (p.channel === 'none') return [p.straightS];
  return [p.rampS, p.rampS + p.holdS, 2 * p.rampS + p.holdS];
}

/** Quintic smoothstep S(u) on [0, 1] and its derivative S'(u) = 30u²(1 − u)². */
function smooth(u: number): number {
  return u * u * u * (10 + u * (-15 + 6 * u));
}
function smoothRate(u: number): number {
  const v = u * (1 - u);
  return 30 * v * v;
}

/** Value of the pulse at leg time s [s]: smoothstep up, hold, smoothstep down; 0 outside. */
export function pulseValue(p: LegPlan, s: number): number {
  if (p.channel === 'none' || s <= 0) return 0;
  const r = p.rampS;
  if (s < r) return p.amp * smooth(s / r);
  if (s <= r + p.holdS) return p.amp;
  const u = s - r - p.holdS;
  if (u < r) return p.amp * (1 - smooth(u / r));
  return 0;
}

/** Time derivative of the pulse at leg time s [channel unit per s]. */
export function pulseRate(p: LegPlan, s: number): number {
  if (p.channel === 'none' || s <= 0) return 0;
  const r = p.rampS;
  if (s < r) return (p.amp / r) * smoothRate(s / r);
  if (s <= r + p.holdS) return 0;
  const u = s - r - p.holdS;
  if (u < r) return -(p.amp / r) * smoothRate(u / r);
  return 0;
}

/** Amplitude and hold so that amp·(hold + ramp) = total, with |amp| ≤ maxAmp (amp shrinks for short changes). */
function shape(total: number, maxAmp: number, rampS: number): { amp: number; holdS: number } {
  const sign = total < 0 ? -1 : 1;
  const mag = Math.abs(total);
  if (mag === 0) return { amp: 0, holdS: 0 };
  if (mag >= maxAmp * rampS) return { amp: sign * maxAmp, holdS: mag / maxAmp - rampS };
  return { amp: (sign * mag) / rampS, holdS: 0 };
}

const DEFAULT_ROLL_S = 2;
const DEFAULT_SPEED_RAMP_S = 1;
const DEFAULT_CLIMB_RAMP_S = 3;
const DEFAULT_MAX_TURN_S = 600;

/** Current aircraft state a leg is planned from. */
export interface PlanState {
  headingDegTrue: number;
  tasMs: number;
  altM: number;
}

/**
 * Plans a leg from the state at its start. Turns: ω from rateDps (default standard rate, FAA-H-8083-15B)
 * or from bankDeg via tan φ = V ω / g (PHYSICS.md §7); bank for a given rate the same way.
 * Throws OptionError (naming `name`) when a climb rate is not below the TAS.
 */
export function planLeg(leg: ScriptLeg, st: PlanState, name: string): LegPlan {
  const base: LegPlan = {
    channel: 'none', amp: 0, rampS: 0, holdS: 0, straightS: 0, reactionS: 0, decided: true, timedOut: false,
    bankDeg: 0, rateDps: 0,
  };
  switch (leg.kind) {
    case 'straight':
      return { ...base, straightS: leg.durationS };
    case 'speed': {
      const rampS = leg.rampS ?? DEFAULT_SPEED_RAMP_S;
      return { ...base, channel: 'tasRate', rampS, ...shape(leg.toTasMs - st.tasMs, Math.abs(leg.accelMs2), rampS) };
    }
    case 'climb': {
      const rampS = leg.rampS ?? DEFAULT_CLIMB_RAMP_S;
      const rate = Math.abs(leg.rateMs);
      if (rate >= 0.5 * st.tasMs) {
        throw new OptionError(`${name}.rateMs`, `must be below half the TAS (${(0.5 * st.tasMs).toFixed(1)} m/s), got ${rate}`);
      }
      return { ...base, channel: 'verticalSpeed', rampS, ...shape(leg.toAltM - st.altM, rate, rampS) };
    }
    case 'turn':
    case 'orbit': {
      const rampS = leg.rollTimeS ?? DEFAULT_ROLL_S;
      const sign = leg.direction === 'right' ? 1 : -1;
      const omegaMax =
        leg.bankDeg !== undefined ? (G0_MS2 * Math.tan(leg.bankDeg * DEG)) / st.tasMs : (leg.rateDps ?? STANDARD_RATE_DPS) * DEG;
      let changeRad: number;
      let decide: TurnLeg['rolloutWhen'];
      let maxS = 0;
      if (leg.kind === 'orbit') changeRad = 2 * Math.PI;
      else if (leg.byDeg !== undefined) changeRad = leg.byDeg * DEG;
      else if (leg.durationS !== undefined) changeRad = omegaMax * leg.durationS;
      else if (leg.toHeadingDegTrue !== undefined) {
        const d = sign > 0 ? leg.toHeadingDegTrue - st.headingDegTrue : st.headingDegTrue - leg.toHeadingDegTrue;
        changeRad = wrap360(d) * DEG;
      } else {
        decide = leg.rolloutWhen;
        maxS = leg.maxDurationS ?? DEFAULT_MAX_TURN_S;
        changeRad = omegaMax * Math.max(maxS - rampS, 0);
      }
      const { amp, holdS } = shape(changeRad, omegaMax, rampS);
      const omega = sign * amp;
      return {
        ...base,
        channel: 'turnRate',
        amp: omega,
        rampS,
        holdS,
        decide,
        reactionS: leg.kind === 'turn' ? (leg.reactionS ?? 0) : 0,
        decided: decide === undefined,
        rateDps: omega / DEG,
        bankDeg: Math.atan((st.tasMs * omega) / G0_MS2) / DEG,
      };
    }
  }
}
