// The batch: find the logs, skip the unchanged ones, debrief the rest in analysis processes (workerPool.ts),
// catalogue each flight as it finishes (this process only, one transaction per flight), then write the overview.
import type { ReadOptions } from '../import/readLog.js';
import { existsSync, promises as fsp, readFileSync } from 'node:fs';
import path from 'node:path';
import type { CompassProfile } from '../compass/compassProfile.js';
import type { SmithCoefficients } from '../deviation/smithCoefficients.js';
import { InputError, OptionError } from '../errors.js';
import { KT_MS } from '../constants.js';
import { writeOutputsAtomically } from '../report/writeAtomic.js';
import { checkWindOption, type WindOption } from '../state/windOption.js';
import { packageRoot } from '../util/packageRoot.js';
import type { BatchJob, BatchJobOutcome } from './batchJob.js';
import type { BatchOverview, OverviewFlight } from './batchOverview.js';
import { fileSha256, optionsSha256 } from './contentKey.js';
import { CATALOGUE_FILE, findLogs, type FoundLog, type SkippedPath } from './findLogs.js';
import { openCatalogue, type CatalogueRow, type FailureKind, type FlightCatalogue } from './flightCatalogue.js';
import type { FlightFacts } from './flightFacts.js';
import { overviewCsv } from './overviewCsv.js';
import { overviewHtml } from './overviewHtml.js';
import { readPlanSideFile, readTags, type FlightTags } from './sideFiles.js';
import { reportFiles, uniqueReportBases } from './reportNames.js';
import { WorkerPool } from './workerPool.js';

/** Logs whose hash and side files are read at once while planning. */
const PLAN_AT_ONCE = 16;

/** Most analysis processes a batch starts (the --jobs range is 1..MAX_JOBS). */
export const MAX_JOBS = 64;

export interface BatchSettings {
  /** Files and folders, as given (relative to `cwd`). */
  inputs: string[];
  /** Output folder (created when missing), relative to `cwd` or absolute. */
  outDir: string;
  cwd: string;
  /** Worker threads, 1..64. */
  jobs: number;
  wind: WindOption;
  compass?: { profile: CompassProfile; file: string };
  deviation?: { coefficients: SmithCoefficients; file: string };
  /** Tags for every flight, over the side files and the logs' own. */
  aircraft?: string;
  pilot?: string;
  /** Roll-out tolerance for grading turns [deg, > 0 and ≤ 90]; default that of the debrief analyses. */
  toleranceDeg?: number;
  /** How to read the logs (format, date, time-zone offset, CSV column map, heading reference), for every flight. */
  read?: BatchReadOptions;
  /** Analyse every flight even when unchanged. */
  force?: boolean;
  /** Progress: called on the main thread. */
  onEvent?: (e: BatchEvent) => void;
  /** Worker module (default: batchWorker beside this file). Tests pass one that fails on purpose. */
  workerEntry?: URL;
  /** The clock (tests). */
  now?: () => Date;
}

/** The reading options a batch passes to every flight (no progress callback: workers read alone). */
export type BatchReadOptions = Omit<ReadOptions, 'onProgress'>;

export type BatchEvent =
  | { kind: 'planned'; total: number; toAnalyse: number; unchanged: number; skipped: SkippedPath[] }
  /** One flight analysed and catalogued (or failed and catalogued); `done` of `toAnalyse`. */
  | { kind: 'flight'; done: number; toAnalyse: number; flight: OverviewFlight };

export interface BatchResult {
  flights: OverviewFlight[];
  skipped: SkippedPath[];
  /** Inputs whose row status is ok / failed (this run's and kept ones alike). */
  ok: number;
  failed: number;
  /** Flights analysed in this run, and kept unchanged. */
  analysed: number;
  unchanged: number;
  overviewPath: string;
  csvPath: string;
  cataloguePath: string;
  /** Analysis processes started in this run, replacements for crashed ones included (0 when nothing needed analysing). */
  workersStarted: number;
}

/** The worker module beside this one, with this module's own extension (.ts when run from the sources). */
export function defaultWorkerEntry(): URL {
  const ext = import.meta.url.endsWith('.ts') ? '.ts' : '.js';
  return new URL(`./batchWorker${ext}`, import.meta.url);
}

/** The package version (package.json), part of the re-run key. */
export function toolVersion(): string {
  const pkg = JSON.parse(readFileSync(path.join(packageRoot(import.meta.url), 'package.json'), 'utf8')) as { version?: string };
  return pkg.version ?? '0.0.0';
}

function emptyFacts(tags: { aircraft?: string; pilot?: string }): FlightFacts {
  return {
    format: '',
    aircraft: tags.aircraft ?? '',
    pilot: tags.pilot ?? '',
    startT: NaN,
    durationS: NaN,
    samples: 0,
    maxAbsErrorDeg: NaN,
    maxErrorT: NaN,
    rmsErrorDeg: NaN,
    turnsFlown: 0,
    turnsGraded: 0,
    turnsWithinTolerance: 0,
    meanAbsRolloutErrorDeg: NaN,
    warnings: 0,
  };
}

function unreadLine(p: string, err: unknown): string {
  const code = (err as NodeJS.ErrnoException).code;
  if (code === 'ENOENT') return new InputError(p, 'no such file', { hint: 'check the path and the file name' }).oneLine();
  if (code === 'EACCES' || code === 'EPERM') return new InputError(p, 'the file cannot be read (permission denied)').oneLine();
  return new InputError(p, `the file cannot be read (${code ?? (err as Error).message})`).oneLine();
}

function windText(w: WindOption): string {
  switch (w.kind) {
    case 'calm':
      return 'wind calm';
    case 'given':
      return `wind ${String(Math.round(w.fromDegTrue)).padStart(3, '0')}/${Math.round(w.speedMs / KT_MS)} kt given`;
    case 'table':
      return 'wind from a table';
    default:
      return 'wind from each log (auto)';
  }
}

/** One input after hashing and reading its side file. */
interface Planned {
  found: FoundLog;
  base: string;
  sha: string;
  tags: FlightTags;
  plan?: { file: string; text: string };
  /** A side file failed: the flight fails with this line without a worker. */
  sideError?: { error: string; errorKind: FailureKind };
  optionsSha: string;
  readError?: string;
  /** The catalogue's row when the last run's result stands (keptFromLastRun), looked up once while planning. */
  kept?: CatalogueRow;
}

/**
 * Runs a batch (see BatchSettings). Every log found is debriefed by the same steps as `report`
 * (debriefOneFlight) in an analysis process, unless the catalogue in the output folder already holds it with
 * the same content hash, options hash and tool version and its outputs are still there (then it is kept
 * as it is; `force` analyses it again). Each finished flight is committed to the catalogue before the next
 * result is taken, so a crash loses only the flights still in progress. A broken log becomes a failed row
 * and never stops the batch. Writes `<outDir>/index.html`, `overview.csv` and `catalogue.sqlite`.
 * @throws OptionError for jobs outside 1..64 or a bad wind; InputError for an unusable output folder or catalogue
 */
export async function runBatch(s: BatchSettings): Promise<BatchResult> {
  if (!Number.isInteger(s.jobs) || s.jobs < 1 || s.jobs > MAX_JOBS) throw new OptionError('jobs', `must be a whole number from 1 to ${MAX_JOBS}, got ${s.jobs}`);
  checkWindOption(s.wind);
  if (s.toleranceDeg !== undefined && !(Number.isFinite(s.toleranceDeg) && s.toleranceDeg > 0 && s.toleranceDeg <= 90)) {
    throw new OptionError('toleranceDeg', `must be above 0 and at most 90 degrees, got ${s.toleranceDeg}`);
  }
  const outAbs = path.resolve(s.cwd, s.outDir);
  try {
    await fsp.mkdir(outAbs, { recursive: true });
  } catch (err) {
    throw new InputError(s.outDir, `cannot make the output folder: ${(err as NodeJS.ErrnoException).code ?? (err as Error).message}`);
  }
  const now = (s.now ?? (() => new Date()))();
  const version = toolVersion();
  const { logs, skipped } = await findLogs(s.inputs, { cwd: s.cwd, excludeDirs: [outAbs] });
  const pool = new WorkerPool<BatchJob, BatchJobOutcome>(s.workerEntry ?? defaultWorkerEntry(), Math.min(s.jobs, logs.length));
  try {
    return await planAndRun(s, logs, skipped, pool, { outAbs, now, version });
  } finally {
    await pool.close();
  }
}

async function planAndRun(
  s: BatchSettings,
  logs: FoundLog[],
  skipped: SkippedPath[],
  pool: WorkerPool<BatchJob, BatchJobOutcome>,
  { outAbs, now, version }: { outAbs: string; now: Date; version: string },
): Promise<BatchResult> {
  const bases = uniqueReportBases(logs.map((l) => l.absPath));
  const sideInputs = [s.compass?.file, s.deviation?.file].filter((p): p is string => p !== undefined).map((p) => path.resolve(s.cwd, p));

  const cataloguePath = path.join(outAbs, CATALOGUE_FILE);
  const catalogue = openCatalogue(cataloguePath);
  try {
    // Each log's hash and side files are read PLAN_AT_ONCE at a time: the file-system round trips overlap
    // (96 small logs: about 0.2 s one by one). The analysis processes start as soon as one log needs
    // analysing, so that their start-up (about 0.2 s of module loading each) overlaps the rest of the
    // planning; a re-run where nothing changed starts none.
    const planned: Planned[] = new Array(logs.length);
    for (let i0 = 0; i0 < logs.length; i0 += PLAN_AT_ONCE) {
      const chunk = await Promise.all(logs.slice(i0, i0 + PLAN_AT_ONCE).map((found, k) => planOne(s, found, bases[i0 + k])));
      chunk.forEach((p, k) => {
        if (p.readError === undefined) p.kept = keptFromLastRun(p, catalogue, s.force === true, outAbs, version);
        planned[i0 + k] = p;
      });
      if (chunk.some((p) => p.readError === undefined && !p.sideError && !p.kept)) pool.warm();
    }

    return await runPlanned(s, planned, skipped, catalogue, pool, { outAbs, now, version, sideInputs });
  } finally {
    catalogue.close();
  }
}

/** One log's entry in the plan: its content hash (or why it could not be read), tags, plan side file and options key. */
async function planOne(s: BatchSettings, found: FoundLog, base: string): Promise<Planned> {
  let sha = '';
  let readError: string | undefined;
  try {
    const st = await fsp.stat(found.absPath);
    if (st.isDirectory()) throw Object.assign(new Error('a directory'), { code: 'EISDIR' });
    sha = await fileSha256(found.absPath);
  } catch (err) {
    readError = unreadLine(found.path, err);
  }
  let tags: FlightTags = {};
  let plan: Planned['plan'];
  let sideError: Planned['sideError'];
  try {
    tags = await readTags(found.absPath);
    plan = await readPlanSideFile(found.absPath);
  } catch (err) {
    sideError = { error: err instanceof InputError ? err.oneLine() : String(err), errorKind: 'input' };
  }
  const aircraft = s.aircraft ?? tags.aircraft;
  const pilot = s.pilot ?? tags.pilot;
  const optionsSha = optionsSha256({
    wind: s.wind,
    compass: s.compass?.profile ?? null,
    deviation: s.deviation?.coefficients ?? null,
    toleranceDeg: s.toleranceDeg ?? null,
    read: s.read ?? null,
    aircraft: aircraft ?? null,
    pilot: pilot ?? null,
    plan: plan?.text ?? null,
    sideError: sideError?.error ?? null,
  });
  return { found, base, sha, tags: { ...tags, aircraft, pilot }, plan, sideError, optionsSha, readError };
}

/**
 * The catalogue's row for a planned log when the last run's result stands: same content, options and tool
 * version, not forced, and either its outputs are still there under the same name or it failed on its
 * input (a worker crash is always tried again).
 */
function keptFromLastRun(p: Planned, catalogue: FlightCatalogue, force: boolean, outAbs: string, version: string): CatalogueRow | undefined {
  const prev = catalogue.get(p.sha);
  if (prev === undefined || force || prev.optionsSha256 !== p.optionsSha || prev.toolVersion !== version) return undefined;
  const stands = prev.status === 'ok' ? prev.reportBase === p.base && outputsExist(outAbs, p.base) : prev.errorKind !== 'worker';
  return stands ? prev : undefined;
}

function outputsExist(outAbs: string, base: string): boolean {
  const f = reportFiles(base);
  return existsSync(path.join(outAbs, f.html)) && existsSync(path.join(outAbs, f.samples)) && existsSync(path.join(outAbs, f.json));
}

async function removeOutputs(outAbs: string, base: string): Promise<void> {
  const f = reportFiles(base);
  await Promise.all([f.html, f.samples, f.json].map((n) => fsp.rm(path.join(outAbs, n), { force: true })));
}

async function runPlanned(
  s: BatchSettings,
  planned: Planned[],
  skipped: SkippedPath[],
  catalogue: FlightCatalogue,
  pool: WorkerPool<BatchJob, BatchJobOutcome>,
  ctx: { outAbs: string; now: Date; version: string; sideInputs: string[] },
): Promise<BatchResult> {
  const flights: (OverviewFlight | undefined)[] = new Array(planned.length);
  const firstOfSha = new Map<string, number>();
  const toAnalyse: number[] = [];
  const failNow: number[] = [];
  const duplicates: number[] = [];
  const rowFor = (p: Planned, facts: FlightFacts, extra: Pick<CatalogueRow, 'status' | 'error' | 'errorKind' | 'reportBase'>): CatalogueRow => ({
    ...facts,
    contentSha256: p.sha,
    optionsSha256: p.optionsSha,
    toolVersion: ctx.version,
    inputPath: p.found.path,
    deviation: s.deviation?.coefficients ?? null,
    analysedT: ctx.now.getTime() / 1000,
    ...extra,
  });

  planned.forEach((p, i) => {
    if (p.readError !== undefined) {
      flights[i] = { inputPath: p.found.path, run: 'unread', note: '', row: rowFor(p, emptyFacts(p.tags), { status: 'failed', error: p.readError, errorKind: 'input', reportBase: '' }) };
      return;
    }
    const first = firstOfSha.get(p.sha);
    if (first !== undefined) {
      duplicates.push(i);
      return;
    }
    firstOfSha.set(p.sha, i);
    if (p.kept) flights[i] = { inputPath: p.found.path, run: 'unchanged', note: '', row: { ...p.kept, inputPath: p.found.path } };
    else if (p.sideError) failNow.push(i);
    else toAnalyse.push(i);
  });
  const unchanged = flights.filter((f) => f?.run === 'unchanged').length;
  s.onEvent?.({ kind: 'planned', total: planned.length, toAnalyse: toAnalyse.length + failNow.length, unchanged, skipped });

  let done = 0;
  const finish = (i: number, row: CatalogueRow) => {
    const p = planned[i];
    catalogue.put(row, p.base);
    const flight: OverviewFlight = { inputPath: p.found.path, run: 'analysed', note: '', row };
    flights[i] = flight;
    done++;
    s.onEvent?.({ kind: 'flight', done, toAnalyse: toAnalyse.length + failNow.length, flight });
  };
  for (const i of failNow) {
    const p = planned[i];
    await removeOutputs(ctx.outAbs, p.base);
    finish(i, rowFor(p, emptyFacts(p.tags), { status: 'failed', error: p.sideError!.error, errorKind: p.sideError!.errorKind, reportBase: '' }));
  }

  const jobs: BatchJob[] = toAnalyse.map((i) => {
    const p = planned[i];
    const f = reportFiles(p.base);
    return {
      logPath: p.found.absPath,
      displayPath: p.found.path,
      htmlPath: path.join(ctx.outAbs, f.html),
      samplesPath: path.join(ctx.outAbs, f.samples),
      jsonPath: path.join(ctx.outAbs, f.json),
      aircraft: p.tags.aircraft,
      pilot: p.tags.pilot,
      wind: s.wind,
      compass: s.compass?.profile,
      deviation: s.deviation?.coefficients,
      toleranceDeg: s.toleranceDeg,
      read: s.read,
      plan: p.plan,
      protectedPaths: [p.found.absPath, ...ctx.sideInputs, ...(p.tags.file ? [p.tags.file] : []), ...(p.plan ? [p.plan.file] : [])],
      generatedAtUtc: ctx.now.toISOString(),
    };
  });
  const stale: number[] = [];
  await pool.run(jobs, (k, result) => {
    const i = toAnalyse[k];
    const p = planned[i];
    if (result.kind === 'reply' && result.value.status === 'ok') {
      finish(i, rowFor(p, result.value.facts, { status: 'ok', error: '', errorKind: '', reportBase: p.base }));
      return;
    }
    const failure: { error: string; errorKind: FailureKind } =
      result.kind === 'crash'
        ? { error: `${p.found.path}: ${result.message}`, errorKind: 'worker' }
        : result.value.status === 'failed'
          ? { error: result.value.error, errorKind: result.value.errorKind }
          : { error: `${p.found.path}: no result`, errorKind: 'internal' };
    stale.push(i);
    finish(i, rowFor(p, emptyFacts(p.tags), { status: 'failed', ...failure, reportBase: '' }));
  });
  // A flight that fails now must not leave an older debrief under its name.
  for (const i of stale) await removeOutputs(ctx.outAbs, planned[i].base);

  for (const i of duplicates) {
    const p = planned[i];
    const first = firstOfSha.get(p.sha)!;
    const src = flights[first]!;
    flights[i] = { inputPath: p.found.path, run: 'duplicate', note: `same content as ${planned[first].found.path}`, row: { ...src.row, inputPath: p.found.path } };
  }

  const list = flights as OverviewFlight[];
  const optionsText = [
    windText(s.wind),
    s.compass ? `compass profile ${path.basename(s.compass.file)}` : 'default compass profile',
    s.deviation ? `deviation card from ${path.basename(s.deviation.file)}` : 'no deviation card',
    ...(s.toleranceDeg !== undefined ? [`roll-out tolerance ±${s.toleranceDeg}°`] : []),
  ].join('; ');
  const overview: BatchOverview = {
    generatedAtUtc: ctx.now.toISOString(),
    toolVersion: ctx.version,
    optionsText,
    flights: list,
    catalogue: catalogue.all().filter((r) => r.status === 'ok' && r.reportBase !== '' && existsSync(path.join(ctx.outAbs, reportFiles(r.reportBase).html))),
    skipped,
  };
  const overviewPath = path.join(ctx.outAbs, 'index.html');
  const csvPath = path.join(ctx.outAbs, 'overview.csv');
  await writeOutputsAtomically(
    [
      { path: overviewPath, content: overviewHtml(overview) },
      { path: csvPath, content: overviewCsv(list) },
    ],
    [...planned.map((p) => p.found.absPath), ...ctx.sideInputs],
  );
  const ok = list.filter((f) => f.row.status === 'ok').length;
  return {
    flights: list,
    skipped,
    ok,
    failed: list.length - ok,
    analysed: list.filter((f) => f.run === 'analysed').length,
    unchanged: list.filter((f) => f.run === 'unchanged').length,
    overviewPath,
    csvPath,
    cataloguePath: catalogue.file,
    workersStarted: pool.startedCount,
  };
}
