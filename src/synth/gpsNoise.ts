// From simulated truth to a recorded-looking FlightLog: seeded GPS position noise, spikes and dropouts.
import { DEG, RAD } from '../constants.js';
import { OptionError } from '../errors.js';
import { wrap360 } from '../geo/angles.js';
import { radiiOfCurvatureM } from '../geo/wgs84.js';
import type { FlightLog, LogFormat, LogMeta } from '../log/flightLog.js';
import { mulberry32, seededNormal } from './seededRandom.js';
import type { SynthTruth } from './synthTruth.js';

/** A position outlier added to the row nearest `t` (UTC s): offsets north, east and up [m]. */
export interface GpsSpike {
  t: number;
  northM: number;
  eastM: number;
  upM?: number;
}

/** Rows with t0 ≤ t < t1 (UTC s) are left out of the log, as when the receiver loses its fix. */
export interface GpsDropout {
  t0: number;
  t1: number;
}

/**
 * Options of toFlightLog. Sigmas are 1-sigma of the stationary error per axis [m] (north and east each
 * get posSigmaM). The error on each axis is the sum of two independent parts:
 *  - a first-order Gauss–Markov process (an exponentially correlated, mean-reverting random walk) with
 *    correlation time correlationTimeS (default 60 s) carrying (1 − whiteShare) of the variance: it is what
 *    makes GPS tracks wander smoothly (slowly changing satellite geometry and atmospheric delays);
 *  - white noise carrying whiteShare (default 0.25, range [0, 1]) of the variance: receiver jitter.
 * A pure random walk is not used because its variance grows without bound; over times short against
 * correlationTimeS the Gauss–Markov part behaves like one [GPS error modelling: common practice; the
 * discrete form b_k = e^(−Δt/τ) b_(k−1) + σ_b √(1 − e^(−2Δt/τ)) w_k is exact for any Δt].
 * velocity: adds gsMs / trackDegTrue columns from the true ground velocity plus white noise sigmaMs per
 * horizontal axis (as a receiver's Doppler velocity). airData: copies the true heading (true reference),
 * bank, pitch and TAS into headingDeg / rollDeg / pitchDeg / tasMs, without noise.
 */
export interface GpsNoiseOptions {
  posSigmaM: number;
  altSigmaM: number;
  seed: number;
  file: string;
  format: LogFormat;
  correlationTimeS?: number;
  whiteShare?: number;
  dropouts?: GpsDropout[];
  spikes?: GpsSpike[];
  velocity?: { sigmaMs: number };
  airData?: boolean;
  meta?: LogMeta;
  altDatum?: FlightLog['source']['altDatum'];
}

function check(name: string, v: number, min: number, max = Infinity): void {
  if (!Number.isFinite(v) || v < min || v > max) {
    throw new OptionError(name, `must be a number in [${min}, ${max}], got ${String(v)}`);
  }
}

/**
 * Turns truth into the FlightLog a receiver would have written: noisy positions (model above), spikes,
 * dropouts; `line` holds the truth row + 1 of each kept row, so tests can find the truth behind any row.
 * The noise of every truth row is drawn in row order before dropouts are applied, so a dropout never shifts
 * the noise of the other rows. Pure and deterministic for a given seed. Throws OptionError for bad options.
 * Example: toFlightLog(truth, { posSigmaM: 2, altSigmaM: 3, seed: 7, file: 'x.gpx', format: 'gpx' }).
 */
export function toFlightLog(truth: SynthTruth, opts: GpsNoiseOptions): FlightLog {
  check('posSigmaM', opts.posSigmaM, 0);
  check('altSigmaM', opts.altSigmaM, 0);
  check('seed', opts.seed, -(2 ** 31), 2 ** 32);
  const tauS = opts.correlationTimeS ?? 60;
  check('correlationTimeS', tauS, 1e-3);
  const share = opts.whiteShare ?? 0.25;
  check('whiteShare', share, 0, 1);
  if (opts.velocity !== undefined) check('velocity.sigmaMs', opts.velocity.sigmaMs, 0);
  for (const [i, d] of (opts.dropouts ?? []).entries()) {
    check(`dropouts[${i}].t0`, d.t0, -Infinity);
    if (!(d.t1 > d.t0)) throw new OptionError(`dropouts[${i}].t1`, `must be after t0, got ${d.t1}`);
  }

  const n = truth.n;
  const normal = seededNormal(opts.seed);
  const noise = { n: new Float64Array(n), e: new Float64Array(n), u: new Float64Array(n) };
  const sigmas = [
    { out: noise.n, s: opts.posSigmaM },
    { out: noise.e, s: opts.posSigmaM },
    { out: noise.u, s: opts.altSigmaM },
  ];
  const gm = [0, 0, 0];
  for (let i = 0; i < n; i++) {
    const dt = i === 0 ? Infinity : truth.t[i] - truth.t[i - 1];
    const phi = Math.exp(-dt / tauS);
    for (let a = 0; a < 3; a++) {
      const { out, s } = sigmas[a];
      const sB = s * Math.sqrt(1 - share);
      const sW = s * Math.sqrt(share);
      gm[a] = phi * gm[a] + sB * Math.sqrt(1 - phi * phi) * normal();
      out[i] = gm[a] + sW * normal();
    }
  }
  for (const [j, sp] of (opts.spikes ?? []).entries()) {
    const i = nearestRow(truth, sp.t);
    if (i < 0) throw new OptionError(`spikes[${j}].t`, `no row within half a sample of ${sp.t}`);
    noise.n[i] += sp.northM;
    noise.e[i] += sp.eastM;
    noise.u[i] += sp.upM ?? 0;
  }

  const keep: number[] = [];
  const drops = opts.dropouts ?? [];
  for (let i = 0; i < n; i++) {
    if (!drops.some((d) => truth.t[i] >= d.t0 && truth.t[i] < d.t1)) keep.push(i);
  }
  const m = keep.length;
  const log: FlightLog = {
    source: {
      format: opts.format,
      file: opts.file,
      warnings: [],
      meta: { ...(opts.meta ?? {}) },
      altDatum: opts.altDatum ?? 'ellipsoid',
    },
    t: new Float64Array(m),
    lat: new Float64Array(m),
    lon: new Float64Array(m),
    altM: new Float64Array(m),
    line: new Int32Array(m),
  };
  const vel = opts.velocity;
  // The velocity noise has its own stream, so adding velocity columns leaves the positions unchanged.
  const velRandom = seededNormal((opts.seed ^ 0x5bd1e995) >>> 0);
  const gs = vel !== undefined ? new Float64Array(m) : undefined;
  const track = vel !== undefined ? new Float64Array(m) : undefined;
  const air = opts.airData === true;
  const hdg = air ? new Float64Array(m) : undefined;
  const roll = air ? new Float64Array(m) : undefined;
  const pitch = air ? new Float64Array(m) : undefined;
  const tas = air ? new Float64Array(m) : undefined;
  for (let j = 0; j < m; j++) {
    const i = keep[j];
    const { meridianM, primeVerticalM } = radiiOfCurvatureM(truth.lat[i]);
    const h = truth.altM[i];
    log.t[j] = truth.t[i];
    log.lat[j] = truth.lat[i] + (noise.n[i] / (meridianM + h)) * RAD;
    log.lon[j] = truth.lon[i] + (noise.e[i] / ((primeVerticalM + h) * Math.cos(truth.lat[i] * DEG))) * RAD;
    log.altM[j] = h + noise.u[i];
    log.line[j] = i + 1;
    if (vel !== undefined && gs !== undefined && track !== undefined) {
      const vN = truth.velN[i] + vel.sigmaMs * velRandom();
      const vE = truth.velE[i] + vel.sigmaMs * velRandom();
      gs[j] = Math.hypot(vN, vE);
      track[j] = wrap360(Math.atan2(vE, vN) * RAD);
    }
    if (hdg !== undefined && roll !== undefined && pitch !== undefined && tas !== undefined) {
      hdg[j] = truth.headingDegTrue[i];
      roll[j] = truth.bankDeg[i];
      pitch[j] = truth.pitchDeg[i];
      tas[j] = truth.tasMs[i];
    }
  }
  if (gs !== undefined && track !== undefined) {
    log.gsMs = gs;
    log.trackDegTrue = track;
  }
  if (hdg !== undefined && roll !== undefined && pitch !== undefined && tas !== undefined) {
    log.headingDeg = hdg;
    log.headingRef = 'true';
    log.rollDeg = roll;
    log.pitchDeg = pitch;
    log.tasMs = tas;
  }
  return log;
}

/** Row whose time is nearest t and within half a sample of it; −1 when none is. */
function nearestRow(truth: SynthTruth, t: number): number {
  if (truth.n === 0 || !Number.isFinite(t)) return -1;
  const i = Math.round((t - truth.t[0]) * truth.sampleRateHz);
  if (i < 0 || i >= truth.n) return -1;
  return Math.abs(truth.t[i] - t) <= 0.5 / truth.sampleRateHz + 1e-9 ? i : -1;
}

/**
 * `count` spikes of `sizeM` metres at seeded random rows (never the first or last, never twice the same row)
 * and random bearings, for tests of outlier rejection. Throws OptionError if count exceeds the inner rows.
 */
export function randomSpikes(truth: SynthTruth, count: number, sizeM: number, seed: number): GpsSpike[] {
  check('count', count, 0, Math.max(0, truth.n - 2));
  check('sizeM', sizeM, 0);
  const u = mulberry32(seed);
  const rows = new Set<number>();
  while (rows.size < count) rows.add(1 + Math.floor(u() * (truth.n - 2)));
  return [...rows]
    .sort((a, b) => a - b)
    .map((i) => {
      const b = 2 * Math.PI * u();
      return { t: truth.t[i], northM: sizeM * Math.cos(b), eastM: sizeM * Math.sin(b) };
    });
}
