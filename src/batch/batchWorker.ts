// Entry of a batch's analysis process (workerPool.ts): receives one job at a time over the IPC channel,
// debriefs it, sends the outcome back. The report template and chart library are read once, at start-up,
// while the parent still plans the batch. Only the parent writes the catalogue.
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

/** Serves jobs from the parent process until it stops this one, or goes away (then this one exits too). */
export function serveBatchJobs(): void {
  const send = process.send?.bind(process);
  if (!send) throw new Error('batchWorker runs as a child process with an IPC channel (workerPool.ts)');
  let assets: ReportAssets | undefined;
  try {
    assets = loadReportAssets();
  } catch {
    // Reported with the first job, which fails on the same error.
  }
  process.on('disconnect', () => process.exit(0));
  process.on('message', async (m: WorkerRequest) => {
    let outcome: BatchJobOutcome;
    try {
      assets ??= loadReportAssets();
      outcome = await runBatchJob(m.job, assets);
    } catch (err) {
      outcome = { status: 'failed', ...failureLine(m.job.logPath, m.job.displayPath, err), elapsedMs: 0 };
    }
    send({ id: m.id, outcome } satisfies WorkerReply);
  });
}

if (process.send) serveBatchJobs();
