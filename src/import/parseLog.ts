// One entry point from a file's bytes to a FlightLog: detect the format, run its reader. Pure (no fs).
import { OptionError, ParseError } from '../errors.js';
import type { FlightLog, LogFormat } from '../log/flightLog.js';
import { checkCsvOptions, parseCsv } from './csv.js';
import { decodeText } from './decodeText.js';
import { detectFormat } from './detectFormat.js';
import { parseFit } from './fit.js';
import { parseGpx } from './gpx.js';
import { parseIgc } from './igc.js';
import { parseKml } from './kml.js';
import { parseNmea } from './nmea.js';

/** Options common to all readers; each reader uses those that apply to it. */
export interface ReadOptions {
  /** Force the format instead of detecting it from the content. */
  format?: LogFormat;
  /** Calendar date YYYY-MM-DD for logs that hold only times of day (CSV time-of-day columns, NMEA without RMC). */
  date?: string;
  /** Offset of local time east of UTC [min] for times written without a zone. */
  tzOffsetMin?: number;
  /** CSV: role → header name (see CsvOptions.columns). */
  columns?: Record<string, string>;
  /** Heading reference where the log does not say (CSV). */
  headingRef?: 'true' | 'magnetic';
  /** Called now and then with the fraction [0, 1] read. */
  onProgress?: (fraction: number) => void;
}

export const LOG_FORMATS: readonly LogFormat[] = ['gpx', 'csv', 'igc', 'nmea', 'fit', 'kml'];

/** Checks ReadOptions. @throws OptionError naming the option and the allowed values. */
export function checkReadOptions(opts: ReadOptions): void {
  if (opts.format !== undefined && !LOG_FORMATS.includes(opts.format)) {
    throw new OptionError('format', `must be one of ${LOG_FORMATS.join(', ')}, got "${String(opts.format)}"`);
  }
  if (opts.headingRef !== undefined && opts.headingRef !== 'true' && opts.headingRef !== 'magnetic') {
    throw new OptionError('headingRef', `must be true or magnetic, got "${String(opts.headingRef)}"`);
  }
  checkCsvOptions({ date: opts.date, tzOffsetMin: opts.tzOffsetMin }); // date YYYY-MM-DD, offset within ±18 h
}

/**
 * Reads a flight log from its bytes, uncleaned (run cleanLog next). The format comes from
 * `opts.format` or from the content (detectFormat). `file` is only used in messages and source.file.
 * @throws ParseError when the content cannot be read; OptionError for bad options.
 */
export function parseLogBytes(bytes: Uint8Array, file: string, opts: ReadOptions = {}): FlightLog {
  checkReadOptions(opts);
  const format = opts.format ?? detectFormat(bytes);
  switch (format) {
    case 'gpx':
      return parseGpx(decodeText(bytes), file);
    case 'csv':
      return parseCsv(decodeText(bytes), file, {
        columns: opts.columns,
        date: opts.date,
        tzOffsetMin: opts.tzOffsetMin,
        headingRef: opts.headingRef,
        onProgress: opts.onProgress,
      });
    case 'igc':
      return parseIgc(decodeText(bytes), file, { date: opts.date });
    case 'nmea':
      return parseNmea(decodeText(bytes), file, { date: opts.date });
    case 'fit':
      return parseFit(bytes, file);
    case 'kml':
      return parseKml(decodeText(bytes), file);
    default:
      throw new ParseError(`unknown format "${String(format)}"`);
  }
}
