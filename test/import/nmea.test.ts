// NMEA 0183 reader. Oracles: the checksum rule of NMEA 0183 (XOR of the characters between '$' and '*'),
// the widely published example sentences $GPGGA,123519,4807.038,N,01131.000,E,1,08,0.9,545.4,M,46.9,M,,*47
// and $GPRMC,123519,A,4807.038,N,01131.000,E,022.4,084.4,230394,003.1,W*6A (checksums as published,
// from memory), the RMC/GGA/VTG/HDT/HDG field layouts of NMEA 0183 (from memory), the knot = 1852 m/h
// (exact), Date.UTC (ECMA-262) for expected times and degrees + minutes/60 for expected positions.
import { describe, expect, it } from 'vitest';
import { parseNmea } from '../../src/import/nmea.js';
import { checkSentence, nmeaAngle } from '../../src/import/nmeaSentence.js';
import { ParseError } from '../../src/errors.js';
import { withChecksum } from './writers/nmeaChecksum.js';

const utc = (y: number, mo: number, d: number, h: number, mi: number, s: number) => Date.UTC(y, mo - 1, d, h, mi, s) / 1000;
const KT = 1852 / 3600;
const GGA_EXAMPLE = '$GPGGA,123519,4807.038,N,01131.000,E,1,08,0.9,545.4,M,46.9,M,,*47';
const RMC_EXAMPLE = '$GPRMC,123519,A,4807.038,N,01131.000,E,022.4,084.4,230394,003.1,W*6A';

describe('NMEA 0183 sentences', () => {
  it('accepts the published example sentences with their checksums', () => {
    expect(checkSentence(GGA_EXAMPLE).ok).toBe(true);
    expect(checkSentence(RMC_EXAMPLE).ok).toBe(true);
    expect(withChecksum(GGA_EXAMPLE.slice(1, -3))).toBe(GGA_EXAMPLE); // the test helper agrees with them
  });

  it('rejects a sentence whose checksum does not match', () => {
    expect(checkSentence(GGA_EXAMPLE.replace('545.4', '545.5'))).toEqual({ ok: false, reason: 'bad-checksum' });
  });

  it('reads ddmm.mmm / dddmm.mmm angles with hemispheres', () => {
    expect(nmeaAngle('4807.038', 'N', 2)).toBeCloseTo(48 + 7.038 / 60, 12);
    expect(nmeaAngle('01131.000', 'W', 3)).toBeCloseTo(-(11 + 31 / 60), 12);
    expect(nmeaAngle('4860.000', 'N', 2)).toBeNaN();
  });

  it('reads the example RMC + GGA as one fix: 1994-03-23 12:35:19 UTC, 545.4 m, 22.4 kt, 084.4° true', () => {
    const log = parseNmea(`${RMC_EXAMPLE}\n${GGA_EXAMPLE}\n`, 'ex.nmea');
    expect(log.t.length).toBe(1);
    expect(log.t[0]).toBe(utc(1994, 3, 23, 12, 35, 19));
    expect(log.lat[0]).toBeCloseTo(48 + 7.038 / 60, 12);
    expect(log.lon[0]).toBeCloseTo(11 + 31 / 60, 12);
    expect(log.altM[0]).toBe(545.4);
    expect(log.gsMs![0]).toBeCloseTo(22.4 * KT, 12);
    expect(log.trackDegTrue![0]).toBe(84.4);
    expect(log.source.altDatum).toBe('msl');
    expect(log.line[0]).toBe(1);
  });
});

describe('parseNmea: a logged flight', () => {
  const lines = [
    withChecksum('GNRMC,235958.00,A,5230.0000,N,00015.0000,W,90.0,270.0,040526,,,A'), // 1
    withChecksum('GNGGA,235958.00,5230.0000,N,00015.0000,W,1,10,0.8,300.0,M,47.0,M,,'), // 2
    withChecksum('GPVTG,270.0,T,268.0,M,90.0,N,166.7,K,A'), // 3
    withChecksum('HCHDG,265.0,1.5,E,0.5,W'), // 4: magnetic 266.5
    withChecksum('GNRMC,235959.00,A,5230.0000,N,00015.0400,W,90.0,270.0,040526,,,A'), // 5
    withChecksum('GLGGA,235959.00,5230.0000,N,00015.0400,W,1,10,0.8,301.0,M,47.0,M,,').replace(/\*..$/, '*00'), // 6: bad checksum
    withChecksum('GNGSV,3,1,10,01,40,083,46,02,17,308,41,12,07,344,39,14,22,228,45'), // 7: ignored
    withChecksum('GAGGA,000000.00,5230.0000,N,00015.0800,W,1,10,0.8,302.0,M,47.0,M,,'), // 8: no RMC; next UTC day
    withChecksum('IIHDM,267.0,M'), // 9
    withChecksum('GNRMC,000001.00,V,,,,,,,050526,,,N'), // 10: no fix
    'garbage that is not a sentence', // 11
    withChecksum('GNRMC,000002.00,A,5230.0000,N,00015.1200,W,91.0,271.0,050526,,,A'), // 12
  ];
  const log = parseNmea(`${lines.join('\r\n')}\r\n`, 'flight.nmea');

  it('makes one row per fix time, with the RMC date and the midnight rollover', () => {
    expect(Array.from(log.t)).toEqual([utc(2026, 5, 4, 23, 59, 58), utc(2026, 5, 4, 23, 59, 59), utc(2026, 5, 5, 0, 0, 0), utc(2026, 5, 5, 0, 0, 2)]);
    expect(Array.from(log.line)).toEqual([1, 5, 8, 12]);
  });

  it('reads any talker id (GN, GP, GL, GA, HC, II)', () => {
    expect(log.lon[2]).toBeCloseTo(-(15.08 / 60), 12); // from $GAGGA
    expect(log.altM[2]).toBe(302);
  });

  it('takes speed in knots and true course from RMC/VTG', () => {
    expect(log.gsMs![0]).toBeCloseTo(90 * KT, 12);
    expect(log.trackDegTrue![3]).toBe(271);
  });

  it('takes magnetic heading from HDG (sensor + easterly deviation) and HDM', () => {
    expect(log.headingRef).toBe('magnetic');
    expect(log.headingDeg![0]).toBe(266.5);
    expect(log.headingDeg![2]).toBe(267);
    expect(log.headingDeg![1]).toBeNaN();
  });

  it('counts bad checksums and non-sentences with their lines', () => {
    expect(log.source.warnings.find((w) => w.code === 'nmea-bad-checksum')?.lines).toEqual([6]);
    expect(log.source.warnings.find((w) => w.code === 'nmea-not-a-sentence')?.lines).toEqual([11]);
    expect(log.source.warnings.find((w) => w.code === 'nmea-no-fix')?.lines).toEqual([10]);
    // The RMC of 23:59:59 still gives that fix, only without GGA altitude.
    expect(log.altM[1]).toBeNaN();
  });

  it('prefers true heading (HDT) over magnetic when both are present', () => {
    const l = parseNmea([lines[0], withChecksum('GPHDT,271.5,T'), withChecksum('HCHDM,268.0,M')].join('\n') + '\n', 'h.nmea');
    expect(l.headingRef).toBe('true');
    expect(l.headingDeg![0]).toBe(271.5);
  });

  it('dates GGA-only fixes before the first RMC from that RMC', () => {
    const l = parseNmea([lines[7], lines[11]].join('\n') + '\n', 'g.nmea');
    expect(l.t[0]).toBe(utc(2026, 5, 5, 0, 0, 0));
  });

  it('reads a log cut off mid-sentence up to the last whole sentence', () => {
    const text = `${lines[0]}\n${lines[1]}\n${lines[4].slice(0, 30)}`;
    const l = parseNmea(text, 'cut.nmea');
    expect(l.t.length).toBe(1);
    expect(l.source.reader?.truncated).toBe(true);
    expect(l.source.warnings.find((w) => w.code === 'file-truncated')?.lines).toEqual([3]);
    expect(l.source.warnings.find((w) => w.code === 'nmea-bad-checksum')).toBeUndefined();
  });

  it('refuses a log without a date unless one is given', () => {
    const text = `${lines[1]}\n`;
    expect(() => parseNmea(text, 'nodate.nmea')).toThrow(ParseError);
    expect(parseNmea(text, 'nodate.nmea', { date: '2026-05-04' }).t[0]).toBe(utc(2026, 5, 4, 23, 59, 58));
  });

  it('refuses a log in which every sentence fails its checksum', () => {
    expect(() => parseNmea(`${lines[5]}\n${lines[5]}\n`, 'bad.nmea')).toThrow(/no NMEA 0183 sentence/);
  });
});
