// The options that say how to read a log (shared by report and batch): --format, --columns, --date,
// --tz-offset, --heading-ref. Bad values are usage errors naming the command.
import { existsSync } from 'node:fs';
import type { LogFormat } from '../src/log/flightLog.js';
import type { ReadOptions } from '../src/import/readLog.js';
import { parseColumnMapping } from '../src/import/columnMapping.js';
import { readSideFileText } from '../src/import/readSideFile.js';
import { UsageError } from './usageError.js';

const FORMATS: LogFormat[] = ['gpx', 'csv', 'igc', 'nmea', 'fit', 'kml'];

/** --format F: one of the formats the readers know, or undefined (told from the content). */
export function parseFormatOption(command: string, value: string | undefined): LogFormat | undefined {
  if (value === undefined) return undefined;
  if (!FORMATS.includes(value as LogFormat)) throw new UsageError(command, `--format ${value}: expected one of ${FORMATS.join(', ')}`);
  return value as LogFormat;
}

/**
 * --columns (inline `time=Zeit,lat=Breite` or a mapping file), --date YYYY-MM-DD (logs with times of day
 * only), --tz-offset ±HH:MM or minutes (local times without a zone), --heading-ref true|magnetic.
 */
export async function readOptionsFrom(
  command: string,
  values: { columns?: string; date?: string; 'tz-offset'?: string; 'heading-ref'?: string },
): Promise<Omit<ReadOptions, 'format'>> {
  const read: Omit<ReadOptions, 'format'> = {};
  if (values.columns !== undefined) {
    const text = /[=:]/.test(values.columns) && !existsSync(values.columns) ? values.columns : await readSideFileText(values.columns, 'column mapping');
    try {
      read.columns = parseColumnMapping(text);
    } catch (err) {
      throw new UsageError(command, `--columns: ${(err as Error).message}`);
    }
  }
  if (values.date !== undefined) {
    if (!/^\d{4}-\d{2}-\d{2}$/.test(values.date) || !Number.isFinite(Date.parse(`${values.date}T00:00:00Z`))) throw new UsageError(command, `--date ${values.date}: expected YYYY-MM-DD`);
    read.date = values.date;
  }
  const tz = values['tz-offset'];
  if (tz !== undefined) {
    const m = /^([+-])(\d{1,2}):?(\d{2})$/.exec(tz.trim());
    const minutes = m ? (m[1] === '-' ? -1 : 1) * (Number(m[2]) * 60 + Number(m[3])) : Number(tz);
    if (!(Number.isFinite(minutes) && Math.abs(minutes) <= 14 * 60)) throw new UsageError(command, `--tz-offset ${tz}: expected ±HH:MM east of UTC (e.g. +02:00) or minutes, within ±14 h`);
    read.tzOffsetMin = minutes;
  }
  const ref = values['heading-ref'];
  if (ref !== undefined) {
    if (ref !== 'true' && ref !== 'magnetic') throw new UsageError(command, `--heading-ref ${ref}: expected true or magnetic`);
    read.headingRef = ref;
  }
  return read;
}

