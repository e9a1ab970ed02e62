// CSV dialects and spellings met in real exports. Oracles as in csv.test.ts (exact unit definitions,
// Date.UTC); the dialects themselves are written out by hand here.
import { describe, expect, it } from 'vitest';
import { parseCsv } from '../../src/import/csv.js';
import { detectCsvDialect } from '../../src/import/csvDialect.js';
import { parseColumnMapping } from '../../src/import/columnMapping.js';
import { OptionError } from '../../src/errors.js';

const utc = (y: number, mo: number, d: number, h: number, mi: number, s: number) => Date.UTC(y, mo - 1, d, h, mi, s) / 1000;
const T = utc(2026, 5, 4, 10, 0, 0);

describe('CSV dialects', () => {
  it.each([
    [',', 'time,lat,lon\n2026-05-04T10:00:00Z,52.5,-0.25\n'],
    [';', 'time;lat;lon\n2026-05-04T10:00:00Z;52.5;-0.25\n'],
    ['\t', 'time\tlat\tlon\n2026-05-04T10:00:00Z\t52.5\t-0.25\n'],
    ['|', 'time|lat|lon\n2026-05-04T10:00:00Z|52.5|-0.25\n'],
  ])('detects the delimiter %j', (delimiter, text) => {
    expect(detectCsvDialect(text).delimiter).toBe(delimiter);
    const l = parseCsv(text, 'd.csv');
    expect(l.t[0]).toBe(T);
    expect(l.lat[0]).toBe(52.5);
    expect(l.lon[0]).toBe(-0.25);
  });

  it('detects decimal commas in semicolon files and German headers (Zeit, Breite, Länge, Höhe, Geschwindigkeit)', () => {
    const text = 'Zeit;Breite;Länge;Höhe (m);Geschwindigkeit (km/h);Querneigung\n2026-05-04T10:00:00Z;52,5;-0,25;300,5;180;-12,5\n';
    expect(detectCsvDialect(text)).toMatchObject({ delimiter: ';', decimalComma: true });
    const l = parseCsv(text, 'de.csv');
    expect(l.lat[0]).toBe(52.5);
    expect(l.lon[0]).toBe(-0.25);
    expect(l.altM[0]).toBe(300.5);
    expect(l.gsMs![0]).toBeCloseTo(50, 12); // 180 km/h = 50 m/s exactly
    expect(l.rollDeg![0]).toBe(-12.5);
  });

  it('reads dotted day-first date-times (04.05.2026 12:00:00) with a time-zone offset option', () => {
    const l = parseCsv('Zeit;Breite;Laenge\n04.05.2026 12:00:00;52,5;1,0\n', 'dot.csv', { tzOffsetMin: 120 });
    expect(l.t[0]).toBe(T);
  });

  it('reads slashed year-first date-times (2026/05/04 10:00:00)', () => {
    expect(parseCsv('time,lat,lon\n2026/05/04 10:00:00Z,52,1\n', 's.csv').t[0]).toBe(T);
  });

  it('combines a date column with a time-of-day column', () => {
    const l = parseCsv('date,time,lat,lon\n2026-05-04,23:59:59,52,1\n2026-05-05,00:00:01,52,1\n', 'dt.csv');
    expect(Array.from(l.t)).toEqual([utc(2026, 5, 4, 23, 59, 59), utc(2026, 5, 5, 0, 0, 1)]);
  });

  it('applies tzOffsetMin to times of day (local 12:00 at UTC+2 is 10:00Z)', () => {
    const l = parseCsv('time,lat,lon\n12:00:00,52,1\n', 'tod.csv', { date: '2026-05-04', tzOffsetMin: 120 });
    expect(l.t[0]).toBe(T);
  });

  it('reads attitude columns: bank (right wing down +) and pitch, and radians when the header says rad', () => {
    const l = parseCsv('time,lat,lon,roll_rad,pitch_deg\n2026-05-04T10:00:00Z,52,1,0.5,3\n', 'att.csv');
    expect(l.rollDeg![0]).toBeCloseTo((0.5 * 180) / Math.PI, 12);
    expect(l.pitchDeg![0]).toBe(3);
  });

  it('gives the same log whatever the chunking of a large text', () => {
    const rows = ['time,lat,lon,alt_m'];
    for (let i = 0; i < 2000; i++) rows.push(`${T + i},${(52 + i * 1e-5).toFixed(5)},1,${i}`);
    const text = rows.join('\r\n') + '\r\n';
    const a = parseCsv(text, 'a.csv');
    expect(a.t.length).toBe(2000);
    expect(a.line[1999]).toBe(2001);
    expect(a.altM[1234]).toBe(1234);
  });
});

describe('parseColumnMapping', () => {
  it('reads the --columns form', () => {
    expect(parseColumnMapping('time=Zeit,lat=Breite,lon=Länge,alt_ft=Höhe (ft)')).toEqual({ time: 'Zeit', lat: 'Breite', lon: 'Länge', alt_ft: 'Höhe (ft)' });
  });

  it('reads one pair per line with comments, and JSON', () => {
    expect(parseColumnMapping('# mapping\ntime = Zeit\nlat: "Breite, Grad"\n')).toEqual({ time: 'Zeit', lat: 'Breite, Grad' });
    expect(parseColumnMapping('{"time": "Zeit", "gs_kt": "GS"}')).toEqual({ time: 'Zeit', gs_kt: 'GS' });
  });

  it('refuses an unknown role or a pair without =', () => {
    expect(() => parseColumnMapping('speedo=GS')).toThrow(OptionError);
    expect(() => parseColumnMapping('time')).toThrow(/role=column/);
  });

  it('maps into parseCsv with the unit in the key', () => {
    const l = parseCsv('Zeit,Breite,Laenge,H\n2026-05-04T10:00:00Z,52,1,1000\n', 'm.csv', { columns: parseColumnMapping('alt_ft=H') });
    expect(l.altM[0]).toBeCloseTo(304.8, 9); // 1000 ft × 0.3048 m/ft (exact)
  });
});
