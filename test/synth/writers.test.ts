// GPX and CSV writers: well-formed XML (checked by the saxes parser), escaped metadata, exact numbers back.
import { describe, expect, it } from 'vitest';
import { SaxesParser } from 'saxes';
import { simulateFlight } from '../../src/synth/simulateFlight.js';
import { toFlightLog } from '../../src/synth/gpsNoise.js';
import { escapeXml, isoUtcMs, writeGpx } from '../../src/synth/writeGpx.js';
import { writeCsv } from '../../src/synth/writeCsv.js';
import { writePlanCsv } from '../../src/synth/writePlanCsv.js';
import { OptionError } from '../../src/errors.js';

const T0 = Date.UTC(2026, 4, 4, 10, 0, 0) / 1000;
const truth = simulateFlight({
  start: { t0: T0, latDeg: -41.3, lonDeg: 173.1, altM: 500, headingDegTrue: 10, tasMs: 50 },
  sampleRateHz: 10,
  legs: [{ kind: 'straight', durationS: 3 }, { kind: 'turn', direction: 'right', byDeg: 45 }, { kind: 'straight', durationS: 3 }],
});
const nasty = 'Tom & "Jerry" <b>\'s\' \u0007bell]]> café ✈';
const log = toFlightLog(truth, {
  posSigmaM: 0, altSigmaM: 0, seed: 1, file: 'x.gpx', format: 'gpx', velocity: { sigmaMs: 0 },
  meta: { name: nasty, pilot: 'R. Saint-Aubyn <instructor>', aircraft: 'Fenbird 2 & co', comment: nasty, device: 'synth' },
  dropouts: [{ t0: T0 + 1, t1: T0 + 2 }],
});

interface Parsed {
  points: Array<{ lat: number; lon: number; ele: number; time: string }>;
  texts: Record<string, string[]>;
  segments: number;
  root: { name: string; uri: string; version: string };
}

/** Parses GPX with saxes (a conforming XML 1.0 + namespaces parser): throws on any well-formedness error. */
function parse(xml: string): Parsed {
  const p = new SaxesParser({ xmlns: true });
  const out: Parsed = { points: [], texts: {}, segments: 0, root: { name: '', uri: '', version: '' } };
  const stack: string[] = [];
  let text = '';
  p.on('error', (e) => {
    throw e;
  });
  p.on('opentag', (tag) => {
    if (stack.length === 0) out.root = { name: tag.local, uri: tag.uri, version: tag.attributes.version?.value ?? '' };
    stack.push(tag.local);
    text = '';
    if (tag.local === 'trkseg') out.segments++;
    if (tag.local === 'trkpt') {
      out.points.push({ lat: Number(tag.attributes.lat.value), lon: Number(tag.attributes.lon.value), ele: NaN, time: '' });
    }
  });
  p.on('text', (t) => {
    text += t;
  });
  p.on('closetag', (tag) => {
    const path = stack.join('/');
    stack.pop();
    const last = out.points[out.points.length - 1];
    if (tag.local === 'ele') last.ele = Number(text);
    else if (tag.local === 'time' && stack[stack.length - 1] === 'trkpt') last.time = text;
    else if (!['trkpt', 'trkseg', 'trk', 'gpx', 'metadata', 'author'].includes(tag.local)) (out.texts[path] ??= []).push(text);
    text = '';
  });
  p.write(xml).close();
  return out;
}

describe('writeGpx', () => {
  const xml = writeGpx(log, { splitAtGapS: 0.5 });
  const g = parse(xml);

  it('writes well-formed GPX 1.1 in the Topografix namespace (saxes parses it without error)', () => {
    expect(g.root).toEqual({ name: 'gpx', uri: 'http://www.topografix.com/GPX/1/1', version: '1.1' });
  });

  it('escapes metadata so it reads back exactly, dropping characters XML 1.0 forbids (W3C XML 1.0 §2.2)', () => {
    const clean = nasty.replace('\u0007', '');
    expect(g.texts['gpx/metadata/name']).toEqual([clean]);
    expect(g.texts['gpx/metadata/desc']).toEqual([clean]);
    expect(g.texts['gpx/metadata/author/name']).toEqual(['R. Saint-Aubyn <instructor>']);
    expect(g.texts['gpx/trk/desc']).toEqual(['Aircraft: Fenbird 2 & co']);
    expect(escapeXml('a<b>&"\'')).toBe('a&lt;b&gt;&amp;&quot;&apos;');
  });

  it('writes every kept row as a trkpt with lat/lon to 7 decimals, ele and ISO time with ms, and splits at gaps', () => {
    expect(g.points.length).toBe(log.t.length);
    expect(g.segments).toBe(2);
    for (let j = 0; j < log.t.length; j++) {
      expect(Math.abs(g.points[j].lat - log.lat[j])).toBeLessThanOrEqual(5e-8);
      expect(Math.abs(g.points[j].lon - log.lon[j])).toBeLessThanOrEqual(5e-8);
      expect(Math.abs(g.points[j].ele - log.altM[j])).toBeLessThanOrEqual(0.005);
      expect(Date.parse(g.points[j].time) / 1000).toBeCloseTo(log.t[j], 3);
      expect(g.points[j].time).toMatch(/^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d\.\d{3}Z$/);
    }
  });

  it('rounds times to the nearest millisecond (0.1 s steps never print as .099)', () => {
    expect(isoUtcMs(1746353472.1)).toBe('2025-05-04T10:11:12.100Z');
    expect(isoUtcMs(T0 + 0.3)).toBe('2026-05-04T10:00:00.300Z');
  });
});

describe('writeCsv', () => {
  it('writes the header and feet, knots and degrees that read back to the log values', () => {
    const text = writeCsv(log, { altUnit: 'ft', velocity: true });
    const lines = text.trimEnd().split('\n');
    expect(lines[0]).toBe('time_utc,lat_deg,lon_deg,alt_ft,gs_kt,track_deg');
    expect(lines.length).toBe(log.t.length + 1);
    const f = lines[5].split(',');
    expect(Date.parse(f[0]) / 1000).toBeCloseTo(log.t[4], 3);
    expect(Number(f[1])).toBeCloseTo(log.lat[4], 7);
    expect(Number(f[2])).toBeCloseTo(log.lon[4], 7);
    expect(Math.abs(Number(f[3]) * 0.3048 - log.altM[4])).toBeLessThan(0.05 * 0.3048 + 1e-9); // international foot
    expect(Math.abs((Number(f[4]) * 1852) / 3600 - (log.gsMs?.[4] ?? NaN))).toBeLessThan(0.006 * (1852 / 3600));
    expect(f[1].split('.')[1].length).toBe(7);
  });

  it('writes metres under alt_m, and NaN as an empty field', () => {
    const copy = { ...log, altM: log.altM.slice() };
    copy.altM[0] = NaN;
    const lines = writeCsv(copy, { altUnit: 'm' }).split('\n');
    expect(lines[0]).toBe('time_utc,lat_deg,lon_deg,alt_m');
    expect(lines[1].endsWith(',')).toBe(true);
    expect(Number(lines[2].split(',')[3])).toBeCloseTo(log.altM[1], 2);
  });

  it('refuses velocity columns for a log without them', () => {
    const bare = toFlightLog(truth, { posSigmaM: 0, altSigmaM: 0, seed: 1, file: 'x.csv', format: 'csv' });
    expect(() => writeCsv(bare, { altUnit: 'ft', velocity: true })).toThrow(OptionError);
  });
});

describe('writePlanCsv', () => {
  it('lists one target per turn, magnetic = true − variation (east +), in order', () => {
    const text = writePlanCsv(truth, 21.3);
    expect(text).toBe(`target_mag_deg,not_before_utc\n034,${isoUtcMs(T0 + 3 - 10)}\n`); // 10 + 45 − 21.3 = 33.7 → 34
  });
});
