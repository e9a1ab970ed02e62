// ISO 8601 date-times without a Date object, checked against ECMAScript's Date.UTC (ECMA-262 §21.4.1.28,
// proleptic Gregorian calendar) over random dates, and on the calendar's edges.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { parseIsoDate, parseIsoDateTime } from '../../src/import/isoTime.js';

const pad = (n: number, w: number) => String(n).padStart(w, '0');

describe('parseIsoDateTime', () => {
  it('equals Date.UTC for any valid date 1900–2199 and time of day (ECMA-262 Date.UTC as oracle)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1900, max: 2199 }), fc.integer({ min: 1, max: 12 }), fc.integer({ min: 1, max: 31 }),
        fc.integer({ min: 0, max: 23 }), fc.integer({ min: 0, max: 59 }), fc.integer({ min: 0, max: 59 }),
        (y, mo, d, h, mi, s) => {
          const valid = new Date(Date.UTC(y, mo - 1, d)).getUTCDate() === d;
          const text = `${y}-${pad(mo, 2)}-${pad(d, 2)}T${pad(h, 2)}:${pad(mi, 2)}:${pad(s, 2)}Z`;
          const got = parseIsoDateTime(text);
          if (valid) expect(got).toBe(Date.UTC(y, mo - 1, d, h, mi, s) / 1000);
          else expect(got).toBeNaN();
        },
      ),
      { numRuns: 5000, seed: 2026 },
    );
  });

  it('knows leap years: 2000-02-29 and 2024-02-29 exist, 1900-02-29 and 2100-02-29 do not (Gregorian rule)', () => {
    expect(parseIsoDate('2000-02-29')).toBe(Date.UTC(2000, 1, 29) / 1000);
    expect(parseIsoDate('2024-02-29')).toBe(Date.UTC(2024, 1, 29) / 1000);
    expect(parseIsoDate('1900-02-29')).toBeNaN();
    expect(parseIsoDate('2100-02-29')).toBeNaN();
  });

  it('applies offsets and keeps fractions as written', () => {
    expect(parseIsoDateTime('2026-05-04T12:11:12.25+02:00')).toBe(Date.UTC(2026, 4, 4, 10, 11, 12) / 1000 + 0.25);
    expect(parseIsoDateTime('1969-12-31T23:59:59Z')).toBe(-1);
  });
});

describe('parseIsoDateTime, the common UTC layout', () => {
  it('reads fractions exactly as the general path and Number() do (ECMA-262 StringToNumber as oracle)', () => {
    for (const f of ['1', '25', '123', '999', '000001', '5']) {
      const got = parseIsoDateTime(`2026-05-04T10:11:12.${f}Z`);
      expect(got).toBe(Date.UTC(2026, 4, 4, 10, 11, 12) / 1000 + Number(`0.${f}`));
    }
  });

  it('refuses what the layout forbids and leaves other forms to the general path', () => {
    expect(parseIsoDateTime('2026-02-30T10:11:12Z')).toBeNaN();
    expect(parseIsoDateTime('2026-05-04T24:00:00Z')).toBeNaN();
    expect(parseIsoDateTime('2026-05-04T10:11:12.Z')).toBeNaN();
    expect(parseIsoDateTime('2026-05-04t10:11:12z')).toBe(Date.UTC(2026, 4, 4, 10, 11, 12) / 1000);
    expect(parseIsoDateTime('2026-05-04 10:11:12Z')).toBe(Date.UTC(2026, 4, 4, 10, 11, 12) / 1000);
  });
});
