// Runs the CLI in-process with captured output, in a fresh temporary folder.
import { mkdtempSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { run } from '../../cli/run.js';

export interface CliResult {
  code: number;
  stdout: string;
  stderr: string;
}

export function tempDir(prefix = 'cd-cli-'): string {
  return mkdtempSync(path.join(os.tmpdir(), prefix));
}

export async function runCli(argv: string[], opts: { cwd?: string; isTty?: boolean; env?: Record<string, string> } = {}): Promise<CliResult> {
  let stdout = '';
  let stderr = '';
  const code = await run(argv, {
    stdout: (t) => (stdout += t),
    stderr: (t) => (stderr += t),
    isTty: opts.isTty ?? false,
    env: opts.env ?? {},
    cwd: opts.cwd ?? tempDir(),
  });
  return { code, stdout, stderr };
}
