// Lesson logs with known truth for the batch tests: invented flights at the fictional Harrowgate Fen Airstrip.
import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { KT_MS } from '../../src/constants.js';
import { HARROWGATE_FEN } from '../../src/synth/scenarios.js';
import { simulateFlight } from '../../src/synth/simulateFlight.js';
import { toFlightLog } from '../../src/synth/gpsNoise.js';
import { writeGpx } from '../../src/synth/writeGpx.js';
import { writeCsv } from '../../src/synth/writeCsv.js';
import type { LogMeta } from '../../src/log/flightLog.js';
import type { SynthTruth } from '../../src/synth/synthTruth.js';

/** A short compass-turn lesson: straight, 180° right, straight, 90° left, straight (1 Hz). */
export function lessonTruth(t0: number, headingDegTrue = 0, straightS = 60): SynthTruth {
  return simulateFlight({
    start: { t0, latDeg: HARROWGATE_FEN.latDeg, lonDeg: HARROWGATE_FEN.lonDeg, altM: 600, headingDegTrue, tasMs: 95 * KT_MS },
    wind: { fromDegTrue: 250, speedMs: 15 * KT_MS },
    legs: [
      { kind: 'straight', durationS: straightS },
      { kind: 'turn', direction: 'right', byDeg: 180 },
      { kind: 'straight', durationS: straightS },
      { kind: 'turn', direction: 'left', byDeg: 90 },
      { kind: 'straight', durationS: straightS },
    ],
  });
}

export interface WrittenLesson {
  file: string;
  truth: SynthTruth;
}

/** Writes a lesson as GPX 1.1 (metadata author = pilot) and returns its truth. */
export function writeLessonGpx(file: string, opts: { t0: number; seed: number; meta?: LogMeta; headingDegTrue?: number; straightS?: number }): WrittenLesson {
  const truth = lessonTruth(opts.t0, opts.headingDegTrue, opts.straightS);
  const log = toFlightLog(truth, { posSigmaM: 2, altSigmaM: 3, seed: opts.seed, file: path.basename(file), format: 'gpx', meta: opts.meta });
  mkdirSync(path.dirname(file), { recursive: true });
  writeFileSync(file, writeGpx(log));
  return { file, truth };
}

/** Writes a lesson as CSV (time_utc, lat_deg, lon_deg, alt_ft) and returns its truth. */
export function writeLessonCsv(file: string, opts: { t0: number; seed: number; headingDegTrue?: number }): WrittenLesson {
  const truth = lessonTruth(opts.t0, opts.headingDegTrue);
  const log = toFlightLog(truth, { posSigmaM: 2, altSigmaM: 3, seed: opts.seed, file: path.basename(file), format: 'csv' });
  mkdirSync(path.dirname(file), { recursive: true });
  writeFileSync(file, writeCsv(log, { altUnit: 'ft' }));
  return { file, truth };
}

/** The three broken logs every batch test meets: empty, binary junk, CSV without a time column. */
export function writeBrokenLogs(dir: string): { empty: string; junk: string; notime: string } {
  mkdirSync(dir, { recursive: true });
  const empty = path.join(dir, 'empty.gpx');
  const junk = path.join(dir, 'junk.gpx');
  const notime = path.join(dir, 'notime.csv');
  writeFileSync(empty, '');
  writeFileSync(junk, Buffer.from(Array.from({ length: 4096 }, (_, i) => (i * 7919 + 13) % 256)));
  writeFileSync(notime, 'lat,lon,alt_m\n52.1,0.1,100\n52.2,0.2,100\n52.3,0.3,100\n');
  return { empty, junk, notime };
}

/** UTC seconds of a calendar time. */
export function utc(y: number, mo: number, d: number, h = 10, mi = 0): number {
  return Date.UTC(y, mo - 1, d, h, mi, 0) / 1000;
}
