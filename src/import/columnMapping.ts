// Parsing a CSV column mapping given on the command line or in a small file.
import { OptionError } from '../errors.js';
import { CSV_ROLES, type CsvRole } from './csvColumns.js';

/**
 * Parses a column mapping: `time=Zeit,lat=Breite,alt_ft=Hoehe` (the --columns form), the same one pair
 * per line (`time = Zeit`, `lat: Breite`; blank lines and `#` comments ignored), or a JSON object
 * `{"time": "Zeit", ...}`. Keys are roles (time, date, lat, lon, alt, gs, track, heading, roll, pitch, tas,
 * ias, hacc), optionally with a unit after `_` (alt_ft, gs_kt, heading_mag, time_ms); values are header
 * names as written in the file (surrounding quotes removed).
 * @throws OptionError('columns', ...) naming the bad pair.
 */
export function parseColumnMapping(text: string): Record<string, string> {
  const trimmed = text.trim();
  const out: Record<string, string> = {};
  let pairs: Array<[string, string]>;
  if (trimmed.startsWith('{')) {
    let obj: unknown;
    try {
      obj = JSON.parse(trimmed);
    } catch (err) {
      throw new OptionError('columns', `not valid JSON: ${(err as Error).message}`);
    }
    if (obj === null || typeof obj !== 'object' || Array.isArray(obj)) throw new OptionError('columns', 'the JSON must be an object of role: column name');
    pairs = Object.entries(obj as Record<string, unknown>).map(([k, v]) => {
      if (typeof v !== 'string') throw new OptionError('columns', `the column name for "${k}" must be a string`);
      return [k, v];
    });
  } else {
    pairs = [];
    for (const part of trimmed.split(/[\r\n]+|,(?=[^,=:]+[=:])/)) {
      const p = part.trim();
      if (p === '' || p.startsWith('#')) continue;
      const m = /^([A-Za-z_]+)\s*[=:]\s*(.+)$/.exec(p);
      if (!m) throw new OptionError('columns', `"${p}" is not role=column (e.g. time=Zeit)`);
      pairs.push([m[1], m[2].trim().replace(/^"(.*)"$/, '$1').replace(/^'(.*)'$/, '$1')]);
    }
  }
  for (const [key, name] of pairs) {
    const role = key.toLowerCase().split('_')[0] as CsvRole;
    if (!CSV_ROLES.includes(role)) {
      throw new OptionError('columns', `"${key}" is not a column role; use ${CSV_ROLES.join(', ')} (a unit may follow, e.g. alt_ft)`);
    }
    if (name.length === 0) throw new OptionError('columns', `no column name given for "${key}"`);
    out[key.toLowerCase()] = name;
  }
  return out;
}
