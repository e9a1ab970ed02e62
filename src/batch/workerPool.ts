// A fixed pool of worker threads working through a list of jobs, one job per worker at a time.
import type { Worker } from 'node:worker_threads';
import { startWorker } from './sourceWorker.js';

/** What came back for one job: the worker's reply, or why the worker stopped while it had the job. */
export type PoolResult<R> = { kind: 'reply'; value: R } | { kind: 'crash'; message: string };

/**
 * Runs `jobs` on up to `size` workers started from `entry` (a module that answers each message
 * `{ id, job }` with one message `{ id, outcome }`). `onDone(index, result)` is called on the main
 * thread as each job finishes, in completion order. A worker that throws, runs out of memory or exits
 * while it holds a job is reported for that job as a crash and replaced, and the rest go on.
 * Resolves when every job is done; rejects (terminating the workers) if `onDone` throws.
 * @param size 1..64 workers (never more than there are jobs)
 */
export function runOnWorkers<J, R>(
  entry: URL,
  jobs: readonly J[],
  size: number,
  onDone: (index: number, result: PoolResult<R>) => void,
): Promise<void> {
  return new Promise((resolve, reject) => {
    let next = 0;
    let finished = 0;
    let failed = false;
    const live = new Set<Worker>();
    if (jobs.length === 0) {
      resolve();
      return;
    }

    const stopAll = () => {
      for (const w of live) void w.terminate();
      live.clear();
    };
    const complete = (index: number, result: PoolResult<R>): boolean => {
      try {
        onDone(index, result);
      } catch (err) {
        failed = true;
        stopAll();
        reject(err);
        return false;
      }
      finished++;
      if (finished === jobs.length) {
        stopAll();
        resolve();
      }
      return true;
    };

    const spawn = () => {
      const w = startWorker(entry);
      live.add(w);
      let current = -1;
      const give = () => {
        if (failed || next >= jobs.length) {
          current = -1;
          live.delete(w);
          void w.terminate();
          return;
        }
        current = next++;
        w.postMessage({ id: current, job: jobs[current] });
      };
      const crashed = (message: string) => {
        live.delete(w);
        const index = current;
        current = -1;
        if (failed || index < 0) return;
        if (!complete(index, { kind: 'crash', message })) return;
        if (next < jobs.length) spawn();
      };
      w.on('message', (m: { id: number; outcome: R }) => {
        if (m.id !== current) return;
        current = -1;
        if (complete(m.id, { kind: 'reply', value: m.outcome })) give();
      });
      w.on('error', (err) => crashed(`the analysis worker stopped: ${err.message.split('\n')[0]}`));
      w.on('exit', (code) => crashed(`the analysis worker exited (code ${code})`));
      give();
    };

    for (let k = 0; k < Math.min(size, jobs.length); k++) spawn();
  });
}
