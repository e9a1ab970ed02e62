// Bench helper: how much two threads at once gain on this machine for plain numeric loops, the ceiling for
// any batch speed-up here. Two kernels, each timed alone in one worker thread and then in two at once:
// an in-cache typed-array loop (the shape of the pipeline's column passes: loads, multiply-adds, stores)
// and a chain of dependent square roots (latency-bound). On two real cores both approach 2×; where the two
// processors share one core's execution units (simultaneous multithreading) the first stays well below.
import { Worker, isMainThread, parentPort, workerData } from 'node:worker_threads';

type Kernel = 'columns' | 'sqrt-chain';

/** Runs one kernel; returns its wall time [ms]. */
function runKernel(kind: Kernel): number {
  const t0 = performance.now();
  let s = 0;
  if (kind === 'columns') {
    const n = 4096;
    const a = new Float64Array(n).fill(1.5);
    const b = new Float64Array(n);
    for (let r = 0; r < 60_000; r++) for (let i = 0; i < n; i++) {
      b[i] = a[i] * 0.5 + r;
      s += b[i];
    }
  } else {
    for (let i = 0; i < 3e8; i++) s += Math.sqrt(i) * 1.0000001;
  }
  if (s === 42) console.log(''); // keeps the loop from being removed
  return performance.now() - t0;
}

function inWorker(kind: Kernel): Promise<number> {
  return new Promise((resolve, reject) => {
    const w = new Worker(new URL(import.meta.url), { workerData: kind });
    w.once('message', (ms: number) => resolve(ms));
    w.once('error', reject);
  });
}

/** Throughput of two threads at once over one thread alone, per kernel (prints and returns them). */
export async function benchMachineCeiling(): Promise<Record<Kernel, number>> {
  const out = {} as Record<Kernel, number>;
  for (const kind of ['columns', 'sqrt-chain'] as Kernel[]) {
    const one = await inWorker(kind);
    const both = await Promise.all([inWorker(kind), inWorker(kind)]);
    out[kind] = (2 * one) / Math.max(...both);
  }
  console.log(`  this machine's two-thread ceiling: column loop ×${out.columns.toFixed(2)}, dependent sqrt chain ×${out['sqrt-chain'].toFixed(2)} (2.00 on two real cores)`);
  return out;
}

if (!isMainThread && parentPort) parentPort.postMessage(runKernel(workerData as Kernel));
