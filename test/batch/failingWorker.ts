// A batch worker that dies (process.exit in the worker thread) on any log whose name holds "crash-me",
// and otherwise serves jobs exactly as the real one does. For the crash-safety tests only.
import { parentPort } from 'node:worker_threads';
import '../../src/batch/batchWorker.js';
import type { WorkerRequest } from '../../src/batch/batchWorker.js';

parentPort?.on('message', (m: WorkerRequest) => {
  if (m.job.logPath.includes('crash-me')) process.exit(7);
});
