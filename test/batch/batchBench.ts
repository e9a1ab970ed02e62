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

async function timedBatch(logsDir: string, outDir: string, jobs: number): Promise<number> {
  let err = '';
  const t0 = performance.now();
  const code = await run(['batch', logsDir, '--out-dir', outDir, '--jobs', String(jobs), '--force', '--quiet'], {
    stdout: () => {},
    stderr: (t) => (err += t),
    isTty: false,
    env: {},
    cwd: logsDir,
  });
  if (code !== 0) throw new Error(`batch exited ${code}: ${err}`);
  return performance.now() - t0;
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
  for (let k = 0; k < repeats; k++) {
    one.push(await timedBatch(logsDir, path.join(workDir, 'batch-out-1'), 1));
    two.push(await timedBatch(logsDir, path.join(workDir, 'batch-out-2'), 2));
  }
  const ratio = median(one) / median(two);
  console.log(`batch of ${flights} × one-hour 1 Hz flights (${truth.t.length} samples each, median of ${repeats}, ${os.availableParallelism()} processors):`);
  console.log(`  --jobs 1                    ${median(one).toFixed(0)} ms`);
  console.log(`  --jobs 2                    ${median(two).toFixed(0)} ms`);
  console.log(`  SPEED-UP jobs 1 / jobs 2    ${ratio.toFixed(2)}×`);
  await benchMachineCeiling();
  return ratio;
}
