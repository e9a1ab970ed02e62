// FlightScript: what the synthetic aircraft is told to fly, leg after leg. Checked by validateFlightScript.
import { OptionError } from '../errors.js';
import type { SynthTruth } from './synthTruth.js';

/** Where and how the flight starts. t0: UTC seconds since the Unix epoch; altM: height above the ellipsoid [m]. */
export interface ScriptStart {
  t0: number;
  latDeg: number;
  lonDeg: number;
  altM: number;
  /** Where the nose points at the start, true, [0, 360). */
  headingDegTrue: number;
  /** True airspeed at the start [m/s], > 0. */
  tasMs: number;
}

/** A wind that blows from `fromDegTrue` (true, [0, 360)) at `speedMs` [m/s, ≥ 0]. */
export interface WindFrom {
  fromDegTrue: number;
  speedMs: number;
}

/** Wind at listed heights [m]; linear in the north/east components between rows, held beyond the ends. */
export interface WindTable {
  table: Array<WindFrom & { altM: number }>;
}

/** Wind as any pure function of height above the ellipsoid [m]. */
export type WindOfAltitude = (altM: number) => WindFrom;

/** Constant wind, a height table, or a function of height. Omitted: calm. */
export type ScriptWind = WindFrom | WindTable | WindOfAltitude;

/**
 * What a scripted pilot may look at when deciding to roll out: the truth recorded so far
 * (rows 0 … n−1 filled, output rate) and the current output row.
 */
export interface RolloutDecisionView {
  /** Index of the row just recorded (the latest sample). */
  index: number;
  /** Columns recorded so far; only rows 0 … index are valid. */
  truth: SynthTruth;
}

/** Shared by turns and orbits: either a rate or a bank, plus the roll-in / roll-out time. */
export interface TurnStyle {
  direction: 'left' | 'right';
  /** Heading rate while established [deg/s], > 0. Default 3 (standard rate). Give this or bankDeg, not both. */
  rateDps?: number;
  /** Bank while established [deg], in (0, 75]; the rate follows from tan φ = V ω / g at the leg's TAS. */
  bankDeg?: number;
  /** Time to roll in (and to roll out) [s], ≥ 0. Default 2. The heading rate (and so the bank) ramps along a minimum-jerk smoothstep. */
  rollTimeS?: number;
}

/** Holds heading, speed and height for a time [s]. */
export interface StraightLeg {
  kind: 'straight';
  durationS: number;
  label?: string;
}

/**
 * A coordinated level turn. Exactly one of: byDeg (heading change, > 0, may exceed 360), toHeadingDegTrue
 * (turn the given way until that true heading), durationS (a timed turn: from the start of roll-in to the
 * start of roll-out, so the change is rate × duration), or rolloutWhen (a pilot's decision, see below).
 * rolloutWhen is asked at every output sample while established; once it returns true the roll-out begins
 * reactionS later (default 0). maxDurationS (default 600) bounds a turn that is never ended.
 */
export interface TurnLeg extends TurnStyle {
  kind: 'turn';
  byDeg?: number;
  toHeadingDegTrue?: number;
  durationS?: number;
  rolloutWhen?: (view: RolloutDecisionView) => boolean;
  reactionS?: number;
  maxDurationS?: number;
  label?: string;
}

/** A full 360° turn (wind-finding orbit). */
export interface OrbitLeg extends TurnStyle {
  kind: 'orbit';
  label?: string;
}

/** Level, constant-heading change of true airspeed to toTasMs at |accelMs2| (> 0); the sign follows the change. */
export interface SpeedLeg {
  kind: 'speed';
  toTasMs: number;
  accelMs2: number;
  /** Time for the acceleration to build up (and to die away) [s], ≥ 0. Default 1. */
  rampS?: number;
  label?: string;
}

/** Constant-heading, constant-TAS climb or descent to toAltM at |rateMs| (> 0) vertical speed. */
export interface ClimbLeg {
  kind: 'climb';
  toAltM: number;
  rateMs: number;
  /** Time for the vertical speed to build up (and to die away) [s], ≥ 0. Default 3. */
  rampS?: number;
  label?: string;
}

export type ScriptLeg = StraightLeg | TurnLeg | OrbitLeg | SpeedLeg | ClimbLeg;

/**
 * A whole flight. sampleRateHz: output rate (default 1; > 0, e.g. 10). integrationHz: internal step rate
 * (default 50, ≥ 50). aoaDeg: angle of attack added to the flight-path angle for the pitch column
 * (default 0; pitch = γ + α cos φ, PHYSICS.md §7).
 */
export interface FlightScript {
  name?: string;
  start: ScriptStart;
  wind?: ScriptWind;
  sampleRateHz?: number;
  integrationHz?: number;
  aoaDeg?: number;
  legs: ScriptLeg[];
}

/** Lowest true airspeed the simulator accepts [m/s] (a coordinated-turn bank needs a moving aircraft). */
export const MIN_TAS_MS = 5;

function finite(name: string, v: unknown): number {
  if (typeof v !== 'number' || !Number.isFinite(v)) throw new OptionError(name, `must be a finite number, got ${String(v)}`);
  return v;
}

function positive(name: string, v: unknown): number {
  const x = finite(name, v);
  if (!(x > 0)) throw new OptionError(name, `must be > 0, got ${x}`);
  return x;
}

function nonNegative(name: string, v: unknown): number {
  const x = finite(name, v);
  if (x < 0) throw new OptionError(name, `must be ≥ 0, got ${x}`);
  return x;
}

function checkWindFrom(name: string, w: WindFrom): void {
  finite(`${name}.fromDegTrue`, w.fromDegTrue);
  nonNegative(`${name}.speedMs`, w.speedMs);
}

function checkTurnStyle(name: string, leg: TurnStyle): void {
  if (leg.direction !== 'left' && leg.direction !== 'right') {
    throw new OptionError(`${name}.direction`, `must be 'left' or 'right', got ${String(leg.direction)}`);
  }
  if (leg.rateDps !== undefined && leg.bankDeg !== undefined) {
    throw new OptionError(name, 'give rateDps or bankDeg, not both');
  }
  if (leg.rateDps !== undefined) positive(`${name}.rateDps`, leg.rateDps);
  if (leg.bankDeg !== undefined) {
    const b = positive(`${name}.bankDeg`, leg.bankDeg);
    if (b > 75) throw new OptionError(`${name}.bankDeg`, `must be in (0, 75], got ${b}`);
  }
  if (leg.rollTimeS !== undefined) nonNegative(`${name}.rollTimeS`, leg.rollTimeS);
}

/**
 * Checks a script's parameters and throws an OptionError naming the first bad one
 * (e.g. `legs[3].rateDps: must be > 0, got 0`). Returns the script unchanged.
 */
export function validateFlightScript(script: FlightScript): FlightScript {
  const s = script.start;
  if (s === undefined || s === null) throw new OptionError('start', 'is required');
  finite('start.t0', s.t0);
  const lat = finite('start.latDeg', s.latDeg);
  if (Math.abs(lat) > 89) throw new OptionError('start.latDeg', `must be within ±89°, got ${lat}`);
  finite('start.lonDeg', s.lonDeg);
  finite('start.altM', s.altM);
  finite('start.headingDegTrue', s.headingDegTrue);
  const tas = finite('start.tasMs', s.tasMs);
  if (tas < MIN_TAS_MS) throw new OptionError('start.tasMs', `must be ≥ ${MIN_TAS_MS} m/s, got ${tas}`);
  if (script.sampleRateHz !== undefined) positive('sampleRateHz', script.sampleRateHz);
  if (script.integrationHz !== undefined) {
    const hz = finite('integrationHz', script.integrationHz);
    if (hz < 50) throw new OptionError('integrationHz', `must be ≥ 50, got ${hz}`);
  }
  if (script.aoaDeg !== undefined) {
    const a = finite('aoaDeg', script.aoaDeg);
    if (Math.abs(a) > 20) throw new OptionError('aoaDeg', `must be within ±20°, got ${a}`);
  }
  const w = script.wind;
  if (w !== undefined && typeof w !== 'function') {
    if ('table' in w) {
      if (!Array.isArray(w.table) || w.table.length === 0) throw new OptionError('wind.table', 'needs at least one row');
      w.table.forEach((row, i) => {
        finite(`wind.table[${i}].altM`, row.altM);
        checkWindFrom(`wind.table[${i}]`, row);
        if (i > 0 && !(row.altM > w.table[i - 1].altM)) {
          throw new OptionError(`wind.table[${i}].altM`, 'heights must increase down the table');
        }
      });
    } else checkWindFrom('wind', w);
  }
  if (!Array.isArray(script.legs)) throw new OptionError('legs', 'must be an array');
  script.legs.forEach((leg, i) => checkLeg(`legs[${i}]`, leg));
  return script;
}

function checkLeg(name: string, leg: ScriptLeg): void {
  switch (leg.kind) {
    case 'straight':
      nonNegative(`${name}.durationS`, leg.durationS);
      return;
    case 'orbit':
      checkTurnStyle(name, leg);
      return;
    case 'turn': {
      checkTurnStyle(name, leg);
      const given = [leg.byDeg, leg.toHeadingDegTrue, leg.durationS, leg.rolloutWhen].filter((v) => v !== undefined);
      if (given.length !== 1) {
        throw new OptionError(name, 'give exactly one of byDeg, toHeadingDegTrue, durationS, rolloutWhen');
      }
      if (leg.byDeg !== undefined) positive(`${name}.byDeg`, leg.byDeg);
      if (leg.toHeadingDegTrue !== undefined) finite(`${name}.toHeadingDegTrue`, leg.toHeadingDegTrue);
      if (leg.durationS !== undefined) positive(`${name}.durationS`, leg.durationS);
      if (leg.rolloutWhen !== undefined && typeof leg.rolloutWhen !== 'function') {
        throw new OptionError(`${name}.rolloutWhen`, 'must be a function');
      }
      if (leg.reactionS !== undefined) nonNegative(`${name}.reactionS`, leg.reactionS);
      if (leg.maxDurationS !== undefined) positive(`${name}.maxDurationS`, leg.maxDurationS);
      return;
    }
    case 'speed': {
      const v = finite(`${name}.toTasMs`, leg.toTasMs);
      if (v < MIN_TAS_MS) throw new OptionError(`${name}.toTasMs`, `must be ≥ ${MIN_TAS_MS} m/s, got ${v}`);
      positive(`${name}.accelMs2`, Math.abs(finite(`${name}.accelMs2`, leg.accelMs2)));
      if (leg.rampS !== undefined) nonNegative(`${name}.rampS`, leg.rampS);
      return;
    }
    case 'climb':
      finite(`${name}.toAltM`, leg.toAltM);
      positive(`${name}.rateMs`, Math.abs(finite(`${name}.rateMs`, leg.rateMs)));
      if (leg.rampS !== undefined) nonNegative(`${name}.rampS`, leg.rampS);
      return;
    default:
      throw new OptionError(`${name}.kind`, `unknown leg kind ${String((leg as { kind: unknown }).kind)}`);
  }
}
