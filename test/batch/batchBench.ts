// Bench section for `npm run bench`: the batch's speed-up from worker threads, as the ratio of the wall
// time of N flights with --jobs 1 to that with --jobs 2 (interleaved runs, median). Reported, never asserted.
import { mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
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

/**
 * CPU time [ms] of this process (every thread) and of its ended child processes (the batch's workers),
 * from /proc/self/stat: utime, stime, cutime, cstime in clock ticks (proc(5); 100 ticks a second, the
 * value of sysconf(_SC_CLK_TCK) on Linux). NaN where there is no /proc.
 */
function cpuWithChildrenMs(): number {
  try {
    const stat = readFileSync('/proc/self/stat', 'utf8');
    const f = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
    return (Number(f[11]) + Number(f[12]) + Number(f[13]) + Number(f[14])) * 10;
  } catch {
    return NaN;
  }
}

/** Wall time and CPU time (user + system: this process, its worker processes and V8's compiler threads) [ms]. */
async function timedBatch(logsDir: string, outDir: string, jobs: number): Promise<{ wallMs: number; cpuMs: number }> {
  let err = '';
  const c0 = cpuWithChildrenMs();
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
  return { wallMs, cpuMs: cpuWithChildrenMs() - c0 };
}

/**
 * Writes `flights` one-hour flights logged at `hz` (one script, GPS noise seeds differ: a school's day of
 * lessons; 1 Hz as phone or panel GPS logs them, 10 Hz as an attitude-and-GPS logger does) and prints the
 * jobs-1 / jobs-2 time ratio. With `ceiling`, then this machine's two-thread ceiling.
 */
export async function benchBatchSpeedup(workDir: string, hz = 1, ceiling = true, flights = 24, repeats = 3): Promise<number> {
  const logsDir = path.join(workDir, `batch-logs-${flights}x${hz}hz`);
  rmSync(logsDir, { recursive: true, force: true });
  mkdirSync(logsDir, { recursive: true });
  const truth = simulateFlight(benchFlight(1, hz));
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
  console.log(`batch of ${flights} × one-hour ${hz} Hz flights (${truth.t.length} samples each, median of ${repeats}, ${os.availableParallelism()} processors):`);
  console.log(`  --jobs 1                    ${median(one).toFixed(0)} ms, CPU ${median(oneCpu).toFixed(0)} ms (all threads and worker processes)`);
  console.log(`  --jobs 2                    ${median(two).toFixed(0)} ms, CPU ${median(twoCpu).toFixed(0)} ms`);
  console.log(`  SPEED-UP jobs 1 / jobs 2    ${ratio.toFixed(2)}×`);
  // Each worker process compiles the pipeline anew: with one worker the compiler runs on the idle
  // processor, with two in line on each worker. The CPU that --jobs 2 needs, spread over two
  // processors, bounds its wall time from below, so this is the most --jobs 2 could gain for that work.
  console.log(`  bound from the CPU used     ${(median(one) / (median(twoCpu) / 2)).toFixed(2)}×  (jobs-1 wall / (jobs-2 CPU / 2 processors))`);
  if (ceiling) await benchMachineCeiling();
  rmSync(logsDir, { recursive: true, force: true });
  return ratio;
}
