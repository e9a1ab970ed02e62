// readLogFile: file-system edge cases give one clear InputError line naming the file (and line where it
// applies), as DESIGN.md requires; inputs are never modified. Files are made in a temporary directory.
import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync, statSync, writeFileSync, copyFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { readLogFile } from '../../src/import/readLog.js';
import { InputError } from '../../src/errors.js';

let dir = '';
const fixture = (name: string) => new URL(`../fixtures/import/${name}`, import.meta.url).pathname;

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'cd-readlog-'));
});

async function inputError(p: Promise<unknown>): Promise<InputError> {
  try {
    await p;
  } catch (err) {
    if (err instanceof InputError) return err;
    throw err;
  }
  throw new Error('expected an InputError');
}

describe('readLogFile: what cannot be read', () => {
  it('a missing file: one line naming the file', async () => {
    const f = join(dir, 'nope.gpx');
    const e = await inputError(readLogFile(f));
    expect(e.file).toBe(f);
    expect(e.oneLine()).toBe(`${f}: no such file (check the path and the file name)`);
  });

  it('a directory', async () => {
    const e = await inputError(readLogFile(dir));
    expect(e.oneLine()).toContain(`${dir}: this is a directory`);
  });

  it('an empty file', async () => {
    const f = join(dir, 'empty.csv');
    writeFileSync(f, '');
    const e = await inputError(readLogFile(f));
    expect(e.message).toBe('the file is empty');
    expect(e.oneLine().split('\n').length).toBe(1);
  });

  it('binary junk, with the supported formats in the hint', async () => {
    const e = await inputError(readLogFile(fixture('binary-junk.bin')));
    expect(e.message).toContain('not a flight log this tool can read');
    expect(e.hint).toContain('GPX');
  });

  it('a CSV without a time column: names the file and the header line', async () => {
    const f = fixture('no-time.csv');
    const e = await inputError(readLogFile(f));
    expect(e.line).toBe(1);
    expect(e.oneLine().startsWith(`${f}:1: no time column found`)).toBe(true);
    expect(e.oneLine().split('\n').length).toBe(1);
  });

  it('a log with fewer than two usable samples', async () => {
    const f = join(dir, 'one.csv');
    writeFileSync(f, 'time,lat,lon\n2026-05-04T10:00:00Z,52,1\n2026-05-04T10:00:01Z,,\n');
    const e = await inputError(readLogFile(f));
    expect(e.message).toMatch(/only one sample/);
    expect(e.hint).toContain('line 3');
  });
});

describe('readLogFile: reading and cleaning', () => {
  it('detects the format from the content whatever the extension, and cleans the log', async () => {
    const f = join(dir, 'track.txt');
    copyFileSync(fixture('two-tracks.gpx'), f);
    const { log, health } = await readLogFile(f);
    expect(log.source.format).toBe('gpx');
    // Fixture times 10:00:00, 10:00:01.25, 10:00:05 (12:00:05+02:00), 10:00:07: already in order.
    expect(health.samplesKept).toBe(4);
    expect(health.recordsRead).toBe(5);
    expect(health.invalidValues).toBe(1); // the point without <time>
    expect(health.truncated).toBe(false);
  });

  it('reads a truncated GPX with health.truncated set and a warning naming the line', async () => {
    const { log, health } = await readLogFile(fixture('truncated.gpx'));
    expect(health.truncated).toBe(true);
    expect(health.samplesKept).toBe(3);
    expect(log.source.warnings.some((w) => w.code === 'file-truncated' && /line 9/.test(w.message))).toBe(true);
  });

  it('reports out-of-order and duplicated CSV rows with their lines', async () => {
    const f = join(dir, 'messy.csv');
    writeFileSync(
      f,
      [
        'time,lat,lon',
        '2026-05-04T10:00:00Z,52.0,1',
        '2026-05-04T10:00:02Z,52.2,1',
        '2026-05-04T10:00:01Z,52.1,1',
        '2026-05-04T10:00:02Z,52.3,1',
        '2026-05-04T10:00:03Z,52.4,1',
        '',
      ].join('\n'),
    );
    const { log, health } = await readLogFile(f);
    expect(Array.from(log.lat)).toEqual([52.0, 52.1, 52.2, 52.4]);
    expect(health.outOfOrder).toBe(1);
    expect(health.duplicateTimes).toBe(1);
    expect(log.source.warnings.find((w) => w.code === 'out-of-order')?.lines).toEqual([4]);
    expect(log.source.warnings.find((w) => w.code === 'duplicate-time')?.lines).toEqual([5]);
  });

  it('never modifies the input file', async () => {
    const f = join(dir, 'keep.csv');
    writeFileSync(f, 'time,lat,lon\n2026-05-04T10:00:01Z,52,1\n2026-05-04T10:00:00Z,52,1\n');
    const hash = () => createHash('sha256').update(readFileSync(f)).digest('hex');
    const before = { h: hash(), m: statSync(f).mtimeMs };
    await readLogFile(f);
    expect(hash()).toBe(before.h);
    expect(statSync(f).mtimeMs).toBe(before.m);
  });
});

describe('readLogFile: options', () => {
  it('refuses a malformed date option with an OptionError naming it, before reading', async () => {
    const { OptionError } = await import('../../src/errors.js');
    await expect(readLogFile(fixture('two-tracks.gpx'), { date: '04.05.2026' })).rejects.toBeInstanceOf(OptionError);
    await expect(readLogFile(fixture('two-tracks.gpx'), { format: 'xls' as never })).rejects.toThrow(/format/);
  });

  it('forces a format over detection when asked', async () => {
    const e = await inputError(readLogFile(fixture('two-tracks.gpx'), { format: 'csv' }));
    expect(e.file).toBe(fixture('two-tracks.gpx'));
  });

  it('reads IGC and NMEA files found by content, through the same cleaning', async () => {
    const { log } = await readLogFile(fixture('midnight.igc'));
    expect(log.source.format).toBe('igc');
    expect(log.t.length).toBe(4);
  });
});
