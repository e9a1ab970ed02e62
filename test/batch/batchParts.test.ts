// The batch's smaller parts: names, keys, discovery, side files, catalogue, CSV, charts, facts, progress.
import { describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { mkdirSync, writeFileSync, symlinkSync } from 'node:fs';
import path from 'node:path';
import Papa from 'papaparse';
import Database from 'better-sqlite3';
import { tempDir } from '../cli/runCli.js';
import { reportFiles, safeBase, uniqueReportBases } from '../../src/batch/reportNames.js';
import { canonicalJson, fileSha256, optionsSha256 } from '../../src/batch/contentKey.js';
import { findLogs } from '../../src/batch/findLogs.js';
import { readPlanSideFile, readTags } from '../../src/batch/sideFiles.js';
import { openCatalogue, CATALOGUE_SCHEMA_VERSION, type CatalogueRow } from '../../src/batch/flightCatalogue.js';
import { csvText, overviewCsv, OVERVIEW_CSV_COLUMNS } from '../../src/batch/overviewCsv.js';
import { niceCeiling, trendChartSvg, trendXY, TREND_FRAME } from '../../src/batch/trendChartSvg.js';
import { flightFacts } from '../../src/batch/flightFacts.js';
import { groupByTag, overviewHtml } from '../../src/batch/overviewHtml.js';
import type { FlightAnalysis } from '../../src/flightAnalysis.js';
import { batchProgress } from '../../cli/batchCommand.js';
import { InputError } from '../../src/errors.js';
import { writeLessonCsv, utc } from './batchFixtures.js';

function row(over: Partial<CatalogueRow> = {}): CatalogueRow {
  return {
    contentSha256: 'a'.repeat(64),
    optionsSha256: 'b'.repeat(64),
    toolVersion: '0.1.0',
    inputPath: 'logs/a.gpx',
    reportBase: 'a',
    status: 'ok',
    error: '',
    errorKind: '',
    deviation: null,
    analysedT: utc(2026, 6, 1),
    format: 'gpx',
    aircraft: 'Fenbird 2',
    pilot: 'P. Okonkwo-Lindqvist',
    startT: utc(2026, 5, 4, 10),
    durationS: 600,
    samples: 601,
    maxAbsErrorDeg: 31.5,
    maxErrorT: utc(2026, 5, 4, 10, 3),
    rmsErrorDeg: 7.25,
    turnsFlown: 4,
    turnsGraded: 3,
    turnsWithinTolerance: 2,
    meanAbsRolloutErrorDeg: 6.5,
    warnings: 1,
    ...over,
  };
}

describe('report names', () => {
  it('keep a unique base as it is and give clashing bases (ignoring case) a suffix from the path hash, stable whatever else is in the batch', () => {
    const one = uniqueReportBases(['/x/a/lesson.gpx', '/x/b/lesson.gpx', '/x/b/Lesson.csv', '/x/navex.csv']);
    expect(one[3]).toBe('navex');
    expect(new Set(one.map((s) => s.toLowerCase())).size).toBe(4);
    // The suffix: first 8 hex digits of SHA-256 of the absolute path (node:crypto as the oracle).
    const h = createHash('sha256').update('/x/a/lesson.gpx').digest('hex').slice(0, 8);
    expect(one[0]).toBe(`lesson-${h}`);
    const two = uniqueReportBases(['/x/b/Lesson.csv', '/x/a/lesson.gpx', '/x/b/lesson.gpx']);
    expect(two[1]).toBe(one[0]);
  });

  it('remove characters unsafe in file names, leading dots and the extension', () => {
    expect(safeBase('a:b*c?.gpx')).toBe('a_b_c_');
    expect(safeBase('..hidden.gpx')).toBe('hidden');
    expect(safeBase('two  words.csv')).toBe('two_words');
    expect(safeBase('.gpx')).toBe('flight');
    expect(reportFiles('x')).toEqual({ html: 'x.debrief.html', samples: 'x.samples.csv', json: 'x.summary.json' });
  });
});

describe('re-run keys', () => {
  it('hash a file to the FIPS 180-2 example value for "abc"', async () => {
    const d = tempDir('cd-key-');
    writeFileSync(path.join(d, 'abc'), 'abc');
    // FIPS 180-2, Appendix B.1: SHA-256("abc").
    expect(await fileSha256(path.join(d, 'abc'))).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
  });

  it('hash a file of 1,000,000 "a" to the FIPS 180-2 example value, read in several pieces', async () => {
    const d = tempDir('cd-key-');
    // FIPS 180-2, Appendix B.3: SHA-256 of one million repetitions of "a". Under the 1 MiB read size, so
    // also a file that spans two reads (the same text three times over) against node's one-shot hash.
    writeFileSync(path.join(d, 'million-a'), 'a'.repeat(1_000_000));
    expect(await fileSha256(path.join(d, 'million-a'))).toBe('cdc76e5c9914fb9281a1c7e284d73e67f1809a48a497200e046d39ccc7112cd0');
    const three = Buffer.from('a'.repeat(3_000_000));
    writeFileSync(path.join(d, 'three'), three);
    expect(await fileSha256(path.join(d, 'three'))).toBe(createHash('sha256').update(three).digest('hex'));
  });

  it('give equal option sets equal keys whatever their member order, and different ones different keys', () => {
    expect(canonicalJson({ b: 1, a: { d: [1, 2], c: null } })).toBe('{"a":{"c":null,"d":[1,2]},"b":1}');
    expect(optionsSha256({ wind: { kind: 'given', fromDegTrue: 250, speedMs: 7 }, pilot: 'x' })).toBe(optionsSha256({ pilot: 'x', wind: { speedMs: 7, fromDegTrue: 250, kind: 'given' } }));
    expect(optionsSha256({ pilot: 'x' })).not.toBe(optionsSha256({ pilot: 'y' }));
  });
});

describe('finding logs', () => {
  it('takes log extensions, detects logs by content, notes other files, and passes over hidden files, side files and the output folder', async () => {
    const d = tempDir('cd-find-');
    const logs = path.join(d, 'logs');
    mkdirSync(path.join(logs, 'sub'), { recursive: true });
    writeLessonCsv(path.join(logs, 'sub', 'flight.csv'), { t0: utc(2026, 5, 4), seed: 1 });
    writeFileSync(path.join(logs, 'broken.gpx'), ''); // a log by its name, even though empty
    writeFileSync(path.join(logs, 'track.dat'), 'time_utc,lat_deg,lon_deg\n2026-05-04T10:00:00Z,52.6,0.4\n2026-05-04T10:00:01Z,52.61,0.41\n');
    writeFileSync(path.join(logs, 'notes.md'), 'just notes\n');
    writeFileSync(path.join(logs, 'swing.csv'), '# swung at the compass base\nHeading_Mag_Deg, "compass_deg"\n0,358\n90,93\n');
    // Our own samples CSV names both swing columns too, beside its positions: a flight.
    writeFileSync(path.join(logs, 'again.samples.csv'), 'time_utc,lat_deg,lon_deg,heading_mag_deg,compass_deg\n2026-05-04T10:00:00Z,52.6,0.4,90,91\n');
    writeFileSync(path.join(logs, 'flight.csv.tags.json'), '{}');
    writeFileSync(path.join(logs, 'sub', 'flight.plan.csv'), 'target_mag_deg\n90\n');
    writeFileSync(path.join(logs, '.secret.gpx'), '<gpx/>');
    mkdirSync(path.join(logs, 'out'));
    writeFileSync(path.join(logs, 'out', 'old.samples.csv'), 'time_utc,lat_deg,lon_deg\n');
    mkdirSync(path.join(logs, 'old-batch'));
    writeFileSync(path.join(logs, 'old-batch', 'catalogue.sqlite'), '');
    writeFileSync(path.join(logs, 'old-batch', 'x.samples.csv'), 'time_utc,lat_deg,lon_deg\n');
    symlinkSync(path.join(logs, 'sub'), path.join(logs, 'loop'));
    const r = await findLogs(['logs', 'named.xyz'], { cwd: d, excludeDirs: [path.join('logs', 'out')] });
    expect(r.logs.map((l) => [l.path, l.explicit])).toEqual([
      [path.join('logs', 'again.samples.csv'), false],
      [path.join('logs', 'broken.gpx'), false],
      [path.join('logs', 'sub', 'flight.csv'), false],
      [path.join('logs', 'track.dat'), false],
      ['named.xyz', true],
    ]);
    const notes = Object.fromEntries(r.skipped.map((s) => [s.path, s.note]));
    expect(Object.keys(notes).sort()).toEqual([path.join('logs', 'loop'), path.join('logs', 'notes.md'), path.join('logs', 'old-batch'), path.join('logs', 'swing.csv')].sort());
    expect(notes[path.join('logs', 'swing.csv')]).toMatch(/compass-swing record.*--deviation/);
    expect(notes[path.join('logs', 'old-batch')]).toMatch(/catalogue\.sqlite/);
    expect(notes[path.join('logs', 'loop')]).toMatch(/symbolic link/);
    expect(notes[path.join('logs', 'notes.md')]).toMatch(/not a flight log/);
  });
});

describe('side files', () => {
  it('read tags from <log>.tags.json before <base>.tags.json, and the plan from <log>.plan.csv', async () => {
    const d = tempDir('cd-side-');
    const log = path.join(d, 'lesson.gpx');
    expect(await readTags(log)).toEqual({});
    writeFileSync(path.join(d, 'lesson.tags.json'), JSON.stringify({ pilot: '  P. Okonkwo-Lindqvist ', aircraft: '' }));
    expect(await readTags(log)).toEqual({ pilot: 'P. Okonkwo-Lindqvist', file: path.join(d, 'lesson.tags.json') });
    writeFileSync(path.join(d, 'lesson.gpx.tags.json'), JSON.stringify({ aircraft: 'Fenbird 2', extra: 1 }));
    expect(await readTags(log)).toEqual({ aircraft: 'Fenbird 2', file: path.join(d, 'lesson.gpx.tags.json') });
    expect(await readPlanSideFile(log)).toBeUndefined();
    writeFileSync(path.join(d, 'lesson.plan.csv'), 'target_mag_deg\n90\n');
    expect((await readPlanSideFile(log))?.text).toBe('target_mag_deg\n90\n');
  });

  it.each([
    ['not JSON', '{pilot:', /not valid JSON/],
    ['an array', '[]', /expected a JSON object/],
    ['a number as pilot', '{"pilot": 7}', /"pilot" must be a string/],
  ])('refuse a tags file holding %s with an InputError naming it', async (_what, text, pattern) => {
    const d = tempDir('cd-side-');
    writeFileSync(path.join(d, 'x.gpx.tags.json'), text);
    const err = await readTags(path.join(d, 'x.gpx')).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(InputError);
    expect((err as InputError).oneLine()).toMatch(/x\.gpx\.tags\.json: /);
    expect((err as InputError).message).toMatch(pattern);
  });
});

describe('the flight catalogue', () => {
  it('is an SQLite file in WAL mode whose rows come back as written, NaN and empty text as NULL', () => {
    const d = tempDir('cd-cat-');
    const file = path.join(d, 'catalogue.sqlite');
    const cat = openCatalogue(file);
    const r = row({ deviation: { aDeg: 0.5, bDeg: -2, cDeg: 1.25, dDeg: 0, eDeg: -0.3 } });
    const failed = row({ contentSha256: 'c'.repeat(64), status: 'failed', error: 'logs/x.gpx: the file is empty', errorKind: 'input', reportBase: '', startT: NaN, maxErrorT: NaN, maxAbsErrorDeg: NaN, aircraft: '' });
    cat.put(r);
    cat.put(failed);
    expect(cat.get(r.contentSha256)).toEqual(r);
    expect(cat.get(failed.contentSha256)).toEqual(failed);
    expect(cat.all().map((x) => x.contentSha256)).toEqual([r.contentSha256, failed.contentSha256]);
    cat.close();
    // Read back by better-sqlite3 directly, as another program would.
    const db = new Database(file, { readonly: true });
    expect(db.pragma('journal_mode', { simple: true })).toBe('wal');
    expect(db.pragma('user_version', { simple: true })).toBe(CATALOGUE_SCHEMA_VERSION);
    const raw = db.prepare('SELECT * FROM flights WHERE status = ?').get('failed') as Record<string, unknown>;
    expect([raw.start_utc, raw.max_abs_error_deg, raw.aircraft, raw.report_base]).toEqual([null, null, null, null]);
    const ok = db.prepare('SELECT * FROM flights WHERE status = ?').get('ok') as Record<string, unknown>;
    expect(ok.start_utc).toBe('2026-05-04T10:00:00.000Z');
    expect(ok.deviation_b_deg).toBe(-2);
    db.close();
  });

  it('replaces a row with the same content hash, and takes a claimed report name off every other row', () => {
    const d = tempDir('cd-cat-');
    const cat = openCatalogue(path.join(d, 'catalogue.sqlite'));
    cat.put(row());
    cat.put(row({ contentSha256: 'd'.repeat(64), reportBase: 'a' }));
    expect(cat.get('a'.repeat(64))!.reportBase).toBe('');
    cat.put(row({ maxAbsErrorDeg: 12 }));
    expect(cat.all()).toHaveLength(2);
    expect(cat.get('a'.repeat(64))!.maxAbsErrorDeg).toBe(12);
    expect(cat.get('d'.repeat(64))!.reportBase).toBe('');
    cat.close();
  });

  it('refuses a file that is not an SQLite database, and one written by a newer layout, naming the file', () => {
    const d = tempDir('cd-cat-');
    const junk = path.join(d, 'junk.sqlite');
    writeFileSync(junk, 'this is not a database at all, just text that is long enough to be read as a header');
    expect(() => openCatalogue(junk)).toThrow(InputError);
    const newer = path.join(d, 'newer.sqlite');
    const db = new Database(newer);
    db.pragma(`user_version = ${CATALOGUE_SCHEMA_VERSION + 1}`);
    db.close();
    expect(() => openCatalogue(newer)).toThrow(/newer compass-debrief/);
  });
});

describe('overview.csv', () => {
  it('quotes fields per RFC 4180 (papaparse reads back every value) and defuses formula-like text (OWASP CSV injection)', () => {
    const nasty = 'a, "quoted"\nline';
    const text = overviewCsv([
      { inputPath: nasty, run: 'analysed', note: '', row: row({ pilot: '=HYPERLINK("x")', aircraft: '+1' }) },
      { inputPath: 'logs/b.gpx', run: 'unchanged', note: 'same content as x', row: row({ status: 'failed', error: 'logs/b.gpx: the file is empty', reportBase: '' }) },
    ]);
    expect(text.endsWith('\r\n')).toBe(true);
    const parsed = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.meta.fields).toEqual([...OVERVIEW_CSV_COLUMNS]);
    expect(parsed.data[0].file).toBe(nasty);
    expect(parsed.data[0].pilot).toBe(`'=HYPERLINK("x")`);
    expect(parsed.data[0].aircraft).toBe(`'+1`);
    expect(parsed.data[0].report).toBe('a.debrief.html');
    expect(parsed.data[0].max_abs_error_deg).toBe('31.5');
    expect(parsed.data[1]).toMatchObject({ status: 'failed', report: '', turns_flown: '', this_run: 'unchanged', error: 'logs/b.gpx: the file is empty' });
    expect(csvText('-3')).toBe(`'-3`);
  });
});

describe('trend charts', () => {
  it('place points linearly in time and value within the frame, from 0 to a round ceiling', () => {
    const f = TREND_FRAME;
    expect(trendXY(100, 0, 100, 200, 10)).toEqual({ x: f.left, y: f.height - f.bottom });
    expect(trendXY(200, 10, 100, 200, 10)).toEqual({ x: f.width - f.right, y: f.top });
    const mid = trendXY(150, 5, 100, 200, 10);
    expect(mid.x).toBeCloseTo((f.left + f.width - f.right) / 2, 9);
    expect(mid.y).toBeCloseTo((f.top + f.height - f.bottom) / 2, 9);
    expect(trendXY(5, 1, 5, 5, 2).x).toBeCloseTo(f.left + (f.width - f.left - f.right) / 2, 9);
    expect([niceCeiling(0.37), niceCeiling(3), niceCeiling(21), niceCeiling(46.8), niceCeiling(0)]).toEqual([0.5, 5, 25, 50, 1]);
  });

  it('draw one marker per finite point with escaped tooltips, and nothing without points', () => {
    const svg = trendChartSvg('<b>t</b>', '°', [
      { name: 'x', colour: '#0072b2', points: [{ tUtc: 2, value: 3, label: '<i>a</i>' }, { tUtc: 1, value: NaN, label: 'gone' }, { tUtc: 3, value: 4, label: 'b' }] },
    ]);
    expect((svg.match(/<circle /g) ?? []).length).toBe(2);
    expect(svg).toContain('&lt;i&gt;a&lt;/i&gt;');
    expect(svg).not.toContain('<i>');
    expect(svg).not.toContain('gone');
    expect(trendChartSvg('t', '°', [{ name: 'x', colour: '#000', points: [{ tUtc: 1, value: NaN, label: '' }] }])).toBe('');
  });
});

describe('the overview page', () => {
  it('groups ok catalogue rows by pilot and aircraft tag, oldest first, leaving untagged and failed flights out', () => {
    const rows = [
      row({ contentSha256: '1', pilot: 'B', startT: 30 }),
      row({ contentSha256: '2', pilot: 'A', startT: 20 }),
      row({ contentSha256: '3', pilot: 'B', startT: 10 }),
      row({ contentSha256: '4', pilot: '', startT: 5 }),
      row({ contentSha256: '5', pilot: 'A', status: 'failed' }),
    ];
    expect(groupByTag(rows, 'pilot').map(([n, g]) => [n, g.map((r) => r.contentSha256)])).toEqual([
      ['A', ['2']],
      ['B', ['3', '1']],
    ]);
  });

  it('escapes every text and links the debrief by its percent-encoded relative name', () => {
    const html = overviewHtml({
      generatedAtUtc: '2026-06-01T12:00:00.000Z',
      toolVersion: '0.1.0',
      optionsText: 'wind <calm>',
      flights: [{ inputPath: 'logs/<a>.gpx', run: 'analysed', note: '', row: row({ reportBase: 'a b#c', pilot: '"><img src=x>' }) }],
      catalogue: [row({ reportBase: 'a b#c', pilot: '"><img src=x>' })],
      skipped: [{ path: 'notes<1>.md', note: 'not a flight log' }],
    });
    expect(html).not.toContain('<img');
    expect(html).not.toContain('<a>.gpx');
    expect(html).toContain('href="a%20b%23c.debrief.html"');
    expect(html).toContain('wind &lt;calm&gt;');
    expect(html).toContain('notes&lt;1&gt;.md');
  });
});

describe('flight facts', () => {
  it('take the largest |error| and its time, the RMS over finite errors, and the roll-out grades (hand-computed values)', () => {
    const a = {
      log: { source: { format: 'gpx', meta: { pilot: 'P' } } },
      state: { n: 4, t: new Float64Array([100, 101, 102, 104]) },
      compass: { errorDeg: new Float64Array([3, -4, NaN, 4]) },
      analysis: {
        turns: [
          { rolloutErrorDeg: -6, withinTolerance: false },
          { rolloutErrorDeg: 2, withinTolerance: true },
          { rolloutErrorDeg: NaN, withinTolerance: false },
        ],
      },
      warnings: [{}, {}],
    } as unknown as FlightAnalysis;
    const f = flightFacts(a);
    expect(f.maxAbsErrorDeg).toBe(4);
    expect(f.maxErrorT).toBe(101); // the first of equal maxima
    expect(f.rmsErrorDeg).toBeCloseTo(Math.sqrt((9 + 16 + 16) / 3), 12);
    expect([f.turnsFlown, f.turnsGraded, f.turnsWithinTolerance]).toEqual([3, 2, 1]);
    expect(f.meanAbsRolloutErrorDeg).toBe(4);
    expect([f.startT, f.durationS, f.samples, f.warnings, f.pilot, f.aircraft]).toEqual([100, 4, 4, 2, 'P', '']);
  });
});

describe('batch progress', () => {
  const flight = (name: string, status: 'ok' | 'failed') => ({ inputPath: `logs/${name}`, run: 'analysed' as const, note: '', row: row({ status }) });
  const events = [
    { kind: 'planned' as const, total: 3, toAnalyse: 2, unchanged: 1, skipped: [] },
    { kind: 'flight' as const, done: 1, toAnalyse: 2, flight: flight('a.gpx', 'ok') },
    { kind: 'flight' as const, done: 2, toAnalyse: 2, flight: flight('b.gpx', 'failed') },
  ];
  function capture(isTty: boolean, quiet: boolean): string {
    let err = '';
    const p = batchProgress({ stdout: () => {}, stderr: (t) => (err += t), isTty, env: {}, cwd: '.' }, quiet);
    for (const e of events) p.onEvent(e);
    p.end();
    return err;
  }

  it('redraws one bar in place on a terminal and clears it at the end', () => {
    const err = capture(true, false);
    expect(err).not.toContain('\n');
    expect(err.split('\r').filter((s) => s !== '')).toHaveLength(4);
    expect(err).toContain('[############............] 1/2 a.gpx ok');
    expect(err).toContain('[########################] 2/2 b.gpx failed');
    expect(err.endsWith('\r\x1b[2K')).toBe(true);
  });

  it('prints one plain line per flight elsewhere, and nothing when quiet', () => {
    expect(capture(false, false)).toBe('[1/2] logs/a.gpx: ok\n[2/2] logs/b.gpx: failed\n');
    expect(capture(true, true)).toBe('');
    expect(capture(false, true)).toBe('');
  });
});
