// Reading a flight log file from disk: the only part of the importers that touches the file system.
import { promises as fsp } from 'node:fs';
import { InputError, ParseError } from '../errors.js';
import { cleanLog } from '../log/cleanLog.js';
import type { FlightLog, LogHealth } from '../log/flightLog.js';
import { parseLogBytes, type ReadOptions } from './parseLog.js';
import { SUPPORTED_FORMATS_HINT } from './detectFormat.js';

export type { ReadOptions } from './parseLog.js';

/** Largest log file read [bytes] (2 GiB: a Node Buffer's practical limit; common practice). */
export const MAX_LOG_BYTES = 2 ** 31 - 1;

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

/**
 * Reads, detects, parses and cleans one flight log. The file is opened read-only and never modified.
 * @returns the cleaned log (sorted, de-duplicated, impossible rows dropped, each repair warned) and its health.
 * @throws InputError(file, message, {line, hint}) for a missing file, a directory, an empty file, binary
 *   junk, an unreadable format or fewer than two usable samples; OptionError for bad options.
 */
export async function readLogFile(path: string, opts: ReadOptions = {}): Promise<{ log: FlightLog; health: LogHealth }> {
  let st: Awaited<ReturnType<typeof fsp.stat>>;
  try {
    st = await fsp.stat(path);
  } catch (err) {
    throw ioProblem(path, err);
  }
  if (st.isDirectory()) throw new InputError(path, 'this is a directory, not a log file', { hint: 'give the path of one log file' });
  if (!st.isFile()) throw new InputError(path, 'not a regular file', { hint: 'give the path of one log file' });
  if (st.size > MAX_LOG_BYTES) throw new InputError(path, `the file is too large (${st.size} bytes)`);
  let bytes: Uint8Array;
  try {
    bytes = await fsp.readFile(path);
  } catch (err) {
    throw ioProblem(path, err);
  }
  if (bytes.length === 0) throw new InputError(path, 'the file is empty', { hint: SUPPORTED_FORMATS_HINT });

  let raw: FlightLog;
  try {
    raw = parseLogBytes(bytes, path, opts);
  } catch (err) {
    if (err instanceof ParseError) throw new InputError(path, err.message, { line: err.line, hint: err.hint });
    throw err;
  }
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
