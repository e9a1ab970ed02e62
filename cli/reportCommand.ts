// `compass-debrief report <log>`: read, analyse, write the debrief (HTML), samples CSV and summary JSON.
import path from 'node:path';
import { promises as fsp } from 'node:fs';
import { analyseFlight, type AnalyseOptions } from '../src/analyseFlight.js';
import { readLogFile } from '../src/import/readLog.js';
import type { LogFormat } from '../src/log/flightLog.js';
import { InputError } from '../src/errors.js';
import { samplesCsv } from '../src/report/samplesCsv.js';
import { summaryJson } from '../src/report/summaryJson.js';
import { writeOutputsAtomically, type PendingOutput } from '../src/report/writeAtomic.js';
import { buildReportModel } from '../src/report/reportModel.js';
import { renderReport } from '../src/report/renderReport.js';
import { loadReportAssets } from '../src/report/loadReportAssets.js';
import { parseCompassProfile } from '../src/compass/compassProfile.js';
import { KT_MS } from '../src/constants.js';
import type { CliIo } from './cliIo.js';
import { parseCommandLine } from './parseCommandLine.js';
import { parseWind } from './parseWind.js';
import { USAGE } from './usage.js';
import { UsageError } from './usageError.js';
import { readDeviationFile } from './readDeviationFile.js';
import { progressReporter } from './progress.js';

const FORMATS: LogFormat[] = ['gpx', 'csv', 'igc', 'nmea', 'fit', 'kml'];

/** Reads a small JSON side file (compass profile) and names the file in any error. */
async function readJsonFile(file: string): Promise<unknown> {
  let text: string;
  try {
    text = await fsp.readFile(file, 'utf8');
  } catch (err) {
    throw new InputError(file, `cannot read the file: ${(err as NodeJS.ErrnoException).code ?? (err as Error).message}`, { hint: 'check the path' });
  }
  try {
    return JSON.parse(text);
  } catch (err) {
    throw new InputError(file, `not valid JSON: ${(err as Error).message}`, { hint: 'see DEVELOPERS.md for the compass profile fields' });
  }
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
  });
  if (values.help) {
    io.stdout(USAGE.report);
    return 0;
  }
  if (positionals.length === 0) throw new UsageError('report', 'no log file given');
  if (positionals.length > 1) throw new UsageError('report', `one log at a time (got ${positionals.length}: ${positionals.join(' ')})`);
  const logPath = positionals[0];
  const wind = parseWind(values.wind ?? 'auto');
  if (wind.kind === 'file') throw new UsageError('report', `--wind ${wind.path}: wind tables are not supported yet; give DDD/SS, calm or auto`);
  let format: LogFormat | undefined;
  if (values.format !== undefined) {
    if (!FORMATS.includes(values.format as LogFormat)) throw new UsageError('report', `--format ${values.format}: expected one of ${FORMATS.join(', ')}`);
    format = values.format as LogFormat;
  }
  const outHtml = values.out ?? path.join(io.cwd, `${path.basename(logPath).replace(/\.[^.]+$/, '')}.debrief.html`);
  const progress = progressReporter(io, Boolean(values.quiet));

  progress.stage('reading the log');
  const { log, health } = await readLogFile(logPath, { format });
  if (values.aircraft !== undefined) log.source.meta.aircraft = values.aircraft;
  if (values.pilot !== undefined) log.source.meta.pilot = values.pilot;

  const options: AnalyseOptions = { wind, onStage: (name) => progress.stage(name) };
  if (values.compass !== undefined) {
    const json = await readJsonFile(values.compass);
    try {
      options.compass = parseCompassProfile(json);
    } catch (err) {
      throw new InputError(values.compass, (err as Error).message, { hint: 'see DEVELOPERS.md for the compass profile fields and ranges' });
    }
  }
  if (values.deviation !== undefined) options.deviation = await readDeviationFile(values.deviation);

  const analysis = analyseFlight(log, options, health);
  progress.stage('writing the debrief');
  const assets = await loadReportAssets();
  const html = renderReport(buildReportModel(analysis, { generatedAt: new Date() }), assets);
  const outputs: PendingOutput[] = [{ path: outHtml, content: html }];
  if (values.samples !== undefined) outputs.push({ path: values.samples, content: samplesCsv(analysis) });
  if (values.json !== undefined) outputs.push({ path: values.json, content: summaryJson(analysis) });
  const inputs = [logPath, values.deviation, values.compass].filter((p): p is string => p !== undefined);
  await writeOutputsAtomically(outputs, inputs);
  progress.done();

  if (!values.quiet) {
    const c = analysis.compass;
    let iMax = -1;
    for (let i = 0; i < c.n; i++) if (Number.isFinite(c.errorDeg[i]) && (iMax < 0 || Math.abs(c.errorDeg[i]) > Math.abs(c.errorDeg[iMax]))) iMax = i;
    const w = analysis.state.winds[0];
    const windText = w ? `${Math.round(w.fromDegTrue).toString().padStart(3, '0')}/${Math.round(w.speedMs / KT_MS)} kt (${w.source})` : 'calm';
    const worst = iMax >= 0 ? `largest compass error ${Math.abs(c.errorDeg[iMax]).toFixed(0)}° at ${new Date(analysis.state.t[iMax] * 1000).toISOString().slice(11, 19)}Z` : 'no compass reading';
    io.stdout(`${path.basename(logPath)}: ${analysis.state.n} samples, wind ${windText}, ${worst}, ${analysis.warnings.length} warning(s)\n`);
    for (const o of outputs) io.stdout(`  wrote ${o.path}\n`);
  }
  return 0;
}
