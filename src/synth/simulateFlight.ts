// Forward flight simulator: integrates a FlightScript over the WGS-84 ellipsoid and records the exact truth.
import { DEG, G0_MS2, RAD } from '../constants.js';
import { wrap360 } from '../geo/angles.js';
import { radiiOfCurvatureM } from '../geo/wgs84.js';
import { validateFlightScript, type FlightScript } from './flightScript.js';
import {
  legBreakpointsS, legDurationS, planLeg, pulseRate, pulseValue, type LegPlan,
} from './legPlan.js';
import { TRUTH_COLUMNS, type SynthLegRecord, type SynthTruth, type TruthColumn } from './synthTruth.js';
import { windProfile, type WindVectorMs } from './windProfile.js';

// State vector y: [lat rad, lon rad, h m (ellipsoidal), ψ rad (true heading, unwrapped), V m/s (TAS)].
const LAT = 0;
const LON = 1;
const ALT = 2;
const PSI = 3;
const TAS = 4;
const NY = 5;

/** Tolerance [s] for two times to count as the same instant (sample grid vs leg ends). */
const T_EPS = 1e-7;

interface Controls {
  omega: number; // heading rate [rad/s], right +
  tasRate: number; // dV/dt [m/s²]
  vs: number; // vertical speed, up + [m/s]
  vsRate: number; // d(vs)/dt [m/s²]
}

function controlsAt(p: LegPlan, s: number, out: Controls): Controls {
  out.omega = p.channel === 'turnRate' ? pulseValue(p, s) : 0;
  out.tasRate = p.channel === 'tasRate' ? pulseValue(p, s) : 0;
  out.vs = p.channel === 'verticalSpeed' ? pulseValue(p, s) : 0;
  out.vsRate = p.channel === 'verticalSpeed' ? pulseRate(p, s) : 0;
  return out;
}

/**
 * Kinematics of a zero-sideslip aircraft in a moving air mass, on the ellipsoid:
 * v_air = (V_h cos ψ, V_h sin ψ, −vs) with V_h = √(V² − vs²); v_ground = v_air + w(h);
 * φ' = v_N / (M + h), λ' = v_E / ((N + h) cos φ), h' = vs, ψ' = ω, V' = TAS rate
 * (M, N: meridian and prime-vertical radii of curvature, NIMA TR8350.2 eq. 4-1, 4-2).
 */
function derivative(y: Float64Array, c: Controls, wind: (altM: number) => WindVectorMs, dy: Float64Array): void {
  const vh = Math.sqrt(Math.max(y[TAS] * y[TAS] - c.vs * c.vs, 0));
  const w = wind(y[ALT]);
  const vN = vh * Math.cos(y[PSI]) + w.nMs;
  const vE = vh * Math.sin(y[PSI]) + w.eMs;
  const latDeg = y[LAT] * RAD;
  const { meridianM, primeVerticalM } = radiiOfCurvatureM(latDeg);
  dy[LAT] = vN / (meridianM + y[ALT]);
  dy[LON] = vE / ((primeVerticalM + y[ALT]) * Math.cos(y[LAT]));
  dy[ALT] = c.vs;
  dy[PSI] = c.omega;
  dy[TAS] = c.tasRate;
}

/** Growable output columns; `truth` is rebuilt on growth so a decision callback always sees current arrays. */
class Recorder {
  cols: Record<TruthColumn, Float64Array>;
  leg: Int32Array;
  n = 0;
  constructor(capacity: number) {
    this.cols = {} as Record<TruthColumn, Float64Array>;
    for (const c of TRUTH_COLUMNS) this.cols[c] = new Float64Array(capacity);
    this.leg = new Int32Array(capacity);
  }
  ensure(): void {
    if (this.n < this.leg.length) return;
    const cap = Math.max(16, this.leg.length * 2);
    for (const c of TRUTH_COLUMNS) {
      const a = new Float64Array(cap);
      a.set(this.cols[c]);
      this.cols[c] = a;
    }
    const l = new Int32Array(cap);
    l.set(this.leg);
    this.leg = l;
  }
  view(name: string, hz: number, legs: SynthLegRecord[], trim: boolean): SynthTruth {
    const cut = (a: Float64Array): Float64Array => (trim ? a.slice(0, this.n) : a);
    const out = { n: this.n, name, sampleRateHz: hz, leg: trim ? this.leg.slice(0, this.n) : this.leg, legs } as SynthTruth;
    for (const c of TRUTH_COLUMNS) out[c] = cut(this.cols[c]);
    return out;
  }
}

/**
 * Flies a script and returns the exact truth at the output rate (t = t0 + k / sampleRateHz, from t0 to the
 * last output instant not after the end of the last leg).
 * Method: classical fourth-order Runge–Kutta at ≥ integrationHz (default 50 Hz), stepping exactly onto every
 * output instant and every end of a control ramp, so each RK4 step sees a smooth right-hand side.
 * Output columns follow from the state and the controls in closed form: accelerations are the analytic time
 * derivative of the NED ground-velocity components, a = V_h'(cos ψ, sin ψ) + V_h ω(−sin ψ, cos ψ) +
 * (dw/dh)·vs, a_D = −vs' (the centripetal term is V_h ω; the NED frame's own rotation along the path is left
 * out); bank from coordinated flight tan φ = V ω / g with V = TAS (PHYSICS.md §7); pitch θ = γ + α cos φ with
 * γ = atan2(vs, V_h) and α = script.aoaDeg (PHYSICS.md §7). Pure and deterministic (a decided turn's callback
 * must be pure too). Throws OptionError for a bad script (see validateFlightScript).
 * Example: simulateFlight({ start: {t0, latDeg: 52.6, lonDeg: 0.4, altM: 600, headingDegTrue: 0, tasMs: 50},
 * legs: [{ kind: 'orbit', direction: 'right' }] }) → 123 rows at 1 Hz, a 360° standard-rate turn.
 */
export function simulateFlight(script: FlightScript): SynthTruth {
  validateFlightScript(script);
  const hz = script.sampleRateHz ?? 1;
  const intHz = script.integrationHz ?? 50;
  const hMax = 1 / Math.max(intHz, hz);
  const aoaRad = (script.aoaDeg ?? 0) * DEG;
  const wind = windProfile(script.wind);
  const name = script.name ?? 'synthetic flight';
  const t0 = script.start.t0;

  const y = new Float64Array(NY);
  y[LAT] = script.start.latDeg * DEG;
  y[LON] = script.start.lonDeg * DEG;
  y[ALT] = script.start.altM;
  y[PSI] = script.start.headingDegTrue * DEG;
  y[TAS] = script.start.tasMs;
  const k1 = new Float64Array(NY);
  const k2 = new Float64Array(NY);
  const k3 = new Float64Array(NY);
  const k4 = new Float64Array(NY);
  const yt = new Float64Array(NY);
  const c = { omega: 0, tasRate: 0, vs: 0, vsRate: 0 };

  const legs: SynthLegRecord[] = [];
  const rec = new Recorder(Math.max(16, Math.ceil(estimateDurationS(script) * hz) + 2));
  let k = 0; // next output row
  let tRel = 0; // seconds since t0

  // One RK4 step of length h from leg time s with plan p.
  const step = (p: LegPlan, s: number, h: number): void => {
    derivative(y, controlsAt(p, s, c), wind, k1);
    for (let j = 0; j < NY; j++) yt[j] = y[j] + 0.5 * h * k1[j];
    derivative(yt, controlsAt(p, s + 0.5 * h, c), wind, k2);
    for (let j = 0; j < NY; j++) yt[j] = y[j] + 0.5 * h * k2[j];
    derivative(yt, controlsAt(p, s + 0.5 * h, c), wind, k3);
    for (let j = 0; j < NY; j++) yt[j] = y[j] + h * k3[j];
    derivative(yt, controlsAt(p, s + h, c), wind, k4);
    for (let j = 0; j < NY; j++) y[j] += (h / 6) * (k1[j] + 2 * k2[j] + 2 * k3[j] + k4[j]);
  };

  const record = (p: LegPlan, s: number, legIndex: number): void => {
    rec.ensure();
    writeRow(rec, rec.n, t0 + k / hz, y, controlsAt(p, s, c), wind, aoaRad);
    rec.leg[rec.n] = legIndex;
    rec.n++;
    k++;
  };

  const all = script.legs;
  if (all.length === 0) {
    record(planLeg({ kind: 'straight', durationS: 0 }, stateOf(y), 'legs'), 0, 0);
  }
  for (let i = 0; i < all.length; i++) {
    const leg = all[i];
    const p = planLeg(leg, stateOf(y), `legs[${i}]`);
    const legStart = tRel;
    const startState = stateOf(y);
    let rolloutStartT = NaN;
    for (;;) {
      const legEnd = legStart + legDurationS(p);
      const last = i === all.length - 1;
      let target = legEnd;
      for (const b of legBreakpointsS(p)) {
        const tb = legStart + b;
        if (tb > tRel + T_EPS && tb < target) target = tb;
      }
      const tOut = k / hz;
      const outHere = tOut < target + T_EPS && (tOut < legEnd - T_EPS || last);
      if (outHere) target = Math.min(target, Math.max(tOut, tRel));
      const span = target - tRel;
      if (span > 0) {
        const nSub = Math.max(1, Math.ceil(span / hMax - 1e-9));
        const h = span / nSub;
        for (let j = 0; j < nSub; j++) step(p, tRel - legStart + j * h, h);
      }
      tRel = target;
      const s = tRel - legStart;
      if (outHere && Math.abs(tRel - tOut) <= T_EPS) {
        record(p, s, i);
        const established = s >= p.rampS - T_EPS && s <= p.rampS + p.holdS + T_EPS;
        if (!p.decided && p.decide !== undefined && established) {
          const view = { index: rec.n - 1, truth: rec.view(name, hz, legs, false) };
          if (p.decide(view)) {
            p.holdS = Math.min(p.holdS, Math.max(0, s - p.rampS) + p.reactionS);
            p.decided = true;
          }
        }
        continue;
      }
      if (tRel >= legEnd - T_EPS && !(last && k / hz <= legEnd + T_EPS)) break;
    }
    if (!p.decided) {
      p.decided = true;
      p.timedOut = true;
    }
    const endState = stateOf(y);
    if (p.channel === 'turnRate') rolloutStartT = t0 + legStart + p.rampS + p.holdS;
    legs.push(legRecord(leg, i, t0 + legStart, t0 + tRel, p, startState, endState, rolloutStartT));
  }
  const truth = rec.view(name, hz, legs, true);
  for (const r of legs) {
    const a = Math.max(0, Math.ceil((r.startT - t0) * hz - 1e-6));
    const b = Math.min(truth.n - 1, Math.floor((r.endT - t0) * hz + 1e-6));
    if (a <= b) {
      r.startIndex = a;
      r.endIndex = b;
    }
  }
  return truth;
}

function stateOf(y: Float64Array): { headingDegTrue: number; tasMs: number; altM: number } {
  return { headingDegTrue: wrap360(y[PSI] * RAD), tasMs: y[TAS], altM: y[ALT] };
}

function legRecord(
  leg: FlightScript['legs'][number], index: number, startT: number, endT: number, p: LegPlan,
  a: { headingDegTrue: number; tasMs: number; altM: number }, b: typeof a, rolloutStartT: number,
): SynthLegRecord {
  const r: SynthLegRecord = {
    index, kind: leg.kind, startT, endT, startIndex: -1, endIndex: -1,
    headingStartDegTrue: a.headingDegTrue, headingEndDegTrue: b.headingDegTrue,
    tasStartMs: a.tasMs, tasEndMs: b.tasMs, altStartM: a.altM, altEndM: b.altM,
  };
  if (leg.label !== undefined) r.label = leg.label;
  if (leg.kind === 'turn' || leg.kind === 'orbit') {
    r.direction = leg.direction;
    r.headingChangeDeg = Math.abs(p.amp) * (p.holdS + p.rampS) * RAD;
    r.rateDps = Math.abs(p.rateDps);
    r.bankDeg = Math.abs(p.bankDeg);
    r.rolloutStartT = rolloutStartT;
    if (p.decide !== undefined) r.timedOut = p.timedOut;
  }
  return r;
}

/** Output row from the state and the controls at one instant (closed forms; see simulateFlight). */
function writeRow(
  rec: Recorder, i: number, t: number, y: Float64Array, c: Controls, wind: (altM: number) => WindVectorMs, aoaRad: number,
): void {
  const V = y[TAS];
  const psi = y[PSI];
  const vh = Math.sqrt(Math.max(V * V - c.vs * c.vs, 0));
  const w = wind(y[ALT]);
  // Wind shear along the climb: central difference over ±0.5 m of height.
  const wUp = wind(y[ALT] + 0.5);
  const wDn = wind(y[ALT] - 0.5);
  const dwN = (wUp.nMs - wDn.nMs) * c.vs;
  const dwE = (wUp.eMs - wDn.eMs) * c.vs;
  const cp = Math.cos(psi);
  const sp = Math.sin(psi);
  const vN = vh * cp + w.nMs;
  const vE = vh * sp + w.eMs;
  const vD = -c.vs;
  const vhRate = vh > 0 ? (V * c.tasRate - c.vs * c.vsRate) / vh : 0;
  const aN = vhRate * cp - vh * c.omega * sp + dwN;
  const aE = vhRate * sp + vh * c.omega * cp + dwE;
  const aD = -c.vsRate;
  const bank = Math.atan((V * c.omega) / G0_MS2);
  const gamma = Math.atan2(c.vs, vh);
  const theta = gamma + aoaRad * Math.cos(bank);
  const col = rec.cols;
  col.t[i] = t;
  col.lat[i] = y[LAT] * RAD;
  col.lon[i] = wrapLonDeg(y[LON] * RAD);
  col.altM[i] = y[ALT];
  col.velN[i] = vN;
  col.velE[i] = vE;
  col.velD[i] = vD;
  col.accN[i] = aN;
  col.accE[i] = aE;
  col.accD[i] = aD;
  col.gsMs[i] = Math.hypot(vN, vE);
  col.trackDegTrue[i] = wrap360(Math.atan2(vE, vN) * RAD);
  col.headingDegTrue[i] = wrap360(psi * RAD);
  col.tasMs[i] = V;
  col.bankDeg[i] = bank * RAD;
  col.pitchDeg[i] = theta * RAD;
  col.turnRateDps[i] = c.omega * RAD;
  col.accelLongMs2[i] = Math.cos(theta) * (cp * aN + sp * aE) - Math.sin(theta) * aD;
  col.windN[i] = w.nMs;
  col.windE[i] = w.eMs;
}

function wrapLonDeg(lon: number): number {
  const w = wrap360(lon + 180) - 180;
  return w === -180 ? 180 : w;
}

/** Rough script length [s] for preallocation (decided turns count as their cap). */
function estimateDurationS(script: FlightScript): number {
  let s = 0;
  for (const leg of script.legs) {
    if (leg.kind === 'straight') s += leg.durationS;
    else if (leg.kind === 'orbit') s += 360 / (leg.rateDps ?? 3) + 4;
    else if (leg.kind === 'turn') s += leg.rolloutWhen !== undefined ? 180 : (leg.byDeg ?? 180) / (leg.rateDps ?? 3) + 4;
    else s += 60;
  }
  return s;
}
