// A batch worker that dies (process.exit in the analysis process) on any log whose name holds "crash-me",
// and otherwise serves jobs exactly as the real one does. For the crash-safety tests only.
import '../../src/batch/batchWorker.js';
import type { WorkerRequest } from '../../src/batch/batchWorker.js';

process.on('message', (m: WorkerRequest) => {
  if (m.job.logPath.includes('crash-me')) process.exit(7);
});
