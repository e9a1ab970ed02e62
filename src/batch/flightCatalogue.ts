// The catalogue of analysed flights: one SQLite row per flight (keyed by the log's content hash), kept
// beside the batch reports as catalogue.sqlite. Node-only (better-sqlite3); only the batch's main thread writes.
import { requireCjs } from '../util/requireCjs.js';
import type SqliteDatabase from 'better-sqlite3';
import { InputError } from '../errors.js';
import type { SmithCoefficients } from '../deviation/smithCoefficients.js';
import type { FlightFacts } from './flightFacts.js';

const Database = requireCjs('better-sqlite3') as typeof SqliteDatabase;

/** Layout version of the catalogue, kept in PRAGMA user_version; bump when a column changes meaning. */
export const CATALOGUE_SCHEMA_VERSION = 1;

/** Why a flight failed: the log or a side file cannot be used; the worker analysing it stopped; anything else. */
export type FailureKind = 'input' | 'worker' | 'internal';

/**
 * One catalogued flight. Facts as FlightFacts (NaN / '' / 0 for a failed flight, except the tags known
 * from the side file or the options). `deviation` holds Smith's A–E [deg, easterly +] of the card applied, or null.
 */
export interface CatalogueRow extends FlightFacts {
  /** SHA-256 (hex) of the log file's bytes: the key. */
  contentSha256: string;
  /** SHA-256 (hex) of the canonical analysis options for this flight (wind, profile, card, tags). */
  optionsSha256: string;
  toolVersion: string;
  /** The log's path as found by the batch (for display). */
  inputPath: string;
  /** File name base of the report in the batch folder (`<base>.debrief.html`); '' when none was written. */
  reportBase: string;
  status: 'ok' | 'failed';
  /** One-line error of a failed flight ('' when ok). */
  error: string;
  errorKind: FailureKind | '';
  deviation: SmithCoefficients | null;
  /** When the row was written [UTC s]. */
  analysedT: number;
}

export interface FlightCatalogue {
  readonly file: string;
  /** The row of a log's content hash, if catalogued. */
  get(contentSha256: string): CatalogueRow | undefined;
  /**
   * Inserts or replaces one row in its own transaction (committed, hence durable, when put returns).
   * `claimBase` (the output name this flight now owns, whether or not it succeeded) is taken off every
   * other row in the same transaction, so no older flight keeps pointing at a report it no longer has.
   */
  put(row: CatalogueRow, claimBase?: string): void;
  /** Every row, oldest flight first (rows without a start time last). */
  all(): CatalogueRow[];
  close(): void;
}

const COLUMNS = `
  content_sha256 TEXT PRIMARY KEY NOT NULL,
  options_sha256 TEXT NOT NULL,
  tool_version TEXT NOT NULL,
  input_path TEXT NOT NULL,
  report_base TEXT,
  status TEXT NOT NULL CHECK (status IN ('ok', 'failed')),
  error TEXT,
  error_kind TEXT,
  format TEXT,
  aircraft TEXT,
  pilot TEXT,
  start_utc TEXT,
  duration_s REAL,
  samples INTEGER,
  max_abs_error_deg REAL,
  max_error_utc TEXT,
  rms_error_deg REAL,
  turns_flown INTEGER,
  turns_graded INTEGER,
  turns_within_tolerance INTEGER,
  mean_abs_rollout_error_deg REAL,
  warnings INTEGER,
  deviation_a_deg REAL,
  deviation_b_deg REAL,
  deviation_c_deg REAL,
  deviation_d_deg REAL,
  deviation_e_deg REAL,
  analysed_utc TEXT NOT NULL`;

const NAMES = COLUMNS.split(',\n').map((l) => l.trim().split(/\s+/)[0]);

type SqlValue = number | string | null;

function num(x: number): number | null {
  return Number.isFinite(x) ? x : null;
}
function text(s: string): string | null {
  return s === '' ? null : s;
}
function iso(tS: number): string | null {
  return Number.isFinite(tS) ? new Date(Math.round(tS * 1000)).toISOString() : null;
}
function fromIso(s: unknown): number {
  return typeof s === 'string' ? Date.parse(s) / 1000 : NaN;
}
function fromNum(x: unknown): number {
  return typeof x === 'number' ? x : NaN;
}
function fromText(s: unknown): string {
  return typeof s === 'string' ? s : '';
}

function toRecord(r: CatalogueRow): Record<string, SqlValue> {
  const d = r.deviation;
  return {
    content_sha256: r.contentSha256,
    options_sha256: r.optionsSha256,
    tool_version: r.toolVersion,
    input_path: r.inputPath,
    report_base: text(r.reportBase),
    status: r.status,
    error: text(r.error),
    error_kind: text(r.errorKind),
    format: text(r.format),
    aircraft: text(r.aircraft),
    pilot: text(r.pilot),
    start_utc: iso(r.startT),
    duration_s: num(r.durationS),
    samples: num(r.samples),
    max_abs_error_deg: num(r.maxAbsErrorDeg),
    max_error_utc: iso(r.maxErrorT),
    rms_error_deg: num(r.rmsErrorDeg),
    turns_flown: num(r.turnsFlown),
    turns_graded: num(r.turnsGraded),
    turns_within_tolerance: num(r.turnsWithinTolerance),
    mean_abs_rollout_error_deg: num(r.meanAbsRolloutErrorDeg),
    warnings: num(r.warnings),
    deviation_a_deg: d ? d.aDeg : null,
    deviation_b_deg: d ? d.bDeg : null,
    deviation_c_deg: d ? d.cDeg : null,
    deviation_d_deg: d ? d.dDeg : null,
    deviation_e_deg: d ? d.eDeg : null,
    analysed_utc: iso(r.analysedT) ?? new Date(0).toISOString(),
  };
}

function fromRecord(o: Record<string, unknown>): CatalogueRow {
  const hasCard = typeof o.deviation_a_deg === 'number';
  return {
    contentSha256: fromText(o.content_sha256),
    optionsSha256: fromText(o.options_sha256),
    toolVersion: fromText(o.tool_version),
    inputPath: fromText(o.input_path),
    reportBase: fromText(o.report_base),
    status: o.status === 'ok' ? 'ok' : 'failed',
    error: fromText(o.error),
    errorKind: fromText(o.error_kind) as FailureKind | '',
    format: fromText(o.format),
    aircraft: fromText(o.aircraft),
    pilot: fromText(o.pilot),
    startT: fromIso(o.start_utc),
    durationS: fromNum(o.duration_s),
    samples: fromNum(o.samples),
    maxAbsErrorDeg: fromNum(o.max_abs_error_deg),
    maxErrorT: fromIso(o.max_error_utc),
    rmsErrorDeg: fromNum(o.rms_error_deg),
    turnsFlown: fromNum(o.turns_flown),
    turnsGraded: fromNum(o.turns_graded),
    turnsWithinTolerance: fromNum(o.turns_within_tolerance),
    meanAbsRolloutErrorDeg: fromNum(o.mean_abs_rollout_error_deg),
    warnings: fromNum(o.warnings),
    deviation: hasCard
      ? { aDeg: fromNum(o.deviation_a_deg), bDeg: fromNum(o.deviation_b_deg), cDeg: fromNum(o.deviation_c_deg), dDeg: fromNum(o.deviation_d_deg), eDeg: fromNum(o.deviation_e_deg) }
      : null,
    analysedT: fromIso(o.analysed_utc),
  };
}

/**
 * Opens (creating when absent) the catalogue at `file`: WAL journal (readers never block the writer),
 * synchronous=FULL so that every committed row survives a crash of the process or the machine
 * (SQLite docs, "Write-Ahead Logging" and PRAGMA synchronous), busy timeout 10 s for a second process
 * on the same folder. The folder must exist.
 * @throws InputError naming the file when it is not an SQLite database or was made by a newer layout
 */
export function openCatalogue(file: string): FlightCatalogue {
  let db: SqliteDatabase.Database;
  try {
    db = new Database(file, { timeout: 10_000 });
    db.pragma('journal_mode = WAL');
    db.pragma('synchronous = FULL');
    const version = db.pragma('user_version', { simple: true }) as number;
    if (version > CATALOGUE_SCHEMA_VERSION) {
      db.close();
      throw new InputError(file, `the catalogue was written by a newer compass-debrief (layout ${version}, this one reads ${CATALOGUE_SCHEMA_VERSION})`, { hint: 'use a newer compass-debrief or another --out-dir' });
    }
    db.exec(`CREATE TABLE IF NOT EXISTS flights (${COLUMNS});
      CREATE INDEX IF NOT EXISTS flights_pilot ON flights (pilot, start_utc);
      CREATE INDEX IF NOT EXISTS flights_aircraft ON flights (aircraft, start_utc);
      PRAGMA user_version = ${CATALOGUE_SCHEMA_VERSION};`);
  } catch (err) {
    if (err instanceof InputError) throw err;
    throw new InputError(file, `cannot open the flight catalogue: ${(err as Error).message}`, { hint: 'delete it to start a new catalogue, or use another --out-dir' });
  }
  const getStmt = db.prepare('SELECT * FROM flights WHERE content_sha256 = ?');
  const putStmt = db.prepare(
    `INSERT INTO flights (${NAMES.join(', ')}) VALUES (${NAMES.map((n) => `@${n}`).join(', ')})
     ON CONFLICT (content_sha256) DO UPDATE SET ${NAMES.filter((n) => n !== 'content_sha256').map((n) => `${n} = excluded.${n}`).join(', ')}`,
  );
  const allStmt = db.prepare('SELECT * FROM flights ORDER BY start_utc IS NULL, start_utc, input_path');
  const releaseStmt = db.prepare('UPDATE flights SET report_base = NULL WHERE report_base = ? AND content_sha256 <> ?');
  const putOne = db.transaction((rec: Record<string, SqlValue>, claimBase: string) => {
    if (claimBase !== '') releaseStmt.run(claimBase, rec.content_sha256);
    putStmt.run(rec);
  });
  return {
    file,
    get(contentSha256) {
      const o = getStmt.get(contentSha256) as Record<string, unknown> | undefined;
      return o ? fromRecord(o) : undefined;
    },
    put(row, claimBase = row.reportBase) {
      putOne(toRecord(row), claimBase);
    },
    all() {
      return (allStmt.all() as Record<string, unknown>[]).map(fromRecord);
    },
    close() {
      if (db.open) db.close();
    },
  };
}
