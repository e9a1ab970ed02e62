// Child process of the crash-safety test: runs a batch and kills itself (SIGKILL, no clean-up of any
// kind) as soon as `killAfter` flights are catalogued, while other flights are still on the workers.
import { runBatch } from '../../src/batch/runBatch.js';

const [inputDir, outDir, killAfter] = process.argv.slice(2);
await runBatch({
  inputs: [inputDir],
  outDir,
  cwd: process.cwd(),
  jobs: 2,
  wind: { kind: 'calm' },
  onEvent(e) {
    if (e.kind === 'flight' && e.done >= Number(killAfter)) process.kill(process.pid, 'SIGKILL');
  },
});
process.stdout.write('finished without being killed\n');
