// Reads a compass-swing CSV and fits the card; every problem becomes an InputError naming the file and line.
import { promises as fsp } from 'node:fs';
import { InputError, ParseError } from '../src/errors.js';
import { parseSwingRecord, swingReport, type SwingReport } from '../src/deviation/swingRecord.js';

/** Reads and fits a swing file; every problem becomes an InputError naming the file and line. */
export async function readSwingFile(file: string): Promise<SwingReport> {
  let text: string;
  try {
    text = await fsp.readFile(file, 'utf8');
  } catch (err) {
    throw new InputError(file, `cannot read the file: ${(err as NodeJS.ErrnoException).code ?? (err as Error).message}`, { hint: 'check the path' });
  }
  try {
    return swingReport(parseSwingRecord(text));
  } catch (err) {
    if (err instanceof ParseError) throw new InputError(file, err.message, { line: err.line, hint: err.hint });
    throw new InputError(file, (err as Error).message, { hint: 'a swing record needs columns heading_mag_deg and compass_deg and five or more headings' });
  }
}

