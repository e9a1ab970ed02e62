// `compass-debrief batch`: reports, overview, catalogue, re-run skipping, broken logs, exit codes.
import { describe, expect, it, beforeAll } from 'vitest';
import { createHash } from 'node:crypto';
import { existsSync, readFileSync, statSync, writeFileSync, mkdirSync } from 'node:fs';
import path from 'node:path';
import Papa from 'papaparse';
import Database from 'better-sqlite3';
import { runCli, tempDir } from '../cli/runCli.js';
import { writeBrokenLogs, writeLessonCsv, writeLessonGpx, utc, type WrittenLesson } from './batchFixtures.js';
import { OVERVIEW_CSV_COLUMNS } from '../../src/batch/overviewCsv.js';

const INJECTION = `<script>alert("x")</script>" onmouseover="alert(1)`;
const PILOT_A = 'P. Okonkwo-Lindqvist';
const PILOT_B = 'R. Ferreira-Achterberg';

let dir = '';
let a: WrittenLesson;
let b: WrittenLesson;
let navex: WrittenLesson;

function sha(file: string): string {
  return createHash('sha256').update(readFileSync(file)).digest('hex');
}

function readOverview(outDir: string): Record<string, string>[] {
  // Parsed with papaparse (RFC 4180), not with our own code.
  const parsed = Papa.parse<Record<string, string>>(readFileSync(path.join(outDir, 'overview.csv'), 'utf8'), { header: true, skipEmptyLines: true });
  expect(parsed.errors).toEqual([]);
  return parsed.data;
}

function catalogueRows(outDir: string): Record<string, unknown>[] {
  const db = new Database(path.join(outDir, 'catalogue.sqlite'), { readonly: true });
  try {
    return db.prepare('SELECT * FROM flights ORDER BY input_path').all() as Record<string, unknown>[];
  } finally {
    db.close();
  }
}

/** stderr without the plain progress lines ("[k/n] file: ok") a non-terminal gets. */
function errorLines(stderr: string): string[] {
  return stderr.split('\n').filter((l) => l.trim() !== '' && !/^\[\d+\/\d+\] /.test(l));
}

function byFile(rows: Record<string, string>[]): Map<string, Record<string, string>> {
  return new Map(rows.map((r) => [r.file, r]));
}

beforeAll(() => {
  dir = tempDir('cd-batch-');
  const logs = path.join(dir, 'logs');
  a = writeLessonGpx(path.join(logs, 'lessons', 'a', 'lesson.gpx'), { t0: utc(2026, 5, 4, 10), seed: 11, meta: { pilot: PILOT_A } });
  b = writeLessonGpx(path.join(logs, 'lessons', 'b', 'lesson.gpx'), { t0: utc(2026, 5, 11, 14), seed: 12, headingDegTrue: 90 });
  writeFileSync(path.join(logs, 'lessons', 'b', 'lesson.gpx.tags.json'), JSON.stringify({ pilot: PILOT_B, aircraft: 'Fenbird 2' }));
  navex = writeLessonCsv(path.join(logs, 'navex.csv'), { t0: utc(2026, 6, 2, 9), seed: 13, headingDegTrue: 180 });
  writeFileSync(path.join(logs, 'navex.tags.json'), JSON.stringify({ pilot: INJECTION, aircraft: 'Fenbird 2' }));
  writeBrokenLogs(path.join(logs, 'broken'));
  writeFileSync(path.join(logs, 'notes.md'), '# lesson notes\nnothing to see\n');
  writeFileSync(path.join(logs, '.hidden.gpx'), 'not even looked at');
});

describe('a batch over a folder of good and broken logs', () => {
  let first: Awaited<ReturnType<typeof runCli>>;
  let out = '';
  beforeAll(async () => {
    out = path.join(dir, 'out');
    first = await runCli(['batch', 'logs', '--out-dir', 'out', '--jobs', '2', '--wind', '250/15'], { cwd: dir });
  });

  it('exits 0 because flights were debriefed, and prints one stderr line per broken log naming it', () => {
    expect(first.code).toBe(0);
    const lines = errorLines(first.stderr);
    expect(lines).toHaveLength(3);
    // Off a terminal, progress is one plain line per analysed flight (no carriage returns).
    expect(first.stderr.match(/^\[\d\/6\] /gm)).toHaveLength(6);
    expect(first.stderr).not.toContain('\r');
    expect(lines.some((l) => /broken[\\/]empty\.gpx: the file is empty/.test(l))).toBe(true);
    expect(lines.some((l) => /broken[\\/]junk\.gpx: /.test(l))).toBe(true);
    expect(lines.some((l) => /broken[\\/]notime\.csv(:\d+)?: .*time/i.test(l))).toBe(true);
    expect(first.stdout).toMatch(/6 flight log\(s\): 3 ok, 3 failed; 6 analysed, 0 unchanged/);
    expect(first.stdout).toMatch(/left out logs[\\/]notes\.md/);
    expect(first.stdout + first.stderr).not.toMatch(/hidden/);
  });

  it('writes one debrief, samples CSV and summary JSON per good flight, with distinct names for the two lesson.gpx', () => {
    const rows = byFile(readOverview(out));
    const ra = rows.get(path.join('logs', 'lessons', 'a', 'lesson.gpx'))!;
    const rb = rows.get(path.join('logs', 'lessons', 'b', 'lesson.gpx'))!;
    const rn = rows.get(path.join('logs', 'navex.csv'))!;
    expect(new Set([ra.report, rb.report, rn.report]).size).toBe(3);
    expect(ra.report).toMatch(/^lesson-[0-9a-f]{8}\.debrief\.html$/);
    expect(rn.report).toBe('navex.debrief.html');
    for (const r of [ra, rb, rn]) {
      const base = r.report.replace(/\.debrief\.html$/, '');
      for (const f of [`${base}.debrief.html`, `${base}.samples.csv`, `${base}.summary.json`]) expect(existsSync(path.join(out, f))).toBe(true);
    }
  });

  it('lists every log in overview.csv with its status, the error line of each failure, and the contract header', () => {
    const text = readFileSync(path.join(out, 'overview.csv'), 'utf8');
    expect(text.split('\r\n')[0]).toBe(OVERVIEW_CSV_COLUMNS.join(','));
    const rows = readOverview(out);
    expect(rows).toHaveLength(6);
    const status = Object.fromEntries(rows.map((r) => [path.basename(r.file), r.status]));
    expect(status).toEqual({ 'lesson.gpx': 'ok', 'navex.csv': 'ok', 'empty.gpx': 'failed', 'junk.gpx': 'failed', 'notime.csv': 'failed' });
    expect(rows.filter((r) => r.status === 'ok')).toHaveLength(3);
    for (const r of rows.filter((x) => x.status === 'failed')) {
      expect(r.error).toContain(path.basename(r.file));
      expect(r.report).toBe('');
    }
    // The injected pilot tag is data, not a formula (OWASP CSV injection: cells must not start with = + - @).
    const rn = byFile(rows).get(path.join('logs', 'navex.csv'))!;
    expect(rn.pilot).toBe(INJECTION);
  });

  it('catalogues one row per flight keyed by the SHA-256 of the file, with the tags, the date and duration of the flown script', () => {
    const rows = catalogueRows(out);
    expect(rows).toHaveLength(6);
    const byPath = new Map(rows.map((r) => [r.input_path as string, r]));
    const ra = byPath.get(path.join('logs', 'lessons', 'a', 'lesson.gpx'))!;
    const rb = byPath.get(path.join('logs', 'lessons', 'b', 'lesson.gpx'))!;
    const rn = byPath.get(path.join('logs', 'navex.csv'))!;
    // Key: SHA-256 (FIPS 180-4) computed here by node:crypto over the bytes on disk.
    expect(ra.content_sha256).toBe(sha(a.file));
    expect(rb.content_sha256).toBe(sha(b.file));
    expect(rn.content_sha256).toBe(sha(navex.file));
    // Tags: the GPX's own author; a side file beside the log; a side file named after the log's base.
    expect([ra.pilot, ra.aircraft]).toEqual([PILOT_A, null]);
    expect([rb.pilot, rb.aircraft]).toEqual([PILOT_B, 'Fenbird 2']);
    expect([rn.pilot, rn.aircraft]).toEqual([INJECTION, 'Fenbird 2']);
    // Date and duration: the simulated script's own first time and span (truth, not our analysis).
    for (const [row, w] of [[ra, a], [rb, b], [rn, navex]] as const) {
      const n = w.truth.t.length;
      expect(row.start_utc).toBe(new Date(w.truth.t[0] * 1000).toISOString());
      expect(row.duration_s as number).toBeCloseTo(w.truth.t[n - 1] - w.truth.t[0], 3);
      expect(row.status).toBe('ok');
    }
    for (const r of rows.filter((x) => x.status === 'failed')) {
      expect(r.error_kind).toBe('input');
      expect(r.report_base).toBeNull();
    }
  });

  it('catalogues the same numbers as the summary JSON written beside each debrief', () => {
    const rows = catalogueRows(out).filter((r) => r.status === 'ok');
    for (const r of rows) {
      const s = JSON.parse(readFileSync(path.join(out, `${r.report_base as string}.summary.json`), 'utf8'));
      expect(r.max_abs_error_deg as number).toBeCloseTo(s.compass.max_abs_error_deg, 1);
      expect(r.max_error_utc).toBe(s.compass.max_error_utc);
      expect(r.rms_error_deg as number).toBeCloseTo(s.compass.rms_error_deg, 1);
      expect(r.turns_flown).toBe(s.turns.length);
      const graded = s.turns.filter((t: { rollout_error_deg: number | null }) => t.rollout_error_deg !== null);
      expect(r.turns_graded).toBe(graded.length);
      expect(r.turns_within_tolerance).toBe(graded.filter((t: { within_tolerance: boolean }) => t.within_tolerance).length);
      if (graded.length > 0) {
        const mean = graded.reduce((k: number, t: { rollout_error_deg: number }) => k + Math.abs(t.rollout_error_deg), 0) / graded.length;
        expect(r.mean_abs_rollout_error_deg as number).toBeCloseTo(mean, 1);
      }
      expect(r.warnings).toBe(s.warnings.length);
      expect(r.deviation_a_deg).toBeNull();
    }
  });

  it('runs the same steps as `report`: the summary JSON is the one report writes for the same log and options', async () => {
    const json = path.join(dir, 'single.json');
    const r = await runCli(['report', a.file, '--wind', '250/15', '--out', path.join(dir, 'single.html'), '--json', json], { cwd: dir });
    expect(r.code).toBe(0);
    const single = JSON.parse(readFileSync(json, 'utf8'));
    const row = catalogueRows(out).find((x) => x.input_path === path.join('logs', 'lessons', 'a', 'lesson.gpx'))!;
    const batch = JSON.parse(readFileSync(path.join(out, `${row.report_base as string}.summary.json`), 'utf8'));
    delete single.source.file;
    delete batch.source.file;
    expect(batch).toEqual(single);
  });

  it('writes an offline overview page: script-free CSP, no remote address, links to the reports, log text escaped', () => {
    const html = readFileSync(path.join(out, 'index.html'), 'utf8');
    const csp = /<meta http-equiv="Content-Security-Policy" content="([^"]+)">/.exec(html);
    expect(csp).not.toBeNull();
    expect(csp![1]).toContain("default-src &#39;none&#39;");
    expect(csp![1]).toContain("script-src &#39;none&#39;");
    expect(html).not.toMatch(/<script/i);
    expect(html).not.toMatch(/(src|href)="(https?:)?\/\//i);
    expect(html).not.toContain(INJECTION);
    expect(html).toContain('&lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt;&quot; onmouseover=&quot;alert(1)');
    const links = [...html.matchAll(/href="([^"]+)"/g)].map((m) => decodeURIComponent(m[1]));
    expect(links.length).toBeGreaterThanOrEqual(3);
    for (const l of links) expect(existsSync(path.join(out, l))).toBe(true);
    // Trends: a section per pilot tag and per aircraft tag, each with its chart.
    for (const name of [PILOT_A, PILOT_B, 'Fenbird 2']) expect(html).toContain(`<h3>${name}</h3>`);
    expect((html.match(/<svg class="trend"/g) ?? []).length).toBeGreaterThanOrEqual(2);
  });

  describe('a second run', () => {
    let second: Awaited<ReturnType<typeof runCli>>;
    let mtimes: Map<string, number>;
    beforeAll(async () => {
      mtimes = new Map(catalogueRows(out).filter((r) => r.status === 'ok').map((r) => [r.report_base as string, statSync(path.join(out, `${r.report_base as string}.debrief.html`)).mtimeMs]));
      second = await runCli(['batch', 'logs', '--out-dir', 'out', '--jobs', '2', '--wind', '250/15'], { cwd: dir });
    });

    it('analyses nothing when no log, option or version changed, reports every flight unchanged and keeps the debriefs', () => {
      expect(second.code).toBe(0);
      expect(second.stdout).toMatch(/0 analysed, 6 unchanged/);
      const rows = readOverview(out);
      expect(rows.map((r) => r.this_run)).toEqual(Array(6).fill('unchanged'));
      expect(rows.filter((r) => r.status === 'ok')).toHaveLength(3);
      for (const [base, t] of mtimes) expect(statSync(path.join(out, `${base}.debrief.html`)).mtimeMs).toBe(t);
      // The broken logs are still reported as failed, with their lines.
      expect(errorLines(second.stderr)).toHaveLength(3);
    });

    it('re-analyses just the one log whose content changed', async () => {
      writeLessonGpx(a.file, { t0: utc(2026, 5, 4, 10), seed: 99, meta: { pilot: PILOT_A } });
      const r = await runCli(['batch', 'logs', '--out-dir', 'out', '--jobs', '2', '--wind', '250/15'], { cwd: dir });
      expect(r.code).toBe(0);
      expect(r.stdout).toMatch(/1 analysed, 5 unchanged/);
      const rows = byFile(readOverview(out));
      expect(rows.get(path.join('logs', 'lessons', 'a', 'lesson.gpx'))!.this_run).toBe('analysed');
      expect(rows.get(path.join('logs', 'lessons', 'a', 'lesson.gpx'))!.content_sha256).toBe(sha(a.file));
      // The old content's row stays in the catalogue (a flight once analysed) but no longer owns the report.
      const cat = catalogueRows(out);
      expect(cat).toHaveLength(7);
      expect(cat.filter((x) => x.input_path === path.join('logs', 'lessons', 'a', 'lesson.gpx') && x.report_base !== null)).toHaveLength(1);
    });

    it('re-analyses a flight whose tags side file changed (the tags are part of the options key)', async () => {
      writeFileSync(path.join(dir, 'logs', 'lessons', 'b', 'lesson.gpx.tags.json'), JSON.stringify({ pilot: PILOT_B, aircraft: 'Fenbird 3' }));
      const r = await runCli(['batch', 'logs', '--out-dir', 'out', '--jobs', '1', '--wind', '250/15'], { cwd: dir });
      expect(r.stdout).toMatch(/1 analysed, 5 unchanged/);
      const row = catalogueRows(out).find((x) => x.content_sha256 === sha(b.file))!;
      expect(row.aircraft).toBe('Fenbird 3');
    });

    it('re-analyses everything with --force, and everything again when an option changes', async () => {
      const f = await runCli(['batch', 'logs', '--out-dir', 'out', '--jobs', '2', '--wind', '250/15', '--force', '--quiet'], { cwd: dir });
      expect(f.code).toBe(0);
      expect(f.stdout).toBe('');
      expect(readOverview(out).map((r) => r.this_run)).toEqual(Array(6).fill('analysed'));
      const w = await runCli(['batch', 'logs', '--out-dir', 'out', '--jobs', '2', '--wind', 'calm'], { cwd: dir });
      expect(w.stdout).toMatch(/6 analysed, 0 unchanged/);
    });
  });
});

describe('exit codes and usage', () => {
  it('exits 1 when every log failed, still writing the overview that lists them', async () => {
    const d = tempDir('cd-batch-bad-');
    writeBrokenLogs(path.join(d, 'bad'));
    const r = await runCli(['batch', 'bad', '--out-dir', 'out', '--jobs', '1'], { cwd: d });
    expect(r.code).toBe(1);
    expect(errorLines(r.stderr)).toHaveLength(3);
    expect(readOverview(path.join(d, 'out')).map((x) => x.status)).toEqual(['failed', 'failed', 'failed']);
  });

  it('exits 1 when no log is found, naming the inputs', async () => {
    const d = tempDir('cd-batch-none-');
    mkdirSync(path.join(d, 'docs'));
    writeFileSync(path.join(d, 'docs', 'readme.md'), 'hello\n');
    const r = await runCli(['batch', 'docs', '--out-dir', 'out'], { cwd: d });
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/no flight log found in docs/);
  });

  it('reports a named file that does not exist as a failed flight (exit 1 when it is the only one)', async () => {
    const d = tempDir('cd-batch-missing-');
    const r = await runCli(['batch', 'nowhere.gpx', '--out-dir', 'out'], { cwd: d });
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/nowhere\.gpx: no such file/);
  });

  it.each([
    [['batch', '--out-dir', 'x'], 'no input'],
    [['batch', 'logs'], 'no --out-dir'],
    [['batch', 'logs', '--out-dir', 'x', '--jobs', '0'], 'zero jobs'],
    [['batch', 'logs', '--out-dir', 'x', '--jobs', '65'], 'more than 64 jobs'],
    [['batch', 'logs', '--out-dir', 'x', '--jobs', '2.5'], 'a fractional job count'],
    [['batch', 'logs', '--out-dir', 'x', '--wind', 'breezy'], 'an unreadable wind'],
    [['batch', 'logs', '--out-dir', 'x', '--bogus'], 'an unknown option'],
  ])('%j exits 2 with the batch usage (%s)', async (argv) => {
    const r = await runCli(argv as string[]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/Usage: compass-debrief batch/);
  });

  it('has help with an example', async () => {
    const r = await runCli(['batch', '--help']);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/Usage: compass-debrief batch/);
    expect(r.stdout).toMatch(/Example:/);
  });
});
