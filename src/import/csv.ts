// Delimited text (CSV and its semicolon/tab/pipe cousins) to a FlightLog, via papaparse, row by row.
import { requireCjs } from '../util/requireCjs.js';
import { OptionError, ParseError } from '../errors.js';
import type { FlightLog, LogWarning, OptionalColumn } from '../log/flightLog.js';
import { LineTally, plural, pushTally } from '../log/logWarnings.js';
import { planCsvColumns, ROLE_COLUMN, type CsvColumn, type CsvPlan, type CsvRole, type CsvTimeKind } from './csvColumns.js';
import { detectCsvDialect, type CsvDelimiter, type CsvDialect } from './csvDialect.js';
import { COMMA, POINT, parseIsoBytes, parsePlainDecimalBytes, parseTimeOfDayBytes } from './asciiFields.js';
import { isoHasZone, parseIsoDate, parseIsoDateTime, parseTimeOfDay } from './isoTime.js';
import { LogBuilder } from './logBuilder.js';
import { parseDecimal, parseDecimalComma } from './parseNumber.js';

const Papa = requireCjs('papaparse') as typeof import('papaparse');

/** Options of the CSV reader. All optional; the defaults read a plain comma-separated log with a header. */
export interface CsvOptions {
  /** Role → header name, overriding the guess (keys: time, date, lat, lon, alt, gs, track, heading, roll,
   *  pitch, tas, ias, hacc; a unit may follow after `_`, e.g. alt_ft, gs_kt, heading_mag, time_ms). */
  columns?: Record<string, string>;
  /** Calendar date `YYYY-MM-DD` for a time column that holds only times of day (rolls over at midnight). */
  date?: string;
  /** Offset of local time east of UTC [min] for times written without a zone (e.g. 120 for UTC+2). */
  tzOffsetMin?: number;
  /** Heading reference when the header does not say. */
  headingRef?: 'true' | 'magnetic';
  /** Force the field delimiter instead of guessing it. */
  delimiter?: CsvDelimiter;
  /** Force (or forbid) the decimal comma instead of guessing it. */
  decimalComma?: boolean;
  /** Called now and then with the fraction [0, 1] of the text read. */
  onProgress?: (fraction: number) => void;
}

const OPTIONAL_ROLES: CsvRole[] = ['gs', 'track', 'heading', 'roll', 'pitch', 'tas', 'ias', 'hacc'];

/** Checks the options that have ranges. @throws OptionError naming the option. */
export function checkCsvOptions(opts: CsvOptions): void {
  if (opts.tzOffsetMin !== undefined && !(Number.isFinite(opts.tzOffsetMin) && Math.abs(opts.tzOffsetMin) <= 18 * 60)) {
    throw new OptionError('tzOffsetMin', `must be a number of minutes within ±1080 (±18 h), got ${opts.tzOffsetMin}`);
  }
  if (opts.date !== undefined && !Number.isFinite(parseIsoDate(opts.date))) {
    throw new OptionError('date', `must be a calendar date YYYY-MM-DD, got "${opts.date}"`);
  }
}

/**
 * Rewrites the date part of a date-time written `YYYY/MM/DD hh:mm...` or `DD.MM.YYYY hh:mm...` (the dotted
 * day-first form of many European locales) as ISO 8601 `YYYY-MM-DD hh:mm...`; other text is returned as is.
 * Slashed day/month orders (`04/05/2026`) are ambiguous and not rewritten.
 */
export function normalizeDateTime(raw: string): string {
  if (raw.charCodeAt(4) === 47 /* '/' */) return raw.replace(/^(\d{4})\/(\d{2})\/(\d{2})/, '$1-$2-$3');
  const dotted = /^\s*(\d{1,2})\.(\d{1,2})\.(\d{4})([ T].*)$/.exec(raw);
  if (dotted) return `${dotted[3]}-${dotted[2].padStart(2, '0')}-${dotted[1].padStart(2, '0')}${dotted[4]}`;
  return raw;
}

/** Parses a date written YYYY-MM-DD, YYYY/MM/DD or DD.MM.YYYY to 00:00 UTC of that day [s]; NaN otherwise. */
function parseDateField(raw: string): number {
  const dotted = /^\s*(\d{1,2})\.(\d{1,2})\.(\d{4})\s*$/.exec(raw);
  if (dotted) return parseIsoDate(`${dotted[3]}-${dotted[2].padStart(2, '0')}-${dotted[1].padStart(2, '0')}`);
  return parseIsoDate(raw.replace(/\//g, '-'));
}

/**
 * Turns the rows of a delimited file into FlightLog columns, one row at a time: the first non-empty row
 * (not starting with '#') is the header; the rest are samples. Local state only: one sink per file.
 */
export class CsvRowSink {
  private plan: CsvPlan | undefined;
  private headerFields = 0;
  private readonly rows = new LogBuilder(4096);
  private readonly warnings: LogWarning[] = [];
  private readonly badValue = new LineTally();
  private readonly badColumns = new Set<string>();
  private readonly quoteTrouble = new LineTally();
  private timeKind: CsvTimeKind = 'auto';
  private readonly parseNum: (s: string | undefined) => number;
  private readonly optionDateS: number;
  private dayOffsetS = 0;
  private lastTimeOfDayS = NaN;
  private lastDateRaw = '';
  /** The date column's bytes in the last row read in place, and the day they give [s]. */
  private lastDateBytes: Uint8Array = new Uint8Array(0);
  private lastDateBytesS = NaN;
  private lastDateS = NaN;
  private recordsRead = 0;
  private recordsDropped = 0;
  private lastRowFields = 0;
  private lastRowLine = 0;
  private lastRowAdded = false;
  private truncated = false;
  /** The optional columns the header has, with the FlightLog column each fills. */
  private optionalColumns: { col: CsvColumn; name: OptionalColumn }[] = [];
  private readonly delimiterCode: number;
  private readonly pointCode: number;
  /** Start of each field of the line being read in place, and one past the end (reused across lines). */
  private fieldStarts: Int32Array = new Int32Array(64);
  private readonly decoder = new TextDecoder('utf-8');

  constructor(
    private readonly file: string,
    private readonly opts: CsvOptions,
    private readonly dialect: CsvDialect,
  ) {
    checkCsvOptions(opts);
    this.parseNum = dialect.decimalComma ? parseDecimalComma : parseDecimal;
    this.optionDateS = opts.date !== undefined ? parseIsoDate(opts.date) : NaN;
    this.delimiterCode = dialect.delimiter.charCodeAt(0);
    this.pointCode = dialect.decimalComma ? COMMA : POINT;
  }

  /** One parsed row: its fields and the 1-based source line; `syntaxTrouble` when the splitter complained. */
  row(fields: string[], line: number, syntaxTrouble = false): void {
    this.lastRowAdded = false;
    const empty = fields.every((f) => f.trim() === '');
    if (empty || fields[0].startsWith('#')) return;
    if (!this.plan) {
      this.header(fields, line);
      return;
    }
    this.recordsRead++;
    this.lastRowFields = fields.length;
    this.lastRowLine = line;
    if (syntaxTrouble) this.quoteTrouble.add(line);
    const c = this.plan.columns;
    const t = this.time(fields, line);
    const lat = this.value(fields, c.lat!, line, false);
    const lon = this.value(fields, c.lon!, line, false);
    const alt = c.alt ? this.value(fields, c.alt, line, true) : NaN;
    this.rows.addRow(t, lat, lon, alt, line);
    for (const o of this.optionalColumns) this.rows.set(o.name, this.value(fields, o.col, line, true));
    this.lastRowAdded = true;
  }

  /**
   * The same as row() for the line bytes[start, end) (line break excluded) of UTF-8 text without quote
   * characters, split at the delimiter as papaparse splits such text; the planned columns are read in
   * place from the bytes, with no string per field. The header line, rows whose time is not in the plain
   * form and any field not in the plain form are decoded and go the way of row() or of its field readers,
   * so the result is the same.
   */
  rowInPlace(bytes: Uint8Array, start: number, end: number, line: number): void {
    if (!this.plan || this.timeKind === 'auto') {
      this.row(this.fieldsOf(bytes, start, end), line);
      return;
    }
    this.lastRowAdded = false;
    if (bytes[start] === 35 /* # */) return;
    const delimiter = this.delimiterCode;
    let starts = this.fieldStarts;
    let n = 0;
    starts[n++] = start;
    for (let i = start; i < end; i++) {
      if (bytes[i] === delimiter) {
        if (n + 1 >= starts.length) starts = this.growFieldStarts();
        starts[n++] = i + 1;
      }
    }
    starts[n] = end + 1;
    // A time read in place means a row that is neither blank nor a comment; any other row (a blank line,
    // text around the time, a time not in the plain form) goes the general way, which decides.
    const t = this.timeInPlace(bytes, n);
    if (t !== t) {
      this.row(this.fieldsOf(bytes, start, end), line);
      return;
    }
    this.recordsRead++;
    this.lastRowFields = n;
    this.lastRowLine = line;
    const c = this.plan.columns;
    const lat = this.valueInPlace(bytes, n, c.lat!, line, false);
    const lon = this.valueInPlace(bytes, n, c.lon!, line, false);
    const alt = c.alt ? this.valueInPlace(bytes, n, c.alt, line, true) : NaN;
    this.rows.addRow(t, lat, lon, alt, line);
    for (const o of this.optionalColumns) this.rows.set(o.name, this.valueInPlace(bytes, n, o.col, line, true));
    this.lastRowAdded = true;
  }

  /** The fields of bytes[start, end), decoded, as papaparse splits a line without quotes. */
  private fieldsOf(bytes: Uint8Array, start: number, end: number): string[] {
    return this.decoder.decode(bytes.subarray(start, end)).split(this.dialect.delimiter);
  }

  private growFieldStarts(): Int32Array {
    const next = new Int32Array(this.fieldStarts.length * 2);
    next.set(this.fieldStarts);
    this.fieldStarts = next;
    return next;
  }

  /** value() for field `col` of the line being read in place (n fields). */
  private valueInPlace(bytes: Uint8Array, n: number, col: CsvColumn, line: number, counted: boolean): number {
    const k = col.index;
    if (k >= n) return NaN;
    const a = this.fieldStarts[k];
    const b = this.fieldStarts[k + 1] - 1;
    const v = parsePlainDecimalBytes(bytes, a, b, this.pointCode);
    if (v === v) return v * col.toSi;
    return this.rawValue(this.decoder.decode(bytes.subarray(a, b)), col, line, counted);
  }

  /** The time of the line being read in place (n fields) when it is an ISO 8601 date-time, a Unix time or a time of day written without blanks; NaN otherwise. */
  private timeInPlace(bytes: Uint8Array, n: number): number {
    const k = this.plan!.columns.time!.index;
    if (k >= n) return NaN;
    const a = this.fieldStarts[k];
    const b = this.fieldStarts[k + 1] - 1;
    if (this.timeKind === 'iso') return parseIsoBytes(bytes, a, b, this.opts.tzOffsetMin ?? 0);
    if (this.timeKind === 'time-of-day') return this.timeOfDayInPlace(bytes, n, parseTimeOfDayBytes(bytes, a, b));
    const v = parsePlainDecimalBytes(bytes, a, b, this.pointCode);
    return this.timeKind === 'epoch-ms' ? v / 1e3 : this.timeKind === 'epoch-us' ? v / 1e6 : v;
  }

  /**
   * timeOfDay() for the line being read in place, given its time of day `tod` [s] (NaN: not in the plain
   * form, and nothing is changed). The date column's text is decoded only when its bytes change.
   */
  private timeOfDayInPlace(bytes: Uint8Array, n: number, tod: number): number {
    if (tod !== tod) return NaN;
    const dateCol = this.plan!.columns.date;
    let dayS: number;
    if (dateCol) {
      const k = dateCol.index;
      if (k >= n) return NaN;
      const a = this.fieldStarts[k];
      const b = this.fieldStarts[k + 1] - 1;
      const last = this.lastDateBytes;
      let same = last.length === b - a;
      for (let i = 0; same && i < last.length; i++) same = last[i] === bytes[a + i];
      if (!same) {
        this.lastDateBytes = bytes.slice(a, b);
        this.lastDateBytesS = parseDateField(this.decoder.decode(this.lastDateBytes).trim());
      }
      dayS = this.lastDateBytesS;
    } else {
      // As in timeOfDay(): a time of day more than 12 h earlier than the last is the next day.
      if (Number.isFinite(this.lastTimeOfDayS) && tod < this.lastTimeOfDayS - 43200) this.dayOffsetS += 86400;
      this.lastTimeOfDayS = tod;
      dayS = this.optionDateS + this.dayOffsetS;
    }
    return dayS + tod - (this.opts.tzOffsetMin ?? 0) * 60;
  }

  private header(fields: string[], line: number): void {
    const numeric = fields.filter((f) => Number.isFinite(this.parseNum(f))).length;
    if (numeric > fields.length / 2) {
      throw new ParseError('the first line holds numbers, not column names', {
        line,
        hint: 'add a header line naming the columns, e.g. time,lat,lon,alt_m',
      });
    }
    this.plan = planCsvColumns(fields, line, this.opts.columns, this.opts.headingRef);
    this.headerFields = fields.length;
    this.timeKind = this.plan.timeKind;
    this.warnings.push(...this.plan.warnings);
    const columns = this.plan.columns;
    this.optionalColumns = OPTIONAL_ROLES.flatMap((role) => {
      const col = columns[role];
      return col ? [{ col, name: ROLE_COLUMN[role]! }] : [];
    });
  }

  /** A numeric field in SI; empty → NaN silently, unreadable → NaN and counted (when `counted`). */
  private value(fields: string[], col: CsvColumn, line: number, counted: boolean): number {
    return this.rawValue(fields[col.index], col, line, counted);
  }

  /** value() of the text of one field (undefined: the row has no such field). */
  private rawValue(raw: string | undefined, col: CsvColumn, line: number, counted: boolean): number {
    if (raw === undefined || raw.trim() === '') return NaN;
    const v = this.parseNum(raw);
    if (Number.isNaN(v) && counted) {
      this.badValue.add(line);
      this.badColumns.add(col.header);
    }
    return v * col.toSi;
  }

  private time(fields: string[], line: number): number {
    const col = this.plan!.columns.time!;
    let raw = (fields[col.index] ?? '').trim();
    if (raw === '') return NaN;
    if (this.timeKind === 'auto') this.timeKind = this.resolveTimeKind(raw, col, line);
    switch (this.timeKind) {
      case 'iso':
        return parseIsoDateTime(normalizeDateTime(raw), this.opts.tzOffsetMin ?? 0);
      case 'epoch-s':
        return this.parseNum(raw);
      case 'epoch-ms':
        return this.parseNum(raw) / 1e3;
      case 'epoch-us':
        return this.parseNum(raw) / 1e6;
      case 'time-of-day':
        return this.timeOfDay(fields, raw);
      default:
        return NaN;
    }
  }

  private resolveTimeKind(raw: string, col: CsvColumn, line: number): CsvTimeKind {
    const iso = normalizeDateTime(raw);
    if (Number.isFinite(parseIsoDateTime(iso))) {
      if (!isoHasZone(iso) && this.opts.tzOffsetMin === undefined) {
        this.warnings.push({
          code: 'time-zone-assumed',
          message: `Times in column "${col.header}" carry no time zone; they are taken as UTC (give the local-time offset if they are not).`,
        });
      }
      return 'iso';
    }
    if (Number.isFinite(parseTimeOfDay(raw))) {
      const hasDate = this.plan!.columns.date !== undefined || Number.isFinite(this.optionDateS);
      if (!hasDate) {
        throw new ParseError(`the time column "${col.header}" holds only times of day ("${raw}"), no date`, {
          line,
          hint: 'give the date of the flight (YYYY-MM-DD) as an option, or add a date column',
        });
      }
      if (this.opts.tzOffsetMin === undefined) {
        this.warnings.push({
          code: 'time-zone-assumed',
          message: `Times of day in column "${col.header}" are taken as UTC (give the local-time offset if they are not).`,
        });
      }
      return 'time-of-day';
    }
    const v = this.parseNum(raw);
    if (Number.isFinite(v)) {
      if (this.plan!.timeKind !== 'auto') return this.plan!.timeKind;
      // Magnitudes of Unix time around the years 1973-5138: seconds ~1e8-1e11, ms ~1e11-1e14, µs above.
      if (Math.abs(v) >= 1e14) return 'epoch-us';
      if (Math.abs(v) >= 1e11) return 'epoch-ms';
      if (Math.abs(v) >= 1e8) return 'epoch-s';
      throw new ParseError(`the time column "${col.header}" starts at ${raw}, which looks like seconds since the start of the recording, not a date and time`, {
        line,
        hint: 'the log needs UTC times (ISO 8601 like 2026-05-04T10:11:12Z, or Unix seconds/milliseconds)',
      });
    }
    throw new ParseError(`the time "${raw}" in column "${col.header}" is not an ISO 8601 date-time, a Unix time or a time of day`, {
      line,
      hint: 'write times like 2026-05-04T10:11:12Z or as Unix seconds',
    });
  }

  private timeOfDay(fields: string[], raw: string): number {
    const tod = parseTimeOfDay(raw);
    if (!Number.isFinite(tod)) return NaN;
    const dateCol = this.plan!.columns.date;
    let dayS: number;
    if (dateCol) {
      const d = (fields[dateCol.index] ?? '').trim();
      if (d !== this.lastDateRaw) {
        this.lastDateRaw = d;
        this.lastDateS = parseDateField(d);
      }
      dayS = this.lastDateS;
    } else {
      // One date for the whole file: a time of day more than 12 h earlier than the last is the next day.
      if (Number.isFinite(this.lastTimeOfDayS) && tod < this.lastTimeOfDayS - 43200) this.dayOffsetS += 86400;
      this.lastTimeOfDayS = tod;
      dayS = this.optionDateS + this.dayOffsetS;
    }
    return dayS + tod - (this.opts.tzOffsetMin ?? 0) * 60;
  }

  /** The log; `endedWithNewline` false means the text stopped mid-line (a last row short of fields is cut off). */
  finish(endedWithNewline: boolean): FlightLog {
    if (!this.plan) {
      throw new ParseError('the file has no header line and no data', { hint: 'a CSV log needs a header line, e.g. time,lat,lon,alt_m' });
    }
    if (!endedWithNewline && this.lastRowAdded && this.lastRowFields < this.headerFields) {
      this.rows.dropLastRow();
      this.recordsDropped++;
      this.truncated = true;
      this.warnings.push({
        code: 'file-truncated',
        message: `The file ends in the middle of line ${this.lastRowLine} (${this.lastRowFields} of ${this.headerFields} fields): it was probably cut off while being written; that row is left out.`,
        lines: [this.lastRowLine],
      });
    }
    pushTally(this.warnings, 'csv-quotes', `${plural(this.quoteTrouble.count, 'row')} with unbalanced quotes read as best possible`, this.quoteTrouble);
    pushTally(
      this.warnings,
      'unreadable-value',
      `${plural(this.badValue.count, 'value')} that are not numbers (${[...this.badColumns].map((h) => `"${h}"`).join(', ')}) treated as missing`,
      this.badValue,
    );
    if (this.rows.length === 0) {
      throw new ParseError('the file has a header but no data rows', { hint: 'the log seems empty' });
    }
    const plan = this.plan;
    return this.rows.build(
      {
        format: 'csv',
        file: this.file,
        warnings: this.warnings,
        meta: {},
        altDatum: plan.columns.alt ? plan.altDatum : 'unknown',
        reader: { recordsRead: this.recordsRead, recordsDropped: this.recordsDropped, truncated: this.truncated },
      },
      plan.headingRef,
    );
  }
}

/** Resolves the dialect from a sample of the text and the options. */
export function csvDialectFor(sample: string, opts: CsvOptions): CsvDialect {
  const guessed = detectCsvDialect(sample);
  return {
    delimiter: opts.delimiter ?? guessed.delimiter,
    decimalComma: opts.decimalComma ?? guessed.decimalComma,
    newline: guessed.newline,
  };
}

/** A copy of part of a byte array (a Buffer's own slice would share the memory). */
function copyOf(bytes: Uint8Array, start: number, end = bytes.length): Uint8Array {
  return Uint8Array.prototype.slice.call(bytes, start, end);
}

/**
 * Feeds the UTF-8 bytes of a delimited text to a CsvRowSink in chunks of any size (a file read as a
 * stream): each chunk is cut after its last line break and the complete lines are read; the rest waits
 * for the next chunk. Lines after a chunk's last quote character are read in place (CsvRowSink.rowInPlace);
 * the lines before it are decoded and go through papaparse. Line numbers continue across chunks.
 * Limitation: a quoted field holding a line break that straddles two chunks is split (such fields do not
 * occur in flight logs; common practice).
 */
export class CsvChunkReader {
  private readonly sink: CsvRowSink;
  private readonly dialect: CsvDialect;
  private readonly nlCode: number;
  private readonly decoder = new TextDecoder('utf-8');
  private rest: Uint8Array = new Uint8Array(0);
  private linesBefore = 0;
  private first = true;

  constructor(file: string, opts: CsvOptions, sample: string) {
    this.dialect = csvDialectFor(sample.charCodeAt(0) === 0xfeff ? sample.slice(1) : sample, opts);
    this.sink = new CsvRowSink(file, opts, this.dialect);
    this.nlCode = this.dialect.newline === '\r' ? 13 : 10;
  }

  /** The next bytes of the file. */
  push(chunk: Uint8Array): void {
    let bytes = chunk;
    if (this.rest.length > 0) {
      bytes = new Uint8Array(this.rest.length + chunk.length);
      bytes.set(this.rest);
      bytes.set(chunk, this.rest.length);
    }
    if (this.first) {
      if (bytes.length < 3) {
        this.rest = copyOf(bytes, 0);
        return;
      }
      if (bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf) bytes = bytes.subarray(3);
      this.first = false;
    }
    const cut = bytes.lastIndexOf(this.nlCode);
    if (cut < 0) {
      this.rest = copyOf(bytes, 0);
      return;
    }
    this.rest = copyOf(bytes, cut + 1);
    this.parse(bytes.subarray(0, cut + 1));
  }

  /** Parses what is left and returns the log. */
  end(): FlightLog {
    let rest = this.rest;
    if (this.first && rest.length >= 3 && rest[0] === 0xef && rest[1] === 0xbb && rest[2] === 0xbf) rest = rest.subarray(3);
    const endedWithNewline = rest.length === 0;
    if (rest.length > 0) this.parse(rest);
    this.rest = new Uint8Array(0);
    return this.sink.finish(endedWithNewline);
  }

  /**
   * Lines up to the one holding the chunk's last quote character go through papaparse; the lines after it
   * hold no quote, so no quoted field can open or close there, and they are read in place (a file with a
   * quoted header line and plain data is read almost wholly in place).
   */
  private parse(body: Uint8Array): void {
    if (this.dialect.newline === '\r') {
      this.parseWithQuotes(this.decoder.decode(body));
      return;
    }
    const lastQuote = body.lastIndexOf(34 /* " */);
    if (lastQuote < 0) {
      this.parseQuoteFree(body);
      return;
    }
    const lineEnd = body.indexOf(10, lastQuote);
    if (lineEnd < 0 || lineEnd === body.length - 1) {
      this.parseWithQuotes(this.decoder.decode(body));
      return;
    }
    this.parseWithQuotes(this.decoder.decode(body.subarray(0, lineEnd + 1)));
    this.parseQuoteFree(body.subarray(lineEnd + 1));
  }

  /** Text with quote characters (or old Mac line breaks), through papaparse. */
  private parseWithQuotes(body: string): void {
    const nlCode = this.nlCode;
    let scan = 0;
    let newlines = this.linesBefore;
    Papa.parse<string[]>(body, {
      delimiter: this.dialect.delimiter,
      newline: this.dialect.newline,
      skipEmptyLines: false,
      step: (result) => {
        const cursor = result.meta.cursor;
        for (; scan < cursor; scan++) if (body.charCodeAt(scan) === nlCode) newlines++;
        const line = cursor > 0 && body.charCodeAt(cursor - 1) === nlCode ? newlines : newlines + 1;
        const trouble = result.errors.some((e) => e.type === 'Quotes');
        this.sink.row(result.data, line, trouble);
      },
    });
    for (; scan < body.length; scan++) if (body.charCodeAt(scan) === nlCode) newlines++;
    this.linesBefore = newlines;
  }

  /**
   * Bytes without quote characters, as papaparse reads such text (its fast mode: split at the newline, then
   * at the delimiter), line by line into the sink's in-place reader. Line numbers count '\n' characters.
   */
  private parseQuoteFree(body: Uint8Array): void {
    const crlf = this.dialect.newline === '\r\n';
    const len = body.length;
    let newlines = this.linesBefore;
    let pos = 0;
    while (pos < len) {
      let nl = body.indexOf(10, pos);
      // With CRLF line breaks a lone '\n' stays inside its row (and still counts for the line numbers).
      let inner = 0;
      while (crlf && nl >= 0 && (nl === pos || body[nl - 1] !== 13)) {
        inner++;
        nl = body.indexOf(10, nl + 1);
      }
      const end = nl < 0 ? len : crlf ? nl - 1 : nl;
      // A row is numbered by the line it ends on, as in the papaparse way.
      newlines += inner;
      this.sink.rowInPlace(body, pos, end, newlines + 1);
      if (nl < 0) break;
      newlines++;
      pos = nl + 1;
    }
    this.linesBefore = newlines;
  }
}

/**
 * Reads a delimited-text flight log (format 'csv'). Columns are found by header name and unit
 * (see planCsvColumns): time (ISO 8601 with Z or offset, Unix s/ms/µs, or time of day with a date),
 * lat/lon [deg], altitude (m or ft), and where present ground speed, track, heading, bank, pitch,
 * TAS, IAS, horizontal accuracy, all converted to SI / degrees. `line` is each row's 1-based line.
 * @throws ParseError (with line) for a missing header or time/lat/lon column or unreadable times;
 *   OptionError for bad options.
 */
export function parseCsv(text: string, file: string, opts: CsvOptions = {}): FlightLog {
  const reader = new CsvChunkReader(file, opts, text.slice(0, 65536));
  const bytes = new TextEncoder().encode(text);
  // Large texts go in slices so that progress can be reported; the result does not depend on the slicing.
  const slice = 4 * 1024 * 1024;
  for (let i = 0; i < bytes.length; i += slice) {
    reader.push(bytes.subarray(i, i + slice));
    opts.onProgress?.(Math.min(1, (i + slice) / Math.max(1, bytes.length)));
  }
  const log = reader.end();
  opts.onProgress?.(1);
  return log;
}
