// Reading a small side file (plan, swing record, wind table, observed readings, profile, column mapping):
// its text, or one InputError that names the file and says what to check.
import { promises as fsp } from 'node:fs';
import { InputError } from '../errors.js';

/** The file's text (UTF-8). `what` names the kind of file in the message ("plan", "swing record", …). */
export async function readSideFileText(file: string, what: string): Promise<string> {
  try {
    return await fsp.readFile(file, 'utf8');
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    const why = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'this is a directory' : `cannot read it (${code ?? (err as Error).message})`;
    throw new InputError(file, `${what}: ${why}`, { hint: 'check the path' });
  }
}
