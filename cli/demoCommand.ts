// `compass-debrief demo`: the debrief of every bundled sample log, written into one folder.
import path from 'node:path';
import { existsSync, promises as fsp } from 'node:fs';
import { packageRoot } from '../src/util/packageRoot.js';
import type { CliIo } from './cliIo.js';
import { parseCommandLine } from './parseCommandLine.js';
import { USAGE } from './usage.js';
import { reportCommand } from './reportCommand.js';

/** Sample logs are the files in samples/ with a log extension; swing records and plans are side files. */
const LOG_EXTENSIONS = new Set(['.gpx', '.csv', '.igc', '.nmea', '.fit', '.kml']);
const SIDE_FILE = /(\.plan\.csv$)|swing/i;

export async function demoCommand(args: string[], io: CliIo): Promise<number> {
  const { values } = parseCommandLine('demo', args, { 'out-dir': { type: 'string' } });
  if (values.help) {
    io.stdout(USAGE.demo);
    return 0;
  }
  const outDir = path.resolve(io.cwd, values['out-dir'] ?? 'compass-debrief-demo');
  const samplesDir = path.join(packageRoot(import.meta.url), 'samples');
  const names = (await fsp.readdir(samplesDir))
    .filter((f) => LOG_EXTENSIONS.has(path.extname(f).toLowerCase()) && !SIDE_FILE.test(f))
    .sort();
  let worst = 0;
  for (const name of names) {
    const base = name.replace(/\.[^.]+$/, '');
    const plan = path.join(samplesDir, `${base}.plan.csv`);
    const code = await reportCommand(
      [
        path.join(samplesDir, name),
        ...(existsSync(plan) ? ['--plan', plan] : []),
        '--out', path.join(outDir, `${base}.html`),
        '--samples', path.join(outDir, `${base}-samples.csv`),
        '--json', path.join(outDir, `${base}-summary.json`),
        ...(values.quiet ? ['--quiet'] : []),
      ],
      io,
    );
    worst = Math.max(worst, code);
  }
  if (!values.quiet) io.stdout(`demo: ${names.length} debrief(s) in ${outDir}\n`);
  return worst;
}
