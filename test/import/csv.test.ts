// CSV reader: header/unit detection and conversion to SI.
// Unit oracles: international foot = 0.3048 m exactly and statute mile = 1609.344 m exactly (1959 international
// yard and pound agreement); knot = 1852 m/h exactly (nautical mile, International Hydrographic Conference 1929).
// Time oracles: Date.UTC (ECMA-262 §21.4.3.1) and ISO 8601 offset arithmetic (12:00+02:00 = 10:00Z).
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseCsv } from '../../src/import/csv.js';
import { OptionError, ParseError } from '../../src/errors.js';

const fixture = (name: string) => readFileSync(new URL(`../fixtures/import/${name}`, import.meta.url), 'utf8');
const utc = (y: number, mo: number, d: number, h: number, mi: number, s: number) => Date.UTC(y, mo - 1, d, h, mi, s) / 1000;
const FT = 0.3048;
const KT = 1852 / 3600;
const MPH = 1609.344 / 3600;
const KMH = 1000 / 3600;

function parseError(fn: () => unknown): ParseError {
  try {
    fn();
  } catch (err) {
    if (err instanceof ParseError) return err;
    throw err;
  }
  throw new Error('expected a ParseError');
}

describe('parseCsv: columns and units from the header', () => {
  const log = parseCsv(fixture('units-ft-kt.csv'), 'units-ft-kt.csv');

  it('converts feet to metres and knots to m/s', () => {
    expect(log.altM[0]).toBeCloseTo(1000 * FT, 9);
    expect(log.gsMs![1]).toBeCloseTo(91 * KT, 9);
    expect(log.iasMs![0]).toBeCloseTo(85 * KT, 9);
    expect(log.tasMs![2]).toBeCloseTo(94 * KT, 9);
  });

  it('reads track, magnetic heading (from the header word "mag"), bank, pitch and accuracy', () => {
    expect(Array.from(log.trackDegTrue!)).toEqual([270, 271, 272]);
    expect(Array.from(log.headingDeg!)).toEqual([268, 269, 270]);
    expect(log.headingRef).toBe('magnetic');
    expect(Array.from(log.rollDeg!)).toEqual([0, 5, 10]);
    expect(Array.from(log.pitchDeg!)).toEqual([2, 2, 1]);
    expect(log.hAccM![0]).toBe(3.5);
    expect(log.hAccM![2]).toBeNaN(); // empty field: missing, not zero
  });

  it('reads ISO 8601 Z times and keeps the data row line numbers', () => {
    expect(log.t[0]).toBe(utc(2026, 5, 4, 10, 0, 0));
    expect(Array.from(log.line)).toEqual([2, 3, 4]);
    expect(log.source.warnings).toEqual([]);
  });

  it.each([
    ['alt_ft', 100, 100 * FT],
    ['altitude (ft)', 100, 100 * FT],
    ['Altitude [feet]', 100, 100 * FT],
    ['altitudeFt', 100, 100 * FT],
    ['alt_m', 100, 100],
    ['GPS Alt (m)', 100, 100],
  ])('altitude header %s: %d → %f m', (header, value, expected) => {
    const l = parseCsv(`time,lat,lon,${header}\n2026-05-04T10:00:00Z,52,1,${value}\n`, 'a.csv');
    expect(l.altM[0]).toBeCloseTo(expected, 9);
    expect(l.source.warnings.find((w) => w.code === 'unit-assumed')).toBeUndefined();
  });

  it('takes an altitude header without a unit (elevation) as metres and warns', () => {
    const l = parseCsv('time,lat,lon,elevation\n2026-05-04T10:00:00Z,52,1,250\n', 'a.csv');
    expect(l.altM[0]).toBe(250);
    expect(l.source.warnings.find((w) => w.code === 'unit-assumed')?.message).toContain('elevation');
  });

  it.each([
    ['speed_kt', 100, 100 * KT],
    ['ground speed (kts)', 100, 100 * KT],
    ['gs_ms', 50, 50],
    ['speed (m/s)', 50, 50],
    ['Speed km/h', 180, 180 * KMH],
    ['speed_kph', 180, 180 * KMH],
    ['speed (mph)', 100, 100 * MPH],
  ])('ground speed header %s: %d → %f m/s', (header, value, expected) => {
    const l = parseCsv(`time,lat,lon,${header}\n2026-05-04T10:00:00Z,52,1,${value}\n`, 'a.csv');
    expect(l.gsMs![0]).toBeCloseTo(expected, 9);
  });

  it.each([
    ['heading_true_deg', 'true'],
    ['Heading (T)', undefined],
    ['hdg_mag', 'magnetic'],
    ['heading magnetic', 'magnetic'],
  ])('heading reference from header %s', (header, ref) => {
    const l = parseCsv(`time,lat,lon,${header}\n2026-05-04T10:00:00Z,52,1,90\n`, 'a.csv');
    if (ref) {
      expect(l.headingRef).toBe(ref);
      expect(l.source.warnings.find((w) => w.code === 'heading-reference-assumed')).toBeUndefined();
    } else {
      // Not stated: taken as magnetic, with a warning (common practice: cockpit heading displays are magnetic).
      expect(l.headingRef).toBe('magnetic');
      expect(l.source.warnings.find((w) => w.code === 'heading-reference-assumed')).toBeDefined();
    }
  });

  it('does not take vertical speed, wind speed or derived compass columns for ground speed or heading', () => {
    const l = parseCsv('time,lat,lon,vertical_speed_fpm,wind_speed_kt,compass_deg\n2026-05-04T10:00:00Z,52,1,500,20,90\n', 'a.csv');
    expect(l.gsMs).toBeUndefined();
    expect(l.headingDeg).toBeUndefined();
  });

  it('prefers a GNSS altitude over a pressure altitude when both are logged', () => {
    const l = parseCsv('time,lat,lon,baro_alt_ft,gps_alt_ft\n2026-05-04T10:00:00Z,52,1,1000,1100\n', 'a.csv');
    expect(l.altM[0]).toBeCloseTo(1100 * FT, 9);
    expect(l.source.altDatum).toBe('unknown');
  });
});

describe('parseCsv: time encodings', () => {
  const row = (header: string, value: string) => parseCsv(`${header},lat,lon\n${value},52,1\n`, 't.csv');

  it('reads ISO 8601 with a numeric offset as UTC (12:00:00+02:00 = 10:00:00Z)', () => {
    expect(row('time', '2026-05-04T12:00:00+02:00').t[0]).toBe(utc(2026, 5, 4, 10, 0, 0));
  });

  it('reads Unix seconds and Unix milliseconds, told apart by magnitude', () => {
    const s = utc(2026, 5, 4, 10, 0, 0);
    expect(row('timestamp', String(s)).t[0]).toBe(s);
    expect(row('timestamp', String(s * 1000 + 500)).t[0]).toBeCloseTo(s + 0.5, 6);
  });

  it('reads Unix milliseconds when the header says ms', () => {
    expect(row('time_ms', '1778000000000').t[0]).toBe(1778000000);
  });

  it('refuses a time column that counts seconds from the start of the recording', () => {
    const e = parseError(() => parseCsv('time,lat,lon\n0.0,52,1\n1.0,52,1\n', 'rel.csv'));
    expect(e.line).toBe(2);
    expect(e.message).toMatch(/since the start/);
  });

  it('reads times of day with a date option, rolling over at midnight', () => {
    const l = parseCsv('time,lat,lon\n23:59:59,52,1\n00:00:01,52,1\n', 'tod.csv', { date: '2026-05-04' });
    expect(l.t[0]).toBe(utc(2026, 5, 4, 23, 59, 59));
    expect(l.t[1]).toBe(utc(2026, 5, 5, 0, 0, 1));
  });

  it('refuses times of day without a date, with a hint to give one', () => {
    const e = parseError(() => parseCsv('time,lat,lon\n10:00:00,52,1\n', 'tod.csv'));
    expect(e.hint).toMatch(/date/);
  });

  it('warns when ISO times carry no zone and takes them as UTC', () => {
    const l = parseCsv('time,lat,lon\n2026-05-04T10:00:00,52,1\n', 'nz.csv');
    expect(l.t[0]).toBe(utc(2026, 5, 4, 10, 0, 0));
    expect(l.source.warnings.find((w) => w.code === 'time-zone-assumed')).toBeDefined();
  });

  it('applies tzOffsetMin to times without a zone', () => {
    const l = parseCsv('time,lat,lon\n2026-05-04T12:00:00,52,1\n', 'nz.csv', { tzOffsetMin: 120 });
    expect(l.t[0]).toBe(utc(2026, 5, 4, 10, 0, 0));
  });

  it('refuses an out-of-range tzOffsetMin with an OptionError naming it', () => {
    expect(() => parseCsv('time,lat,lon\n', 'x.csv', { tzOffsetMin: 5000 })).toThrow(OptionError);
    expect(() => parseCsv('time,lat,lon\n', 'x.csv', { tzOffsetMin: 5000 })).toThrow(/tzOffsetMin/);
  });
});

describe('parseCsv: dialects, line numbers and bad input', () => {
  it('reads semicolon-separated text with decimal commas and a column mapping', () => {
    const l = parseCsv(fixture('semicolon-decimal-comma.csv'), 'de.csv', {
      columns: { time: 'Zeit', lat: 'Breite', lon: 'Laenge', alt: 'Hoehe (m)', gs: 'Geschwindigkeit (km/h)' },
    });
    expect(Array.from(l.lat)).toEqual([52.501, 52.5011]);
    expect(l.lon[1]).toBeCloseTo(-0.251, 12);
    expect(l.altM[0]).toBe(300.5);
    // Unit from the mapped header's own words: "(km/h)".
    expect(l.gsMs![1]).toBeCloseTo(181.5 * KMH, 9);
    expect(l.t[0]).toBe(utc(2026, 5, 4, 10, 0, 0));
  });

  it('counts lines across blank lines and CRLF line breaks', () => {
    const l = parseCsv('time,lat,lon\r\n\r\n2026-05-04T10:00:00Z,52,1\r\n2026-05-04T10:00:01Z,52,1\r\n', 'crlf.csv');
    expect(Array.from(l.line)).toEqual([3, 4]);
  });

  it('skips # comment lines before the header', () => {
    const l = parseCsv('# recorded by a Fenbird logger\ntime,lat,lon\n2026-05-04T10:00:00Z,52,1\n', 'c.csv');
    expect(Array.from(l.line)).toEqual([3]);
  });

  it('refuses a CSV without a time column, naming the header line and giving a hint', () => {
    const e = parseError(() => parseCsv(fixture('no-time.csv'), 'no-time.csv'));
    expect(e.message).toMatch(/no time column/);
    expect(e.message).toContain('lat, lon, alt_m');
    expect(e.line).toBe(1);
    expect(e.hint).toMatch(/--columns time=/);
  });

  it('refuses a file whose first line holds numbers instead of column names', () => {
    const e = parseError(() => parseCsv('1778000000,52,1\n1778000001,52,1\n', 'nh.csv'));
    expect(e.message).toMatch(/numbers, not column names/);
  });

  it('drops a last row cut off mid-way and marks the log truncated', () => {
    const l = parseCsv('time,lat,lon,alt_m\n2026-05-04T10:00:00Z,52,1,100\n2026-05-04T10:00:01Z,52.1', 'cut.csv');
    expect(l.t.length).toBe(1);
    expect(l.source.reader).toEqual({ recordsRead: 2, recordsDropped: 1, truncated: true });
    expect(l.source.warnings.find((w) => w.code === 'file-truncated')?.lines).toEqual([3]);
  });

  it('turns an unreadable number into NaN and counts it with its line', () => {
    const l = parseCsv('time,lat,lon,alt_m\n2026-05-04T10:00:00Z,52,1,abc\n2026-05-04T10:00:01Z,52,1,5\n', 'bad.csv');
    expect(l.altM[0]).toBeNaN();
    expect(l.altM[1]).toBe(5);
    const w = l.source.warnings.find((x) => x.code === 'unreadable-value');
    expect(w?.lines).toEqual([2]);
  });

  it('refuses a column mapping naming a column that does not exist', () => {
    const e = parseError(() => parseCsv('a,b,c\n1,2,3\n', 'm.csv', { columns: { time: 'Zeit' } }));
    expect(e.message).toContain('"Zeit"');
    expect(e.hint).toContain('a, b, c');
  });

  it('refuses a column mapping key that is not a role with an OptionError', () => {
    expect(() => parseCsv('a,b,c\n1,2,3\n', 'm.csv', { columns: { speedo: 'a' } })).toThrow(OptionError);
  });
});
