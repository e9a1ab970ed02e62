// The command line: exit codes, one-line errors naming the file, no partial outputs, help for every command.
import { describe, expect, it, beforeAll } from 'vitest';
import { createHash } from 'node:crypto';
import { existsSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { runCli, tempDir } from './runCli.js';
import { simulateFlight } from '../../src/synth/simulateFlight.js';
import { toFlightLog } from '../../src/synth/gpsNoise.js';
import { writeGpx } from '../../src/synth/writeGpx.js';
import { KT_MS } from '../../src/constants.js';
import { SAMPLES_CONTRACT_COLUMNS } from '../../src/report/samplesCsv.js';
import { useColour } from '../../cli/cliIo.js';

const INJECTION = `<script>alert("x")</script>" onmouseover="alert(1)`;

let dir = '';
let gpxPath = '';

beforeAll(() => {
  dir = tempDir();
  const truth = simulateFlight({
    start: { t0: Date.UTC(2026, 4, 4, 10, 0, 0) / 1000, latDeg: 52.6, lonDeg: 0.4, altM: 600, headingDegTrue: 0, tasMs: 95 * KT_MS },
    wind: { fromDegTrue: 250, speedMs: 15 * KT_MS },
    legs: [
      { kind: 'straight', durationS: 60 },
      { kind: 'turn', direction: 'right', byDeg: 180 },
      { kind: 'straight', durationS: 60 },
    ],
  });
  const log = toFlightLog(truth, { posSigmaM: 2, altSigmaM: 3, seed: 5, file: 'x.gpx', format: 'gpx' });
  gpxPath = path.join(dir, 'lesson.gpx');
  writeFileSync(gpxPath, writeGpx(log, { name: INJECTION }));
});

function sha(file: string): string {
  return createHash('sha256').update(readFileSync(file)).digest('hex');
}

describe('usage errors print usage and exit 2', () => {
  it.each([
    [[], 'no command'],
    [['report'], 'no log'],
    [['report', 'a.gpx', '--bogus'], 'an unknown option'],
    [['report', 'a.gpx', '--wind', '400/20'], 'an impossible wind direction'],
    [['report', 'a.gpx', '--wind', '250/900'], 'an impossible wind speed'],
    [['report', 'a.gpx', '--wind', 'breezy'], 'an unreadable wind'],
    [['frobnicate'], 'an unknown command'],
    [['toString'], 'a name every object has (not a command)'],
    [['constructor'], 'a name every object has (not a command)'],
    [['field', '95', '0'], 'a latitude beyond the pole'],
  ])('%j (%s)', async (argv) => {
    const r = await runCli(argv as string[]);
    expect(r.code).toBe(2);
    expect(r.stdout + r.stderr).toMatch(/Usage/);
  });
});

describe('every command has help with an example', () => {
  it.each(['report', 'swing', 'field', 'demo', 'batch'])('%s --help', async (cmd) => {
    const r = await runCli([cmd, '--help']);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(new RegExp(`Usage: compass-debrief ${cmd}`));
  });
});

describe('bad input: one line naming the file, exit 1, no output written', () => {
  const cases: Array<[string, (d: string) => string, RegExp]> = [
    ['a missing file', (d) => path.join(d, 'nowhere.gpx'), /nowhere\.gpx: no such file/],
    ['an empty file', (d) => { const p = path.join(d, 'empty.gpx'); writeFileSync(p, ''); return p; }, /empty\.gpx: the file is empty/],
    ['binary junk', (d) => { const p = path.join(d, 'junk.gpx'); writeFileSync(p, Buffer.from(Array.from({ length: 4096 }, (_, i) => (i * 7919 + 13) % 256))); return p; }, /junk\.gpx/],
    ['a CSV without a time column', (d) => { const p = path.join(d, 'notime.csv'); writeFileSync(p, 'lat,lon,alt_m\n52.1,0.1,100\n52.2,0.2,100\n52.3,0.3,100\n'); return p; }, /notime\.csv(:\d+)?: .*time/i],
  ];
  it.each(cases)('%s', async (_name, make, pattern) => {
    const d = tempDir();
    const input = make(d);
    const out = path.join(d, 'out');
    const before = readdirSync(d).sort();
    const r = await runCli(['report', input, '--out', `${out}.html`, '--samples', `${out}.csv`, '--json', `${out}.json`], { cwd: d });
    expect(r.code).toBe(1);
    const lines = r.stderr.trim().split('\n');
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatch(pattern);
    expect(r.stderr).not.toMatch(/\s+at\s+\S+\s+\(/); // no stack trace without --debug
    expect(readdirSync(d).sort()).toEqual(before);
  });
});

describe('a good run', () => {
  it('writes the three outputs, never touches the input, and keeps log text out of the markup', async () => {
    const before = sha(gpxPath);
    const out = path.join(dir, 'run1');
    const r = await runCli(['report', gpxPath, '--wind', '250/15', '--out', `${out}.html`, '--samples', `${out}.csv`, '--json', `${out}.json`]);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    expect(sha(gpxPath)).toBe(before);
    const header = readFileSync(`${out}.csv`, 'utf8').split('\n')[0].split(',');
    expect(header.slice(0, SAMPLES_CONTRACT_COLUMNS.length)).toEqual([...SAMPLES_CONTRACT_COLUMNS]);
    const summary = JSON.parse(readFileSync(`${out}.json`, 'utf8'));
    expect(summary.wind).toMatchObject({ from_deg: 250, speed_kt: 15, source: 'given' });
    const html = readFileSync(`${out}.html`, 'utf8');
    expect(html).not.toContain('<script>alert("x")</script>');
    expect(html).not.toContain('" onmouseover="alert(1)');
    expect(existsSync(`${out}.html`)).toBe(true);
  });

  it('refuses to write an output over its own input', async () => {
    const r = await runCli(['report', gpxPath, '--wind', 'calm', '--out', gpxPath]);
    expect(r.code).toBe(1);
    expect(readFileSync(gpxPath, 'utf8')).toContain('<gpx');
  });
});

describe('field: WMM2025 at a point', () => {
  it('matches the WMM2025 report test value at 80S 240E (120W), 100 km, 2027.5 (D 67.93, I −72.10; WMM2025 Technical Report table 3b)', async () => {
    // 2027.5 is 2 July 2027 12:00 UTC; --date takes whole days, so take 2 July (2027.4986) and allow the secular change of half a day.
    const r = await runCli(['field', '-80', '-120', '--alt-ft', String(100_000 / 0.3048), '--date', '2027-07-02', '--json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.stdout);
    expect(j.variation_deg).toBeCloseTo(67.93, 1);
    expect(j.dip_deg).toBeCloseTo(-72.1, 1);
  });
});

describe('colour', () => {
  it('is used only on a terminal and never with NO_COLOR (no-color.org)', () => {
    const io = { stdout: () => {}, stderr: () => {}, cwd: '.', isTty: true, env: {} as Record<string, string> };
    expect(useColour(io)).toBe(true);
    expect(useColour({ ...io, env: { NO_COLOR: '1' } })).toBe(false);
    expect(useColour({ ...io, isTty: false })).toBe(false);
  });
});
