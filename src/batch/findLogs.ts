// Finds the flight logs of a batch: files given by name, and the logs inside folders (searched recursively).
import { promises as fsp } from 'node:fs';
import path from 'node:path';
import { ParseError } from '../errors.js';
import { hasSwingRecordHeader } from '../deviation/swingColumns.js';
import { detectFormat } from '../import/detectFormat.js';
import { readHead } from '../import/readLog.js';

/** File name endings taken as logs without looking inside (case-insensitive). Other files are tried by content. */
export const LOG_EXTENSIONS: readonly string[] = ['.gpx', '.csv', '.igc', '.nmea', '.txt', '.fit', '.kml'];

/** Tag side files (`<log>.tags.json`) belong to a log; they are never candidates themselves. */
export const TAGS_SUFFIX = '.tags.json';

/** Turn plans (`<log>.plan.csv`, the report's --plan file) belong to a log; never candidates themselves. */
export const PLAN_SUFFIX = '.plan.csv';

/** A folder holding this file is a batch's output folder; its samples CSVs are not flights. */
export const CATALOGUE_FILE = 'catalogue.sqlite';

export interface FoundLog {
  /** Path as the user would write it: the input as given, joined with the path inside a folder. */
  path: string;
  absPath: string;
  /** Given by name on the command line (always analysed) rather than found in a folder. */
  explicit: boolean;
}

/** A file or folder left out, with the reason in plain words. */
export interface SkippedPath {
  path: string;
  note: string;
}

export interface FoundInputs {
  /** Sorted by path within each input, inputs in the order given; each file once. */
  logs: FoundLog[];
  /** Files in folders that are not flight logs, folders not searched. */
  skipped: SkippedPath[];
}

/** Why a compass-swing record found in a folder is left out. */
export const SWING_RECORD_NOTE = 'a compass-swing record (heading_mag_deg, compass_deg), not a flight log: fit its deviation card with `compass-debrief swing`, apply it with --deviation';

/** Whether a file found in a folder is a log: by its extension, else by its first bytes; the reason when not. */
async function classify(file: string): Promise<{ log: true } | { log: false; note: string }> {
  const ext = path.extname(file).toLowerCase();
  if (ext === '.csv' || ext === '.txt') {
    // A compass-swing record kept beside the logs (as in samples/) is not a flight that failed.
    let text = '';
    try {
      text = new TextDecoder().decode(await readHead(file));
    } catch {
      return { log: true }; // unreadable: analysed, so that the batch reports why
    }
    if (hasSwingRecordHeader(text)) return { log: false, note: SWING_RECORD_NOTE };
  }
  if (LOG_EXTENSIONS.includes(ext)) return { log: true };
  let head: Uint8Array;
  try {
    head = await readHead(file);
  } catch (err) {
    return { log: false, note: `cannot be read (${(err as NodeJS.ErrnoException).code ?? (err as Error).message})` };
  }
  if (head.length === 0) return { log: false, note: 'empty, and its name does not end in a log extension' };
  try {
    detectFormat(head);
    return { log: true };
  } catch (err) {
    if (err instanceof ParseError) return { log: false, note: err.message };
    throw err;
  }
}

/**
 * Expands the batch inputs. A file named on the command line is always a candidate (even a broken one:
 * the batch reports why it fails). In a folder, searched recursively in name order: files ending in one
 * of LOG_EXTENSIONS are candidates, except a .csv or .txt whose header is a compass-swing record's
 * (skipped with a note); other files are candidates when their content is detected as a log
 * (detectFormat), else skipped with a note; hidden names (leading dot) and the side files `*.tags.json`
 * and `*.plan.csv` are passed over silently; `excludeDirs` (the output folder) silently; folders holding catalogue.sqlite
 * (another batch's output) and symbolic links to folders are skipped with a note.
 * A named input that does not exist is returned as a candidate too, so that it is reported as failed.
 * @param inputs paths as given (relative to `cwd`)
 */
export async function findLogs(inputs: string[], opts: { cwd: string; excludeDirs?: string[] }): Promise<FoundInputs> {
  const exclude = new Set((opts.excludeDirs ?? []).map((d) => path.resolve(opts.cwd, d)));
  const logs: FoundLog[] = [];
  const skipped: SkippedPath[] = [];
  const seen = new Set<string>();
  const add = (p: string, absPath: string, explicit: boolean) => {
    if (seen.has(absPath)) return;
    seen.add(absPath);
    logs.push({ path: p, absPath, explicit });
  };

  const walk = async (dirShown: string, dirAbs: string): Promise<void> => {
    let entries: import('node:fs').Dirent[];
    try {
      entries = await fsp.readdir(dirAbs, { withFileTypes: true });
    } catch (err) {
      skipped.push({ path: dirShown, note: `folder cannot be read (${(err as NodeJS.ErrnoException).code ?? (err as Error).message})` });
      return;
    }
    if (entries.some((e) => e.name === CATALOGUE_FILE)) {
      skipped.push({ path: dirShown, note: `a batch output folder (holds ${CATALOGUE_FILE}); not searched` });
      return;
    }
    entries.sort((a, b) => (a.name < b.name ? -1 : a.name > b.name ? 1 : 0));
    for (const e of entries) {
      const lower = e.name.toLowerCase();
      if (e.name.startsWith('.') || lower.endsWith(TAGS_SUFFIX) || lower.endsWith(PLAN_SUFFIX)) continue;
      const shown = path.join(dirShown, e.name);
      const abs = path.join(dirAbs, e.name);
      let isDir = e.isDirectory();
      let isFile = e.isFile();
      if (e.isSymbolicLink()) {
        const st = await fsp.stat(abs).catch(() => undefined);
        if (st?.isDirectory()) {
          skipped.push({ path: shown, note: 'a symbolic link to a folder; not followed' });
          continue;
        }
        isDir = false;
        isFile = st?.isFile() ?? false;
      }
      if (isDir) {
        if (!exclude.has(abs)) await walk(shown, abs);
        continue;
      }
      if (!isFile) continue;
      const c = await classify(abs);
      if (c.log) add(shown, abs, false);
      else skipped.push({ path: shown, note: c.note });
    }
  };

  for (const input of inputs) {
    const abs = path.resolve(opts.cwd, input);
    const st = await fsp.stat(abs).catch(() => undefined);
    if (st?.isDirectory()) await walk(input, abs);
    else add(input, abs, true);
  }
  return { logs, skipped };
}
