// Reads a compass-swing CSV and fits the card; every problem becomes an InputError naming the file and line.
import { readSideFileText } from '../src/import/readSideFile.js';
import { InputError, ParseError } from '../src/errors.js';
import { parseSwingRecord, swingReport, type SwingReport } from '../src/deviation/swingRecord.js';

/** Reads and fits a swing file; every problem becomes an InputError naming the file and line. */
export async function readSwingFile(file: string): Promise<SwingReport> {
  const text = await readSideFileText(file, 'swing record');
  try {
    return swingReport(parseSwingRecord(text));
  } catch (err) {
    if (err instanceof ParseError) throw new InputError(file, err.message, { line: err.line, hint: err.hint });
    throw new InputError(file, (err as Error).message, { hint: 'a swing record needs columns heading_mag_deg and compass_deg and five or more headings' });
  }
}

