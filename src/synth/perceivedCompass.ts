// What a scripted pilot reads on the compass during the simulation: the card model run over the flight so far.
import { DEFAULT_COMPASS_PROFILE, type CompassProfile } from '../compass/compassProfile.js';
import { simulateCompass } from '../compass/simulateCompass.js';
import { levelTurnReadingDeg } from '../compass/turningError.js';
import { wrap360 } from '../geo/angles.js';
import { decimalYearOf } from '../magnetic/wmm2025.js';
import { zoneOfHorizontalIntensity, type FieldAlongPath } from '../magnetic/fieldAlongPath.js';
import type { FieldEvaluator } from '../magnetic/wmm2025.js';
import type { RolloutDecisionView } from './flightScript.js';
import { pilotFieldEvaluator, type PilotMagnetics } from './pilotMagnetics.js';
import { truthToFlightState } from './truthToFlightState.js';

/** The compass reading [deg, [0, 360)] a pilot sees at the latest recorded row of the flight so far. */
export type CompassReadingFn = (view: RolloutDecisionView) => number;

/** Options of modelCompassReading. windowBeforeLegS: how far before the current leg the card starts (default 20 s). */
export interface ModelCompassOptions {
  magnetics?: PilotMagnetics;
  profile?: CompassProfile;
  deviation?: (compassDeg: number) => number;
  windowBeforeLegS?: number;
}

/**
 * The dynamic compass of src/compass (simulateCompass: pendulous card, tilt stop, period and damping, swirl,
 * deviation) run over the truth from `windowBeforeLegS` before the current leg to the latest row, in the field
 * of `magnetics` (default WMM2025). The card starts settled at the window's first row, which is exact when the
 * aircraft was in steady straight flight there. Field values are cached per row inside the returned function
 * (checked against the row's time, so one function may serve several flights); nothing is module-level.
 */
export function modelCompassReading(opts: ModelCompassOptions = {}): CompassReadingFn {
  const magnetics = opts.magnetics ?? { kind: 'wmm2025' };
  const profile = opts.profile ?? DEFAULT_COMPASS_PROFILE;
  const beforeS = opts.windowBeforeLegS ?? 20;
  let evaluator: FieldEvaluator | undefined;
  let evaluatorT0 = NaN;
  let cache = emptyField(0);
  let cachedT = new Float64Array(0);
  const legStart = new Map<number, number>();
  return (view) => {
    const tr = view.truth;
    const i = view.index;
    if (evaluator === undefined || evaluatorT0 !== tr.t[0]) {
      evaluator = pilotFieldEvaluator(magnetics, tr.t[0]);
      evaluatorT0 = tr.t[0];
      legStart.clear();
      cachedT = new Float64Array(0);
    }
    if (cachedT.length <= i) {
      const grown = emptyField(Math.max(2 * cachedT.length, i + 1, 64));
      for (const k of ['xNt', 'yNt', 'zNt', 'hNt', 'variationDeg', 'dipDeg'] as const) grown[k].set(cache[k]);
      grown.zone.set(cache.zone);
      const t = new Float64Array(grown.n).fill(NaN);
      t.set(cachedT);
      cache = grown;
      cachedT = t;
    }
    const leg = tr.leg[i];
    let first = legStart.get(leg);
    if (first === undefined) {
      first = i;
      while (first > 0 && tr.leg[first - 1] === leg) first--;
      legStart.set(leg, first);
    }
    const start = Math.max(0, first - Math.round(beforeS * tr.sampleRateHz));
    for (let r = start; r <= i; r++) {
      if (cachedT[r] === tr.t[r]) continue;
      const f = evaluator(tr.lat[r], tr.lon[r], tr.altM[r]);
      cache.xNt[r] = f.xNt;
      cache.yNt[r] = f.yNt;
      cache.zNt[r] = f.zNt;
      cache.hNt[r] = f.hNt;
      cache.variationDeg[r] = f.variationDeg;
      cache.dipDeg[r] = f.dipDeg;
      cache.zone[r] = zoneOfHorizontalIntensity(f.hNt);
      cachedT[r] = tr.t[r];
    }
    const field: FieldAlongPath = {
      n: i + 1 - start,
      xNt: cache.xNt.subarray(start, i + 1),
      yNt: cache.yNt.subarray(start, i + 1),
      zNt: cache.zNt.subarray(start, i + 1),
      hNt: cache.hNt.subarray(start, i + 1),
      variationDeg: cache.variationDeg.subarray(start, i + 1),
      dipDeg: cache.dipDeg.subarray(start, i + 1),
      zone: cache.zone.subarray(start, i + 1),
      model: magnetics.kind === 'wmm2025' ? 'WMM2025' : 'constant field',
      decimalYear: decimalYearOf(tr.t[0]),
    };
    const trace = simulateCompass(truthToFlightState(tr, start, i + 1), field, profile, opts.deviation);
    return trace.readingDeg[trace.n - 1];
  };
}

function emptyField(n: number): FieldAlongPath {
  return {
    n,
    xNt: new Float64Array(n),
    yNt: new Float64Array(n),
    zNt: new Float64Array(n),
    hNt: new Float64Array(n),
    variationDeg: new Float64Array(n),
    dipDeg: new Float64Array(n),
    zone: new Uint8Array(n),
    model: '',
    decimalYear: NaN,
  };
}

/**
 * The textbook static card at the latest row: the steady coordinated level-turn reading
 * tan ψc = (sin ψm cos φ − tan μ sin φ) / cos ψm (Williams, "Compass Errors", eq. 2, via src/compass
 * levelTurnReadingDeg) with ψm = true heading − variation, φ the bank, μ the dip of `magnetics`.
 * No lag, no swirl, no acceleration error: the compass of the handbook explanations.
 */
export function staticTurnCompassReading(magnetics: PilotMagnetics = { kind: 'wmm2025' }): CompassReadingFn {
  let evaluator: FieldEvaluator | undefined;
  let t0 = NaN;
  return (view) => {
    const tr = view.truth;
    const i = view.index;
    if (evaluator === undefined || t0 !== tr.t[0]) {
      evaluator = pilotFieldEvaluator(magnetics, tr.t[0]);
      t0 = tr.t[0];
    }
    const f = evaluator(tr.lat[i], tr.lon[i], tr.altM[i]);
    return levelTurnReadingDeg(wrap360(tr.headingDegTrue[i] - f.variationDeg), tr.bankDeg[i], f.dipDeg);
  };
}
