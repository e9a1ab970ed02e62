// KML reader. Oracle: OGC KML 2.2 (07-147r2) with Google's gx extension: gx:Track pairs the i-th <when>
// (xsd:dateTime) with the i-th <gx:coord> "lon lat alt"; altitudeMode absolute = metres above sea level
// (from memory). Times from Date.UTC (ECMA-262); 12:00:03+02:00 = 10:00:03Z (ISO 8601).
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseKml } from '../../src/import/kml.js';
import { ParseError } from '../../src/errors.js';

const fixture = (name: string) => readFileSync(new URL(`../fixtures/import/${name}`, import.meta.url), 'utf8');
const utc = (h: number, mi: number, s: number) => Date.UTC(2026, 4, 4, h, mi, s) / 1000;
const kml = (body: string) => `<kml xmlns="http://www.opengis.net/kml/2.2" xmlns:gx="http://www.google.com/kml/ext/2.2"><Document>${body}</Document></kml>`;

describe('parseKml (OGC KML 2.2, gx:Track)', () => {
  const log = parseKml(fixture('track.kml'), 'track.kml');

  it('pairs each <when> with its <gx:coord> (lon lat alt)', () => {
    expect(Array.from(log.t)).toEqual([utc(10, 0, 0), utc(10, 0, 1) + 0.5, utc(10, 0, 3)]);
    expect(Array.from(log.lon)).toEqual([-0.25, -0.2502, -0.2504]);
    expect(Array.from(log.lat)).toEqual([52.5, 52.5001, 52.5002]);
    expect(Array.from(log.altM)).toEqual([300, 301.5, 303]);
    expect(log.source.altDatum).toBe('msl');
    expect(Array.from(log.line)).toEqual([12, 13, 14]);
    expect(log.source.meta.name).toBe('Navex from Harrowgate Fen');
  });

  it('does not use heights of a track that is not altitudeMode absolute', () => {
    const l = parseKml(kml('<Placemark><gx:Track><when>2026-05-04T10:00:00Z</when><gx:coord>1 2 300</gx:coord></gx:Track></Placemark>'), 'c.kml');
    expect(l.altM[0]).toBeNaN();
    expect(l.source.warnings.some((w) => w.code === 'kml-altitude-mode')).toBe(true);
  });

  it('reads every gx:Track of a gx:MultiTrack', () => {
    const tr = (t: string, x: number) => `<gx:Track><when>${t}</when><gx:coord>${x} 50 1</gx:coord></gx:Track>`;
    const l = parseKml(kml(`<Placemark><gx:MultiTrack>${tr('2026-05-04T10:00:00Z', 1)}${tr('2026-05-04T10:00:05Z', 2)}</gx:MultiTrack></Placemark>`), 'm.kml');
    expect(Array.from(l.lon)).toEqual([1, 2]);
  });

  it('refuses an untimed LineString with a hint to export a timed track', () => {
    try {
      parseKml(kml('<Placemark><LineString><coordinates>1,2,0 3,4,0</coordinates></LineString></Placemark>'), 'ls.kml');
      expect.unreachable();
    } catch (err) {
      expect(err).toBeInstanceOf(ParseError);
      expect((err as ParseError).message).toMatch(/untimed path \(LineString\)/);
      expect((err as ParseError).hint).toMatch(/gx:Track/);
    }
  });

  it('reads a file cut off inside the track up to its last complete pair', () => {
    const text = fixture('track.kml');
    const cut = text.slice(0, text.indexOf('<gx:coord>-0.2504'));
    const l = parseKml(cut, 'cut.kml');
    expect(l.t.length).toBe(2);
    expect(l.source.reader?.truncated).toBe(true);
    expect(l.source.warnings.find((w) => w.code === 'file-truncated')).toBeDefined();
  });
});
