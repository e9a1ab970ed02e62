// Writes the committed demo logs under samples/ from the invented scenarios in src/synth/scenarios.ts.
// Run: npm run samples (builds, then node dist/samples/makeSamples.js). Deterministic: same files every run.
import { existsSync, mkdirSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { toFlightLog } from '../src/synth/gpsNoise.js';
import { SAMPLE_SPECS, SCENARIO_VARIATION_DEG } from '../src/synth/scenarios.js';
import { simulateFlight } from '../src/synth/simulateFlight.js';
import { writeCsv } from '../src/synth/writeCsv.js';
import { writeGpx } from '../src/synth/writeGpx.js';
import { writePlanCsv } from '../src/synth/writePlanCsv.js';

/** The folder holding package.json, found by walking up from this module (works from src and from dist). */
function repoRoot(): string {
  let dir = dirname(fileURLToPath(import.meta.url));
  for (;;) {
    if (existsSync(join(dir, 'package.json'))) return dir;
    const up = dirname(dir);
    if (up === dir) throw new Error('makeSamples: no package.json above ' + fileURLToPath(import.meta.url));
    dir = up;
  }
}

function main(): void {
  const outDir = join(repoRoot(), 'samples');
  mkdirSync(outDir, { recursive: true });
  for (const spec of SAMPLE_SPECS) {
    const truth = simulateFlight(spec.script());
    const log = toFlightLog(truth, { ...spec.noise, file: spec.file, format: spec.format });
    const text = spec.format === 'gpx' ? writeGpx(log) : writeCsv(log, spec.csv ?? { altUnit: 'm' });
    writeFileSync(join(outDir, spec.file), text);
    const minutes = (truth.t[truth.n - 1] - truth.t[0]) / 60;
    console.log(`samples/${spec.file}: ${truth.n} samples, ${minutes.toFixed(1)} min`);
    if (spec.file === 'circuit-practice.gpx') {
      writeFileSync(join(outDir, 'circuit-practice.plan.csv'), writePlanCsv(truth, SCENARIO_VARIATION_DEG.circuit));
      console.log('samples/circuit-practice.plan.csv: turn plan');
    }
  }
}

main();
