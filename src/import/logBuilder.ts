// Growing the columns of a FlightLog row by row, in typed-array chunks (no object per row).
import { OPTIONAL_COLUMNS, type FlightLog, type OptionalColumn } from '../log/flightLog.js';

/** A Float64Array that doubles its capacity as values are appended. */
export class GrowingFloat64 {
  data: Float64Array;
  length = 0;
  constructor(capacity: number) {
    this.data = new Float64Array(capacity);
  }
  push(v: number): void {
    if (this.length === this.data.length) this.grow();
    this.data[this.length++] = v;
  }
  grow(): void {
    const next = new Float64Array(Math.max(16, this.data.length * 2));
    next.set(this.data.subarray(0, this.length));
    this.data = next;
  }
  finish(): Float64Array {
    return this.data.slice(0, this.length);
  }
}

/** Same for source line numbers. */
class GrowingInt32 {
  data: Int32Array;
  length = 0;
  constructor(capacity: number) {
    this.data = new Int32Array(capacity);
  }
  push(v: number): void {
    if (this.length === this.data.length) {
      const next = new Int32Array(Math.max(16, this.data.length * 2));
      next.set(this.data);
      this.data = next;
    }
    this.data[this.length++] = v;
  }
  finish(): Int32Array {
    return this.data.slice(0, this.length);
  }
}

/**
 * Row-by-row builder for the columns of a FlightLog. `addRow` starts a row with the required values;
 * `set` fills an optional column of the row just added (the column appears, NaN-filled for the rows
 * before, the first time it is set). Every column keeps the same length: one row index for all.
 */
export class LogBuilder {
  private readonly t: GrowingFloat64;
  private readonly lat: GrowingFloat64;
  private readonly lon: GrowingFloat64;
  private readonly altM: GrowingFloat64;
  private readonly line: GrowingInt32;
  private readonly optional = new Map<OptionalColumn, GrowingFloat64>();
  private readonly capacity: number;

  constructor(capacity = 1024) {
    this.capacity = capacity;
    this.t = new GrowingFloat64(capacity);
    this.lat = new GrowingFloat64(capacity);
    this.lon = new GrowingFloat64(capacity);
    this.altM = new GrowingFloat64(capacity);
    this.line = new GrowingInt32(capacity);
  }

  get length(): number {
    return this.t.length;
  }

  /** Appends a row: t [s since epoch UTC], lat/lon [deg], altM [m], source line (1-based). */
  addRow(t: number, latDeg: number, lonDeg: number, altM: number, line: number): void {
    this.t.push(t);
    this.lat.push(latDeg);
    this.lon.push(lonDeg);
    this.altM.push(altM);
    this.line.push(line);
    for (const col of this.optional.values()) col.push(NaN);
  }

  /** Sets an optional column's value in the last row added. No-op before the first row. */
  set(column: OptionalColumn, value: number): void {
    const n = this.t.length;
    if (n === 0) return;
    let col = this.optional.get(column);
    if (!col) {
      col = new GrowingFloat64(Math.max(this.capacity, n));
      for (let i = 0; i < n; i++) col.push(NaN);
      this.optional.set(column, col);
    }
    col.data[n - 1] = value;
  }

  /** Whether an optional column has been set in any row. */
  has(column: OptionalColumn): boolean {
    return this.optional.has(column);
  }

  /** Removes the last row (e.g. a record found incomplete after it was started). */
  dropLastRow(): void {
    if (this.t.length === 0) return;
    this.t.length--;
    this.lat.length--;
    this.lon.length--;
    this.altM.length--;
    this.line.length--;
    for (const col of this.optional.values()) col.length--;
  }

  /** The finished log; the builder should not be used afterwards. */
  build(source: FlightLog['source'], headingRef?: FlightLog['headingRef']): FlightLog {
    const log: FlightLog = {
      source,
      t: this.t.finish(),
      lat: this.lat.finish(),
      lon: this.lon.finish(),
      altM: this.altM.finish(),
      line: this.line.finish(),
    };
    for (const name of OPTIONAL_COLUMNS) {
      const col = this.optional.get(name);
      if (col) log[name] = col.finish();
    }
    if (log.headingDeg) log.headingRef = headingRef ?? 'true';
    return log;
  }
}
