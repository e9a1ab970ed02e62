// `compass-debrief report <log>`: read, analyse, write the debrief (HTML), samples CSV and summary JSON.
import path from 'node:path';
import { readSideFileText } from '../src/import/readSideFile.js';
import { InputError, ParseError } from '../src/errors.js';
import type { AnalyseOptions } from '../src/analyseFlight.js';
import { writeOutputsAtomically } from '../src/report/writeAtomic.js';
import { debriefOneFlight } from '../src/batch/debriefOneFlight.js';
import { readCompassProfileFile } from '../src/batch/readCompassProfileFile.js';
import { KT_MS } from '../src/constants.js';
import type { CliIo } from './cliIo.js';
import { parseCommandLine } from './parseCommandLine.js';
import { parseWind } from './parseWind.js';
import { USAGE } from './usage.js';
import { UsageError } from './usageError.js';
import { readDeviationFile } from './readDeviationFile.js';
import { progressReporter } from './progress.js';
import { parseFormatOption, readOptionsFrom } from './readOptions.js';
import { readWindTable } from './readWindTable.js';
import { readObservedReadings } from './readObservedReadings.js';

/**
 * --excursion START/END: UTC times, either full ISO 8601 (with Z or an offset) or HH:MM[:SS] on the log's
 * own UTC day (resolved by analyseFlight; a time before the log's start is taken on the next day).
 */
export function parseExcursion(text: string): NonNullable<AnalyseOptions['excursion']> {
  const parts = text.split('/');
  if (parts.length !== 2) throw new UsageError('report', `--excursion ${text}: expected START/END, UTC times (e.g. 10:12:00/10:20:30 or full ISO 8601)`);
  const one = (s: string): { t: number; timeOfDay: boolean } => {
    const v = s.trim();
    const hm = /^(\d{1,2}):(\d{2})(?::(\d{2}(?:\.\d+)?))?Z?$/i.exec(v);
    if (hm && Number(hm[1]) < 24) return { t: Number(hm[1]) * 3600 + Number(hm[2]) * 60 + Number(hm[3] ?? 0), timeOfDay: true };
    const ms = Date.parse(v);
    if (Number.isFinite(ms) && /(Z|[+-]\d\d:?\d\d)$/i.test(v)) return { t: ms / 1000, timeOfDay: false };
    throw new UsageError('report', `--excursion ${text}: '${v}' is not a UTC time (HH:MM:SS or ISO 8601 with Z)`);
  };
  const a = one(parts[0]);
  const b = one(parts[1]);
  if (a.timeOfDay !== b.timeOfDay) throw new UsageError('report', `--excursion ${text}: give both times the same way (both HH:MM:SS or both ISO 8601)`);
  if (!a.timeOfDay && !(b.t > a.t)) throw new UsageError('report', `--excursion ${text}: the end must come after the start`);
  return { startT: a.t, endT: b.t, timeOfDay: a.timeOfDay };
}


export async function reportCommand(args: string[], io: CliIo): Promise<number> {
  const { values, positionals } = parseCommandLine('report', args, {
    out: { type: 'string', short: 'o' },
    samples: { type: 'string' },
    json: { type: 'string' },
    wind: { type: 'string' },
    deviation: { type: 'string' },
    compass: { type: 'string' },
    format: { type: 'string' },
    aircraft: { type: 'string' },
    pilot: { type: 'string' },
    plan: { type: 'string' },
    excursion: { type: 'string' },
    tolerance: { type: 'string' },
    observed: { type: 'string' },
    columns: { type: 'string' },
    date: { type: 'string' },
    'tz-offset': { type: 'string' },
    'heading-ref': { type: 'string' },
  });
  if (values.help) {
    io.stdout(USAGE.report);
    return 0;
  }
  if (positionals.length === 0) throw new UsageError('report', 'no log file given');
  if (positionals.length > 1) throw new UsageError('report', `one log at a time (got ${positionals.length}: ${positionals.join(' ')})`);
  const logPath = positionals[0];
  const windArg = parseWind(values.wind ?? 'auto');
  let toleranceDeg: number | undefined;
  if (values.tolerance !== undefined) {
    toleranceDeg = Number(values.tolerance);
    if (!(Number.isFinite(toleranceDeg) && toleranceDeg > 0 && toleranceDeg <= 90)) throw new UsageError('report', `--tolerance ${values.tolerance}: must be a number of degrees above 0 and up to 90`);
  }
  const excursion = values.excursion !== undefined ? parseExcursion(values.excursion) : undefined;
  const format = parseFormatOption('report', values.format);
  const read = await readOptionsFrom('report', values);
  const outHtml = values.out ?? path.join(io.cwd, `${path.basename(logPath).replace(/\.[^.]+$/, '')}.debrief.html`);
  const progress = progressReporter(io, Boolean(values.quiet));
  read.onProgress = (f) => progress.fraction(f);

  // Side files first (they are small; a bad one fails before the log is read), then the shared steps.
  const wind = windArg.kind === 'file' ? await readWindTable(windArg.path) : windArg;
  const options: Omit<AnalyseOptions, 'onStage'> = { wind, excursion, debrief: {} };
  if (toleranceDeg !== undefined) options.debrief!.toleranceDeg = toleranceDeg;
  if (values.plan !== undefined) options.debrief!.planCsvText = await readSideFileText(values.plan, 'plan');
  if (values.compass !== undefined) options.compass = await readCompassProfileFile(values.compass);
  if (values.deviation !== undefined) options.deviation = await readDeviationFile(values.deviation);
  if (values.observed !== undefined) options.observed = await readObservedReadings(values.observed);

  let outcome;
  try {
    outcome = await debriefOneFlight(
      { logPath, format, read, aircraft: values.aircraft, pilot: values.pilot, htmlPath: outHtml, samplesPath: values.samples, jsonPath: values.json },
      { analyse: options, onStage: (name) => progress.stage(name) },
    );
  } catch (err) {
    // The plan is parsed inside the analysis: name the plan file and its line.
    if (err instanceof ParseError && values.plan !== undefined) throw new InputError(values.plan, err.message, { line: err.line, hint: err.hint });
    throw err;
  }
  const { analysis, outputs } = outcome;
  const inputs = [logPath, values.deviation, values.compass, values.plan, values.observed, windArg.kind === 'file' ? windArg.path : undefined].filter((p): p is string => p !== undefined);
  await writeOutputsAtomically(outputs, inputs);
  progress.done();

  if (!values.quiet) {
    const c = analysis.compass;
    let iMax = -1;
    let nUnreliable = 0;
    for (let i = 0; i < c.n; i++) {
      if (c.unreliable[i]) {
        nUnreliable++;
        continue;
      }
      if (Number.isFinite(c.errorDeg[i]) && (iMax < 0 || Math.abs(c.errorDeg[i]) > Math.abs(c.errorDeg[iMax]))) iMax = i;
    }
    const w = analysis.state.winds[0];
    const windText = w ? `${Math.round(w.fromDegTrue).toString().padStart(3, '0')}/${Math.round(w.speedMs / KT_MS)} kt (${w.source})` : 'calm';
    const worst = iMax >= 0 ? `largest compass error ${Math.abs(c.errorDeg[iMax]).toFixed(0)}° at ${new Date(analysis.state.t[iMax] * 1000).toISOString().slice(11, 19)}Z` : 'no reliable compass reading';
    const flagged = nUnreliable > 0 ? ` (${nUnreliable} sample(s) where the card is unreliable left out)` : '';
    io.stdout(`${path.basename(logPath)}: ${analysis.state.n} samples, wind ${windText}, ${worst}${flagged}, ${analysis.warnings.length} warning(s)\n`);
    const cal = analysis.calibration;
    if (cal) {
      io.stdout(`  compass fitted to ${cal.used} observed reading(s): RMS ${cal.initialRmsDeg.toFixed(1)}° → ${cal.rmsDeg.toFixed(1)}°${cal.converged ? '' : ' (did not converge: treat with care)'}\n`);
      for (const p of cal.params) io.stdout(`    ${p.name.padEnd(20)} ${p.initial.toPrecision(3).padStart(8)} → ${p.value.toPrecision(3).padStart(8)} ± ${p.sigma.toPrecision(2)}${p.atBound ? ' (at its bound)' : ''}\n`);
    }
    for (const o of outputs) io.stdout(`  wrote ${o.path}\n`);
  }
  return 0;
}
