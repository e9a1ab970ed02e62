// Reading a flight log file from disk: the only part of the importers that touches the file system.
// Delimited text and NMEA logs are read as a stream (chunks of 1 MiB through typed-array columns), so a
// log of a million samples never exists as one string or as one object per row; other formats are read
// whole (XML and IGC files of real flights are small; FIT is binary and decoded in one go).
import { createReadStream, promises as fsp } from 'node:fs';
import { InputError, ParseError } from '../errors.js';
import { cleanLog } from '../log/cleanLog.js';
import type { FlightLog, LogFormat, LogHealth } from '../log/flightLog.js';
import { CsvChunkReader } from './csv.js';
import { hasUtf16Bom } from './decodeText.js';
import { DETECT_BYTES, SUPPORTED_FORMATS_HINT, detectFormat } from './detectFormat.js';
import { LineSplitter } from './lineSplitter.js';
import { NmeaLineSink } from './nmea.js';
import { checkReadOptions, parseLogBytes, type ReadOptions } from './parseLog.js';

export type { ReadOptions } from './parseLog.js';

/** Largest file read whole [bytes] (2 GiB − 1: a Node Buffer's limit). Streamed formats have no limit. */
export const MAX_LOG_BYTES = 2 ** 31 - 1;

/** Chunk size of streamed reading [bytes]. */
const STREAM_CHUNK_BYTES = 1 << 20;

function ioProblem(file: string, err: unknown): InputError {
  const code = (err as NodeJS.ErrnoException).code;
  switch (code) {
    case 'ENOENT':
      return new InputError(file, 'no such file', { hint: 'check the path and the file name' });
    case 'EACCES':
    case 'EPERM':
      return new InputError(file, 'the file cannot be read (permission denied)');
    case 'EISDIR':
      return new InputError(file, 'this is a directory, not a log file', { hint: 'give the path of one log file' });
    default:
      return new InputError(file, `the file cannot be read (${code ?? (err as Error).message})`);
  }
}

/** The first DETECT_BYTES bytes of a file (fewer if it is shorter), for telling its format from the content. */
export async function readHead(path: string): Promise<Uint8Array> {
  const fh = await fsp.open(path, 'r');
  try {
    const buf = new Uint8Array(DETECT_BYTES);
    const { bytesRead } = await fh.read(buf, 0, DETECT_BYTES, 0);
    return buf.subarray(0, bytesRead);
  } finally {
    await fh.close();
  }
}

/** Streams a CSV or NMEA file through its chunk reader (CSV as bytes, NMEA as decoded text). */
async function streamTextLog(path: string, size: number, format: 'csv' | 'nmea', head: Uint8Array, opts: ReadOptions): Promise<FlightLog> {
  let push: (bytes: Uint8Array) => void;
  let end: () => FlightLog;
  if (format === 'csv') {
    const reader = new CsvChunkReader(path, { columns: opts.columns, date: opts.date, tzOffsetMin: opts.tzOffsetMin, headingRef: opts.headingRef }, new TextDecoder('utf-8').decode(head));
    push = (b) => reader.push(b);
    end = () => reader.end();
  } else {
    const decoder = new TextDecoder('utf-8');
    let first = true;
    const sink = new NmeaLineSink(path, { date: opts.date });
    const lines = new LineSplitter((line, n) => sink.line(line, n));
    push = (b) => {
      let text = decoder.decode(b, { stream: true });
      if (first) {
        if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
        first = false;
      }
      lines.push(text);
    };
    end = () => {
      lines.push(decoder.decode());
      return sink.finish(lines.end());
    };
  }
  let read = 0;
  let lastReported = 0;
  const stream = createReadStream(path, { highWaterMark: STREAM_CHUNK_BYTES });
  for await (const chunk of stream as AsyncIterable<Buffer>) {
    read += chunk.length;
    push(chunk);
    const fraction = Math.min(1, read / Math.max(1, size));
    if (opts.onProgress && fraction - lastReported >= 0.01) {
      lastReported = fraction;
      opts.onProgress(fraction);
    }
  }
  return end();
}

/**
 * Reads, detects, parses and cleans one flight log. The file is opened read-only and never modified.
 * CSV and NMEA files are streamed (ReadOptions.onProgress sees the fraction of bytes read).
 * @returns the cleaned log (sorted, de-duplicated, impossible rows dropped, each repair warned) and its health.
 * @throws InputError(file, message, {line, hint}) for a missing file, a directory, an empty file, binary
 *   junk, an unreadable format or fewer than two usable samples; OptionError for bad options.
 */
export async function readLogFile(path: string, opts: ReadOptions = {}): Promise<{ log: FlightLog; health: LogHealth }> {
  checkReadOptions(opts);
  let st: Awaited<ReturnType<typeof fsp.stat>>;
  try {
    st = await fsp.stat(path);
  } catch (err) {
    throw ioProblem(path, err);
  }
  if (st.isDirectory()) throw new InputError(path, 'this is a directory, not a log file', { hint: 'give the path of one log file' });
  if (!st.isFile()) throw new InputError(path, 'not a regular file', { hint: 'give the path of one log file' });
  if (st.size === 0) throw new InputError(path, 'the file is empty', { hint: SUPPORTED_FORMATS_HINT });

  let raw: FlightLog;
  try {
    let head: Uint8Array;
    try {
      head = await readHead(path);
    } catch (err) {
      throw ioProblem(path, err);
    }
    if (head.length === 0) throw new InputError(path, 'the file is empty', { hint: SUPPORTED_FORMATS_HINT });
    const format: LogFormat = opts.format ?? detectFormat(head);
    if ((format === 'csv' || format === 'nmea') && !hasUtf16Bom(head)) {
      try {
        raw = await streamTextLog(path, st.size, format, head, opts);
      } catch (err) {
        if (err instanceof ParseError || err instanceof InputError) throw err;
        if ((err as NodeJS.ErrnoException).code !== undefined) throw ioProblem(path, err);
        throw err;
      }
    } else {
      if (st.size > MAX_LOG_BYTES) throw new InputError(path, `the file is too large to read whole (${st.size} bytes)`);
      let bytes: Uint8Array;
      try {
        bytes = await fsp.readFile(path);
      } catch (err) {
        throw ioProblem(path, err);
      }
      raw = parseLogBytes(bytes, path, { ...opts, format });
    }
  } catch (err) {
    if (err instanceof ParseError) throw new InputError(path, err.message, { line: err.line, hint: err.hint });
    throw err;
  }
  opts.onProgress?.(1);
  const cleaned = cleanLog(raw);
  if (cleaned.health.samplesKept < 2) {
    const why = cleaned.log.source.warnings.map((w) => w.message).join(' ');
    throw new InputError(
      path,
      cleaned.health.samplesKept === 0 ? 'no sample has both a usable time and position' : 'only one sample has a usable time and position',
      { hint: why || 'a flight needs at least two timed positions' },
    );
  }
  return cleaned;
}
