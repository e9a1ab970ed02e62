// Bench section for `npm run bench`: the batch's speed-up from worker threads, as the ratio of the wall
// time of N flights with --jobs 1 to that with --jobs 2 (interleaved runs, median). Reported, never asserted.
import { mkdirSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { benchFlight } from '../../src/synth/scenarios.js';
import { simulateFlight } from '../../src/synth/simulateFlight.js';
import { toFlightLog } from '../../src/synth/gpsNoise.js';
import { writeGpx } from '../../src/synth/writeGpx.js';
import { run } from '../../cli/run.js';
import { benchMachineCeiling } from '../bench/machineCeiling.js';

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

/** Wall time and the process's CPU time (user + system, every thread: the workers and V8's compiler threads) [ms]. */
async function timedBatch(logsDir: string, outDir: string, jobs: number): Promise<{ wallMs: number; cpuMs: number }> {
  let err = '';
  const c0 = process.cpuUsage();
  const t0 = performance.now();
  const code = await run(['batch', logsDir, '--out-dir', outDir, '--jobs', String(jobs), '--force', '--quiet'], {
    stdout: () => {},
    stderr: (t) => (err += t),
    isTty: false,
    env: {},
    cwd: logsDir,
  });
  if (code !== 0) throw new Error(`batch exited ${code}: ${err}`);
  const wallMs = performance.now() - t0;
  const c = process.cpuUsage(c0);
  return { wallMs, cpuMs: (c.user + c.system) / 1000 };
}

/**
 * Writes `flights` one-hour 1 Hz flights (one script, GPS noise seeds differ: a school's day of lessons as
 * phone or panel GPS logs them) and prints the jobs-1 / jobs-2 time ratio, then this machine's ceiling for it.
 */
export async function benchBatchSpeedup(workDir: string, flights = 24, repeats = 3): Promise<number> {
  const logsDir = path.join(workDir, 'batch-logs');
  rmSync(logsDir, { recursive: true, force: true });
  mkdirSync(logsDir, { recursive: true });
  const truth = simulateFlight(benchFlight(1, 1));
  for (let k = 0; k < flights; k++) {
    const log = toFlightLog(truth, { posSigmaM: 2, altSigmaM: 3, seed: 500 + k, file: `flight-${k + 1}.gpx`, format: 'gpx' });
    writeFileSync(path.join(logsDir, `flight-${k + 1}.gpx`), writeGpx(log));
  }
  const one: number[] = [];
  const two: number[] = [];
  const oneCpu: number[] = [];
  const twoCpu: number[] = [];
  for (let k = 0; k < repeats; k++) {
    const a = await timedBatch(logsDir, path.join(workDir, 'batch-out-1'), 1);
    const b = await timedBatch(logsDir, path.join(workDir, 'batch-out-2'), 2);
    one.push(a.wallMs);
    oneCpu.push(a.cpuMs);
    two.push(b.wallMs);
    twoCpu.push(b.cpuMs);
  }
  const ratio = median(one) / median(two);
  console.log(`batch of ${flights} × one-hour 1 Hz flights (${truth.t.length} samples each, median of ${repeats}, ${os.availableParallelism()} processors):`);
  console.log(`  --jobs 1                    ${median(one).toFixed(0)} ms, CPU ${median(oneCpu).toFixed(0)} ms (all threads)`);
  console.log(`  --jobs 2                    ${median(two).toFixed(0)} ms, CPU ${median(twoCpu).toFixed(0)} ms`);
  console.log(`  SPEED-UP jobs 1 / jobs 2    ${ratio.toFixed(2)}×`);
  // Each worker compiles the pipeline anew on V8's compiler threads: with one worker those run on the idle
  // processor, with two they take CPU from the workers. The CPU that --jobs 2 needs, spread over two
  // processors, bounds its wall time from below, so this is the most --jobs 2 could gain for that work.
  console.log(`  bound from the CPU used     ${(median(one) / (median(twoCpu) / 2)).toFixed(2)}×  (jobs-1 wall / (jobs-2 CPU / 2 processors))`);
  await benchMachineCeiling();
  return ratio;
}
