// One measured run in a fresh process: 'parse' (bare papaparse of the file, the baseline) or 'report'
// (the whole report command with all three outputs) or 'report-html' (the command's default output only). Prints one JSON line: wall time inside the process and its peak RSS.
import { readFileSync } from 'node:fs';
import Papa from 'papaparse';
import { run } from '../../cli/run.js';
// Loaded here, before the clock starts: run() loads each command's modules when it runs.
import '../../cli/reportCommand.js';

/**
 * Peak resident memory of this process [MB]: VmHWM from /proc/self/status (proc(5): "peak resident set
 * size"), which belongs to this program's own address space. getrusage's maxRSS is not used where /proc
 * is there: Linux carries it across fork and exec, so a child started by a large parent reports the
 * parent's size (the bench's children all read the same 221 MB, the bench process's own peak).
 */
function peakRssMb(): number {
  try {
    const m = /^VmHWM:\s+(\d+) kB/m.exec(readFileSync('/proc/self/status', 'utf8'));
    if (m) return Number(m[1]) / 1024;
  } catch {
    // no /proc: fall back below
  }
  return process.resourceUsage().maxRSS / 1024;
}

async function main(): Promise<void> {
  const [mode, file, outDir] = process.argv.slice(2);
  const t0 = performance.now();
  let rows = 0;
  if (mode === 'parse') {
    const text = readFileSync(file, 'utf8');
    const parsed = Papa.parse<string[]>(text, { skipEmptyLines: true });
    rows = parsed.data.length;
  } else if (mode === 'parse-typed') {
    // The same parse as a script that wants numbers would do it: a header, one object per row, numbers typed.
    const text = readFileSync(file, 'utf8');
    const parsed = Papa.parse<Record<string, unknown>>(text, { header: true, dynamicTyping: true, skipEmptyLines: true });
    rows = parsed.data.length;
  } else if (mode === 'report' || mode === 'report-html') {
    // 'report': all three outputs; 'report-html': the command's default, the debrief page alone.
    let err = '';
    const extra = mode === 'report' ? ['--samples', `${outDir}/bench-samples.csv`, '--json', `${outDir}/bench-summary.json`] : [];
    const code = await run(
      ['report', file, '--out', `${outDir}/bench.html`, ...extra, '--quiet'],
      { stdout: () => {}, stderr: (t) => (err += t), isTty: false, env: {}, cwd: outDir },
    );
    if (code !== 0) throw new Error(`report exited ${code}: ${err}`);
  } else {
    throw new Error(`unknown mode ${mode}`);
  }
  const ms = performance.now() - t0;
  process.stdout.write(JSON.stringify({ mode, ms, rows, maxRssMb: peakRssMb() }) + '\n');
}

main().catch((e) => {
  process.stderr.write(`${(e as Error).stack}\n`);
  process.exit(1);
});
