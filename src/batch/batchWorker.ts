// Worker-thread entry of the batch: receives one job at a time, debriefs it, posts the outcome back.
// The report template and chart library are read once per worker. Only the main thread writes the catalogue.
import { parentPort } from 'node:worker_threads';
import { loadReportAssets } from '../report/loadReportAssets.js';
import type { ReportAssets } from '../report/renderReport.js';
import { failureLine, runBatchJob, type BatchJob, type BatchJobOutcome } from './batchJob.js';

/** Message main → worker. */
export interface WorkerRequest {
  id: number;
  job: BatchJob;
}

/** Message worker → main. */
export interface WorkerReply {
  id: number;
  outcome: BatchJobOutcome;
}

/** Serves jobs on `port` until the main thread terminates the worker. */
export function serveBatchJobs(port: NonNullable<typeof parentPort>): void {
  let assets: ReportAssets | undefined;
  port.on('message', async (m: WorkerRequest) => {
    let outcome: BatchJobOutcome;
    try {
      assets ??= loadReportAssets();
      outcome = await runBatchJob(m.job, assets);
    } catch (err) {
      outcome = { status: 'failed', ...failureLine(m.job.logPath, m.job.displayPath, err), elapsedMs: 0 };
    }
    port.postMessage({ id: m.id, outcome } satisfies WorkerReply);
  });
}

if (parentPort) serveBatchJobs(parentPort);
