// Reads a compass profile side file (JSON) for `report` and `batch`; every problem names the file.
import { readSideFileText } from '../import/readSideFile.js';
import { parseCompassProfile, type CompassProfile } from '../compass/compassProfile.js';
import { InputError } from '../errors.js';

/** Reads a small JSON side file and names the file in any error. */
async function readJsonFile(file: string): Promise<unknown> {
  const text = await readSideFileText(file, 'compass profile');
  try {
    return JSON.parse(text);
  } catch (err) {
    throw new InputError(file, `not valid JSON: ${(err as Error).message}`, { hint: 'see DEVELOPERS.md for the compass profile fields' });
  }
}

/**
 * Reads and checks a compass profile file (the fields and ranges of parseCompassProfile).
 * @throws InputError naming the file for an unreadable file, bad JSON or a field out of range
 */
export async function readCompassProfileFile(file: string): Promise<CompassProfile> {
  const json = await readJsonFile(file);
  try {
    return parseCompassProfile(json);
  } catch (err) {
    throw new InputError(file, (err as Error).message, { hint: 'see DEVELOPERS.md for the compass profile fields and ranges' });
  }
}
