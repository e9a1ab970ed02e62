// `compass-debrief swing <swing.csv>`: Smith's coefficients, residuals and a correction card from a compass swing.
import { writeOutputsAtomically } from '../src/report/writeAtomic.js';
import type { CliIo } from './cliIo.js';
import { parseCommandLine } from './parseCommandLine.js';
import { USAGE } from './usage.js';
import { UsageError } from './usageError.js';
import { wrap360 } from '../src/geo/angles.js';

/** Three-digit heading, 0 for anything that rounds to 360. */
function hdg(x: number): string {
  return (Math.round(wrap360(x)) % 360).toString().padStart(3, '0');
}


/** A signed coefficient, sign always shown, right-aligned in `w` characters. */
function pad(x: number, w: number, d = 1): string {
  return `${x >= 0 ? '+' : '−'}${Math.abs(x).toFixed(d)}`.padStart(w);
}

export async function swingCommand(args: string[], io: CliIo): Promise<number> {
  const { values, positionals } = parseCommandLine('swing', args, { json: { type: 'string' } });
  if (values.help) {
    io.stdout(USAGE.swing);
    return 0;
  }
  if (positionals.length !== 1) throw new UsageError('swing', positionals.length === 0 ? 'no swing record given' : 'one swing record at a time');
  const file = positionals[0];
  const { readSwingFile } = await import('./swingFile.js');
  const r = await readSwingFile(file);
  if (values.json !== undefined) await writeOutputsAtomically([{ path: values.json, content: JSON.stringify(r, null, 2) + '\n' }], [file]);
  if (!values.quiet) {
    const lines = [
      `${file}: ${r.residuals_deg.length} headings swung`,
      `  deviation(h) = A + B sin h + C cos h + D sin 2h + E cos 2h   (${r.sign_convention})`,
      `  A ${pad(r.A_deg, 5, 2)}°  B ${pad(r.B_deg, 5, 2)}°  C ${pad(r.C_deg, 5, 2)}°  D ${pad(r.D_deg, 5, 2)}°  E ${pad(r.E_deg, 5, 2)}°`,
      `  largest deviation ${r.max_abs_deviation_deg.toFixed(1)}°; largest residual ${Math.max(...r.residuals_deg.map(Math.abs)).toFixed(2)}°`,
      r.over_limit.length > 0
        ? `  OVER THE USUAL 10° LIMIT on: ${r.over_limit.map((o: { heading_mag_deg: number }) => hdg(o.heading_mag_deg)).join(', ')} — have the compass compensated by licensed maintenance`
        : '  within the usual 10° limit on every heading',
      '  correction card:   for (magnetic)   steer (compass)',
      ...r.card.map((c: { fly_mag_deg: number; steer_compass_deg: number }) => `                       ${hdg(c.fly_mag_deg)}              ${hdg(c.steer_compass_deg)}`),
    ];
    io.stdout(lines.join('\n') + '\n');
  }
  return 0;
}
