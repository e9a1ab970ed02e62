// Writes the committed demo logs under samples/ from the invented scenarios in src/synth/scenarios.ts.
// Run: npm run samples (builds, then node dist/samples/makeSamples.js). Deterministic: same files every run.
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { packageRoot } from '../src/util/packageRoot.js';
import { studentLesson, STUDENT_SAMPLE } from '../src/synth/studentLesson.js';
import { toFlightLog } from '../src/synth/gpsNoise.js';
import { SAMPLE_SPECS, SCENARIO_VARIATION_DEG } from '../src/synth/scenarios.js';
import { simulateFlight } from '../src/synth/simulateFlight.js';
import { writeCsv } from '../src/synth/writeCsv.js';
import { writeGpx } from '../src/synth/writeGpx.js';
import { writePlanCsv } from '../src/synth/writePlanCsv.js';

function main(): void {
  const outDir = join(packageRoot(import.meta.url), 'samples');
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
  const student = studentLesson();
  const studentLog = toFlightLog(student.truth, { ...STUDENT_SAMPLE.noise, file: STUDENT_SAMPLE.file, format: 'gpx' });
  writeFileSync(join(outDir, STUDENT_SAMPLE.file), writeGpx(studentLog));
  writeFileSync(join(outDir, STUDENT_SAMPLE.planFile), student.planCsv);
  console.log(`samples/${STUDENT_SAMPLE.file}: ${student.truth.n} samples, flown by a scripted student; plan beside it`);
}

main();
