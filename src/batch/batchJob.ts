// One batch flight as a worker does it: the shared debrief steps, the outputs written whole, the facts sent back.
import type { ReadOptions } from '../import/readLog.js';
import { InputError, OptionError, ParseError } from '../errors.js';
import type { CompassProfile } from '../compass/compassProfile.js';
import type { SmithCoefficients } from '../deviation/smithCoefficients.js';
import type { ReportAssets } from '../report/renderReport.js';
import { writeOutputsAtomically } from '../report/writeAtomic.js';
import type { WindOption } from '../state/windOption.js';
import { debriefOneFlight } from './debriefOneFlight.js';
import type { FailureKind } from './flightCatalogue.js';
import { flightFacts, type FlightFacts } from './flightFacts.js';

/** Everything a worker needs for one flight; plain data (structured-clonable), no functions. */
export interface BatchJob {
  /** Absolute path of the log (a worker's cwd need not be the user's). */
  logPath: string;
  /** The log's path as the user sees it, used in error lines. */
  displayPath: string;
  htmlPath: string;
  samplesPath: string;
  jsonPath: string;
  /** Tag overrides (options, else side file); undefined keeps the log's own. */
  aircraft?: string;
  pilot?: string;
  wind: WindOption;
  compass?: CompassProfile;
  /** Smith's coefficients of the deviation card to apply (easterly +, compass + deviation = magnetic). */
  deviation?: SmithCoefficients;
  /** Roll-out tolerance for grading turns [deg]; default that of the debrief analyses. */
  toleranceDeg?: number;
  /** How to read the log (format, date, zone offset, column map, heading reference). */
  read?: Omit<ReadOptions, 'onProgress'>;
  /** The turn plan side file (its path for error lines, and its text). */
  plan?: { file: string; text: string };
  /** Files never to overwrite (the log and the side files). */
  protectedPaths: string[];
  /** Time stamp printed in every report of the batch [ISO 8601 UTC]. */
  generatedAtUtc: string;
}

export type BatchJobOutcome =
  | { status: 'ok'; facts: FlightFacts; elapsedMs: number }
  | { status: 'failed'; error: string; errorKind: FailureKind; elapsedMs: number };

/**
 * The one line a failed flight shows: InputError's own line (with `logPath` written as `displayPath`),
 * else the first line of the message prefixed by the log's displayed path.
 */
export function failureLine(logPath: string, displayPath: string, err: unknown): { error: string; errorKind: FailureKind } {
  if (err instanceof InputError) {
    const e = err.file === logPath ? new InputError(displayPath, err.message, { line: err.line, hint: err.hint }) : err;
    return { error: e.oneLine(), errorKind: 'input' };
  }
  if (err instanceof OptionError) return { error: `${displayPath}: ${err.message}`, errorKind: 'input' };
  const msg = err instanceof Error ? err.message : String(err);
  return { error: `${displayPath}: ${msg.split('\n')[0]}`, errorKind: 'internal' };
}

/**
 * Debriefs one batch flight (debriefOneFlight, the same steps as `report`) and writes its HTML, samples
 * CSV and summary JSON whole or not at all. Never throws: a failure comes back as one line.
 */
export async function runBatchJob(job: BatchJob, assets: ReportAssets): Promise<BatchJobOutcome> {
  const t0 = performance.now();
  try {
    const card = job.deviation;
    // smithCoefficients pulls in mathjs (about a second to load): only when a card is applied.
    const deviationAtDeg = card ? (await import('../deviation/smithCoefficients.js')).deviationAtDeg : undefined;
    const { analysis, outputs } = await debriefOneFlight(
      { logPath: job.logPath, format: job.read?.format, read: job.read, aircraft: job.aircraft, pilot: job.pilot, htmlPath: job.htmlPath, samplesPath: job.samplesPath, jsonPath: job.jsonPath },
      {
        analyse: {
          wind: job.wind,
          compass: job.compass,
          deviation: card && deviationAtDeg ? (compassDeg: number) => deviationAtDeg(card, compassDeg) : undefined,
          debrief: {
            ...(job.toleranceDeg !== undefined ? { toleranceDeg: job.toleranceDeg } : {}),
            ...(job.plan ? { planCsvText: job.plan.text } : {}),
          },
        },
        assets,
        generatedAt: new Date(job.generatedAtUtc),
      },
    );
    await writeOutputsAtomically(outputs, job.protectedPaths);
    return { status: 'ok', facts: flightFacts(analysis), elapsedMs: performance.now() - t0 };
  } catch (err) {
    // The plan is parsed inside the analysis: name the plan file and its line (as `report --plan` does).
    const e = err instanceof ParseError && job.plan ? new InputError(job.plan.file, err.message, { line: err.line, hint: err.hint }) : err;
    return { status: 'failed', ...failureLine(job.logPath, job.displayPath, e), elapsedMs: performance.now() - t0 };
  }
}
