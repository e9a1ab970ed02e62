// Batch options and side files: deviation card, turn plan beside a log, copies of one log, bad side files.
import { describe, expect, it } from 'vitest';
import { copyFileSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import Database from 'better-sqlite3';
import { runCli, tempDir } from '../cli/runCli.js';
import { runBatch } from '../../src/batch/runBatch.js';
import { writeLessonGpx, utc } from './batchFixtures.js';

function catalogue(outDir: string): Record<string, unknown>[] {
  const db = new Database(path.join(outDir, 'catalogue.sqlite'), { readonly: true });
  try {
    return db.prepare('SELECT * FROM flights ORDER BY input_path').all() as Record<string, unknown>[];
  } finally {
    db.close();
  }
}

describe('a deviation card for every flight', () => {
  it("catalogues Smith's A–E of the card: the 8-point closed form recovers the coefficients a swing on 8 headings was made from", async () => {
    const d = tempDir('cd-batch-card-');
    writeLessonGpx(path.join(d, 'logs', 'lesson.gpx'), { t0: utc(2026, 5, 4), seed: 3, straightS: 30 });
    // deviation(h) = A + B sin h + C cos h + D sin 2h + E cos 2h on the compass heading h, easterly +
    // (NGA Handbook of Magnetic Compass Adjustment ch. V). On 8 equally spaced headings the 8-point closed
    // forms (A = mean, B = (1/4) Σ δ sin h, ...) return A–E exactly, so the fit must too.
    const k = { a: 1, b: 2, c: -1.5, d: 0.5, e: -0.25 };
    const rows = ['heading_mag_deg,compass_deg'];
    for (let h = 0; h < 360; h += 45) {
      const r = (h * Math.PI) / 180;
      const dev = k.a + k.b * Math.sin(r) + k.c * Math.cos(r) + k.d * Math.sin(2 * r) + k.e * Math.cos(2 * r);
      rows.push(`${(h + dev + 360) % 360},${h}`);
    }
    writeFileSync(path.join(d, 'swing.csv'), rows.join('\n') + '\n');
    const r = await runCli(['batch', 'logs', '--out-dir', 'out', '--deviation', 'swing.csv', '--wind', 'calm', '--jobs', '1', '--quiet'], { cwd: d });
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const [row] = catalogue(path.join(d, 'out'));
    expect(row.deviation_a_deg as number).toBeCloseTo(k.a, 6);
    expect(row.deviation_b_deg as number).toBeCloseTo(k.b, 6);
    expect(row.deviation_c_deg as number).toBeCloseTo(k.c, 6);
    expect(row.deviation_d_deg as number).toBeCloseTo(k.d, 6);
    expect(row.deviation_e_deg as number).toBeCloseTo(k.e, 6);
    expect(readFileSync(path.join(d, 'out', 'index.html'), 'utf8')).toContain('deviation card from swing.csv');
    // The card is part of the options key: the same batch without it analyses the flight again.
    const again = await runBatch({ inputs: ['logs'], outDir: 'out', cwd: d, jobs: 1, wind: { kind: 'calm' } });
    expect(again.analysed).toBe(1);
    expect(catalogue(path.join(d, 'out'))[0].deviation_a_deg).toBeNull();
  });

  it('refuses an unreadable card or compass profile before any flight is analysed (exit 1, one line naming the file)', async () => {
    const d = tempDir('cd-batch-card-');
    writeLessonGpx(path.join(d, 'logs', 'lesson.gpx'), { t0: utc(2026, 5, 4), seed: 3, straightS: 30 });
    writeFileSync(path.join(d, 'profile.json'), '{ not json');
    for (const args of [['--deviation', 'nowhere.csv'], ['--compass', 'profile.json']]) {
      const r = await runCli(['batch', 'logs', '--out-dir', 'out', ...args], { cwd: d });
      expect(r.code).toBe(1);
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
      expect(r.stderr).toContain(args[1]);
    }
  });
});

describe('a turn plan beside a log', () => {
  it('grades the turns against <log>.plan.csv, and a broken plan fails that flight naming the plan and its line', async () => {
    const d = tempDir('cd-batch-plan-');
    writeLessonGpx(path.join(d, 'logs', 'a.gpx'), { t0: utc(2026, 5, 4), seed: 5, straightS: 40 });
    writeLessonGpx(path.join(d, 'logs', 'b.gpx'), { t0: utc(2026, 5, 5), seed: 6, straightS: 40 });
    writeFileSync(path.join(d, 'logs', 'a.plan.csv'), 'target_mag_deg\n180\n090\n');
    writeFileSync(path.join(d, 'logs', 'b.gpx.plan.csv'), 'target_mag_deg\n180\nnorth-ish\n');
    const r = await runBatch({ inputs: ['logs'], outDir: 'out', cwd: d, jobs: 2, wind: { kind: 'calm' } });
    expect(r.flights.map((f) => [path.basename(f.inputPath), f.row.status])).toEqual([
      ['a.gpx', 'ok'],
      ['b.gpx', 'failed'],
    ]);
    const summary = JSON.parse(readFileSync(path.join(d, 'out', 'a.summary.json'), 'utf8'));
    expect(summary.turns.length).toBeGreaterThan(0);
    expect(summary.turns.every((t: { target_source: string }) => t.target_source === 'plan')).toBe(true);
    expect(r.flights[1].row.error).toMatch(/b\.gpx\.plan\.csv:3: /);
    // The plan files are side files, never flights themselves.
    expect(r.flights).toHaveLength(2);
  });
});

describe('copies of one log', () => {
  it('are analysed once; the copy is listed with a note and shares the row and the debrief', async () => {
    const d = tempDir('cd-batch-copy-');
    const w = writeLessonGpx(path.join(d, 'logs', 'one', 'lesson.gpx'), { t0: utc(2026, 5, 4), seed: 8, straightS: 30 });
    copyFileSync(w.file, path.join(d, 'logs', 'two.gpx'));
    const r = await runBatch({ inputs: ['logs'], outDir: 'out', cwd: d, jobs: 2, wind: { kind: 'calm' } });
    expect(r.flights.map((f) => f.run)).toEqual(['analysed', 'duplicate']);
    expect(r.flights[1].note).toBe(`same content as ${path.join('logs', 'one', 'lesson.gpx')}`);
    expect(r.flights[1].row.reportBase).toBe(r.flights[0].row.reportBase);
    expect(catalogue(path.join(d, 'out'))).toHaveLength(1);
    const again = await runBatch({ inputs: ['logs'], outDir: 'out', cwd: d, jobs: 2, wind: { kind: 'calm' } });
    expect(again.flights.map((f) => f.run)).toEqual(['unchanged', 'duplicate']);
  });
});

describe('analysis processes', () => {
  it('start for the first run and not at all for a re-run where nothing changed', async () => {
    const d = tempDir('cd-batch-procs-');
    writeLessonGpx(path.join(d, 'logs', 'a.gpx'), { t0: utc(2026, 5, 4), seed: 21, straightS: 30 });
    writeLessonGpx(path.join(d, 'logs', 'b.gpx'), { t0: utc(2026, 5, 5), seed: 22, straightS: 30 });
    const marker = path.join(d, 'started.txt');
    writeFileSync(marker, '');
    const started = () => readFileSync(marker, 'utf8').split('\n').filter((l) => l !== '').length;
    const settings = { inputs: ['logs'], outDir: 'out', cwd: d, jobs: 2, wind: { kind: 'calm' as const }, workerEntry: new URL('./markerWorker.ts', import.meta.url) };
    process.env.CD_TEST_MARKER = marker;
    try {
      const first = await runBatch(settings);
      expect(first.flights.map((f) => f.run)).toEqual(['analysed', 'analysed']);
      expect(first.workersStarted).toBe(2);
      expect(started()).toBe(2);
      const again = await runBatch(settings);
      expect(again.flights.map((f) => f.run)).toEqual(['unchanged', 'unchanged']);
      expect(again.workersStarted).toBe(0);
      expect(started()).toBe(2);
    } finally {
      delete process.env.CD_TEST_MARKER;
    }
  });
});

describe('a bad tags side file', () => {
  it('fails only its flight, naming the side file, without stopping the batch', async () => {
    const d = tempDir('cd-batch-tags-');
    writeLessonGpx(path.join(d, 'logs', 'a.gpx'), { t0: utc(2026, 5, 4), seed: 9, straightS: 30 });
    writeLessonGpx(path.join(d, 'logs', 'b.gpx'), { t0: utc(2026, 5, 5), seed: 10, straightS: 30 });
    writeFileSync(path.join(d, 'logs', 'a.gpx.tags.json'), '{"pilot": 42}');
    const r = await runCli(['batch', 'logs', '--out-dir', 'out', '--jobs', '1', '--quiet'], { cwd: d });
    expect(r.code).toBe(0);
    expect(r.stderr.trim()).toMatch(/a\.gpx\.tags\.json: "pilot" must be a string/);
    expect(catalogue(path.join(d, 'out')).map((x) => x.status)).toEqual(['failed', 'ok']);
  });
});
