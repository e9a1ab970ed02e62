// cleanLog: repairs are checked against hand-built logs whose right answer is known by construction
// (the sorted, de-duplicated order is written out in each test), not against our own output.
import { describe, expect, it } from 'vitest';
import { cleanLog } from '../../src/log/cleanLog.js';
import type { FlightLog } from '../../src/log/flightLog.js';
import { MAX_WARNING_LINES } from '../../src/log/logWarnings.js';

const T0 = Date.UTC(2026, 4, 4, 10, 0, 0) / 1000;

function makeLog(rows: Array<[t: number, lat: number, lon: number]>, extra: Partial<FlightLog> = {}): FlightLog {
  return {
    source: { format: 'csv', file: 'x.csv', warnings: [], meta: {}, altDatum: 'unknown' },
    t: Float64Array.from(rows.map((r) => r[0])),
    lat: Float64Array.from(rows.map((r) => r[1])),
    lon: Float64Array.from(rows.map((r) => r[2])),
    altM: Float64Array.from(rows.map((_, i) => 100 + i)),
    line: Int32Array.from(rows.map((_, i) => i + 2)), // row i came from line i + 2 (after a header)
    ...extra,
  };
}

describe('cleanLog', () => {
  it('puts out-of-order rows back in time order and reports their lines', () => {
    const log = makeLog([
      [T0, 52, 1],
      [T0 + 2, 52.2, 1],
      [T0 + 1, 52.1, 1], // line 4, recorded late
      [T0 + 3, 52.3, 1],
    ]);
    const { log: out, health } = cleanLog(log);
    expect(Array.from(out.t)).toEqual([T0, T0 + 1, T0 + 2, T0 + 3]);
    expect(Array.from(out.lat)).toEqual([52, 52.1, 52.2, 52.3]);
    expect(Array.from(out.altM)).toEqual([100, 102, 101, 103]); // the other columns move with their row
    expect(Array.from(out.line)).toEqual([2, 4, 3, 5]);
    expect(health.outOfOrder).toBe(1);
    const w = out.source.warnings.find((x) => x.code === 'out-of-order');
    expect(w?.lines).toEqual([4]);
    expect(w?.message).toContain('line 4');
  });

  it('drops repeated times keeping the first row in file order, and reports the dropped lines', () => {
    const log = makeLog([
      [T0, 52, 1],
      [T0 + 1, 52.1, 1],
      [T0 + 1, 52.15, 1], // line 4: same time, dropped
      [T0 + 2, 52.2, 1],
      [T0, 88, 1], // line 6: repeats T0 and is also out of order; the line-2 row is kept
    ]);
    const { log: out, health } = cleanLog(log);
    expect(Array.from(out.lat)).toEqual([52, 52.1, 52.2]);
    expect(health.duplicateTimes).toBe(2);
    expect(out.source.warnings.find((x) => x.code === 'duplicate-time')?.lines).toEqual([4, 6]);
    // The late line-6 row was dropped, not re-ordered: it is not also counted as out of order.
    expect(health.outOfOrder).toBe(0);
  });

  it('drops rows without a usable time or position, each kind reported with its lines', () => {
    const log = makeLog([
      [T0, 52, 1],
      [NaN, 52, 1], // line 3
      [T0 + 1, NaN, 1], // line 4
      [T0 + 2, 91, 1], // line 5: |lat| > 90
      [T0 + 3, 52, 181], // line 6: |lon| > 180
      [T0 + 4, 0, 0], // line 7: the no-fix position
      [0, 52, 1], // line 8: 1970, before GPS time began
      [T0 + 5, 52, 1],
    ]);
    const { log: out, health } = cleanLog(log);
    expect(Array.from(out.line)).toEqual([2, 9]);
    expect(out.source.warnings.find((x) => x.code === 'invalid-time')?.lines).toEqual([3, 8]);
    expect(out.source.warnings.find((x) => x.code === 'invalid-position')?.lines).toEqual([4, 5, 6]);
    expect(out.source.warnings.find((x) => x.code === 'no-fix-position')?.lines).toEqual([7]);
    expect(health.invalidValues).toBe(6);
    expect(health.samplesKept).toBe(2);
    expect(health.recordsRead).toBe(8);
  });

  it('accounts for every row: kept + dropped = read', () => {
    const log = makeLog([
      [T0, 52, 1],
      [T0, 52, 1],
      [NaN, 52, 1],
      [T0 + 1, 52, 1],
    ]);
    const { health } = cleanLog(log);
    expect(health.samplesKept + health.duplicateTimes + health.invalidValues).toBe(health.recordsRead);
  });

  it('turns impossible values in optional columns into NaN and counts them, and wraps track to [0, 360)', () => {
    const log = makeLog(
      [
        [T0, 52, 1],
        [T0 + 1, 52, 1],
        [T0 + 2, 52, 1],
      ],
      { gsMs: Float64Array.from([50, -3, 51]), trackDegTrue: Float64Array.from([-10, 360, 10]), rollDeg: Float64Array.from([0, 200, NaN]) },
    );
    const { log: out, health } = cleanLog(log);
    expect(Array.from(out.gsMs!)).toEqual([50, NaN, 51]);
    expect(Array.from(out.trackDegTrue!)).toEqual([350, 0, 10]);
    expect(out.rollDeg![1]).toBeNaN();
    expect(health.invalidValues).toBe(2);
    expect(out.source.warnings.find((x) => x.code === 'invalid-value')?.lines).toEqual([3, 3]);
  });

  it('caps the listed lines and still counts them all', () => {
    const rows: Array<[number, number, number]> = [];
    for (let i = 0; i < 50; i++) rows.push([T0, 52, 1]);
    const { log: out } = cleanLog(makeLog(rows));
    const w = out.source.warnings.find((x) => x.code === 'duplicate-time')!;
    expect(w.count).toBe(49);
    expect(w.lines!.length).toBe(MAX_WARNING_LINES);
    expect(w.message).toContain('49 in all');
  });

  it('does not modify its input and is idempotent', () => {
    const log = makeLog([
      [T0 + 1, 52, 1],
      [T0, 52, 1],
    ]);
    const before = Array.from(log.t);
    const once = cleanLog(log);
    expect(Array.from(log.t)).toEqual(before);
    expect(log.source.warnings).toEqual([]);
    const twice = cleanLog(once.log);
    expect(Array.from(twice.log.t)).toEqual(Array.from(once.log.t));
    expect(twice.health.outOfOrder).toBe(0);
    expect(twice.log.source.warnings.length).toBe(once.log.source.warnings.length);
  });

  it('carries the reader counts into health (records read, dropped by the reader, truncated)', () => {
    const log = makeLog([
      [T0, 52, 1],
      [T0 + 1, 52, 1],
    ]);
    log.source.reader = { recordsRead: 5, recordsDropped: 3, truncated: true };
    const { health } = cleanLog(log);
    expect(health).toEqual({
      recordsRead: 5,
      samplesKept: 2,
      duplicateTimes: 0,
      outOfOrder: 0,
      positionSpikes: 0,
      invalidValues: 3,
      gaps: 0,
      truncated: true,
    });
  });
});
