// The plan file: parsing (pure text in, typed rows or a ParseError with the line) and in-order matching to turns.
import { describe, expect, it } from 'vitest';
import { ParseError } from '../../src/errors.js';
import { matchPlanToTurns, parsePlanCsv } from '../../src/analysis/turnPlan.js';

// Format contract: DESIGN.md "Plan file" (column target_mag_deg, optional not_before_utc), plus our timed_s and label.
describe('parsePlanCsv', () => {
  it('reads targets, anchors and timed turns with their 1-based lines; blank and # lines are skipped', () => {
    const text = '\uFEFFTarget_Mag_Deg,not_before_utc,timed_s,label\r\n# warm-up\r\n090,,,\r\n\r\n360,2026-05-04T10:12:00Z,,"north, again"\r\n180,,60,\r\n';
    const rows = parsePlanCsv(text);
    expect(rows.map((r) => r.line)).toEqual([3, 5, 6]);
    expect(rows.map((r) => r.targetMagDeg)).toEqual([90, 0, 180]); // 360 means north
    expect(Number.isNaN(rows[0].notBeforeT)).toBe(true);
    expect(rows[1].notBeforeT).toBe(Date.UTC(2026, 4, 4, 10, 12, 0) / 1000);
    expect(rows[1].label).toBe('north, again');
    expect(rows[2].timedS).toBe(60);
  });

  it('columns may come in any order and unknown ones are ignored', () => {
    const rows = parsePlanCsv('note,target_mag_deg\nfirst,045\nsecond,270.5\n');
    expect(rows.map((r) => r.targetMagDeg)).toEqual([45, 270.5]);
  });

  const bad: Array<[string, string, number]> = [
    ['heading\n090\n', 'no target_mag_deg column', 1],
    ['target_mag_deg\n090\nabc\n', 'target "abc"', 3],
    ['target_mag_deg\n090\n\n400\n', 'outside 0–360', 4],
    ['target_mag_deg\n-5\n', 'negative target', 2],
    ['target_mag_deg,not_before_utc\n090,10:12\n', 'time without a date', 2],
    ['target_mag_deg,timed_s\n090,0\n', 'timed_s 0', 2],
    ['target_mag_deg\n,\n', 'empty target', 2],
    ['target_mag_deg\n', 'header only', 1],
    ['\n# nothing\n', 'empty plan', 1],
  ];
  for (const [text, what, line] of bad) {
    it(`throws a ParseError naming line ${line} for ${what}`, () => {
      let err: unknown;
      try {
        parsePlanCsv(text);
      } catch (e) {
        err = e;
      }
      expect(err).toBeInstanceOf(ParseError);
      expect((err as ParseError).line).toBe(line);
    });
  }
});

describe('matchPlanToTurns', () => {
  const rows = parsePlanCsv('target_mag_deg,not_before_utc\n090,\n180,\n270,1970-01-01T00:05:00Z\n000,\n');
  it('matches rows to turns in order when nothing is anchored', () => {
    const m = matchPlanToTurns(rows.slice(0, 2), [10, 50, 90]);
    expect(Array.from(m.rowOfTurn)).toEqual([0, 1, -1]);
    expect(m.unmatchedRows).toEqual([]);
  });
  it('an anchor skips turns that start before it, realigning the plan after an unplanned turn', () => {
    // Turns at 10 s, 50 s, 120 s (unplanned), 300 s, 400 s.
    const m = matchPlanToTurns(rows, [10, 50, 120, 300, 400]);
    expect(Array.from(m.rowOfTurn)).toEqual([0, 1, -1, 2, 3]);
  });
  it('rows with no turn left are reported', () => {
    const m = matchPlanToTurns(rows, [10, 50]);
    expect(m.unmatchedRows.map((r) => r.line)).toEqual([4, 5]);
  });
});
