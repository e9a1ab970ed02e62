// Format detection by content. Oracles: the formats' own signatures — GPX root <gpx> (GPX 1.1 Schema
// Documentation, topografix.com/GPX/1/1: "GPX is the root element in the XML file"); KML root <kml>
// (OGC KML 2.2, 07-147r2 §6.1); IGC A record first, B fixes (FAI IGC technical specification, Appendix A);
// NMEA 0183 sentences "$" + talker + sentence formatter (NMEA 0183 standard, sentence structure);
// FIT header ".FIT" at bytes 8-11 (Garmin FIT SDK, FIT Protocol, File Header).
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { detectFormat, detectTextFormat } from '../../src/import/detectFormat.js';
import { ParseError } from '../../src/errors.js';

const bytes = (s: string) => new TextEncoder().encode(s);

describe('detectFormat: by content, not by file name', () => {
  it('recognises GPX from its root element, after a declaration and comments', () => {
    expect(detectFormat(bytes('<?xml version="1.0"?>\n<!-- x -->\n<gpx version="1.1" creator="t"></gpx>'))).toBe('gpx');
  });

  it('recognises KML from its root element', () => {
    expect(detectFormat(bytes('<?xml version="1.0"?><kml xmlns="http://www.opengis.net/kml/2.2"></kml>'))).toBe('kml');
  });

  it('recognises an IGC file by its A record and B fixes', () => {
    const igc = 'AXXX001 invented recorder\r\nHFDTE040526\r\nB1000005230000N00015000WA0010000120\r\n';
    expect(detectTextFormat(igc)).toBe('igc');
  });

  it('recognises NMEA 0183 sentences with any talker id', () => {
    const nmea = '$GNRMC,100000.00,A,5230.0000,N,00015.0000,W,90.0,270.0,040526,,,A*00\n$GPGGA,100000.00,5230.0000,N,00015.0000,W,1,08,1.0,100.0,M,47.0,M,,*00\n';
    expect(detectTextFormat(nmea)).toBe('nmea');
  });

  it('recognises a FIT file by its header', () => {
    const h = new Uint8Array([14, 0x20, 0, 0, 0, 0, 0, 0, 0x2e, 0x46, 0x49, 0x54, 0, 0]);
    expect(detectFormat(h)).toBe('fit');
  });

  it('recognises delimited text with a header as CSV', () => {
    expect(detectTextFormat('time;lat;lon\n2026-05-04T10:00:00Z;52;1\n')).toBe('csv');
  });

  it('takes a lone header line of three or more fields as CSV (so the reader can say it has no data rows), not a lone line of prose', () => {
    expect(detectTextFormat('time,lat,lon\n')).toBe('csv');
    expect(() => detectTextFormat('Dear pilot, hello\n')).toThrow(/not a flight log/);
  });

  it('names the first ragged row of a delimited log whose header names latitude and longitude (common practice: say where, not only "not a log")', () => {
    const text = '# logger v2\ntime,lat,lon\n\nfoo,bar\nbaz,qux\n2026-05-04T10:00:01Z,52.1,0.1\n';
    try {
      detectTextFormat(text);
      expect.unreachable();
    } catch (err) {
      expect(err).toBeInstanceOf(ParseError);
      expect((err as ParseError).line).toBe(4);
      expect((err as ParseError).message).toContain('3 comma-separated columns, but this row has 2 field(s)');
    }
    // Without latitude and longitude columns the text is prose or another table: the plain refusal.
    expect(() => detectTextFormat('name,club,town\nHarrowgate,Fen\n')).toThrow(/not a flight log this tool can read/);
  });

  it('refuses binary junk with a hint listing the supported formats', () => {
    const junk = readFileSync(new URL('../fixtures/import/binary-junk.bin', import.meta.url));
    try {
      detectFormat(junk);
      expect.unreachable();
    } catch (err) {
      expect(err).toBeInstanceOf(ParseError);
      expect((err as ParseError).message).toContain('not a flight log this tool can read');
      expect((err as ParseError).hint).toMatch(/GPX.*CSV.*IGC.*NMEA.*FIT.*KML/);
    }
  });

  it('refuses plain prose and other XML', () => {
    expect(() => detectTextFormat('Dear pilot, here is my flight.\nRegards\n')).toThrow(/not a flight log/);
    expect(() => detectTextFormat('<html><body/></html>')).toThrow(/root element is <html>/);
  });

  it('reads UTF-16 text with a byte-order mark', () => {
    const s = 'time,lat,lon\n2026-05-04T10:00:00Z,52,1\n';
    const b = new Uint8Array(2 + s.length * 2);
    b[0] = 0xff;
    b[1] = 0xfe;
    for (let i = 0; i < s.length; i++) b[2 + 2 * i] = s.charCodeAt(i);
    expect(detectFormat(b)).toBe('csv');
  });
});

describe('detectFormat: archives', () => {
  it('refuses a ZIP (KMZ) with a hint to unzip it (ZIP signature PK\\3\\4, PKWARE APPNOTE)', () => {
    expect(() => detectFormat(new Uint8Array([0x50, 0x4b, 0x03, 0x04, 0, 0, 0, 0]))).toThrow(/KMZ/);
  });
});
