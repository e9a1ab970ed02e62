// The in-place CSV reader (bytes, no string per field) against the general way (papaparse, then the
// string readers), and the byte readers of asciiFields.ts against their regular-expression definitions.
// Oracles: Number() (ECMA-262 §7.1.4.1.1 StringToNumber, correctly rounded) for decimals; the regex-based
// parseIsoDateTimeByPattern / parseTimeOfDayByPattern of isoTime.ts for times (parseIsoDateTime, byte
// reader first, is checked against Date.UTC in isoTime.test.ts); papaparse's own reading of the same text
// for the split into rows and fields.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { COMMA, POINT, parseIsoBytes, parsePlainDecimalBytes, parseTimeOfDayBytes } from '../../src/import/asciiFields.js';
import { parseCsv } from '../../src/import/csv.js';
import { parseIsoDateTimeByPattern, parseTimeOfDayByPattern } from '../../src/import/isoTime.js';
import { parseDecimal, parseDecimalComma } from '../../src/import/parseNumber.js';
import type { FlightLog } from '../../src/log/flightLog.js';

const ascii = (s: string) => new TextEncoder().encode(s);

describe('parsePlainDecimalBytes', () => {
  it('equals Number() wherever it gives a number, over random plain decimals', () => {
    const plain = fc
      .tuple(fc.constantFrom('', '-', '+'), fc.stringMatching(/^[0-9]{0,9}$/), fc.option(fc.stringMatching(/^[0-9]{0,9}$/)))
      .map(([s, i, f]) => `${s}${i}${f === null ? '' : `.${f}`}`);
    fc.assert(
      fc.property(plain, (text) => {
        const v = parsePlainDecimalBytes(ascii(text), 0, text.length, POINT);
        const digits = text.replace(/[^0-9]/g, '').length;
        if (digits === 0 || digits > 15) expect(v).toBeNaN();
        else expect(Object.is(v, Number(text))).toBe(true);
      }),
      { numRuns: 20000 },
    );
  });

  it('equals Number() on printed doubles (shortest round-trip and fixed forms)', () => {
    fc.assert(
      fc.property(fc.double({ min: -1e6, max: 1e6, noNaN: true }), fc.integer({ min: 0, max: 9 }), (x, d) => {
        for (const text of [x.toFixed(d), String(x)]) {
          const v = parsePlainDecimalBytes(ascii(text), 0, text.length, POINT);
          if (v === v) expect(Object.is(v, Number(text))).toBe(true);
        }
      }),
      { numRuns: 20000 },
    );
  });

  it('gives NaN (the general way decides) for blanks, exponents, junk, a lone point, two points', () => {
    for (const text of ['', ' 1', '1 ', '1e3', '0x10', '1,5', '.', '-', '1.2.3', 'Infinity', '12a']) {
      expect(parsePlainDecimalBytes(ascii(text), 0, text.length, POINT)).toBeNaN();
    }
    expect(parsePlainDecimalBytes(ascii('12,5'), 0, 4, COMMA)).toBe(12.5);
    expect(parsePlainDecimalBytes(ascii('12.5'), 0, 4, COMMA)).toBeNaN();
    // Reads only its span: "52.5" inside "x,52.5,y".
    expect(parsePlainDecimalBytes(ascii('x,52.5,y'), 2, 6, POINT)).toBe(52.5);
  });
});

describe('parseIsoBytes', () => {
  it('equals parseIsoDateTimeByPattern on random extended-format date-times (separators, seconds, fractions, zones, impossible dates)', () => {
    const p2 = (k: number) => String(k).padStart(2, '0');
    const zone = fc.oneof(
      fc.constantFrom('', 'Z', 'z', '+00:00', '-05:30', '+0200', '+02', '-1200', '+19:00', '+05:60'),
      fc.tuple(fc.constantFrom('+', '-'), fc.integer({ min: 0, max: 20 }), fc.integer({ min: 0, max: 61 })).map(([sg, h, m]) => `${sg}${p2(h)}:${p2(m)}`),
    );
    fc.assert(
      fc.property(
        fc.integer({ min: 1980, max: 2099 }),
        fc.integer({ min: 0, max: 13 }),
        fc.integer({ min: 0, max: 32 }),
        fc.integer({ min: 0, max: 24 }),
        fc.integer({ min: 0, max: 60 }),
        fc.option(fc.integer({ min: 0, max: 61 })),
        fc.stringMatching(/^[0-9]{0,17}$/),
        fc.constantFrom('T', 't', ' ', 'x'),
        fc.constantFrom('.', ','),
        zone,
        fc.integer({ min: -720, max: 840 }),
        (y, mo, d, h, mi, sec, f, sep, point, z, tzMin) => {
          const time = sec === null ? `${p2(h)}:${p2(mi)}` : `${p2(h)}:${p2(mi)}:${p2(sec)}${f ? `${point}${f}` : ''}`;
          const text = `${y}-${p2(mo)}-${p2(d)}${sep}${time}${z}`;
          const v = parseIsoBytes(ascii(text), 0, text.length, tzMin);
          const ref = parseIsoDateTimeByPattern(text, tzMin);
          // NaN from the byte reader means "the general way decides"; it may only do so for more than 15
          // fraction digits where the general way still reads a time.
          if (Number.isNaN(v) && !Number.isNaN(ref)) expect(f.length).toBeGreaterThan(15);
          else expect(Object.is(v, ref) || (Number.isNaN(v) && Number.isNaN(ref))).toBe(true);
        },
      ),
      { numRuns: 30000 },
    );
  });

  it('reads only its span and gives NaN for blanks around the text (the general way trims them)', () => {
    const line = ascii('x,2026-05-04T10:00:00Z,y');
    expect(parseIsoBytes(line, 2, 22, 0)).toBe(Date.UTC(2026, 4, 4, 10) / 1000);
    expect(parseIsoBytes(ascii(' 2026-05-04T10:00:00Z'), 0, 21, 0)).toBeNaN();
    expect(parseIsoBytes(ascii('2026-05-04T10:00:00Z '), 0, 21, 0)).toBeNaN();
  });
});

describe('parseTimeOfDayBytes', () => {
  it('equals parseTimeOfDayByPattern on random times of day, in range or not, with point or comma fractions', () => {
    const text = fc.oneof(
      fc
        .tuple(fc.integer({ min: 0, max: 25 }), fc.boolean(), fc.integer({ min: 0, max: 61 }), fc.option(fc.integer({ min: 0, max: 61 })), fc.stringMatching(/^[0-9]{0,17}$/), fc.constantFrom('.', ','))
        .map(([h, pad, m, sec, f, p]) => `${pad ? String(h).padStart(2, '0') : h}:${String(m).padStart(2, '0')}${sec === null ? '' : `:${String(sec).padStart(2, '0')}${f ? p + f : ''}`}`),
      fc.stringMatching(/^[0-9:., ]{0,12}$/),
    );
    fc.assert(
      fc.property(text, (t) => {
        const v = parseTimeOfDayBytes(ascii(t), 0, t.length);
        const ref = parseTimeOfDayByPattern(t);
        // NaN from the byte reader means "the general way decides" (blanks, more than 15 fraction digits).
        if (Number.isNaN(v) && !Number.isNaN(ref)) expect(/^\s|\s$|[.,]\d{16,}/.test(t)).toBe(true);
        else expect(Object.is(v, ref) || (Number.isNaN(v) && Number.isNaN(ref))).toBe(true);
      }),
      { numRuns: 30000 },
    );
  });
});

/** The log's columns and what the reader said, for comparing two readings of the same rows. */
function essence(log: FlightLog) {
  const cols: Record<string, number[]> = {};
  for (const [k, v] of Object.entries(log)) if (v instanceof Float64Array || v instanceof Int32Array) cols[k] = Array.from(v);
  return { cols, warnings: log.source.warnings, reader: log.source.reader };
}

describe('parseCsv: the in-place way reads as the papaparse way does', () => {
  // A field: a plain number, an unusual but valid number, a blank, junk or nothing.
  const field = fc.oneof(
    { weight: 6, arbitrary: fc.double({ min: -500, max: 500, noNaN: true }).map((x) => x.toFixed(3)) },
    { weight: 1, arbitrary: fc.constantFrom('', ' ', '1e2', ' 7.5 ', '+3', '.5', '5.', 'abc', '1.2.3', '12345678901234567', '\t') },
  );
  const time = fc.oneof(
    { weight: 8, arbitrary: fc.integer({ min: 0, max: 86399 }).map((s) => new Date(Date.UTC(2026, 4, 4) + s * 1000).toISOString()) },
    { weight: 1, arbitrary: fc.constantFrom('', 'not a time', '2026-05-04 10:00:00Z', '2026-05-04T10:00:00+02:00', ' 2026-05-04T10:00:01Z') },
  );
  const row = fc.oneof(
    { weight: 12, arbitrary: fc.tuple(time, field, field, field, field).map((fs) => fs.join(',')) },
    { weight: 1, arbitrary: fc.constantFrom('', ',,,,', '# a comment', '  ', '2026-05-04T10:00:00Z,52', 'x,y,z,w,v,u') },
  );

  it('gives the same columns, warnings and counts for random quote-free texts, LF and CRLF', () => {
    fc.assert(
      fc.property(fc.array(row, { minLength: 1, maxLength: 40 }), fc.boolean(), (rows, crlf) => {
        const nl = crlf ? '\r\n' : '\n';
        const text = ['time,lat,lon,alt_ft,gs_kt', ...rows].join(nl) + nl;
        // A quote character anywhere sends the whole text through papaparse: a comment line at the end.
        const quoted = `${text}#"${nl}`;
        let a: unknown;
        let b: unknown;
        try {
          a = essence(parseCsv(text, 'a.csv'));
        } catch (err) {
          a = String(err);
        }
        try {
          b = essence(parseCsv(quoted, 'a.csv'));
        } catch (err) {
          b = String(err);
        }
        expect(a).toEqual(b);
      }),
      { numRuns: 1500 },
    );
  });

  it('reads a quoted header with plain data rows as papaparse reads the whole text', () => {
    fc.assert(
      fc.property(fc.array(row, { minLength: 1, maxLength: 30 }), fc.boolean(), (rows, crlf) => {
        const nl = crlf ? '\r\n' : '\n';
        const text = ['"time","lat","lon","alt_ft","gs_kt"', ...rows].join(nl) + nl;
        let a: unknown;
        let b: unknown;
        try {
          a = essence(parseCsv(text, 'q.csv'));
        } catch (err) {
          a = String(err);
        }
        try {
          b = essence(parseCsv(`${text}#"${nl}`, 'q.csv'));
        } catch (err) {
          b = String(err);
        }
        expect(a).toEqual(b);
      }),
      { numRuns: 800 },
    );
  });

  it('reads times of day (with a date column, or one date and midnight roll-over) as the papaparse way does', () => {
    const tod = fc.oneof(
      { weight: 8, arbitrary: fc.integer({ min: 0, max: 86399 }).map((s) => new Date(s * 1000).toISOString().slice(11, 21)) },
      { weight: 1, arbitrary: fc.constantFrom('', '25:00:00', '9:05', ' 10:00:00', '10:00:00,25', 'noon') },
    );
    const date = fc.constantFrom('2026-05-04', '2026-05-05', '04.05.2026', '2026/05/06', '', 'bad');
    fc.assert(
      fc.property(fc.array(fc.tuple(date, tod, field, field), { minLength: 1, maxLength: 30 }), fc.boolean(), (rows, withDate) => {
        const lines = withDate ? ['date,time,lat,lon', ...rows.map(([d, t, a, b]) => `${d},${t},${a},${b}`)] : ['time,lat,lon', ...rows.map(([, t, a, b]) => `${t},${a},${b}`)];
        const text = lines.join('\n') + '\n';
        const opts = withDate ? { tzOffsetMin: 60 } : { date: '2026-05-04' };
        const read = (t: string) => {
          try {
            return essence(parseCsv(t, 'tod.csv', opts));
          } catch (err) {
            return String(err);
          }
        };
        expect(read(text)).toEqual(read(`${text}#"\n`));
      }),
      { numRuns: 800 },
    );
  });

  it('keeps line numbers across lone line feeds in a CRLF file and across chunks', () => {
    const text = 'time,lat,lon\r\n2026-05-04T10:00:00Z,52,1\r\n\n2026-05-04T10:00:01Z,52,1\r\n';
    const ref = parseCsv(`${text}#"\r\n`, 'c.csv');
    const log = parseCsv(text, 'c.csv');
    expect(Array.from(log.line)).toEqual(Array.from(ref.line));
    expect(log.t.length).toBe(2);
  });
});

describe('parseDecimal and parseDecimalComma (string readers with the same fast path)', () => {
  // Reference: the strict grammar of parseNumber.ts, then Number() (ECMA-262 StringToNumber).
  const DECIMAL = /^\s*[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?\s*$/;
  const reference = (t: string) => (DECIMAL.test(t) ? Number(t) : NaN);
  it('equal the grammar-then-Number() reference on random numbers and near-numbers', () => {
    const text = fc.oneof(
      fc.double({ noNaN: true }).map(String),
      fc.double({ min: -1e4, max: 1e4, noNaN: true }).chain((x) => fc.integer({ min: 0, max: 12 }).map((d) => x.toFixed(d))),
      fc.stringMatching(/^[ +\-0-9.eE,x]{0,12}$/),
    );
    fc.assert(
      fc.property(text, (t) => {
        expect(Object.is(parseDecimal(t), reference(t))).toBe(true);
        const comma = t.replace('.', ',');
        const refComma = /^\s*[+-]?(?:\d+(?:,\d*)?|,\d+)(?:[eE][+-]?\d+)?\s*$/.test(comma) ? Number(comma.replace(',', '.')) : NaN;
        expect(Object.is(parseDecimalComma(comma), refComma)).toBe(true);
      }),
      { numRuns: 30000 },
    );
  });
});
