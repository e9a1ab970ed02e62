// --observed FILE: compass readings noted in flight (by the pilot, or read off cockpit video), for the fit
// of the compass profile. Columns: time_utc (ISO 8601 with Z) and compass_deg. Lines starting with # are comments.
import { readSideFileText } from '../src/import/readSideFile.js';
import { requireCjs } from '../src/util/requireCjs.js';
import { InputError } from '../src/errors.js';
import type { CompassObservations } from '../src/compass/calibrateProfile.js';

const Papa = requireCjs('papaparse') as typeof import('papaparse');

const HINT = 'an observed-readings file has columns time_utc (e.g. 2026-05-04T10:12:30Z) and compass_deg (0 to 360)';

/** Reads the observations; every bad row names the file and line. */
export async function readObservedReadings(file: string): Promise<CompassObservations> {
  const text = await readSideFileText(file, 'observed readings');
  const parsed = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: 'greedy', comments: '#', transformHeader: (h) => h.trim().toLowerCase() });
  const fields = parsed.meta.fields ?? [];
  if (!fields.includes('time_utc') || !fields.includes('compass_deg')) throw new InputError(file, 'the columns time_utc and compass_deg are needed', { line: 1, hint: HINT });
  const t: number[] = [];
  const c: number[] = [];
  parsed.data.forEach((r, k) => {
    const line = k + 2;
    const ts = (r.time_utc ?? '').trim();
    const ms = Date.parse(ts);
    if (!Number.isFinite(ms) || !/(Z|[+-]\d\d:?\d\d)$/i.test(ts)) throw new InputError(file, `time '${ts}' is not an ISO 8601 UTC time`, { line, hint: HINT });
    const deg = Number((r.compass_deg ?? '').trim());
    if (!(Number.isFinite(deg) && deg >= 0 && deg <= 360) || (r.compass_deg ?? '').trim() === '') throw new InputError(file, `compass reading '${r.compass_deg ?? ''}' is not 0 to 360 degrees`, { line, hint: HINT });
    t.push(ms / 1000);
    c.push(deg % 360);
  });
  if (t.length < 6) throw new InputError(file, `only ${t.length} reading(s): the fit of period, damping, swirl and pendulosity needs at least 6`, { hint: HINT });
  return { t: Float64Array.from(t), compassDeg: Float64Array.from(c) };
}
