// Which CSV column holds what, in which unit: read from the header names (or a user's column mapping).
import { FT_M, KT_MS } from '../constants.js';
import { OptionError, ParseError } from '../errors.js';
import type { FlightLog, LogWarning, OptionalColumn } from '../log/flightLog.js';

/** What a column can mean. */
export type CsvRole =
  | 'time'
  | 'date'
  | 'lat'
  | 'lon'
  | 'alt'
  | 'gs'
  | 'track'
  | 'heading'
  | 'roll'
  | 'pitch'
  | 'tas'
  | 'ias'
  | 'hacc';

export const CSV_ROLES: readonly CsvRole[] = ['time', 'date', 'lat', 'lon', 'alt', 'gs', 'track', 'heading', 'roll', 'pitch', 'tas', 'ias', 'hacc'];

/** Time column encodings. 'auto' is decided from the first value. */
export type CsvTimeKind = 'auto' | 'iso' | 'epoch-s' | 'epoch-ms' | 'epoch-us' | 'time-of-day';

/** One used column: its index, header text, and the factor that turns its values into SI (or degrees). */
export interface CsvColumn {
  role: CsvRole;
  index: number;
  header: string;
  /** Multiply a value by this to get m, m/s or degrees (1 when already so). */
  toSi: number;
  /** The unit as understood, for messages: 'm', 'ft', 'kt', 'm/s', 'km/h', 'mph', 'deg', 'rad', ... */
  unit: string;
  /** Whether the unit was assumed because neither the header nor the mapping named one. */
  unitAssumed: boolean;
}

/** The column plan of one CSV file. */
export interface CsvPlan {
  columns: Partial<Record<CsvRole, CsvColumn>>;
  timeKind: CsvTimeKind;
  headingRef?: 'true' | 'magnetic';
  altDatum: FlightLog['source']['altDatum'];
  warnings: LogWarning[];
}

/** FlightLog column filled by each optional role. */
export const ROLE_COLUMN: Partial<Record<CsvRole, OptionalColumn>> = {
  gs: 'gsMs',
  track: 'trackDegTrue',
  heading: 'headingDeg',
  roll: 'rollDeg',
  pitch: 'pitchDeg',
  tas: 'tasMs',
  ias: 'iasMs',
  hacc: 'hAccM',
};

/** Lower-case word tokens of a header: `GPS Alt (ft)` → gps alt ft, `altitudeFt` → altitude ft, `m/s` → m s. */
export function headerTokens(header: string): string[] {
  return header
    .normalize('NFD')
    .replace(/[\u0300-\u036f]/g, '') // Höhe → Hohe, Länge → Lange (diacritics dropped)
    .replace(/ß/g, 'ss')
    .replace(/([a-z])([A-Z])/g, '$1 $2')
    .toLowerCase()
    .replace(/°/g, ' deg ')
    .split(/[^a-z0-9]+/)
    .filter((s) => s.length > 0);
}

type Tokens = Set<string>;
const any = (tk: Tokens, ...words: string[]) => words.some((w) => tk.has(w));

/** Role suggested by a header's tokens, or undefined. Order matters: specific names before generic ones. */
export function roleOfHeader(tk: Tokens): CsvRole | undefined {
  // Quantities that share words with ours but are something else (wind speed, vertical speed, height above
  // ground, accelerations, rates, our own derived compass columns, dilution of precision).
  if (
    any(tk, 'wind', 'vertical', 'vs', 'vsi', 'climb', 'vario', 'vspeed', 'agl', 'elapsed', 'duration', 'delta') ||
    any(tk, 'hdop', 'vdop', 'pdop', 'accel', 'acceleration', 'rate', 'compass', 'variation', 'dip', 'error', 'err') ||
    any(tk, 'deviation', 'static', 'lateral', 'longitudinal', 'g', 'load')
  ) {
    return undefined;
  }
  if (any(tk, 'tas', 'ktas') || (tk.has('true') && any(tk, 'airspeed', 'air'))) return 'tas';
  if (any(tk, 'ias', 'kias', 'cas', 'airspeed', 'indicated') || (tk.has('air') && tk.has('speed'))) return 'ias';
  // English, then German and French spellings (diacritics dropped by headerTokens).
  if (any(tk, 'lat', 'latitude', 'breite', 'breitengrad')) return 'lat';
  if (any(tk, 'lon', 'lng', 'long', 'longitude', 'lange', 'laenge', 'langengrad', 'laengengrad')) return 'lon';
  if (any(tk, 'roll', 'bank', 'rollwinkel', 'querneigung', 'roulis', 'inclinaison')) return 'roll';
  if (any(tk, 'pitch', 'nick', 'nickwinkel', 'tangage', 'assiette')) return 'pitch';
  if (any(tk, 'heading', 'hdg', 'yaw', 'steuerkurs', 'cap')) return 'heading';
  if (any(tk, 'track', 'trk', 'course', 'cog', 'crs', 'kurs') && !any(tk, 'name', 'id', 'number')) return 'track';
  if (any(tk, 'gs', 'groundspeed', 'speed', 'spd', 'sog', 'velocity', 'vel', 'geschwindigkeit', 'vitesse')) return 'gs';
  if (any(tk, 'hacc', 'eph', 'accuracy', 'acc', 'genauigkeit')) return 'hacc';
  if (any(tk, 'alt', 'altitude', 'elevation', 'ele', 'height', 'msl', 'gpsalt', 'altm', 'altft', 'hohe', 'hoehe')) return 'alt';
  if (any(tk, 'time', 'timestamp', 'datetime', 'utc', 'epoch', 'unix', 'timeutc', 'zeit', 'uhrzeit', 'zeitstempel', 'heure', 'horodatage')) return 'time';
  if (any(tk, 'date', 'datum')) return 'date';
  return undefined;
}

function speedUnit(tk: Tokens): [number, string] | undefined {
  if (any(tk, 'kt', 'kts', 'knot', 'knots', 'kn', 'ktas', 'kias')) return [KT_MS, 'kt'];
  if (any(tk, 'kmh', 'kph', 'kmph') || (tk.has('km') && tk.has('h'))) return [1000 / 3600, 'km/h'];
  if (tk.has('mph')) return [1609.344 / 3600, 'mph'];
  if (tk.has('fps') || (tk.has('ft') && tk.has('s'))) return [FT_M, 'ft/s'];
  if (any(tk, 'ms', 'mps') || (tk.has('m') && tk.has('s'))) return [1, 'm/s'];
  return undefined;
}

function lengthUnit(tk: Tokens): [number, string] | undefined {
  if (any(tk, 'ft', 'feet', 'foot', 'altft')) return [FT_M, 'ft'];
  if (any(tk, 'm', 'meter', 'meters', 'metre', 'metres', 'altm')) return [1, 'm'];
  return undefined;
}

/** Unit of a column of the given role from its tokens: [factor to SI, unit name, assumed?]. */
function unitOf(role: CsvRole, tk: Tokens): [number, string, boolean] {
  switch (role) {
    case 'alt':
    case 'hacc': {
      const u = lengthUnit(tk);
      return u ? [u[0], u[1], false] : [1, 'm', true];
    }
    case 'gs':
    case 'tas':
    case 'ias': {
      const u = speedUnit(tk);
      if (u) return [u[0], u[1], false];
      // IAS/TAS from an air-data computer are knots in practice; GNSS speed is m/s (common practice).
      return role === 'gs' ? [1, 'm/s', true] : [KT_MS, 'kt', true];
    }
    case 'lat':
    case 'lon':
    case 'track':
    case 'heading':
    case 'roll':
    case 'pitch':
      return any(tk, 'rad', 'radian', 'radians') ? [180 / Math.PI, 'rad', false] : [1, 'deg', false];
    default:
      return [1, '', false];
  }
}

function timeKindOf(tk: Tokens): CsvTimeKind {
  if (any(tk, 'ms', 'millis', 'milliseconds', 'msec')) return 'epoch-ms';
  if (any(tk, 'us', 'micros', 'microseconds', 'usec')) return 'epoch-us';
  if (any(tk, 's', 'sec', 'secs', 'seconds')) return 'epoch-s';
  return 'auto';
}

const ROLE_NAMES: Record<CsvRole, string> = {
  time: 'time',
  date: 'date',
  lat: 'latitude',
  lon: 'longitude',
  alt: 'altitude',
  gs: 'ground speed',
  track: 'track',
  heading: 'heading',
  roll: 'bank',
  pitch: 'pitch',
  tas: 'true airspeed',
  ias: 'indicated airspeed',
  hacc: 'horizontal accuracy',
};

/**
 * Decides which column holds what. `headers` are the header fields as written; `mapping` (role → header,
 * e.g. `{ time: 'Zeit', lat: 'Breite', alt_ft: 'Hoehe' }`) overrides the guess for the roles it names; a
 * mapping key may carry a unit after an underscore (alt_ft, gs_kt, gs_kmh, heading_mag, time_ms).
 * Units come from the mapping key, else from the header words; where neither names one the plan says
 * the unit was assumed (m for heights, m/s for ground speed, kt for air speeds) and warns.
 * @throws OptionError for a mapping key that is no role; ParseError (line = headerLine) when a mapped
 *   column is absent or there is no time, latitude or longitude column.
 */
export function planCsvColumns(
  headers: string[],
  headerLine: number,
  mapping?: Record<string, string>,
  headingRefOption?: 'true' | 'magnetic',
): CsvPlan {
  const warnings: LogWarning[] = [];
  const columns: Partial<Record<CsvRole, CsvColumn>> = {};
  const mapped = new Set<number>();
  const keyTokens = new Map<CsvRole, Tokens>();
  const trimmed = headers.map((h) => h.trim());

  for (const [key, name] of Object.entries(mapping ?? {})) {
    const ktk = headerTokens(key);
    const role = ktk[0] as CsvRole;
    if (!CSV_ROLES.includes(role)) {
      throw new OptionError('columns', `"${key}" is not a column role; use ${CSV_ROLES.join(', ')} (a unit may follow, e.g. alt_ft)`);
    }
    const index = trimmed.findIndex((h) => h === name.trim());
    const index2 = index >= 0 ? index : trimmed.findIndex((h) => h.toLowerCase() === name.trim().toLowerCase());
    if (index2 < 0) {
      throw new ParseError(`the column mapping names "${name}" for ${key}, but the header has no such column`, {
        line: headerLine,
        hint: `the columns are: ${trimmed.join(', ')}`,
      });
    }
    mapped.add(index2);
    keyTokens.set(role, new Set(ktk.slice(1)));
    columns[role] = { role, index: index2, header: trimmed[index2], toSi: 1, unit: '', unitAssumed: false };
  }

  const also: string[] = [];
  trimmed.forEach((header, index) => {
    if (mapped.has(index)) return;
    const role = roleOfHeader(new Set(headerTokens(header)));
    if (role === undefined) return;
    if (keyTokens.has(role)) return;
    const prior = columns[role];
    if (prior) {
      // Prefer a satellite (GNSS) altitude over a pressure altitude when both are logged.
      const priorTk = new Set(headerTokens(prior.header));
      if (role === 'alt' && any(priorTk, 'baro', 'pressure', 'press', 'qnh', 'std') && !any(new Set(headerTokens(header)), 'baro', 'pressure', 'press', 'qnh', 'std')) {
        also.push(`"${prior.header}"`);
        columns[role] = { role, index, header, toSi: 1, unit: '', unitAssumed: false };
      } else {
        also.push(`"${header}"`);
      }
      return;
    }
    columns[role] = { role, index, header, toSi: 1, unit: '', unitAssumed: false };
  });

  let timeKind: CsvTimeKind = 'auto';
  let headingRef: 'true' | 'magnetic' | undefined;
  let altDatum: CsvPlan['altDatum'] = 'unknown';
  for (const col of Object.values(columns)) {
    if (!col) continue;
    const tk = new Set([...headerTokens(col.header), ...(keyTokens.get(col.role) ?? [])]);
    const keyTk = keyTokens.get(col.role);
    const unitTk = keyTk && keyTk.size > 0 ? keyTk : tk;
    const [toSi, unit, assumed] = unitOf(col.role, unitTk);
    col.toSi = toSi;
    col.unit = unit;
    col.unitAssumed = assumed;
    if (col.role === 'time') timeKind = timeKindOf(unitTk);
    if (col.role === 'heading') {
      if (any(unitTk, 'mag', 'magnetic', 'hdm')) headingRef = 'magnetic';
      else if (any(unitTk, 'true', 'tru', 'hdt')) headingRef = 'true';
    }
    if (col.role === 'alt') {
      if (any(tk, 'baro', 'pressure', 'press', 'std')) altDatum = 'pressure';
      else if (any(tk, 'ellipsoid', 'hae', 'wgs84', 'ellipsoidal')) altDatum = 'ellipsoid';
      else if (any(tk, 'msl', 'amsl', 'geoid', 'orthometric')) altDatum = 'msl';
    }
    if (col.role === 'track' && any(tk, 'mag', 'magnetic')) {
      warnings.push({
        code: 'magnetic-track-ignored',
        message: `Column "${col.header}" looks like a magnetic track; only true tracks are used, so it is ignored.`,
      });
      delete columns.track;
    }
  }
  if (headingRefOption !== undefined) headingRef = headingRefOption;
  if (columns.heading && headingRef === undefined) {
    headingRef = 'magnetic';
    warnings.push({
      code: 'heading-reference-assumed',
      message: `The header "${columns.heading.header}" does not say whether the heading is true or magnetic; it is taken as magnetic (as cockpit heading displays show).`,
    });
  }
  for (const col of Object.values(columns)) {
    if (col?.unitAssumed) {
      warnings.push({
        code: 'unit-assumed',
        message: `The header "${col.header}" names no unit; its ${ROLE_NAMES[col.role]} values are taken as ${col.unit}.`,
      });
    }
  }
  if (also.length > 0) {
    warnings.push({ code: 'column-unused', message: `Columns ${also.join(', ')} repeat a quantity already read from another column and are not used.` });
  }

  const missing = (['time', 'lat', 'lon'] as const).filter((r) => !columns[r]);
  if (missing.length > 0) {
    const what = missing.map((r) => ROLE_NAMES[r]).join(' and ');
    const hint =
      missing[0] === 'time'
        ? 'the file needs a column of UTC times, e.g. "time" with ISO 8601 values like 2026-05-04T10:11:12Z or Unix seconds; name it time/timestamp/time_utc or map it with --columns time=<column>'
        : `name the columns lat and lon (decimal degrees) or map them with --columns lat=<column>,lon=<column>`;
    throw new ParseError(`no ${what} column found among the columns: ${trimmed.join(', ')}`, { line: headerLine, hint });
  }
  return { columns, timeKind, headingRef, altDatum, warnings };
}
