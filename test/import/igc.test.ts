// IGC reader. Oracle: FAI/IGC Technical Specification for IGC-approved GNSS Flight Recorders, Appendix A
// (B record: HHMMSS DDMMmmmN DDDMMmmmE V PPPPP GGGGG, extensions at the bytes the I record gives; HFDTE
// date in both the DDMMYY and DATE:DDMMYY,NN forms; fix validity A = 3-D fix, V = 2-D or none).
// Expected coordinates are the hand conversion degrees + minutes/60 of the fixture's fields; expected
// times come from Date.UTC (ECMA-262 §21.4.3.1). Extension units (km/h, FXA 2-sigma) are from memory.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseIgc, parseIgcDate } from '../../src/import/igc.js';
import { ParseError } from '../../src/errors.js';

const fixture = (name: string) => readFileSync(new URL(`../fixtures/import/${name}`, import.meta.url), 'utf8');
const utc = (y: number, mo: number, d: number, h: number, mi: number, s: number) => Date.UTC(y, mo - 1, d, h, mi, s) / 1000;

describe('parseIgc (FAI IGC technical specification, Appendix A)', () => {
  const log = parseIgc(fixture('midnight.igc'), 'midnight.igc');

  it('reads B-record positions: DDMMmmm N/S and DDDMMmmm E/W to decimal degrees', () => {
    expect(log.lat[0]).toBeCloseTo(52 + 30.123 / 60, 12);
    expect(log.lon[0]).toBeCloseTo(-(0 + 15.456 / 60), 12);
    expect(log.lat[3]).toBeCloseTo(52 + 30.423 / 60, 12);
  });

  it('dates fixes from HFDTEDATE:DDMMYY,NN and rolls over at UTC midnight', () => {
    expect(Array.from(log.t)).toEqual([
      utc(2026, 5, 4, 23, 59, 58),
      utc(2026, 5, 4, 23, 59, 59),
      utc(2026, 5, 5, 0, 0, 0),
      utc(2026, 5, 5, 0, 0, 1),
    ]);
  });

  it('leaves out fixes flagged V and names their lines', () => {
    const w = log.source.warnings.find((x) => x.code === 'igc-no-fix');
    expect(w?.lines).toEqual([11]);
    expect(log.source.reader).toEqual({ recordsRead: 5, recordsDropped: 1, truncated: false });
  });

  it('prefers the GNSS altitude and records its datum from HFALGALTGPS:GEO (mean sea level)', () => {
    expect(Array.from(log.altM)).toEqual([120, 121, 122, 123]);
    expect(log.source.altDatum).toBe('msl');
    expect(log.source.warnings.find((w) => w.code === 'altitude-source')?.message).toMatch(/GNSS/);
  });

  it('reads the I-record extensions FXA, TAS and HDT at their declared bytes', () => {
    expect(Array.from(log.hAccM!)).toEqual([17.5, 17, 16.5, 16]); // FXA 035.. halved to 1-sigma
    expect(log.tasMs![0]).toBeCloseTo(150 / 3.6, 12); // km/h
    expect(Array.from(log.headingDeg!)).toEqual([270, 271, 272, 273]);
    expect(log.headingRef).toBe('true');
  });

  it('takes pilot, aircraft and recorder from the H records', () => {
    expect(log.source.meta.pilot).toBe('P. Okonkwo-Lindqvist');
    expect(log.source.meta.aircraft).toBe('Fenbird 2 G-XFEN');
    expect(log.source.meta.device).toBe('Fenbird logger 0.3');
  });

  it('reads the old HFDTEDDMMYY form and the new HFDTEDATE:DDMMYY,NN form alike', () => {
    expect(parseIgcDate('HFDTE160701')).toBe(utc(2001, 7, 16, 0, 0, 0));
    expect(parseIgcDate('HFDTEDATE:160701,02')).toBe(utc(2001, 7, 16, 0, 0, 0));
    expect(parseIgcDate('HFDTE320126')).toBeNaN();
  });

  it('uses the pressure altitude, marked as such, when the file has no GNSS altitude', () => {
    const text = 'AXXX001\nHFDTE040526\nB1000005230000N00015000WA0050000000\nB1000015230000N00015000WA0051000000\n';
    const l = parseIgc(text, 'p.igc');
    expect(Array.from(l.altM)).toEqual([500, 510]);
    expect(l.source.altDatum).toBe('pressure');
  });

  it('reads a negative altitude field (-dddd)', () => {
    const l = parseIgc('AXXX001\nHFDTE040526\nB1000005230000N00015000WA-0012-0005\n', 'n.igc');
    expect(l.altM[0]).toBe(-5);
  });

  it('reads a file cut off mid-fix up to the last complete fix and says where it ended', () => {
    const text = 'AXXX001\r\nHFDTE040526\r\nB1000005230000N00015000WA0050000520\r\nB1000015230000N00015000WA0051000530\r\nB10000252300';
    const l = parseIgc(text, 'cut.igc');
    expect(l.t.length).toBe(2);
    expect(l.source.reader?.truncated).toBe(true);
    expect(l.source.warnings.find((w) => w.code === 'file-truncated')?.lines).toEqual([5]);
    expect(l.source.warnings.find((w) => w.code === 'igc-bad-fix')).toBeUndefined();
  });

  it('counts malformed B records with their lines', () => {
    const text = 'AXXX001\nHFDTE040526\nB1000005230000N00015000WA0050000520\nB10000X5230000N00015000WA0051000530\nB1000025260000N00015000WA0051000530\n';
    const l = parseIgc(text, 'bad.igc');
    expect(l.source.warnings.find((w) => w.code === 'igc-bad-fix')?.lines).toEqual([4, 5]); // letter in time; 60 minutes
  });

  it('refuses a file without a date unless one is given', () => {
    const text = 'AXXX001\nB1000005230000N00015000WA0050000520\n';
    expect(() => parseIgc(text, 'nodate.igc')).toThrow(ParseError);
    expect(() => parseIgc(text, 'nodate.igc')).toThrow(/HFDTE/);
    expect(parseIgc(text, 'nodate.igc', { date: '2026-05-04' }).t[0]).toBe(utc(2026, 5, 4, 10, 0, 0));
  });

  it('refuses a file without fixes', () => {
    expect(() => parseIgc('AXXX001\nHFDTE040526\n', 'empty.igc')).toThrow(/no fix \(B\) records/);
  });
});
