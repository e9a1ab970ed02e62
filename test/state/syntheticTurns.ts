// Test helper (not a test): steady flight built analytically, placed on the WGS-84 ellipsoid with
// GeographicLib, sampled with seeded Gaussian noise. Truth comes from the construction and GeographicLib,
// never from the code under test.
import geodesic from 'geographiclib-geodesic';
import type { FlightLog } from '../../src/log/flightLog.js';

const geod = geodesic.Geodesic.WGS84;
const D2R = Math.PI / 180;
const G = 9.80665; // standard gravity, BIPM

/** Seeded PRNG (mulberry32, public-domain construction by T. Ettinger) with Box–Muller normals. */
export function gaussianSource(seed: number): () => number {
  let a = seed >>> 0;
  const uniform = (): number => {
    a = (a + 0x6d2b79f5) >>> 0;
    let x = a;
    x = Math.imul(x ^ (x >>> 15), x | 1);
    x ^= x + Math.imul(x ^ (x >>> 7), x | 61);
    return ((x ^ (x >>> 14)) >>> 0) / 4294967296;
  };
  return () => {
    const u = Math.max(uniform(), 1e-300);
    return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * uniform());
  };
}

export interface FlightSpec {
  latDeg: number;
  lonDeg: number;
  altM: number;
  tasMs: number;
  /** TAS as a function of time [m/s] when it changes (default: constant tasMs). */
  tasMsAt?: (tS: number) => number;
  /** Heading as a function of time since start [deg true], with its rate [deg/s] (right +). */
  headingDeg: (tS: number) => number;
  rateDps: (tS: number) => number;
  windFromDeg: number;
  windMs: number;
  hz: number;
  durationS: number;
  noiseM: number;
  vNoiseM?: number;
  seed: number;
  t0?: number;
}

export interface SyntheticFlight {
  log: FlightLog;
  truth: { tS: Float64Array; headingDeg: Float64Array; bankDeg: Float64Array; trackDeg: Float64Array; gsMs: Float64Array; rateDps: Float64Array };
}

/**
 * Air path in a local plane: heading ψ(t), air velocity V(cos ψ, sin ψ), plus a steady wind; positions are
 * the time integral (trapezoid on a 1 ms grid), placed on the ellipsoid by geodesic Direct from the start
 * point along the plane azimuth and distance (an azimuthal equidistant placement: within a few km the
 * direction error is below 0.05°). Truth track and ground speed from GeographicLib Inverse between the
 * placed points at t ± 0.05 s; truth heading = azimuth of (ground velocity − wind); truth bank
 * tan φ = V ω / g (level coordinated turn, PHYSICS.md §7).
 */
export function makeFlight(s: FlightSpec): SyntheticFlight {
  const n = Math.floor(s.durationS * s.hz) + 1;
  const t0 = s.t0 ?? 1_780_000_000;
  const wN = -s.windMs * Math.cos(s.windFromDeg * D2R);
  const wE = -s.windMs * Math.sin(s.windFromDeg * D2R);
  const dt = 0.001;
  const V = s.tasMsAt ?? ((): number => s.tasMs);
  const place = (northM: number, eastM: number): { lat: number; lon: number } => {
    const d = Math.hypot(northM, eastM);
    if (d === 0) return { lat: s.latDeg, lon: s.lonDeg };
    const r = geod.Direct(s.latDeg, s.lonDeg, Math.atan2(eastM, northM) / D2R, d);
    return { lat: r.lat2!, lon: r.lon2! };
  };
  // Integrate the plane path on a fine grid.
  const steps = Math.ceil((s.durationS + 1) / dt);
  const pn = new Float64Array(steps + 1);
  const pe = new Float64Array(steps + 1);
  let prevN = V(0) * Math.cos(s.headingDeg(0) * D2R) + wN;
  let prevE = V(0) * Math.sin(s.headingDeg(0) * D2R) + wE;
  for (let k = 1; k <= steps; k++) {
    const h = s.headingDeg(k * dt) * D2R;
    const vn = V(k * dt) * Math.cos(h) + wN;
    const ve = V(k * dt) * Math.sin(h) + wE;
    pn[k] = pn[k - 1] + 0.5 * (prevN + vn) * dt;
    pe[k] = pe[k - 1] + 0.5 * (prevE + ve) * dt;
    prevN = vn;
    prevE = ve;
  }
  const at = (tS: number): { lat: number; lon: number } => {
    const x = tS / dt;
    const k = Math.min(steps - 1, Math.max(0, Math.floor(x)));
    const f = x - k;
    return place(pn[k] + f * (pn[k + 1] - pn[k]), pe[k] + f * (pe[k + 1] - pe[k]));
  };
  const rnd = gaussianSource(s.seed);
  const t = new Float64Array(n), lat = new Float64Array(n), lon = new Float64Array(n), altM = new Float64Array(n);
  const tS = new Float64Array(n), headingDeg = new Float64Array(n), bankDeg = new Float64Array(n);
  const trackDeg = new Float64Array(n), gsMs = new Float64Array(n), rateDps = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const ts = i / s.hz;
    tS[i] = ts;
    t[i] = t0 + ts;
    const p = at(ts);
    // Noise in metres north/east, moved with the geodesic too.
    const dn = s.noiseM * rnd();
    const de = s.noiseM * rnd();
    const d = Math.hypot(dn, de);
    if (d > 0) {
      const q = geod.Direct(p.lat, p.lon, Math.atan2(de, dn) / D2R, d);
      lat[i] = q.lat2!;
      lon[i] = q.lon2!;
    } else {
      lat[i] = p.lat;
      lon[i] = p.lon;
    }
    altM[i] = s.altM + (s.vNoiseM ?? s.noiseM) * rnd();
    const a = at(Math.max(0, ts - 0.05));
    const b = at(ts + 0.05);
    const inv = geod.Inverse(a.lat, a.lon, b.lat, b.lon);
    const trk = (inv.azi1! + inv.azi2!) / 2;
    const gs = inv.s12! / (ts >= 0.05 ? 0.1 : ts + 0.05);
    trackDeg[i] = ((trk % 360) + 360) % 360;
    gsMs[i] = gs;
    const vN = gs * Math.cos(trk * D2R) - wN;
    const vE = gs * Math.sin(trk * D2R) - wE;
    headingDeg[i] = ((Math.atan2(vE, vN) / D2R) % 360 + 360) % 360;
    rateDps[i] = s.rateDps(ts);
    bankDeg[i] = Math.atan((V(ts) * s.rateDps(ts) * D2R) / G) / D2R;
  }
  const log: FlightLog = {
    source: { format: 'csv', file: 'synthetic.csv', warnings: [], meta: {}, altDatum: 'ellipsoid' },
    t, lat, lon, altM,
    line: Int32Array.from({ length: n }, (_, i) => i + 2),
  };
  return { log, truth: { tS, headingDeg, bankDeg, trackDeg, gsMs, rateDps } };
}

/** The q-th quantile (0..1) of |values| over the finite entries, by sorting. */
export function absQuantile(values: ArrayLike<number>, q: number): number {
  const a: number[] = [];
  for (let i = 0; i < values.length; i++) if (Number.isFinite(values[i])) a.push(Math.abs(values[i]));
  a.sort((x, y) => x - y);
  if (a.length === 0) return NaN;
  return a[Math.min(a.length - 1, Math.floor(q * a.length))];
}
