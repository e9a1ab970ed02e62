// The steps of one debrief, shared by `report` and the batch workers: read → analyse → render → outputs.
// Node-side (it reads the log and the template through the existing I/O edges readLogFile and
// loadReportAssets); it writes nothing: the caller writes the pending outputs (writeOutputsAtomically).
import { analyseFlight, type AnalyseOptions } from '../analyseFlight.js';
import type { FlightAnalysis } from '../flightAnalysis.js';
import { readLogFile, type ReadOptions } from '../import/readLog.js';
import type { LogFormat } from '../log/flightLog.js';
import { loadReportAssets } from '../report/loadReportAssets.js';
import { buildReportModel } from '../report/reportModel.js';
import { renderReportChunks, type ReportAssets } from '../report/renderReport.js';
import { samplesCsvChunks } from '../report/samplesCsv.js';
import { summaryJson } from '../report/summaryJson.js';
import type { PendingOutput } from '../report/writeAtomic.js';

/** What to debrief and where its outputs go. */
export interface DebriefRequest {
  /** The flight log (any supported format; told from the content unless `format` is given). */
  logPath: string;
  format?: LogFormat;
  /** Further reading options: date and time zone for local times, CSV column mapping, heading reference, progress. */
  read?: Omit<ReadOptions, 'format'>;
  /** Tags that replace the log's own meta.aircraft / meta.pilot when given (never markup: escaped in the page). */
  aircraft?: string;
  pilot?: string;
  /** HTML debrief path (always produced). */
  htmlPath: string;
  /** Samples CSV path; none when omitted. */
  samplesPath?: string;
  /** Summary JSON path; none when omitted. */
  jsonPath?: string;
}

/** Analysis options plus what the rendering needs. */
export interface DebriefSettings {
  /** Wind, compass profile, deviation card, angle of attack (see AnalyseOptions). `onStage` is set from `onStage` below. */
  analyse: Omit<AnalyseOptions, 'onStage'>;
  /** Template and chart library; read with loadReportAssets when omitted (a worker passes its cached copy). */
  assets?: ReportAssets;
  /** Time stamp printed in the report; default now. */
  generatedAt?: Date;
  /** Called as each step starts ('reading the log', the analysis stages, 'writing the debrief'). */
  onStage?: (name: string) => void;
}

export interface DebriefOutcome {
  analysis: FlightAnalysis;
  /** HTML first, then samples CSV and summary JSON when asked for. */
  outputs: PendingOutput[];
}

/**
 * Debriefs one flight: readLogFile → analyseFlight → buildReportModel + renderReport, plus the samples CSV
 * and summary JSON when their paths are given. Writes nothing.
 * @throws InputError for a log the tool cannot use (names the file, and the line where it applies);
 *   OptionError for bad analysis options.
 * @example const { outputs } = await debriefOneFlight({ logPath: 'a.gpx', htmlPath: 'a.html' }, { analyse: { wind: { kind: 'auto' } } });
 */
export async function debriefOneFlight(req: DebriefRequest, settings: DebriefSettings): Promise<DebriefOutcome> {
  const onStage = settings.onStage;
  onStage?.('reading the log');
  const { log, health } = await readLogFile(req.logPath, { ...req.read, format: req.format });
  if (req.aircraft !== undefined) log.source.meta.aircraft = req.aircraft;
  if (req.pilot !== undefined) log.source.meta.pilot = req.pilot;

  const analysis = analyseFlight(log, { ...settings.analyse, onStage }, health);
  onStage?.('writing the debrief');
  const assets = settings.assets ?? (await loadReportAssets());
  // As chunks: the chart library goes out as bytes encoded once per process (a batch writes it per flight).
  const page = renderReportChunks(buildReportModel(analysis, { generatedAt: settings.generatedAt ?? new Date() }), assets);
  const outputs: PendingOutput[] = [{ path: req.htmlPath, content: page }];
  if (req.samplesPath !== undefined) outputs.push({ path: req.samplesPath, content: samplesCsvChunks(analysis) });
  if (req.jsonPath !== undefined) outputs.push({ path: req.jsonPath, content: summaryJson(analysis) });
  return { analysis, outputs };
}
