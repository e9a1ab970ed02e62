// File names of the per-flight outputs in a batch folder: readable, stable from run to run, never clashing.
import { sha256 } from '../report/sha256.js';

/** Longest name base kept from a log's file name [characters]. */
const MAX_BASE_CHARS = 80;

/** Outputs of one flight in the batch folder, from its name base. */
export function reportFiles(base: string): { html: string; samples: string; json: string } {
  return { html: `${base}.debrief.html`, samples: `${base}.samples.csv`, json: `${base}.summary.json` };
}

/**
 * A file-name base from a log's file name: the name without its last extension, with characters that
 * are unsafe in file names on common systems (control characters, < > : " / \ | ? *) and white space
 * runs replaced by `_`, leading dots removed, cut to 80 characters; 'flight' when nothing is left.
 */
export function safeBase(fileName: string): string {
  const noExt = fileName.replace(/\.[^.]*$/, '');
  const clean = noExt
    .replace(/[\u0000-\u001f\u007f<>:"/\\|?*]/g, '_')
    .replace(/\s+/g, '_')
    .replace(/^\.+/, '')
    .slice(0, MAX_BASE_CHARS);
  return clean === '' ? 'flight' : clean;
}

function hex(bytes: Uint8Array): string {
  return Array.from(bytes, (b) => b.toString(16).padStart(2, '0')).join('');
}

/**
 * Unique output bases for logs identified by `absPaths` (absolute paths). A base shared (ignoring case,
 * for case-insensitive file systems) by two or more logs gets `-` and the first 8 hex digits of the
 * SHA-256 of the log's absolute path appended, so each log keeps the same name in every run whatever
 * else is in the batch; a remaining clash (not expected) gets a counter. Pure.
 * @example uniqueReportBases(['/a/lesson.gpx', '/b/lesson.gpx']) → ['lesson-1c8e…', 'lesson-9f02…']
 */
export function uniqueReportBases(absPaths: string[]): string[] {
  const bases = absPaths.map((p) => safeBase(p.split(/[\\/]/).pop() ?? p));
  const count = new Map<string, number>();
  for (const b of bases) count.set(b.toLowerCase(), (count.get(b.toLowerCase()) ?? 0) + 1);
  const out = bases.map((b, i) => ((count.get(b.toLowerCase()) ?? 0) > 1 ? `${b}-${hex(sha256(new TextEncoder().encode(absPaths[i]))).slice(0, 8)}` : b));
  const used = new Set<string>();
  return out.map((b) => {
    let name = b;
    for (let k = 2; used.has(name.toLowerCase()); k++) name = `${b}-${k}`;
    used.add(name.toLowerCase());
    return name;
  });
}
