// Which reader a file needs, decided from its content (never from its name).
import { ParseError } from '../errors.js';
import type { LogFormat } from '../log/flightLog.js';
import { headerTokens, roleOfHeader } from './csvColumns.js';
import { CSV_DELIMITERS, type CsvDelimiter } from './csvDialect.js';
import { decodeText, hasUtf16Bom } from './decodeText.js';

/** Human list of what can be read, for hints. */
export const SUPPORTED_FORMATS_HINT =
  'supported: GPX 1.1 track, CSV/delimited text with a header (time, lat, lon, ...), IGC, NMEA 0183, FIT, KML 2.2 gx:Track';

/** How many leading bytes the detector looks at. */
export const DETECT_BYTES = 65536;

/**
 * FIT file header: byte 0 header size (12 or 14), bytes 8-11 the ASCII data type ".FIT".
 * Source: Garmin FIT SDK, "FIT Protocol" document, section 3.3.1 File Header.
 */
export function looksLikeFit(bytes: Uint8Array): boolean {
  return (
    bytes.length >= 12 &&
    (bytes[0] === 12 || bytes[0] === 14) &&
    bytes[8] === 0x2e && // '.'
    bytes[9] === 0x46 && // 'F'
    bytes[10] === 0x49 && // 'I'
    bytes[11] === 0x54 // 'T'
  );
}

/**
 * Whether bytes look like binary data rather than text: any NUL byte, or more than 2 % control bytes
 * other than tab/CR/LF/FF (common practice, as file(1)-style detectors do). UTF-8 multibyte is text.
 */
export function looksBinary(bytes: Uint8Array): boolean {
  const n = Math.min(bytes.length, DETECT_BYTES);
  let control = 0;
  for (let i = 0; i < n; i++) {
    const b = bytes[i];
    if (b === 0) return true;
    if (b < 32 && b !== 9 && b !== 10 && b !== 13 && b !== 12) control++;
    else if (b === 127) control++;
  }
  return n > 0 && control / n > 0.02;
}

const NMEA_SENTENCE = /^\s*(?:[^$!]{0,40}?)[$!][A-Z]{2}[A-Z]{3},/;
const IGC_A_RECORD = /^A[A-Z0-9]{3}/;
const IGC_B_RECORD = /^B\d{6}\d{7}[NS]\d{8}[EW][AV]/;

/**
 * A header line and data lines that split into the same number (≥ 2) of fields on one of , ; tab |; or a
 * lone line of at least 3 such fields (a header without data: the CSV reader then says so, which tells the
 * user more than "not a flight log").
 */
function looksDelimited(lines: string[]): boolean {
  const body = lines.filter((l) => !l.startsWith('#'));
  if (body.length === 1) return CSV_DELIMITERS.some((d) => body[0].split(d).length >= 3);
  if (body.length < 2) return false;
  for (const d of CSV_DELIMITERS) {
    const fields = (l: string) => l.split(d).length;
    const n = fields(body[0]);
    if (n < 2) continue;
    const rest = body.slice(1, 50);
    const same = rest.filter((l) => fields(l) === n).length;
    if (same >= Math.max(1, rest.length / 2)) return true;
  }
  return false;
}

const DELIMITER_NAMES: Record<CsvDelimiter, string> = { ',': 'comma', ';': 'semicolon', '\t': 'tab', '|': 'bar' };

/**
 * For text that is not a log: a first line that splits on one delimiter into ≥ 3 columns, two of them named as
 * latitude and longitude (roleOfHeader), and the first later line (1-based, blank and '#' lines counted) that
 * splits into a different number of fields. A ragged CSV log then gets that line instead of "not a flight log".
 */
function raggedRowOfCsvHeader(text: string): { line: number; fields: number; headerFields: number; delimiter: CsvDelimiter } | undefined {
  const lines = text.split(/\r\n|\n|\r/).slice(0, 200);
  const body = lines.map((l, k) => ({ l, line: k + 1 })).filter(({ l }) => l.trim().length > 0 && !l.startsWith('#'));
  if (body.length < 2) return undefined;
  for (const d of CSV_DELIMITERS) {
    const header = body[0].l.split(d);
    if (header.length < 3) continue;
    const roles = new Set(header.map((h) => roleOfHeader(new Set(headerTokens(h)))));
    if (!roles.has('lat') || !roles.has('lon')) continue;
    const ragged = body.slice(1).find(({ l }) => l.split(d).length !== header.length);
    if (ragged) return { line: ragged.line, fields: ragged.l.split(d).length, headerFields: header.length, delimiter: d };
  }
  return undefined;
}

/**
 * Decides the format of a text log from its first part (`head`, e.g. the first 64 kB):
 * XML whose root is <gpx> → gpx, <kml> → kml; an IGC A record followed by B fixes → igc;
 * mostly NMEA 0183 sentences ($ttsss,...) → nmea; else a header line split by , ; tab or | → csv.
 * @throws ParseError "not a flight log this tool can read" with a hint naming the supported formats.
 */
export function detectTextFormat(head: string): LogFormat {
  const text = head.charCodeAt(0) === 0xfeff ? head.slice(1) : head;
  const trimmed = text.trimStart();
  if (trimmed.startsWith('<')) {
    // Skip the XML declaration, comments, processing instructions and DOCTYPE to the root element.
    const root = /<([A-Za-z_][\w.-]*:)?([A-Za-z_][\w.-]*)[\s>/]/.exec(trimmed.replace(/<\?[\s\S]*?\?>|<!--[\s\S]*?-->|<![^>]*>/g, ''));
    const name = root ? root[2].toLowerCase() : '';
    if (name === 'gpx') return 'gpx';
    if (name === 'kml') return 'kml';
    throw new ParseError(name ? `an XML file whose root element is <${root![0].slice(1, -1).trim()}>, not a flight log this tool can read` : 'an XML file, not a flight log this tool can read', {
      hint: SUPPORTED_FORMATS_HINT,
    });
  }
  const lines = text.split(/\r\n|\n|\r/).filter((l) => l.trim().length > 0);
  if (lines.length === 0) throw new ParseError('the file holds only white space', { hint: SUPPORTED_FORMATS_HINT });
  const sample = lines.slice(0, 200);
  if (IGC_A_RECORD.test(sample[0]) && sample.some((l) => IGC_B_RECORD.test(l) || /^H[FOP]/.test(l))) return 'igc';
  if (sample.some((l) => IGC_B_RECORD.test(l)) && sample.some((l) => /^HFDTE/.test(l))) return 'igc';
  const nmea = sample.filter((l) => NMEA_SENTENCE.test(l)).length;
  if (nmea > 0 && nmea >= sample.length / 2) return 'nmea';
  if (looksDelimited(sample)) return 'csv';
  const ragged = raggedRowOfCsvHeader(text);
  if (ragged) {
    const { line, fields, headerFields, delimiter } = ragged;
    throw new ParseError(`the header names latitude and longitude in ${headerFields} ${DELIMITER_NAMES[delimiter]}-separated columns, but this row has ${fields} field(s)`, {
      line,
      hint: 'give every row one value per header column, split by the same delimiter; quote a value that holds the delimiter',
    });
  }
  throw new ParseError('not a flight log this tool can read', { hint: SUPPORTED_FORMATS_HINT });
}

/**
 * Decides the format of a file from its first bytes: FIT by its binary header, else (if the bytes are
 * text) by detectTextFormat. Binary data that is not FIT is refused.
 * @throws ParseError "not a flight log this tool can read" with a hint naming the supported formats.
 */
export function detectFormat(bytes: Uint8Array): LogFormat {
  if (looksLikeFit(bytes)) return 'fit';
  if (bytes.length >= 4 && bytes[0] === 0x50 && bytes[1] === 0x4b && bytes[2] === 0x03 && bytes[3] === 0x04) {
    // ZIP local file header signature "PK\3\4" (PKWARE APPNOTE §4.3.7): a KMZ is a zipped KML.
    throw new ParseError('a ZIP archive (a KMZ?), not a flight log this tool can read directly', {
      hint: 'unzip it and give the .kml inside; ' + SUPPORTED_FORMATS_HINT,
    });
  }
  if (hasUtf16Bom(bytes)) return detectTextFormat(decodeText(bytes.subarray(0, DETECT_BYTES)));
  if (looksBinary(bytes)) {
    throw new ParseError('binary data, not a flight log this tool can read', { hint: SUPPORTED_FORMATS_HINT });
  }
  const head = new TextDecoder('utf-8', { fatal: false }).decode(bytes.subarray(0, DETECT_BYTES));
  return detectTextFormat(head);
}
