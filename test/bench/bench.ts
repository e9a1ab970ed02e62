// npm run bench: the 3-hour 10 Hz flight (108,000 samples) through the whole report run, measured as a
// ratio to a bare papaparse parse of the same file in the same run, plus stage times and peak memory.
import { execFileSync } from 'node:child_process';
import { mkdirSync, readFileSync, statSync, writeFileSync, existsSync } from 'node:fs';
import Papa from 'papaparse';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { benchFlight } from '../../src/synth/scenarios.js';
import { simulateFlight } from '../../src/synth/simulateFlight.js';
import { toFlightLog } from '../../src/synth/gpsNoise.js';
import { writeCsv } from '../../src/synth/writeCsv.js';
import { readLogFile } from '../../src/import/readLog.js';
import { analyseFlight } from '../../src/analyseFlight.js';
import { buildReportModel } from '../../src/report/reportModel.js';
import { renderReport } from '../../src/report/renderReport.js';
import { loadReportAssets } from '../../src/report/loadReportAssets.js';
import { samplesCsv } from '../../src/report/samplesCsv.js';
import { summaryJson } from '../../src/report/summaryJson.js';

const here = path.dirname(fileURLToPath(import.meta.url));
const REPEATS = 7;

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

function child(mode: string, file: string, outDir: string): { ms: number; maxRssMb: number } {
  const out = execFileSync(process.execPath, [path.join(here, 'benchChild.js'), mode, file, outDir], { encoding: 'utf8', maxBuffer: 1 << 20 });
  return JSON.parse(out.trim().split('\n').pop() as string);
}

async function main(): Promise<void> {
  const workDir = path.join(os.tmpdir(), 'compass-debrief-bench');
  mkdirSync(workDir, { recursive: true });
  const csvPath = path.join(workDir, 'flight-3h-10hz.csv');

  let t0 = performance.now();
  const truth = simulateFlight(benchFlight(3, 10));
  const log = toFlightLog(truth, { posSigmaM: 2, altSigmaM: 3, seed: 2026, file: 'flight-3h-10hz.csv', format: 'csv' });
  writeFileSync(csvPath, writeCsv(log, { altUnit: 'ft' }));
  const genMs = performance.now() - t0;
  const sizeMb = statSync(csvPath).size / 1e6;
  console.log(`bench flight: ${log.t.length} samples, ${sizeMb.toFixed(1)} MB CSV (generated in ${(genMs / 1000).toFixed(1)} s, not counted)`);

  // Stage times, in this process.
  t0 = performance.now();
  const { log: read, health } = await readLogFile(csvPath);
  const readMs = performance.now() - t0;
  const a = analyseFlight(read, { wind: { kind: 'auto' } }, health);
  t0 = performance.now();
  const assets = await loadReportAssets();
  const html = renderReport(buildReportModel(a, {}), assets);
  const renderMs = performance.now() - t0;
  t0 = performance.now();
  const csvOut = samplesCsv(a);
  const jsonOut = summaryJson(a);
  const writersMs = performance.now() - t0;
  const htmlPath = path.join(workDir, 'bench-inprocess.html');
  writeFileSync(htmlPath, html);
  console.log('stage times (in process, ms):');
  console.log(`  read + clean            ${readMs.toFixed(0)}`);
  for (const [k, v] of Object.entries(a.timingsMs)) console.log(`  ${k.padEnd(24)}${v.toFixed(0)}`);
  console.log(`  report model + HTML     ${renderMs.toFixed(0)}`);
  console.log(`  samples CSV + JSON      ${writersMs.toFixed(0)}  (${(csvOut.length / 1e6).toFixed(1)} MB + ${(jsonOut.length / 1e3).toFixed(0)} kB)`);
  console.log(`  HTML size               ${(html.length / 1e6).toFixed(2)} MB`);

  // The same stages warm (JIT warm-up paid by the passes before), and a bare parse warm, in this process:
  // the floor of this implementation's ratio, whatever is done about start-up and warm-up.
  let warm = { readMs: 0, analyseMs: 0, pageMs: 0, writersMs: 0, parseMs: 0 };
  for (let k = 0; k < 3; k++) {
    let t = performance.now();
    const text = readFileSync(csvPath, 'utf8');
    Papa.parse<string[]>(text, { skipEmptyLines: true });
    const parseMs = performance.now() - t;
    t = performance.now();
    const r = await readLogFile(csvPath);
    const readMs = performance.now() - t;
    t = performance.now();
    const wa = analyseFlight(r.log, { wind: { kind: 'auto' } }, r.health);
    const analyseMs = performance.now() - t;
    t = performance.now();
    renderReport(buildReportModel(wa, {}), assets);
    const pageMs = performance.now() - t;
    t = performance.now();
    samplesCsv(wa);
    summaryJson(wa);
    warm = { readMs, analyseMs, pageMs, writersMs: performance.now() - t, parseMs };
  }
  const warmPage = warm.readMs + warm.analyseMs + warm.pageMs;
  console.log(`warm, fourth pass in this process (ms): parse ${warm.parseMs.toFixed(0)}; read ${warm.readMs.toFixed(0)}, analysis ${warm.analyseMs.toFixed(0)}, page ${warm.pageMs.toFixed(0)}, samples CSV + JSON ${warm.writersMs.toFixed(0)}`);
  console.log(`  warm floor of the ratio: page alone ${(warmPage / warm.parseMs).toFixed(2)}×, all outputs ${((warmPage + warm.writersMs) / warm.parseMs).toFixed(2)}×`);

  // Whole runs, each in a fresh process, interleaved so that machine load affects both alike.
  const parse: number[] = [];
  const parseTyped: number[] = [];
  const report: number[] = [];
  const reportHtml: number[] = [];
  let rss = 0;
  let parseRss = 0;
  for (let k = 0; k < REPEATS; k++) {
    const p = child('parse', csvPath, workDir);
    parse.push(p.ms);
    parseRss = Math.max(parseRss, p.maxRssMb);
    parseTyped.push(child('parse-typed', csvPath, workDir).ms);
    const r = child('report', csvPath, workDir);
    report.push(r.ms);
    rss = Math.max(rss, r.maxRssMb);
    reportHtml.push(child('report-html', csvPath, workDir).ms);
  }
  const ratio = median(report) / median(parse);
  // The machine's speed drifts within a run (other tenants): the ratio of each adjacent parse/report pair
  // sees the same load, so their median is the steadier estimate. Both are printed.
  const pairRatio = median(report.map((r, k) => r / parse[k]));
  const pairRatioHtml = median(reportHtml.map((r, k) => r / parse[k]));
  console.log(`whole runs (median of ${REPEATS}, fresh process each; times inside the process, after module loading):`);
  console.log(`  papaparse parse, rows of strings (baseline)   ${median(parse).toFixed(0)} ms, peak RSS ${parseRss.toFixed(0)} MB`);
  console.log(`  papaparse parse, header + dynamicTyping        ${median(parseTyped).toFixed(0)} ms`);
  console.log(`  report run (HTML + samples CSV + summary)      ${median(report).toFixed(0)} ms, peak RSS ${rss.toFixed(0)} MB`);
  console.log(`  RATIO report / parse                           ${ratio.toFixed(2)}×  (vs typed parse ${(median(report) / median(parseTyped)).toFixed(2)}×)`);
  console.log(`  same, median of the ${REPEATS} paired ratios           ${pairRatio.toFixed(2)}×`);
  console.log(`  report run, HTML only (the command's default)  ${median(reportHtml).toFixed(0)} ms, ratio ${(median(reportHtml) / median(parse)).toFixed(2)}× (paired ${pairRatioHtml.toFixed(2)}×)`);

  // A million samples (about 28 hours at 10 Hz): peak memory of the whole report run.
  if (process.env.BENCH_SKIP_MILLION !== '1') {
    const bigPath = path.join(workDir, 'flight-1m-10hz.csv');
    if (!existsSync(bigPath)) {
      const big = simulateFlight(benchFlight(1_000_000 / 36_000, 10));
      writeFileSync(bigPath, writeCsv(toFlightLog(big, { posSigmaM: 2, altSigmaM: 3, seed: 2027, file: 'flight-1m-10hz.csv', format: 'csv' }), { altUnit: 'ft' }));
    }
    const bp = child('parse', bigPath, workDir);
    const br = child('report', bigPath, workDir);
    console.log(`1,000,000 samples (${(statSync(bigPath).size / 1e6).toFixed(0)} MB CSV): parse ${bp.ms.toFixed(0)} ms; report ${br.ms.toFixed(0)} ms, ratio ${(br.ms / bp.ms).toFixed(2)}×, peak RSS ${br.maxRssMb.toFixed(0)} MB`);
  }

  // Time until every chart is drawn, in Debian's chromium, where it is installed.
  const measurePath = path.join(here, '..', 'browser', 'measureReport.js');
  if (existsSync('/usr/bin/chromium') && existsSync(measurePath)) {
    const { measureReportInBrowser } = (await import(measurePath)) as { measureReportInBrowser: (p: string) => Promise<{ drawnMs: number }> };
    const drawn: number[] = [];
    for (let k = 0; k < REPEATS; k++) drawn.push((await measureReportInBrowser(htmlPath)).drawnMs);
    console.log(`report in chromium: ${(html.length / 1e6).toFixed(2)} MB, every chart drawn in ${median(drawn).toFixed(0)} ms (median of ${REPEATS})`);
  } else {
    console.log('report in chromium: skipped (no /usr/bin/chromium)');
  }

  // Batch speed-up from worker threads: N flights with --jobs 1 against --jobs 2 (a ratio, never asserted).
  const { benchBatchSpeedup } = await import('../batch/batchBench.js');
  // A day's lessons at 1 Hz and at 10 Hz, and a season's review at 1 Hz: the speed-up grows with the
  // work per worker, since each worker's warm-up is paid once.
  await benchBatchSpeedup(workDir, 1, false);
  await benchBatchSpeedup(workDir, 10, false);
  await benchBatchSpeedup(workDir, 1, true, 96);
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
