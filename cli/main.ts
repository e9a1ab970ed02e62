#!/usr/bin/env node
// The compass-debrief command. The only file that calls process.exit.
import { run } from './run.js';
import { processIo } from './cliIo.js';

run(process.argv.slice(2), processIo()).then(
  (code) => {
    process.exitCode = code;
  },
  (err: unknown) => {
    process.stderr.write(`compass-debrief: internal error: ${String(err)}\n`);
    process.exit(70);
  },
);
