// GPX reader. Oracle: GPX 1.1 Schema Documentation, topografix.com/GPX/1/1 (gpx.xsd):
// trkpt lat/lon attributes in decimal degrees WGS-84; <ele> "Elevation (in meters) of the point";
// <time> "Date and time in are in Univeral Coordinated Time (UTC) ... Conforms to ISO 8601";
// trk holds trkseg, trkseg holds trkpt. Expected times come from Date.UTC (ECMA-262 §21.4.3.1), not our parser.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseGpx } from '../../src/import/gpx.js';
import { ParseError } from '../../src/errors.js';

const fixture = (name: string) => readFileSync(new URL(`../fixtures/import/${name}`, import.meta.url), 'utf8');
const utc = (y: number, mo: number, d: number, h: number, mi: number, s: number) => Date.UTC(y, mo - 1, d, h, mi, s) / 1000;

function gpx(body: string): string {
  return `<?xml version="1.0"?>\n<gpx version="1.1" creator="test" xmlns="http://www.topografix.com/GPX/1/1">\n${body}\n</gpx>\n`;
}

describe('parseGpx: GPX 1.1 tracks (GPX 1.1 Schema Documentation, topografix.com/GPX/1/1)', () => {
  const log = parseGpx(fixture('two-tracks.gpx'), 'two-tracks.gpx');

  it('reads every trkpt with a time from all trkseg of all trk, in file order', () => {
    // Schema: gpx contains trk*, trk contains trkseg*, trkseg contains trkpt*. 5 points, one without <time>.
    expect(Array.from(log.lat)).toEqual([52.501, 52.502, 52.503, 52.505]);
    expect(Array.from(log.lon)).toEqual([-0.25, -0.249, -0.248, -0.246]);
    expect(log.source.format).toBe('gpx');
    expect(log.source.file).toBe('two-tracks.gpx');
  });

  it('reads <time> as ISO 8601 UTC, keeping fractional seconds and applying a zone offset', () => {
    // Schema: times are UTC, ISO 8601, "Fractional seconds are allowed". 12:00:05+02:00 is 10:00:05Z (ISO 8601).
    expect(log.t[0]).toBe(utc(2026, 5, 4, 10, 0, 0));
    expect(log.t[1]).toBeCloseTo(utc(2026, 5, 4, 10, 0, 1) + 0.25, 9);
    expect(log.t[2]).toBe(utc(2026, 5, 4, 10, 0, 5));
    expect(log.t[3]).toBe(utc(2026, 5, 4, 10, 0, 7));
  });

  it('reads <ele> in metres and gives NaN where a point has none', () => {
    // Schema: "Elevation (in meters) of the point", minOccurs=0.
    expect(log.altM[0]).toBe(12.5);
    expect(log.altM[1]).toBe(20);
    expect(log.altM[2]).toBeNaN();
    expect(log.altM[3]).toBe(41);
  });

  it('records the source line of each trkpt tag', () => {
    const lines = fixture('two-tracks.gpx').split('\n');
    for (let i = 0; i < log.line.length; i++) {
      expect(lines[log.line[i] - 1]).toContain(`lat="${log.lat[i].toFixed(6)}"`);
    }
  });

  it("records the line of a trkpt's '<' when its attributes stand on the next lines, plain XML or not", () => {
    const body = '<trk><trkseg>\n<trkpt\n  lat="52.5"\n  lon="-0.25"><time>2026-05-04T10:00:00Z</time></trkpt>\n<trkpt\r\n lat="52.6" lon="-0.2"><time>2026-05-04T10:00:01Z</time></trkpt>\n</trkseg></trk>';
    // Lines: 1 declaration, 2 <gpx>, 3 <trk><trkseg>, 4 the first <trkpt, 7 the second.
    expect(Array.from(parseGpx(gpx(body), 'a.gpx').line)).toEqual([4, 7]);
    expect(Array.from(parseGpx(gpx(body.replace('<trk>', '<trk><![CDATA[]]>')), 'a.gpx').line)).toEqual([4, 7]); // through saxes
  });

  it('drops a point without <time>, counts it and names its line', () => {
    const w = log.source.warnings.find((x) => x.code === 'no-time');
    expect(w?.count).toBe(1);
    const untimed = fixture('two-tracks.gpx').split('\n').findIndex((l) => l.includes('lat="52.504000"')) + 1;
    expect(untimed).toBe(15);
    expect(w?.lines).toEqual([untimed]);
    expect(w?.message).toContain(`line ${untimed}`);
    expect(log.source.reader).toEqual({ recordsRead: 5, recordsDropped: 1, truncated: false });
  });

  it('takes the first track name as meta.name and its desc as plain text (markup removed)', () => {
    expect(log.source.meta.name).toBe('Circuits at Harrowgate Fen Airstrip');
    expect(log.source.meta.comment).toBe('Fenbird 2, P. Okonkwo-Lindqvist &amp; instructor');
    expect(log.source.meta.device).toBe('Fenbird logger 0.3 (invented)');
  });

  it('records the altitude datum it assumes for <ele> (msl; the schema names none)', () => {
    expect(log.source.altDatum).toBe('msl');
  });

  it('accepts prefixed GPX element names', () => {
    const text = `<?xml version="1.0"?><g:gpx xmlns:g="http://www.topografix.com/GPX/1/1" version="1.1" creator="t"><g:trk><g:trkseg>
<g:trkpt lat="1.5" lon="2.5"><g:time>2026-01-01T00:00:00Z</g:time></g:trkpt>
</g:trkseg></g:trk></g:gpx>`;
    const l = parseGpx(text, 'p.gpx');
    expect(Array.from(l.lat)).toEqual([1.5]);
    expect(l.line[0]).toBe(2);
  });

  it('reads a GPX 1.0 track the same way (same trk/trkseg/trkpt structure)', () => {
    const text = `<gpx version="1.0" creator="t" xmlns="http://www.topografix.com/GPX/1/0"><trk><trkseg>
<trkpt lat="10" lon="20"><ele>5</ele><time>2026-01-01T00:00:00Z</time></trkpt></trkseg></trk></gpx>`;
    const l = parseGpx(text, 'v10.gpx');
    expect(l.altM[0]).toBe(5);
    expect(l.source.warnings.find((w) => w.code === 'gpx-version')).toBeUndefined();
  });

  it('ignores lat/lon/time inside extensions of other elements and waypoints outside tracks', () => {
    const text = gpx(`<wpt lat="1" lon="1"><time>2026-01-01T00:00:00Z</time></wpt>
<trk><trkseg><trkpt lat="3" lon="4"><time>2026-01-01T00:00:01Z</time><extensions><x><time>1999-01-01T00:00:00Z</time></x></extensions></trkpt></trkseg></trk>`);
    const l = parseGpx(text, 'x.gpx');
    expect(Array.from(l.lat)).toEqual([3]);
    expect(l.t[0]).toBe(utc(2026, 1, 1, 0, 0, 1));
  });
});

describe('parseGpx: speed, course, routes and waypoints', () => {
  it('reads GPX 1.0 <speed> (m/s) and <course> (degrees true) of a trkpt', () => {
    // GPX 1.0 schema: trkpt speed "(meters per second)", course "(degrees, true)" [from memory].
    const text = `<gpx version="1.0" creator="t"><trk><trkseg>
<trkpt lat="1" lon="2"><time>2026-01-01T00:00:00Z</time><course>271.5</course><speed>45.5</speed></trkpt>
<trkpt lat="1" lon="2.1"><time>2026-01-01T00:00:01Z</time></trkpt></trkseg></trk></gpx>`;
    const l = parseGpx(text, 'v10.gpx');
    expect(l.gsMs![0]).toBe(45.5);
    expect(l.trackDegTrue![0]).toBe(271.5);
    expect(l.gsMs![1]).toBeNaN();
  });

  it('reads speed and course from trkpt extensions (Garmin TrackPointExtension v2: m/s, degrees)', () => {
    const text = gpx(`<trk><trkseg><trkpt lat="1" lon="2"><time>2026-01-01T00:00:00Z</time>
<extensions><gpxtpx:TrackPointExtension xmlns:gpxtpx="http://www.garmin.com/xmlschemas/TrackPointExtension/v2"><gpxtpx:speed>50.25</gpxtpx:speed><gpxtpx:course>90</gpxtpx:course></gpxtpx:TrackPointExtension></extensions>
</trkpt></trkseg></trk>`);
    const l = parseGpx(text, 'x.gpx');
    expect(l.gsMs![0]).toBe(50.25);
    expect(l.trackDegTrue![0]).toBe(90);
  });

  it('keeps the first route (rte/rtept) with its point names, apart from the samples', () => {
    const text = gpx(`<wpt lat="9" lon="9"><name>ignored when a route exists</name></wpt>
<rte><name>Fen navex</name><rtept lat="52.5" lon="-0.25"><name>Harrowgate Fen</name></rtept><rtept lat="52.7" lon="-0.1"><name>Turn 1</name></rtept><rtept lat="52.6" lon="0.1"/></rte>
<trk><trkseg><trkpt lat="52.5" lon="-0.25"><time>2026-01-01T00:00:00Z</time></trkpt></trkseg></trk>`);
    const l = parseGpx(text, 'r.gpx');
    expect(l.route?.name).toBe('Fen navex');
    expect(Array.from(l.route!.lat)).toEqual([52.5, 52.7, 52.6]);
    expect(Array.from(l.route!.lon)).toEqual([-0.25, -0.1, 0.1]);
    expect(l.route!.names).toEqual(['Harrowgate Fen', 'Turn 1', '']);
    expect(l.t.length).toBe(1);
  });

  it('keeps waypoints as the route when there is no rte', () => {
    const text = gpx(`<wpt lat="1" lon="2"><name>A</name></wpt><wpt lat="3" lon="4"><name>B</name></wpt>
<trk><trkseg><trkpt lat="1" lon="2"><time>2026-01-01T00:00:00Z</time></trkpt></trkseg></trk>`);
    const l = parseGpx(text, 'w.gpx');
    expect(l.route!.names).toEqual(['A', 'B']);
    expect(Array.from(l.route!.lat)).toEqual([1, 3]);
  });

  it('takes the metadata author as pilot and the track src as device', () => {
    const text = gpx(`<metadata><author><name>P. Okonkwo-Lindqvist</name></author></metadata>
<trk><src>Fenbird panel logger</src><trkseg><trkpt lat="1" lon="2"><time>2026-01-01T00:00:00Z</time></trkpt></trkseg></trk>`);
    const l = parseGpx(text, 'm.gpx');
    expect(l.source.meta.pilot).toBe('P. Okonkwo-Lindqvist');
    expect(l.source.meta.device).toBe('Fenbird panel logger');
  });
});

describe('parseGpx: broken and unusable documents', () => {
  it('reads a file cut off mid-point up to its last complete trkpt and says where it ended', () => {
    const log = parseGpx(fixture('truncated.gpx'), 'truncated.gpx');
    expect(log.t.length).toBe(3);
    expect(log.source.reader?.truncated).toBe(true);
    const w = log.source.warnings.find((x) => x.code === 'file-truncated');
    expect(w).toBeDefined();
    expect(w!.message).toMatch(/line 9/); // the file's last line, where the incomplete 4th point begins
    expect(w!.message).toContain('line 8'); // the last complete point ends on line 8
  });

  it('stops at the first well-formedness error mid-file (XML 1.0 §1.2) and keeps the points before it', () => {
    const text = gpx(`<trk><trkseg>
<trkpt lat="1" lon="1"><time>2026-01-01T00:00:00Z</time></trkpt>
<trkpt lat="2" lon="2"><time>2026-01-01T00:00:01Z</time></trkpt>
<trkpt lat="3" lon="3"><time>2026-01-01T00:00:02Z</timex></trkpt>
<trkpt lat="4" lon="4"><time>2026-01-01T00:00:03Z</time></trkpt>
</trkseg></trk>`);
    const log = parseGpx(text, 'broken.gpx');
    expect(Array.from(log.lat)).toEqual([1, 2]);
    const w = log.source.warnings.find((x) => x.code === 'xml-broken');
    expect(w?.lines).toEqual([6]);
    expect(log.source.reader?.truncated).toBe(true);
  });

  it('refuses an XML document whose root is not <gpx>', () => {
    expect(() => parseGpx('<kml><Document/></kml>', 'a.gpx')).toThrow(ParseError);
    expect(() => parseGpx('<kml><Document/></kml>', 'a.gpx')).toThrow(/root element is <kml>/);
  });

  it('refuses a GPX that holds only a route, with a hint that routes carry no flight times', () => {
    const text = gpx('<rte><rtept lat="1" lon="1"/><rtept lat="2" lon="2"/></rte>');
    try {
      parseGpx(text, 'r.gpx');
      expect.unreachable();
    } catch (err) {
      expect(err).toBeInstanceOf(ParseError);
      expect((err as ParseError).hint).toMatch(/route/);
    }
  });

  it('refuses a track none of whose points has a time', () => {
    const text = gpx('<trk><trkseg><trkpt lat="1" lon="1"/><trkpt lat="2" lon="2"/></trkseg></trk>');
    expect(() => parseGpx(text, 't.gpx')).toThrow(/none of the 2 track points has a <time>/);
  });

  it('refuses broken XML before the first point with the line of the error', () => {
    try {
      parseGpx('<gpx version="1.1">\n<trk>\n<trkseg><<trkpt', 'b.gpx');
      expect.unreachable();
    } catch (err) {
      expect(err).toBeInstanceOf(ParseError);
      expect((err as ParseError).line).toBe(3);
    }
  });
});
