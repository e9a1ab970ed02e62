// Delimited text (CSV and its semicolon/tab/pipe cousins) to a FlightLog, via papaparse, row by row.
import Papa from 'papaparse';
import { OptionError, ParseError } from '../errors.js';
import type { FlightLog, LogWarning } from '../log/flightLog.js';
import { LineTally, plural, pushTally } from '../log/logWarnings.js';
import { planCsvColumns, ROLE_COLUMN, type CsvColumn, type CsvPlan, type CsvRole, type CsvTimeKind } from './csvColumns.js';
import { detectCsvDialect, type CsvDelimiter, type CsvDialect } from './csvDialect.js';
import { isoHasZone, parseIsoDate, parseIsoDateTime, parseTimeOfDay } from './isoTime.js';
import { LogBuilder } from './logBuilder.js';
import { parseDecimal, parseDecimalComma } from './parseNumber.js';

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
  private lastDateS = NaN;
  private recordsRead = 0;
  private recordsDropped = 0;
  private lastRowFields = 0;
  private lastRowLine = 0;
  private lastRowAdded = false;
  private truncated = false;

  constructor(
    private readonly file: string,
    private readonly opts: CsvOptions,
    private readonly dialect: CsvDialect,
  ) {
    checkCsvOptions(opts);
    this.parseNum = dialect.decimalComma ? parseDecimalComma : parseDecimal;
    this.optionDateS = opts.date !== undefined ? parseIsoDate(opts.date) : NaN;
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
    for (const role of OPTIONAL_ROLES) {
      const col = c[role];
      if (col) this.rows.set(ROLE_COLUMN[role]!, this.value(fields, col, line, true));
    }
    this.lastRowAdded = true;
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
  }

  /** A numeric field in SI; empty → NaN silently, unreadable → NaN and counted (when `counted`). */
  private value(fields: string[], col: CsvColumn, line: number, counted: boolean): number {
    const raw = fields[col.index];
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

/**
 * Feeds a delimited text to a CsvRowSink in chunks of any size (a file read as a stream): each chunk is
 * cut after its last line break and the complete lines go through papaparse; the rest waits for the next
 * chunk. Line numbers continue across chunks. Limitation: a quoted field holding a line break that
 * straddles two chunks is split (such fields do not occur in flight logs; common practice).
 */
export class CsvChunkReader {
  private readonly sink: CsvRowSink;
  private readonly dialect: CsvDialect;
  private readonly nlCode: number;
  private rest = '';
  private linesBefore = 0;
  private first = true;

  constructor(file: string, opts: CsvOptions, sample: string) {
    this.dialect = csvDialectFor(sample.charCodeAt(0) === 0xfeff ? sample.slice(1) : sample, opts);
    this.sink = new CsvRowSink(file, opts, this.dialect);
    this.nlCode = this.dialect.newline === '\r' ? 13 : 10;
  }

  push(chunk: string): void {
    let text = this.rest + chunk;
    if (this.first && text.length > 0) {
      if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
      this.first = false;
    }
    const nl = this.dialect.newline === '\r' ? '\r' : '\n';
    const cut = text.lastIndexOf(nl);
    if (cut < 0) {
      this.rest = text;
      return;
    }
    this.rest = text.slice(cut + 1);
    this.parse(text.slice(0, cut + 1));
  }

  /** Parses what is left and returns the log. */
  end(): FlightLog {
    const endedWithNewline = this.rest.length === 0;
    if (this.rest.length > 0) this.parse(this.rest);
    this.rest = '';
    return this.sink.finish(endedWithNewline);
  }

  private parse(body: string): void {
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
  // Large texts go in slices so that progress can be reported; the result does not depend on the slicing.
  const slice = 4 * 1024 * 1024;
  for (let i = 0; i < text.length; i += slice) {
    reader.push(text.slice(i, i + slice));
    opts.onProgress?.(Math.min(1, (i + slice) / Math.max(1, text.length)));
  }
  const log = reader.end();
  opts.onProgress?.(1);
  return log;
}
