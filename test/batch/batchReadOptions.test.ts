// batch passes report's reading options to every flight: --columns, --tz-offset (and they count in the re-run key).
import { describe, expect, it } from 'vitest';
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import Papa from 'papaparse';
import { runCli, tempDir } from '../cli/runCli.js';

function ownHeaderCsv(): string {
  const rows = ['k1;k2;k3;k4'];
  for (let i = 0; i < 150; i++) rows.push(`2026-05-04 12:${String(Math.floor(i / 60)).padStart(2, '0')}:${String(i % 60).padStart(2, '0')};${(52 + 0.0004 * i).toFixed(6).replace('.', ',')};10,000000;500`);
  return rows.join('\n') + '\n';
}

function overview(out: string): Record<string, string>[] {
  return Papa.parse<Record<string, string>>(readFileSync(path.join(out, 'overview.csv'), 'utf8'), { header: true, skipEmptyLines: true }).data;
}

describe('batch with reading options', () => {
  it('reads logs with their own headers and local times when told how, and fails them (listed) when not', async () => {
    const dir = tempDir();
    const logs = path.join(dir, 'logs');
    mkdirSync(logs);
    writeFileSync(path.join(logs, 'eigen.csv'), ownHeaderCsv());

    const bare = path.join(dir, 'out-bare');
    const r1 = await runCli(['batch', logs, '--out-dir', bare, '--jobs', '1', '--quiet'], { cwd: dir });
    expect(r1.code).toBe(1); // every flight failed: columns k1…k4 are not recognised
    expect(overview(bare)[0].status).toBe('failed');

    const told = path.join(dir, 'out-told');
    const r2 = await runCli(['batch', logs, '--out-dir', told, '--jobs', '1', '--quiet', '--columns', 'time=k1,lat=k2,lon=k3,alt=k4', '--tz-offset', '+02:00'], { cwd: dir });
    expect(r2.code).toBe(0);
    const row = overview(told)[0];
    expect(row.status).toBe('ok');
    const summaryFile = readFileSync(path.join(told, 'eigen.summary.json'), 'utf8');
    expect(JSON.parse(summaryFile).start_utc).toBe('2026-05-04T10:00:00.000Z'); // 12:00 at UTC+2
  });

  it('rejects a bad reading option as a usage error before any flight runs', async () => {
    const r = await runCli(['batch', '.', '--out-dir', tempDir(), '--tz-offset', 'noon']);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/--tz-offset/);
  });
});
