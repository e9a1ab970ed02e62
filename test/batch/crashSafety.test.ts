// Crash safety of the batch: a worker that dies costs only its own flight, and a process killed mid-batch
// loses no flight it had already catalogued (one committed transaction per flight, WAL journal).
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import Database from 'better-sqlite3';
import { tempDir } from '../cli/runCli.js';
import { runBatch } from '../../src/batch/runBatch.js';
import { sourceLoaderImportUrl } from '../../src/batch/sourceLoader.js';
import { writeLessonGpx, utc } from './batchFixtures.js';

function rows(outDir: string): Record<string, unknown>[] {
  const db = new Database(path.join(outDir, 'catalogue.sqlite'));
  try {
    expect(db.pragma('integrity_check', { simple: true })).toBe('ok');
    return db.prepare('SELECT * FROM flights ORDER BY input_path').all() as Record<string, unknown>[];
  } finally {
    db.close();
  }
}

describe('a worker that dies', () => {
  it('fails only the flight it held; rows catalogued before it remain; a new worker takes the rest; a re-run retries it', async () => {
    const d = tempDir('cd-batch-crash-');
    const names = ['a.gpx', 'b-crash-me.gpx', 'c.gpx', 'd.gpx'];
    names.forEach((n, k) => writeLessonGpx(path.join(d, 'logs', n), { t0: utc(2026, 5, 4 + k, 10), seed: 40 + k, straightS: 30 }));
    const events: string[] = [];
    const r = await runBatch({
      inputs: ['logs'],
      outDir: 'out',
      cwd: d,
      jobs: 1,
      wind: { kind: 'calm' },
      workerEntry: new URL('./failingWorker.ts', import.meta.url),
      onEvent: (e) => {
        if (e.kind === 'flight') events.push(`${path.basename(e.flight.inputPath)} ${e.flight.row.status} ${rows(path.join(d, 'out')).length}`);
      },
    });
    // One worker, name order: a is committed (1 row) before the crash on b; c and d follow on a new worker.
    expect(events).toEqual(['a.gpx ok 1', 'b-crash-me.gpx failed 2', 'c.gpx ok 3', 'd.gpx ok 4']);
    expect([r.ok, r.failed]).toEqual([3, 1]);
    const crashed = rows(path.join(d, 'out')).find((x) => String(x.input_path).includes('crash-me'))!;
    expect(crashed.status).toBe('failed');
    expect(crashed.error_kind).toBe('worker');
    expect(crashed.error).toMatch(/b-crash-me\.gpx: the analysis worker exited \(code 7\)/);
    expect(existsSync(path.join(d, 'out', 'index.html'))).toBe(true);

    const again = await runBatch({ inputs: ['logs'], outDir: 'out', cwd: d, jobs: 1, wind: { kind: 'calm' } });
    expect([again.analysed, again.unchanged, again.ok]).toEqual([1, 3, 4]);
    expect(again.flights.find((f) => f.inputPath.includes('crash-me'))!.run).toBe('analysed');
  });
});

describe('a batch process killed mid-run', () => {
  it('keeps every flight catalogued before the kill, and the next run analyses only the others', async () => {
    const d = tempDir('cd-batch-kill-');
    for (let k = 0; k < 5; k++) writeLessonGpx(path.join(d, 'logs', `lesson-${k + 1}.gpx`), { t0: utc(2026, 6, 1 + k, 9), seed: 60 + k, straightS: 30 });
    const child = fileURLToPath(new URL('./killedBatchChild.ts', import.meta.url));
    const res = spawnSync(process.execPath, ['--import', sourceLoaderImportUrl(), child, 'logs', 'out', '2'], { cwd: d, encoding: 'utf8', timeout: 240_000 });
    expect(res.stderr).not.toMatch(/Error/);
    expect(res.signal).toBe('SIGKILL');
    expect(res.stdout).not.toContain('finished');
    expect(existsSync(path.join(d, 'out', 'index.html'))).toBe(false); // killed before the overview
    const kept = rows(path.join(d, 'out'));
    expect(kept).toHaveLength(2);
    for (const row of kept) {
      expect(row.status).toBe('ok');
      expect(existsSync(path.join(d, 'out', `${String(row.report_base)}.debrief.html`))).toBe(true);
    }
    const again = await runBatch({ inputs: ['logs'], outDir: 'out', cwd: d, jobs: 2, wind: { kind: 'calm' } });
    expect([again.analysed, again.unchanged, again.ok]).toEqual([3, 2, 5]);
    expect(rows(path.join(d, 'out'))).toHaveLength(5);
  });
});
