// The two columns that make a CSV a compass-swing record, and a check of a file's first line for them.
// Kept apart from swingRecord.ts so that the batch's folder search can tell a swing record from a flight
// log without loading the fitting code (mathjs).

/** The aircraft's magnetic heading at each swung heading [deg]. */
export const HEADING_COLUMN = 'heading_mag_deg';
/** What the aircraft's compass read there [deg]. */
export const COMPASS_COLUMN = 'compass_deg';

/**
 * Whether the first line of `head` that is neither blank nor a # comment is a header naming both swing
 * columns (comma, semicolon or tab separated; case, blanks and double quotes ignored), as parseSwingRecord
 * reads them, and no latitude column (a name starting "lat"): a samples CSV has both swing columns too,
 * beside its positions, and is a flight. Only the header is looked at: a true answer says what the file is
 * meant to be, not that it parses.
 */
export function hasSwingRecordHeader(head: string): boolean {
  for (const raw of head.split(/\r?\n/)) {
    const line = raw.trim();
    if (line === '' || line.startsWith('#')) continue;
    const names = line.split(/[,;\t]/).map((c) => c.trim().replace(/^"(.*)"$/, '$1').trim().toLowerCase());
    return names.includes(HEADING_COLUMN) && names.includes(COMPASS_COLUMN) && !names.some((n) => n.startsWith('lat'));
  }
  return false;
}
