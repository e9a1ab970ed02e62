// A fixed pool of analysis processes working through a list of jobs, one job per process at a time.
import os from 'node:os';
import { startAnalysisProcess, type AnalysisProcess } from './analysisProcess.js';

/** What came back for one job: the worker's reply, or why the worker stopped while it had the job. */
export type PoolResult<R> = { kind: 'reply'; value: R } | { kind: 'crash'; message: string };

interface Slot {
  proc: AnalysisProcess;
  /** Index of the job it holds, or -1. */
  current: number;
}

interface Run<J, R> {
  jobs: readonly J[];
  onDone: (index: number, result: PoolResult<R>) => void;
  next: number;
  finished: number;
  resolve: () => void;
  reject: (err: unknown) => void;
}

/**
 * Analysis processes started from `entry` (a module that answers each message `{ id, job }` with one
 * message `{ id, outcome }`): by `warm`, so that their start-up overlaps whatever the caller still does
 * before `run` (the batch plans the rest of its inputs meanwhile), else by `run`. When there are at least
 * as many processes as processors, each compiles in line (analysisProcess.ts says why).
 */
export class WorkerPool<J, R> {
  private readonly live = new Set<Slot>();
  private readonly started: Promise<void>[] = [];
  private readonly inLineCompile: boolean;
  private active: Run<J, R> | undefined;
  private closed = false;

  /** @param size 0..64 processes (`run` starts one when there are none) */
  constructor(
    private readonly entry: URL,
    private readonly size: number,
    processors = os.availableParallelism(),
  ) {
    this.inLineCompile = size >= processors;
  }

  /** Processes started so far, replacements included. */
  get startedCount(): number {
    return this.started.length;
  }

  /** Starts the pool's processes now, if not yet started. */
  warm(): void {
    if (this.closed) return;
    while (this.started.length < this.size) this.spawn();
  }

  /**
   * Runs `jobs`, calling `onDone(index, result)` as each finishes, in completion order. A process that
   * throws, runs out of memory or exits while it holds a job is reported for that job as a crash and
   * replaced, and the rest go on. Resolves when every job is done; rejects (stopping the processes) if
   * `onDone` throws. Processes beyond the number of jobs are stopped.
   */
  run(jobs: readonly J[], onDone: (index: number, result: PoolResult<R>) => void): Promise<void> {
    if (this.closed) return Promise.reject(new Error('the worker pool is closed'));
    return new Promise((resolve, reject) => {
      const r: Run<J, R> = { jobs, onDone, next: 0, finished: 0, resolve, reject };
      this.active = r;
      if (jobs.length === 0) {
        void this.close();
        resolve();
        return;
      }
      while (this.live.size < Math.max(1, Math.min(this.size, jobs.length))) this.spawn();
      for (const s of [...this.live]) this.give(s);
    });
  }

  /** Stops every process; settles when all that were ever started have ended. */
  close(): Promise<void> {
    this.closed = true;
    for (const s of this.live) s.proc.stop();
    this.live.clear();
    return Promise.all(this.started).then(() => undefined);
  }

  private spawn(): Slot {
    const slot: Slot = { proc: undefined as unknown as AnalysisProcess, current: -1 };
    slot.proc = startAnalysisProcess(this.entry, this.inLineCompile, {
      message: (m) => this.onMessage(slot, m as { id: number; outcome: R }),
      exit: (why) => this.onExit(slot, why),
    });
    this.live.add(slot);
    this.started.push(slot.proc.ended);
    return slot;
  }

  private give(s: Slot): void {
    const r = this.active;
    if (!r || this.closed || r.next >= r.jobs.length) {
      s.current = -1;
      this.live.delete(s);
      s.proc.stop();
      return;
    }
    s.current = r.next++;
    s.proc.send({ id: s.current, job: r.jobs[s.current] });
  }

  private onMessage(s: Slot, m: { id: number; outcome: R }): void {
    if (m.id !== s.current) return;
    s.current = -1;
    // The next job goes out before this one is recorded, so the process does not wait on the caller.
    this.give(s);
    this.complete(m.id, { kind: 'reply', value: m.outcome });
  }

  private onExit(s: Slot, why: string | undefined): void {
    this.live.delete(s);
    const index = s.current;
    s.current = -1;
    const r = this.active;
    // Closed (all done, or onDone threw): nothing to report. Without a job: a process that died before it
    // was given work is replaced when the run starts.
    if (!r || this.closed || index < 0) return;
    if (this.complete(index, { kind: 'crash', message: why ?? 'the analysis worker exited' }) && !this.closed && r.next < r.jobs.length) {
      this.give(this.spawn());
    }
  }

  private complete(index: number, result: PoolResult<R>): boolean {
    const r = this.active as Run<J, R>;
    try {
      r.onDone(index, result);
    } catch (err) {
      void this.close();
      r.reject(err);
      return false;
    }
    r.finished++;
    if (r.finished === r.jobs.length) {
      void this.close();
      r.resolve();
    }
    return true;
  }
}
