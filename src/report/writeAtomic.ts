// Writes output files whole or not at all: every file goes to a temporary sibling first, then all are renamed.
import { promises as fsp } from 'node:fs';
import path from 'node:path';

/** A file to write: its whole text, or its text or bytes as chunks (written one after another, for long files). */
export interface PendingOutput {
  path: string;
  content: string | Iterable<string | Uint8Array>;
}

async function writeContent(file: string, content: PendingOutput['content']): Promise<void> {
  if (typeof content === 'string') {
    await fsp.writeFile(file, content, 'utf8');
    return;
  }
  const fh = await fsp.open(file, 'w');
  try {
    for (const chunk of content) {
      if (typeof chunk === 'string') await fh.write(chunk, null, 'utf8');
      else await fh.write(chunk);
    }
  } finally {
    await fh.close();
  }
}

/**
 * Writes all outputs, each through a temporary file in its own folder followed by a rename, so that no
 * reader ever sees half a file. If any write fails, the temporaries are removed and nothing is renamed.
 * Refuses to overwrite any of `protectedPaths` (the inputs), resolved to absolute paths.
 */
export async function writeOutputsAtomically(outputs: PendingOutput[], protectedPaths: string[] = []): Promise<void> {
  const guarded = new Set(protectedPaths.map((p) => path.resolve(p)));
  for (const o of outputs) {
    if (guarded.has(path.resolve(o.path))) throw new Error(`${o.path}: refusing to overwrite an input file`);
  }
  const temps: string[] = [];
  try {
    for (const o of outputs) {
      await fsp.mkdir(path.dirname(path.resolve(o.path)), { recursive: true });
      const tmp = `${o.path}.${process.pid}.${Date.now()}.tmp`;
      temps.push(tmp);
      await writeContent(tmp, o.content);
    }
  } catch (err) {
    await Promise.all(temps.map((t) => fsp.rm(t, { force: true })));
    throw err;
  }
  for (let i = 0; i < outputs.length; i++) await fsp.rename(temps[i], outputs[i].path);
}
