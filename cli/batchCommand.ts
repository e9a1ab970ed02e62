// `compass-debrief batch <folders or files…> --out-dir DIR`: every log debriefed in analysis processes, an
// overview page and CSV, and a catalogue of the flights; unchanged flights are kept from the last run.
import { parseFormatOption, readOptionsFrom } from './readOptions.js';
import os from 'node:os';
import path from 'node:path';
import type { SmithCoefficients } from '../src/deviation/smithCoefficients.js';
import { readCompassProfileFile } from '../src/batch/readCompassProfileFile.js';
import { MAX_JOBS, runBatch, type BatchEvent, type BatchSettings } from '../src/batch/runBatch.js';
import type { CliIo } from './cliIo.js';
import { parseCommandLine } from './parseCommandLine.js';
import { parseWind } from './parseWind.js';
import { readWindTable } from './readWindTable.js';
import { USAGE } from './usage.js';
import { UsageError } from './usageError.js';

/** Width of the terminal progress bar [characters]. */
const BAR_CHARS = 24;

/**
 * Progress of a batch on stderr: on a terminal one bar redrawn in place (\r, erase line), elsewhere one
 * plain line per finished flight; nothing when quiet.
 */
export function batchProgress(io: CliIo, quiet: boolean): { onEvent: (e: BatchEvent) => void; end: () => void } {
  let drawn = false;
  const bar = (done: number, total: number, label: string) => {
    const filled = total > 0 ? Math.round((done / total) * BAR_CHARS) : BAR_CHARS;
    io.stderr(`\r\x1b[2K[${'#'.repeat(filled)}${'.'.repeat(BAR_CHARS - filled)}] ${done}/${total} ${label}`);
    drawn = true;
  };
  return {
    onEvent(e) {
      if (quiet) return;
      if (e.kind === 'planned') {
        if (io.isTty && e.toAnalyse > 0) bar(0, e.toAnalyse, `flights to analyse${e.unchanged > 0 ? ` (${e.unchanged} unchanged)` : ''}`);
        return;
      }
      const f = e.flight;
      const what = f.row.status === 'ok' ? 'ok' : 'failed';
      if (io.isTty) bar(e.done, e.toAnalyse, `${path.basename(f.inputPath)} ${what}`);
      else io.stderr(`[${e.done}/${e.toAnalyse}] ${f.inputPath}: ${what}\n`);
    },
    end() {
      if (drawn) io.stderr('\r\x1b[2K');
      drawn = false;
    },
  };
}

/** Reads a swing record into Smith's coefficients (the swing code loads mathjs, so only when asked). */
async function readCard(file: string): Promise<SmithCoefficients> {
  const { readSwingFile } = await import('./swingFile.js');
  const r = await readSwingFile(file);
  return { aDeg: r.A_deg, bDeg: r.B_deg, cDeg: r.C_deg, dDeg: r.D_deg, eDeg: r.E_deg };
}

export async function batchCommand(args: string[], io: CliIo): Promise<number> {
  const { values, positionals } = parseCommandLine('batch', args, {
    'out-dir': { type: 'string' },
    jobs: { type: 'string', short: 'j' },
    wind: { type: 'string' },
    deviation: { type: 'string' },
    compass: { type: 'string' },
    tolerance: { type: 'string' },
    aircraft: { type: 'string' },
    pilot: { type: 'string' },
    force: { type: 'boolean' },
    format: { type: 'string' },
    columns: { type: 'string' },
    date: { type: 'string' },
    'tz-offset': { type: 'string' },
    'heading-ref': { type: 'string' },
  });
  if (values.help) {
    io.stdout(USAGE.batch);
    return 0;
  }
  if (positionals.length === 0) throw new UsageError('batch', 'no folder or log file given');
  const outDir = values['out-dir'];
  if (outDir === undefined) throw new UsageError('batch', '--out-dir DIR is required (the folder for the debriefs, the overview and the catalogue)');
  let jobs = Math.min(MAX_JOBS, Math.max(1, os.availableParallelism()));
  if (values.jobs !== undefined) {
    jobs = Number(values.jobs);
    if (!/^\d+$/.test(values.jobs.trim()) || !(jobs >= 1 && jobs <= MAX_JOBS)) throw new UsageError('batch', `--jobs ${values.jobs}: expected a whole number from 1 to ${MAX_JOBS}`);
  }
  let toleranceDeg: number | undefined;
  if (values.tolerance !== undefined) {
    toleranceDeg = Number(values.tolerance);
    if (!(Number.isFinite(toleranceDeg) && toleranceDeg > 0 && toleranceDeg <= 90)) throw new UsageError('batch', `--tolerance ${values.tolerance}: must be a number of degrees above 0 and up to 90`);
  }
  const windArg = parseWind(values.wind ?? 'auto', 'batch');
  const resolve = (p: string) => path.resolve(io.cwd, p);

  const settings: BatchSettings = {
    inputs: positionals,
    outDir,
    cwd: io.cwd,
    jobs,
    wind: windArg.kind === 'file' ? await readWindTable(resolve(windArg.path)) : windArg,
    aircraft: values.aircraft,
    pilot: values.pilot,
    toleranceDeg,
    read: { ...(await readOptionsFrom('batch', values)), ...(values.format !== undefined ? { format: parseFormatOption('batch', values.format) } : {}) },
    force: Boolean(values.force),
  };
  if (values.compass !== undefined) settings.compass = { profile: await readCompassProfileFile(resolve(values.compass)), file: values.compass };
  if (values.deviation !== undefined) settings.deviation = { coefficients: await readCard(resolve(values.deviation)), file: values.deviation };

  const progress = batchProgress(io, Boolean(values.quiet));
  settings.onEvent = progress.onEvent;
  let result;
  try {
    result = await runBatch(settings);
  } finally {
    progress.end();
  }

  // Failures are errors: one line each on stderr, even when quiet.
  for (const f of result.flights) if (f.row.status === 'failed' && f.run !== 'duplicate') io.stderr(`${f.row.error}\n`);
  if (result.flights.length === 0) {
    io.stderr(`compass-debrief batch: no flight log found in ${positionals.join(' ')}${result.skipped.length > 0 ? ` (${result.skipped.length} file(s) left out: see ${result.overviewPath})` : ''}\n`);
    return 1;
  }
  if (!values.quiet) {
    const n = result.flights.length;
    io.stdout(
      `batch: ${n} flight log(s): ${result.ok} ok, ${result.failed} failed; ${result.analysed} analysed, ${result.unchanged} unchanged (kept)` +
        `${result.skipped.length > 0 ? `; ${result.skipped.length} left out` : ''}\n`,
    );
    for (const s of result.skipped) io.stdout(`  left out ${s.path}: ${s.note}\n`);
    io.stdout(`  wrote ${result.overviewPath}\n  wrote ${result.csvPath}\n  catalogue ${result.cataloguePath}\n`);
  }
  return result.ok > 0 ? 0 : 1;
}
