// A leg flown on the compass: cross-track from compass error and from wind, against closed forms (constant error,
// constant wind: −V T sin e and w⊥ T) and positions measured with GeographicLib (meridian arcs on WGS-84).
import geodesic from 'geographiclib-geodesic';
import { describe, expect, it } from 'vitest';
import { analyseDebrief } from '../../src/analysis/analyseDebrief.js';
import { isometricLatitude, rhumbOffsetM } from '../../src/analysis/rhumbOffset.js';
import { KT_MS } from '../../src/constants.js';
import { reconstructState } from '../../src/state/reconstructState.js';
import { toFlightLog } from '../../src/synth/gpsNoise.js';
import { simulateFlight } from '../../src/synth/simulateFlight.js';
import { truthToFlightState } from '../../src/synth/truthToFlightState.js';
import type { FlightState } from '../../src/state/flightState.js';
import { DEG, traceFromReadings, uniformField, wrap360 } from './lessonFixtures.js';

const geod = geodesic.Geodesic.WGS84;
/** Signed meridian arc from latitude a to b at one longitude [m], north + (GeographicLib inverse along a meridian). */
const meridianArcM = (aDeg: number, bDeg: number, lonDeg: number) => Math.sign(bDeg - aDeg) * geod.Inverse(aDeg, lonDeg, bDeg, lonDeg).s12;

// The leg: the pilot holds 090 on a compass reading 6° high (deviation −6, westerly), so the aircraft heads 084;
// wind from 000 at 15 kt pushes it south. TAS 50 m/s, 600 s, variation 0. Right of the believed track (090) = south.
const V = 50;
const T = 600;
const ERR = 6;
const WIND = 15 * KT_MS;
const t0 = 1.8e9;
const truth = simulateFlight({
  start: { t0, latDeg: 52.6, lonDeg: 0.4, altM: 600, headingDegTrue: 90 - ERR, tasMs: V },
  wind: { fromDegTrue: 0, speedMs: WIND },
  sampleRateHz: 1,
  legs: [{ kind: 'straight', durationS: T }],
});

function compassOn(state: FlightState, wanderDeg = (_i: number) => 0) {
  const n = state.n;
  const field = uniformField(n, 19000, 67, 0);
  const mag = Float64Array.from(state.headingDegTrue, (h) => wrap360(h));
  const reading = Float64Array.from(mag, (m, i) => wrap360(m + ERR + wanderDeg(i)));
  const dev = Float64Array.from(mag, (_m, i) => ERR + wanderDeg(i));
  return { field, compass: traceFromReadings(mag, reading, { errDeviationDeg: dev }) };
}

const compassPart = -V * T * Math.sin(ERR * DEG); // −3135.8 m: reading high → aircraft left of the believed track
const windPart = WIND * T; // wind toward 180, across a 090 track: to the right, +4630 m
const observedGeo = -meridianArcM(truth.lat[0], truth.lat[truth.n - 1], truth.lon[0]); // south of the start parallel = right

describe('excursion on a leg with a known compass error and a known wind', () => {
  const state = truthToFlightState(truth);
  const { field, compass } = compassOn(state);
  const { analysis, warnings } = analyseDebrief(state, field, compass, { excursion: { startT: t0, endT: t0 + T } });
  const [x] = analysis.excursions;

  it('the reference is the believed track: held reading 090 + variation 0', () => {
    expect(analysis.excursions.length).toBe(1);
    expect(x.source).toBe('option');
    expect(x.heldCompassDeg).toBeCloseTo(90, 9);
    expect(x.refTrackDegTrue).toBeCloseTo(90, 9);
    expect(x.meanCompassErrorDeg).toBeCloseTo(ERR, 9);
  });
  it('compass part = −V T sin(error) = −3135.8 m (left), wind part = w⊥ T = +4630 m (right)', () => {
    expect(x.compassCrossTrackM).toBeCloseTo(compassPart, 0);
    expect(x.windCrossTrackM).toBeCloseTo(windPart, 0);
    expect(x.headingCrossTrackM).toBeCloseTo(0, 6);
  });
  it('observed cross-track from the positions matches GeographicLib\'s meridian arc (within 1 m of 1494 m)', () => {
    expect(Math.abs(x.observedCrossTrackM - observedGeo)).toBeLessThan(1);
    expect(observedGeo).toBeCloseTo(compassPart + windPart, -1);
  });
  it('the attributed parts add up to the observed displacement within the stated tolerance (max(25 m, 0.5 % of the along-track))', () => {
    expect(x.closureToleranceM).toBeCloseTo(0.005 * x.alongTrackM!, 6);
    expect(Math.abs(x.closureErrorM!)).toBeLessThan(1); // measured: well inside the tolerance
    expect(x.closes).toBe(true);
    expect(x.residualCrossTrackM).toBeCloseTo(x.observedCrossTrackM - x.compassCrossTrackM - x.windCrossTrackM, 9);
    expect(warnings.filter((w) => w.code.startsWith('excursion'))).toEqual([]);
  });
  it('the believed track ends where heading 090 plus the wind would have taken the aircraft (GeographicLib: 4630 m south, 30 km east)', () => {
    const bt = x.believedTrack!;
    expect(bt.latDeg.length).toBe(state.n);
    const end = bt.latDeg.length - 1;
    expect(-meridianArcM(truth.lat[0], bt.latDeg[end], truth.lon[0])).toBeCloseTo(windPart, -1);
    // East distance on the parallel of the mean latitude, at the surface (the flight is 600 m up: factor N/(N + h)).
    const midLat = (truth.lat[0] + bt.latDeg[end]) / 2;
    const east = geod.Inverse(midLat, truth.lon[0], midLat, bt.lonDeg[end]).s12;
    expect(Math.abs(east - V * T * (1 - 600 / 6.39e6))).toBeLessThan(2);
  });
  it('the along-track distance is V T cos(error) (the wind is square to the track)', () => {
    expect(x.alongTrackM).toBeCloseTo(V * T * Math.cos(ERR * DEG), 0);
  });
});

describe('with a planned route (a rhumb line 500 m north of the start, along 090)', () => {
  const state = truthToFlightState(truth);
  const { field, compass } = compassOn(state);
  const wp = geod.Direct(truth.lat[0], truth.lon[0], 0, 500);
  const route = { lat: new Float64Array([wp.lat2, wp.lat2]), lon: new Float64Array([truth.lon[0] - 0.1, truth.lon[0] + 1]), names: ['A', 'B'] };
  const [x] = analyseDebrief(state, field, compass, { excursion: { startT: t0, endT: t0 + T }, route }).analysis.excursions;
  it('cross-track against the route: +500 m at the start, +500 + 1494 m at the end, split into compass, wind and heading', () => {
    const r = x.route!;
    expect(r.legIndex).toBe(0);
    expect(r.legTrackDegTrue).toBeCloseTo(90, 9);
    expect(r.startCrossTrackM).toBeCloseTo(500, 0);
    expect(Math.abs(r.endCrossTrackM - (500 + observedGeo))).toBeLessThan(1.5);
    expect(r.compassM).toBeCloseTo(compassPart, 0);
    expect(r.windM).toBeCloseTo(windPart, 0);
    expect(r.headingM).toBeCloseTo(0, 6);
    expect(Math.abs(r.residualM)).toBeLessThan(1.5);
  });
});

describe('closure under realistic conditions', () => {
  it('a held reading wandering ±2° (period 90 s) moves its effect into the heading part; the sum still closes', () => {
    const state = truthToFlightState(truth);
    const { field, compass } = compassOn(state, (i) => 2 * Math.sin((2 * Math.PI * i) / 90));
    const [x] = analyseDebrief(state, field, compass, { excursion: { startT: t0, endT: t0 + T } }).analysis.excursions;
    expect(Math.abs(x.closureErrorM!)).toBeLessThan(1);
    // The aircraft's path is unchanged; the reference is the mean reading (090 + mean wander), so compass + heading
    // = V T sin(084 − reference), the whole air part of the cross-track.
    expect(x.refTrackDegTrue).not.toBeCloseTo(90, 3);
    expect(x.compassCrossTrackM + x.headingCrossTrackM!).toBeCloseTo(V * T * Math.sin((90 - ERR - x.refTrackDegTrue!) * DEG), 0);
    expect(x.residualCrossTrackM).toBeCloseTo(x.headingCrossTrackM! + x.closureErrorM!, 6);
  });
  it('from a noisy log (GPS σ 2 m) through the state stage: observed within 10 m of GeographicLib, parts within 2 %, closes', () => {
    const log = toFlightLog(truth, { posSigmaM: 2, altSigmaM: 3, seed: 21, file: 'leg.gpx', format: 'gpx' });
    const state = reconstructState(log, { wind: { kind: 'given', fromDegTrue: 0, speedMs: WIND } });
    const { field, compass } = compassOn(state);
    const [x] = analyseDebrief(state, field, compass, { excursion: { startT: t0, endT: t0 + T } }).analysis.excursions;
    expect(Math.abs(x.observedCrossTrackM - observedGeo)).toBeLessThan(10);
    expect(Math.abs(x.compassCrossTrackM / compassPart - 1)).toBeLessThan(0.02);
    expect(Math.abs(x.windCrossTrackM / windPart - 1)).toBeLessThan(0.02);
    expect(x.closes).toBe(true);
  });
  it('a heading column 5° off the air vector (e.g. a mis-aligned attitude source) does not close, with a warning', () => {
    const s0 = truthToFlightState(truth);
    const state = { ...s0, headingDegTrue: Float64Array.from(s0.headingDegTrue, (h) => wrap360(h + 5)) };
    const { field, compass } = compassOn(s0);
    const r = analyseDebrief(state, field, compass, { excursion: { startT: t0, endT: t0 + T } });
    expect(r.analysis.excursions[0].closes).toBe(false);
    expect(r.warnings.map((w) => w.code)).toContain('excursion-does-not-close');
  });
});

describe('detected compass legs and empty spans', () => {
  it('without a span given, the steady straight leg is found as a compass-flown span', () => {
    const state = truthToFlightState(truth);
    const { field, compass } = compassOn(state);
    const ex = analyseDebrief(state, field, compass, {}).analysis.excursions;
    expect(ex.length).toBe(1);
    expect(ex[0].source).toBe('detected');
    expect(ex[0].endT - ex[0].startT).toBeCloseTo(T, 0);
    expect(analyseDebrief(state, field, compass, { detectExcursions: false }).analysis.excursions).toEqual([]);
  });
  it('a route with fewer than two usable waypoints is set aside with a warning (it comes from the file: no throw)', () => {
    const state = truthToFlightState(truth);
    const { field, compass } = compassOn(state);
    const r = analyseDebrief(state, field, compass, { excursion: { startT: t0, endT: t0 + T }, route: { lat: new Float64Array([52.6]), lon: new Float64Array([0.4]), names: ['A'] } });
    expect(r.warnings.map((w) => w.code)).toEqual(['route-unusable']);
    expect(r.analysis.excursions[0].route).toBeUndefined();
  });
  it('a span given outside the flight is reported, not analysed', () => {
    const state = truthToFlightState(truth);
    const { field, compass } = compassOn(state);
    const r = analyseDebrief(state, field, compass, { excursion: { startT: t0 - 100, endT: t0 - 50 } });
    expect(r.analysis.excursions).toEqual([]);
    expect(r.warnings.map((w) => w.code)).toEqual(['excursion-empty']);
  });
});

describe('rhumbOffsetM (Mercator rhumb-line geometry) against GeographicLib', () => {
  it('cross-track from a parallel is the meridian arc; along-track on a meridian is the meridian arc', () => {
    const p = geod.Direct(52.6, 0.4, 135, 20000); // 20 km south-east
    const o = rhumbOffsetM(52.6, 0.4, 90, p.lat2, p.lon2);
    expect(o.crossM).toBeCloseTo(-meridianArcM(52.6, p.lat2, p.lon2), 0);
    const q = rhumbOffsetM(52.6, 0.4, 0, p.lat2, p.lon2);
    expect(q.alongM).toBeCloseTo(meridianArcM(52.6, p.lat2, 0.4), -1);
    expect(q.crossM).toBeCloseTo(geod.Inverse(p.lat2, 0.4, p.lat2, p.lon2).s12, 0);
  });
  it('a point 10 km right of a 045 rhumb line, 30 km along it: cross-track within 1 m, along-track as the Mercator foot', () => {
    // Point F on the rhumb line at distance s: the meridian arc covered is s·cos α (GeographicLib along the meridian),
    // and Δλ = tan α · Δq (rhumb-line definition, Snyder 1987 §7). P: 10 km from F on the geodesic at α + 90.
    const s = 30000;
    const f = geod.Direct(52.6, 0.4, 0, s * Math.cos(45 * DEG));
    const lonF = 0.4 + (Math.tan(45 * DEG) * (isometricLatitude(f.lat2) - isometricLatitude(52.6))) / DEG;
    const onLine = rhumbOffsetM(52.6, 0.4, 45, f.lat2, lonF);
    expect(Math.abs(onLine.crossM)).toBeLessThan(1e-6);
    expect(onLine.alongM).toBeCloseTo(s, 0);
    const p = geod.Direct(f.lat2, lonF, 135, 10000);
    const o = rhumbOffsetM(52.6, 0.4, 45, p.lat2, p.lon2);
    expect(Math.abs(o.crossM - 10000)).toBeLessThan(1);
    // The foot of a geodesic perpendicular and of the straight Mercator one differ along the line by
    // ≈ d² cos α tan φ / (2N) = 10 km² · cos 45 · tan 52.6 / (2 · 6391 km) ≈ 7.2 m (derived): that is the along-track.
    const shift = (1e8 * Math.cos(45 * DEG) * Math.tan(52.6 * DEG)) / (2 * 6.391e6);
    expect(Math.abs(Math.abs(o.alongM - s) - shift)).toBeLessThan(0.5);
  });
});
