// Large inputs: a 1,000,000-sample CSV and a 200,000-fix NMEA log read as a stream. The checks are on
// content (count, first/last values, line numbers) and on progress reports; nothing is timed.
import { appendFileSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readLogFile } from '../../src/import/readLog.js';
import { withChecksum } from './writers/nmeaChecksum.js';

const dir = mkdtempSync(join(tmpdir(), 'cd-large-'));
const T0 = Date.UTC(2026, 4, 4, 8, 0, 0) / 1000;

describe('large logs are streamed', () => {
  it('reads a 1,000,000-sample CSV into typed columns with progress reports', async () => {
    const f = join(dir, 'million.csv');
    const N = 1_000_000;
    writeFileSync(f, 'time_unix_ms,lat,lon,alt_m,gs_kt\n');
    const batch = 100_000;
    for (let b = 0; b < N; b += batch) {
      const rows: string[] = [];
      // 10 Hz for 100,000 s: times in ms are exact integers.
      for (let i = b; i < b + batch; i++) rows.push(`${(T0 * 1000 + i * 100).toFixed(0)},${(52 + (i % 1000) * 1e-5).toFixed(5)},${(-0.25 + (i % 777) * 1e-5).toFixed(5)},${i % 3000},${90 + (i % 20)}`);
      appendFileSync(f, rows.join('\n') + '\n');
    }
    const progress: number[] = [];
    const { log, health } = await readLogFile(f, { onProgress: (x) => progress.push(x) });
    expect(health.samplesKept).toBe(N);
    expect(log.t).toBeInstanceOf(Float64Array);
    expect(log.t[0]).toBe(T0);
    expect(log.t[N - 1]).toBeCloseTo(T0 + (N - 1) * 0.1, 6);
    expect(log.line[N - 1]).toBe(N + 1);
    expect(log.altM[123_456]).toBe(123_456 % 3000);
    expect(log.gsMs![999_999]).toBeCloseTo((90 + (999_999 % 20)) * (1852 / 3600), 9);
    expect(progress.length).toBeGreaterThan(10);
    for (let i = 1; i < progress.length; i++) expect(progress[i]).toBeGreaterThanOrEqual(progress[i - 1]);
    expect(progress[progress.length - 1]).toBe(1);
  });

  it('reads a 200,000-fix NMEA log as a stream', async () => {
    const f = join(dir, 'long.nmea');
    writeFileSync(f, '');
    const N = 200_000;
    const batch = 50_000;
    for (let b = 0; b < N; b += batch) {
      const lines: string[] = [];
      for (let i = b; i < b + batch; i++) {
        const tod = (8 * 3600 + i) % 86400; // runs past midnight at i = 57,600
        const hh = String(Math.floor(tod / 3600)).padStart(2, '0');
        const mm = String(Math.floor((tod % 3600) / 60)).padStart(2, '0');
        const ss = String(tod % 60).padStart(2, '0');
        const day = i < 57_600 ? '040526' : i < 57_600 + 86_400 ? '050526' : '060526';
        lines.push(withChecksum(`GPRMC,${hh}${mm}${ss}.00,A,5230.0000,N,00015.0000,W,90.0,270.0,${day},,,A`));
        lines.push(withChecksum(`GPGGA,${hh}${mm}${ss}.00,5230.0000,N,00015.0000,W,1,10,0.8,${300 + (i % 100)}.0,M,47.0,M,,`));
      }
      appendFileSync(f, lines.join('\r\n') + '\r\n');
    }
    const { log, health } = await readLogFile(f);
    expect(health.samplesKept).toBe(N);
    expect(log.t[N - 1]).toBe(T0 + N - 1);
    expect(log.line[N - 1]).toBe(2 * N - 1);
    expect(log.altM[N - 1]).toBe(300 + ((N - 1) % 100));
  });
});
