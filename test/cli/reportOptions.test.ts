// report's side files and options: --observed (compass fit), --plan, --excursion, --tolerance, --wind table,
// --deviation; each bad side file gives one line naming it.
import { beforeAll, describe, expect, it } from 'vitest';
import { readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { runCli, tempDir } from './runCli.js';
import { simulateFlight } from '../../src/synth/simulateFlight.js';
import { toFlightLog } from '../../src/synth/gpsNoise.js';
import { writeGpx } from '../../src/synth/writeGpx.js';
import { parseGpx } from '../../src/import/gpx.js';
import { analyseFlight } from '../../src/analyseFlight.js';
import { simulateCompass } from '../../src/compass/simulateCompass.js';
import { DEFAULT_COMPASS_PROFILE } from '../../src/compass/compassProfile.js';
import { KT_MS } from '../../src/constants.js';
import { seededNormal } from '../../src/synth/seededRandom.js';

let dir = '';
let gpx = '';

beforeAll(() => {
  dir = tempDir();
  const truth = simulateFlight({
    start: { t0: Date.UTC(2026, 8, 3, 14, 0, 0) / 1000, latDeg: 57.2, lonDeg: -3.9, altM: 900, headingDegTrue: 0, tasMs: 90 * KT_MS },
    wind: { fromDegTrue: 220, speedMs: 12 * KT_MS },
    legs: [
      { kind: 'straight', durationS: 40 },
      { kind: 'turn', direction: 'right', byDeg: 360 },
      { kind: 'straight', durationS: 30 },
      { kind: 'turn', direction: 'left', byDeg: 270 },
      { kind: 'straight', durationS: 60 },
      { kind: 'turn', direction: 'right', byDeg: 180 },
      { kind: 'straight', durationS: 60 },
    ],
  });
  gpx = path.join(dir, 'fit.gpx');
  writeFileSync(gpx, writeGpx(toFlightLog(truth, { posSigmaM: 1.5, altSigmaM: 2, seed: 3, file: 'fit.gpx', format: 'gpx' })));
});

describe('--observed', () => {
  it('fits the card to readings made by a card of known period and damping, and says so (model readings, noise 0.5°)', async () => {
    const log = parseGpx(readFileSync(gpx, 'utf8'), gpx);
    const a = analyseFlight(log, { wind: { kind: 'given', fromDegTrue: 220, speedMs: 12 * KT_MS } });
    const trueProfile = { ...DEFAULT_COMPASS_PROFILE, periodS: 6, dampingRatio: 0.45 };
    const c = simulateCompass(a.state, a.field, trueProfile);
    const noise = seededNormal(9);
    const rows = ['time_utc,compass_deg'];
    for (let i = 5; i < a.state.n; i += 3) if (Number.isFinite(c.readingDeg[i])) rows.push(`${new Date(a.state.t[i] * 1000).toISOString()},${((c.readingDeg[i] + 0.5 * noise() + 360) % 360).toFixed(2)}`);
    const obs = path.join(dir, 'observed.csv');
    writeFileSync(obs, rows.join('\n') + '\n');
    const json = path.join(dir, 'fit.json');
    const r = await runCli(['report', gpx, '--wind', '220/12', '--observed', obs, '--json', json, '--out', path.join(dir, 'fit.html')]);
    // stderr carries only progress notes of stages over a second (not a terminal): "stage: 1.2 s".
    for (const line of r.stderr.split('\n').filter(Boolean)) expect(line).toMatch(/: \d+\.\d s$/);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/compass fitted to \d+ observed reading/);
    const cal = JSON.parse(readFileSync(json, 'utf8')).calibration;
    expect(cal.rms_deg).toBeLessThan(cal.initial_rms_deg);
    expect(cal.rms_deg).toBeLessThan(1);
    const period = cal.params.find((p: { name: string }) => p.name === 'periodS');
    expect(Math.abs(period.value - 6)).toBeLessThan(0.5);
  });

  it('names the file and line of a bad reading', async () => {
    const obs = path.join(dir, 'bad-observed.csv');
    writeFileSync(obs, 'time_utc,compass_deg\n2026-09-03T14:01:00Z,123\n2026-09-03T14:01:05Z,north\n');
    const r = await runCli(['report', gpx, '--observed', obs, '--out', path.join(dir, 'x.html')]);
    expect(r.code).toBe(1);
    expect(r.stderr.trim()).toMatch(/bad-observed\.csv:3: compass reading 'north'/);
  });
});

describe('reading options', () => {
  it('reads a CSV with its own headers through --columns, local times through --tz-offset, decimal commas by detection', async () => {
    const rows = ['Zeit;Breite;Laenge;Hoehe'];
    for (let i = 0; i < 120; i++) rows.push(`2026-05-04 12:${String(Math.floor(i / 60)).padStart(2, '0')}:${String(i % 60).padStart(2, '0')};${(52 + 0.0004 * i).toFixed(6).replace('.', ',')};10,000000;500`);
    const csv = path.join(dir, 'eigen.csv');
    writeFileSync(csv, rows.join('\n') + '\n');
    const json = path.join(dir, 'eigen.json');
    const r = await runCli(['report', csv, '--columns', 'time=Zeit,lat=Breite,lon=Laenge,alt=Hoehe', '--tz-offset', '+02:00', '--json', json, '--out', path.join(dir, 'eigen.html')]);
    expect(r.code).toBe(0);
    const j = JSON.parse(readFileSync(json, 'utf8'));
    expect(j.start_utc).toBe('2026-05-04T10:00:00.000Z'); // 12:00 at UTC+2
    expect(j.samples).toBe(120);
  });

  it.each([
    [['--tz-offset', '+25:00'], /--tz-offset/],
    [['--date', '4 May'], /--date/],
    [['--heading-ref', 'grid'], /--heading-ref/],
  ])('rejects %j as a usage error', async (extra, pattern) => {
    const r = await runCli(['report', gpx, ...(extra as string[])]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(pattern);
  });
});

describe('--plan, --tolerance, --excursion, wind tables', () => {
  it('grades turns against the plan with the tolerance given', async () => {
    const plan = path.join(dir, 'plan.csv');
    writeFileSync(plan, 'target_mag_deg\n000\n270\n090\n');
    const json = path.join(dir, 'plan.json');
    const r = await runCli(['report', gpx, '--plan', plan, '--tolerance', '5', '--json', json, '--out', path.join(dir, 'plan.html')]);
    expect(r.code).toBe(0);
    const turns = JSON.parse(readFileSync(json, 'utf8')).turns;
    expect(turns.map((t: { target_source: string }) => t.target_source)).toEqual(['plan', 'plan', 'plan']);
    expect(turns.every((t: { tolerance_deg: number }) => t.tolerance_deg === 5)).toBe(true);
  });

  it('names the plan file and line of a bad plan row', async () => {
    const plan = path.join(dir, 'bad-plan.csv');
    writeFileSync(plan, 'target_mag_deg\n000\nwest\n');
    const r = await runCli(['report', gpx, '--plan', plan, '--out', path.join(dir, 'bp.html')]);
    expect(r.code).toBe(1);
    expect(r.stderr.trim()).toMatch(/bad-plan\.csv:3:/);
  });

  it('analyses the excursion span given by time of day', async () => {
    const json = path.join(dir, 'exc.json');
    const r = await runCli(['report', gpx, '--excursion', '14:04:30/14:05:20', '--json', json, '--out', path.join(dir, 'exc.html')]);
    expect(r.code).toBe(0);
    const ex = JSON.parse(readFileSync(json, 'utf8')).excursions;
    expect(ex).toHaveLength(1);
    expect(ex[0].source).toBe('option');
    expect(Date.parse(ex[0].start_utc) / 1000).toBeGreaterThanOrEqual(Date.UTC(2026, 8, 3, 14, 4, 30) / 1000 - 1);
  });

  it('takes a wind table by altitude and reports it as the wind used', async () => {
    const table = path.join(dir, 'winds.csv');
    writeFileSync(table, '# forecast\nalt_ft,wind\n0,200/10\n6000,240/14\n');
    const json = path.join(dir, 'tab.json');
    const r = await runCli(['report', gpx, '--wind', table, '--json', json, '--out', path.join(dir, 'tab.html')]);
    expect(r.code).toBe(0);
    expect(JSON.parse(readFileSync(json, 'utf8')).wind.source).toBe('table');
  });

  it.each([
    [['--tolerance', '0'], /--tolerance/],
    [['--excursion', '14:00'], /--excursion/],
    [['--excursion', '14:10:00/2026-09-03T14:20:00Z'], /same way/],
  ])('rejects %j as a usage error', async (extra, pattern) => {
    const r = await runCli(['report', gpx, ...(extra as string[])]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(pattern);
  });
});
