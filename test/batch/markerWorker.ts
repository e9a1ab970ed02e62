// The real batch worker, which first appends a line to the file named by CD_TEST_MARKER: lets a test
// count how many analysis processes a batch started.
import { appendFileSync } from 'node:fs';

if (process.env.CD_TEST_MARKER) appendFileSync(process.env.CD_TEST_MARKER, `${process.pid}\n`);
await import('../../src/batch/batchWorker.js');
