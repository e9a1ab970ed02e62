// The batch's pool of analysis processes: replies and crashes per job, the in-line compile flag when every
// processor has a worker, and the crash line taken from a child's error output.
import { describe, expect, it } from 'vitest';
import { crashLine, IN_LINE_COMPILE_FLAG } from '../../src/batch/analysisProcess.js';
import { WorkerPool, type PoolResult } from '../../src/batch/workerPool.js';

const entry = new URL('./echoWorker.ts', import.meta.url);
type Echo = { job: string; execArgv: string[]; pid: number; nan: number };

async function runPool(jobs: string[], size: number, processors: number): Promise<PoolResult<Echo>[]> {
  const out: PoolResult<Echo>[] = new Array(jobs.length);
  await new WorkerPool<string, Echo>(entry, size, processors).run(jobs, (i, r) => (out[i] = r));
  return out;
}

describe('WorkerPool', () => {
  it('answers every job once, over as many processes as asked, with values a JSON channel would lose', async () => {
    const jobs = ['a', 'b', 'c', 'd', 'e'];
    const out = await runPool(jobs, 2, 8);
    expect(out.map((r) => (r.kind === 'reply' ? r.value.job : r.kind))).toEqual(jobs);
    const pids = new Set(out.map((r) => (r.kind === 'reply' ? r.value.pid : 0)));
    expect(pids.size).toBeLessThanOrEqual(2);
    expect(pids.has(process.pid)).toBe(false);
    // Structured clone, not JSON: NaN stays NaN (a flight's facts hold NaN where nothing was measured).
    expect(out.every((r) => r.kind === 'reply' && Number.isNaN(r.value.nan))).toBe(true);
  });

  it('compiles in line only when every processor has a worker', async () => {
    const busy = await runPool(['x', 'y'], 2, 2);
    const spare = await runPool(['x', 'y'], 1, 2);
    for (const r of busy) expect(r.kind === 'reply' && r.value.execArgv).toContain(IN_LINE_COMPILE_FLAG);
    for (const r of spare) expect(r.kind === 'reply' && r.value.execArgv).not.toContain(IN_LINE_COMPILE_FLAG);
  });

  it('reports a crash for the job held, with the error line, and goes on with a new process', async () => {
    const out = await runPool(['a', 'throw', 'b', 'exit', 'c'], 1, 4);
    expect(out[0].kind).toBe('reply');
    expect(out[1]).toEqual({ kind: 'crash', message: 'the analysis worker stopped: RangeError: the test job asked for a crash' });
    expect(out[2].kind).toBe('reply');
    expect(out[3]).toEqual({ kind: 'crash', message: 'the analysis worker exited (code 5)' });
    expect(out[4].kind).toBe('reply');
  });

  it('with no jobs, stops the processes it started and resolves', async () => {
    await expect(new WorkerPool<string, Echo>(entry, 2, 2).run([], () => {})).resolves.toBeUndefined();
  });
});

describe('crashLine', () => {
  it("takes V8's fatal line, or the error line of an uncaught exception, else the last line", () => {
    // The text Node 20 printed here when a heap limit was reached (`node --max-old-space-size=16`, an
    // array grown without end), abridged.
    const oom =
      '\n<--- Last few GCs --->\n\n[9941:0x17307e20]       48 ms: Mark-Compact 16.3 (32.8) -> 16.3 (32.8) MB, 3.07 / 0.00 ms  (average mu = 0.404, current mu = 0.251) allocation failure; scavenge might not succeed\n\n\n<--- JS stacktrace --->\n\nFATAL ERROR: Reached heap limit Allocation failed - JavaScript heap out of memory\n----- Native stack trace -----\n';
    expect(crashLine(oom)).toBe('FATAL ERROR: Reached heap limit Allocation failed - JavaScript heap out of memory');
    const thrown = 'file:///x/echoWorker.ts:4\n  throw new RangeError("no");\n  ^\n\nRangeError: no\n    at process.<anonymous> (file:///x/echoWorker.ts:4:9)\n\nNode.js v20.20.2\n';
    expect(crashLine(thrown)).toBe('RangeError: no');
    expect(crashLine('something odd\nlast words\n')).toBe('last words');
    expect(crashLine('')).toBeUndefined();
  });
});
