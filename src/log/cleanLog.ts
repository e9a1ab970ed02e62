// cleanLog: the first repair pass over a FlightLog, before any smoothing. Pure; every repair is reported.
import { OPTIONAL_COLUMNS, type FlightLog, type LogHealth, type LogWarning, type OptionalColumn } from './flightLog.js';
import { LineTally, plural, pushTally } from './logWarnings.js';
import { wrap360 } from '../geo/angles.js';

/** Earliest plausible sample time: 1980-01-01T00:00:00Z [s since epoch]. GPS time begins 1980-01-06 (IS-GPS-200). */
export const EARLIEST_T = 315532800;
/** Latest plausible sample time: 2100-01-01T00:00:00Z [s since epoch] (common practice: a sanity bound). */
export const LATEST_T = 4102444800;

/**
 * Physically possible range of each value column; outside it a value becomes NaN and is counted.
 * Bounds are deliberately wide (common practice: reject only impossible values here; spikes are the
 * state stage's business).
 */
const VALUE_RANGES: Record<'altM' | OptionalColumn, [number, number]> = {
  altM: [-1000, 40000],
  gsMs: [0, 600],
  trackDegTrue: [-360, 720],
  headingDeg: [-360, 720],
  rollDeg: [-180, 180],
  pitchDeg: [-90, 90],
  tasMs: [0, 600],
  iasMs: [0, 600],
  hAccM: [0, 100000],
};

const ANGLE_COLUMNS = new Set<string>(['trackDegTrue', 'headingDeg']);

/**
 * Checks and repairs a log as read:
 * - rows without a usable time (non-finite, before 1980 or after 2099) or position (non-finite,
 *   |lat| > 90°, |lon| > 180°, or exactly 0°/0°, which receivers write before they have a fix) are dropped;
 * - rows out of time order are put in order (stable sort by t: equal times keep file order);
 * - rows repeating an earlier time are dropped (the first one in the file is kept);
 * - impossible values in the other columns (e.g. negative speed, bank beyond ±180°) become NaN;
 *   track and heading are wrapped to [0, 360).
 * Each repair is one LogWarning with the source lines (capped list + count). Nothing is dropped silently.
 * LogHealth: positionSpikes and gaps stay 0 here (the state stage fills them). The input is not modified.
 */
export function cleanLog(log: FlightLog): { log: FlightLog; health: LogHealth } {
  const n = log.t.length;
  const { t, lat, lon, line } = log;
  const badTime = new LineTally();
  const badPosition = new LineTally();
  const noFix = new LineTally();
  const outOfOrder = new LineTally();
  const duplicate = new LineTally();

  // 1. Rows with a usable time and position, in file order; count those that go back in time.
  let valid = new Int32Array(n);
  let nValid = 0;
  const late = new Uint8Array(n);
  let lateCount = 0;
  let maxT = -Infinity;
  for (let i = 0; i < n; i++) {
    const ti = t[i];
    if (!(Number.isFinite(ti) && ti >= EARLIEST_T && ti < LATEST_T)) {
      badTime.add(line[i]);
      continue;
    }
    const la = lat[i];
    const lo = lon[i];
    if (!(Number.isFinite(la) && Number.isFinite(lo) && Math.abs(la) <= 90 && Math.abs(lo) <= 180)) {
      badPosition.add(line[i]);
      continue;
    }
    if (la === 0 && lo === 0) {
      noFix.add(line[i]);
      continue;
    }
    if (ti < maxT) {
      late[i] = 1;
      lateCount++;
    } else maxT = ti;
    valid[nValid++] = i;
  }
  valid = valid.subarray(0, nValid);

  // 2. Stable sort by time (ties broken by row index, so file order is kept whatever the engine).
  if (lateCount > 0) valid = Int32Array.from(Array.from(valid).sort((a, b) => t[a] - t[b] || a - b));

  // 3. Drop repeated times, keeping the first row of each time. A late row that is kept counts as out of order.
  const keep = new Int32Array(valid.length);
  let m = 0;
  for (let k = 0; k < valid.length; k++) {
    const i = valid[k];
    if (m > 0 && t[i] === t[keep[m - 1]]) {
      duplicate.add(line[i]);
      continue;
    }
    if (late[i] === 1) outOfOrder.add(line[i]);
    keep[m++] = i;
  }
  const rows = keep.subarray(0, m);

  // 4. Gather the kept rows; impossible values become NaN.
  const badValue = new LineTally();
  const badColumns = new Set<string>();
  const gather = (src: Float64Array, name: 'altM' | OptionalColumn): Float64Array => {
    const [lo, hi] = VALUE_RANGES[name];
    const angle = ANGLE_COLUMNS.has(name);
    const out = new Float64Array(m);
    for (let k = 0; k < m; k++) {
      const v = src[rows[k]];
      if (Number.isNaN(v)) {
        out[k] = NaN;
      } else if (!(v >= lo && v <= hi)) {
        out[k] = NaN;
        badValue.add(line[rows[k]]);
        badColumns.add(name);
      } else {
        out[k] = angle ? wrap360(v) : v;
      }
    }
    return out;
  };
  const pick = (src: Float64Array): Float64Array => {
    const out = new Float64Array(m);
    for (let k = 0; k < m; k++) out[k] = src[rows[k]];
    return out;
  };
  const lines = new Int32Array(m);
  for (let k = 0; k < m; k++) lines[k] = line[rows[k]];

  const warnings: LogWarning[] = log.source.warnings.slice();
  pushTally(warnings, 'invalid-time', `${plural(badTime.count, 'sample')} without a usable time left out`, badTime);
  pushTally(warnings, 'invalid-position', `${plural(badPosition.count, 'sample')} without a usable position left out`, badPosition);
  pushTally(warnings, 'no-fix-position', `${plural(noFix.count, 'sample')} at 0°N 0°E (a receiver without a fix) left out`, noFix);
  pushTally(warnings, 'out-of-order', `${plural(outOfOrder.count, 'sample')} recorded out of time order put back in order`, outOfOrder);
  pushTally(warnings, 'duplicate-time', `${plural(duplicate.count, 'sample')} repeating an earlier time left out (the first kept)`, duplicate);

  const cleaned: FlightLog = {
    source: { ...log.source, warnings },
    t: pick(t),
    lat: pick(lat),
    lon: pick(lon),
    altM: gather(log.altM, 'altM'),
    line: lines,
  };
  for (const name of OPTIONAL_COLUMNS) {
    const col = log[name];
    if (col) cleaned[name] = gather(col, name);
  }
  if (log.headingRef !== undefined) cleaned.headingRef = log.headingRef;
  if (log.route !== undefined) cleaned.route = log.route;
  pushTally(
    warnings,
    'invalid-value',
    `${plural(badValue.count, 'value')} outside the possible range (${[...badColumns].join(', ')}) treated as missing`,
    badValue,
  );

  const reader = log.source.reader;
  const health: LogHealth = {
    recordsRead: reader?.recordsRead ?? n,
    samplesKept: m,
    duplicateTimes: duplicate.count,
    outOfOrder: outOfOrder.count,
    positionSpikes: 0,
    invalidValues: (reader?.recordsDropped ?? 0) + badTime.count + badPosition.count + noFix.count + badValue.count,
    gaps: 0,
    truncated: reader?.truncated ?? false,
  };
  return { log: cleaned, health };
}
