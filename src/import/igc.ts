// IGC flight recorder files (FAI) to FlightLog columns: A, H, I and B records.
//
// Source: FAI/IGC "Technical Specification for IGC-approved GNSS Flight Recorders", Appendix A (the IGC
// data file format). Checks below name the part of the specification they rest on; statements marked
// [from memory] were not verified against the text of the specification while writing this reader.
import { ParseError } from '../errors.js';
import type { FlightLog, LogMeta, LogWarning, OptionalColumn } from '../log/flightLog.js';
import { LineTally, plural, pushTally } from '../log/logWarnings.js';
import { forEachLine } from './forEachLine.js';
import { parseIsoDate } from './isoTime.js';
import { LogBuilder } from './logBuilder.js';
import { toPlainText } from './plainText.js';

/** Options of the IGC reader. */
export interface IgcOptions {
  /** Date YYYY-MM-DD (UTC) to use when the file has no HFDTE header. */
  date?: string;
}

/** One B-record extension declared by the I record: 1-based first and last byte, three-letter code. */
interface IgcExtension {
  first: number;
  last: number;
  code: string;
}

/** km/h to m/s. */
const KMH_MS = 1000 / 3600;

/**
 * B-record extensions read into FlightLog columns. Appendix A three-letter codes [units from memory]:
 * FXA fix accuracy (EPE, 2-sigma, metres) → hAccM as 1-sigma (FXA / 2); TAS/IAS airspeed true/indicated,
 * km/h; GSP ground speed, km/h; HDT/HDM heading true/magnetic, degrees; TRT track true, degrees.
 */
const EXTENSION_COLUMNS: Record<string, { column: OptionalColumn; toSi: number }> = {
  FXA: { column: 'hAccM', toSi: 0.5 },
  TAS: { column: 'tasMs', toSi: KMH_MS },
  IAS: { column: 'iasMs', toSi: KMH_MS },
  GSP: { column: 'gsMs', toSi: KMH_MS },
  TRT: { column: 'trackDegTrue', toSi: 1 },
  HDT: { column: 'headingDeg', toSi: 1 },
  HDM: { column: 'headingDeg', toSi: 1 },
};

/**
 * HFDTE date header, both forms: the original `HFDTEDDMMYY` and the 2015+ `HFDTEDATE:DDMMYY,NN`
 * (NN = flight of the day) — Appendix A, H record, "HFDTE". Returns 00:00 UTC of that day [s] or NaN.
 * Two-digit years: 80-99 → 19YY, 00-79 → 20YY (IGC files exist only since 1995; common practice).
 */
export function parseIgcDate(line: string): number {
  const m = /^HFDTE(?:DATE)?:?\s*(\d{2})(\d{2})(\d{2})/.exec(line);
  if (!m) return NaN;
  const yy = +m[3];
  const year = yy >= 80 ? 1900 + yy : 2000 + yy;
  return parseIsoDate(`${year}-${m[2]}-${m[1]}`);
}

/** Latitude DDMMmmm + N/S or longitude DDDMMmmm + E/W (Appendix A, B record) to degrees; NaN if malformed. */
function igcAngle(digits: string, hemi: string, degDigits: number, extraMilli: string): number {
  if (!/^\d+$/.test(digits)) return NaN;
  const deg = +digits.slice(0, degDigits);
  const min = +digits.slice(degDigits, degDigits + 2);
  const milli = digits.slice(degDigits + 2) + extraMilli;
  if (min >= 60) return NaN;
  const minutes = min + Number(`0.${milli}`);
  const v = deg + minutes / 60;
  if (hemi === 'S' || hemi === 'W') return -v;
  if (hemi === 'N' || hemi === 'E') return v;
  return NaN;
}

/** A 5-character altitude field (metres, may start with '-'); NaN if malformed. */
function igcAltitude(field: string): number {
  return /^(?:\d{5}|-\d{4})$/.test(field) ? Number(field) : NaN;
}

/**
 * Reads an IGC file (format 'igc'). t from the B-record UTC time and the HFDTE date, rolling over at UTC
 * midnight; lat/lon [deg] from the B record (WGS-84, Appendix A); altM from the GNSS altitude where the
 * file has one, else from the pressure altitude (ISA 1013.25 hPa, altDatum 'pressure'), with a warning
 * saying which. I-record extensions FXA, TAS, IAS, GSP, TRT, HDT, HDM (and LAD/LOD extra decimals of the
 * minutes, TDS decimal seconds) fill the optional columns. Fixes flagged V (no 3-D fix) are left out.
 * @throws ParseError when the file has no B records or no date (and `opts.date` is not given).
 */
export function parseIgc(text: string, file: string, opts: IgcOptions = {}): FlightLog {
  const warnings: LogWarning[] = [];
  const meta: LogMeta = {};
  const badFix = new LineTally();
  const noFix = new LineTally();
  const outOfRange = new LineTally();
  let extensions: IgcExtension[] = [];
  let dateS = NaN;
  let dateLine = 0;
  let altGpsDatum: FlightLog['source']['altDatum'] = 'unknown';
  let gliderType = '';
  let gliderId = '';
  let sawA = false;
  let firstLine = '';
  let recordsRead = 0;
  let lastLine = 0;
  // Raw per-fix values kept until the altitude source is chosen at the end.
  const rows = new LogBuilder(4096);
  const pressAlt: number[] = [];
  let gnssValid = 0;
  let headingSeen: 'HDT' | 'HDM' | undefined;
  let prevTod = NaN;
  let dayOffset = 0;
  const optDate = opts.date !== undefined ? parseIsoDate(opts.date) : NaN;

  let shortFixLine = 0; // a B record too short to read, reported once we know whether it was the cut-off last line
  const ended = forEachLine(text, (raw, lineNo) => {
    if (shortFixLine > 0) {
      badFix.add(shortFixLine);
      shortFixLine = 0;
    }
    const line = raw.trimEnd();
    lastLine = lineNo;
    if (lineNo === 1) firstLine = line;
    const kind = line.charAt(0);
    if (kind === 'A') sawA = true;
    else if (kind === 'H') {
      if (line.startsWith('HFDTE') && !Number.isFinite(dateS)) {
        dateS = parseIgcDate(line);
        dateLine = lineNo;
      } else if (/^H[FOP]PLT/.test(line)) meta.pilot = toPlainText(afterColon(line.slice(5)));
      else if (/^H[FOP]GTY/.test(line)) gliderType = afterColon(line.slice(5));
      else if (/^H[FOP]GID/.test(line)) gliderId = afterColon(line.slice(5));
      else if (/^H[FOP]FTY/.test(line)) meta.device = toPlainText(afterColon(line.slice(5)));
      else if (/^H[FOP]ALG/.test(line)) {
        // HFALGALTGPS: GEO (geoid, i.e. mean sea level) or ELL (WGS-84 ellipsoid) — Appendix A H record.
        const v = afterColon(line.slice(5)).toUpperCase();
        if (v.startsWith('GEO')) altGpsDatum = 'msl';
        else if (v.startsWith('ELL')) altGpsDatum = 'ellipsoid';
      } else if (/^H[FOP]DTM/.test(line)) {
        const v = line.toUpperCase();
        if (!v.includes('WGS') && !v.includes('100')) {
          warnings.push({ code: 'igc-datum', message: `The file names a datum other than WGS-84 (line ${lineNo}); positions are read as WGS-84.`, lines: [lineNo] });
        }
      }
    } else if (kind === 'I' && extensions.length === 0) {
      extensions = parseIRecord(line, lineNo, warnings);
    } else if (kind === 'B') {
      recordsRead++;
      readFix(line, lineNo);
    }
  });

  function readFix(line: string, lineNo: number): void {
    // B HHMMSS DDMMmmmN DDDMMmmmE V PPPPP GGGGG: 35 bytes (Appendix A, B record).
    if (line.length < 35) {
      shortFixLine = lineNo;
      return;
    }
    const hh = +line.slice(1, 3);
    const mm = +line.slice(3, 5);
    const ss = +line.slice(5, 7);
    if (!/^\d{6}$/.test(line.slice(1, 7)) || hh > 23 || mm > 59 || ss > 59) {
      badFix.add(lineNo);
      return;
    }
    const ext = (code: string) => {
      const e = extensions.find((x) => x.code === code);
      return e && line.length >= e.last ? line.slice(e.first - 1, e.last) : undefined;
    };
    const lad = ext('LAD') ?? '';
    const lod = ext('LOD') ?? '';
    const lat = igcAngle(line.slice(7, 14), line.charAt(14), 2, /^\d*$/.test(lad) ? lad : '');
    const lon = igcAngle(line.slice(15, 23), line.charAt(23), 3, /^\d*$/.test(lod) ? lod : '');
    if (!Number.isFinite(lat) || !Number.isFinite(lon)) {
      badFix.add(lineNo);
      return;
    }
    if (Math.abs(lat) > 90 || Math.abs(lon) > 180) {
      outOfRange.add(lineNo);
      return;
    }
    const validity = line.charAt(24);
    if (validity === 'V') {
      // "V = 2D or no GNSS data" (Appendix A, B record fix validity): not a usable 3-D fix.
      noFix.add(lineNo);
      return;
    }
    if (validity !== 'A') {
      badFix.add(lineNo);
      return;
    }
    let tod = hh * 3600 + mm * 60 + ss;
    const tds = ext('TDS');
    if (tds !== undefined && /^\d+$/.test(tds)) tod += Number(`0.${tds}`);
    // UTC midnight: B records are in time order (Appendix A), so a time of day more than 12 h earlier
    // than the previous fix belongs to the next UTC day.
    if (Number.isFinite(prevTod) && tod < prevTod - 43200) dayOffset += 86400;
    prevTod = tod;
    const pAlt = igcAltitude(line.slice(25, 30));
    const gAlt = igcAltitude(line.slice(30, 35));
    if (Number.isFinite(gAlt) && gAlt !== 0) gnssValid++;
    rows.addRow(tod + dayOffset, lat, lon, gAlt, lineNo);
    pressAlt.push(pAlt);
    for (const e of extensions) {
      const spec = EXTENSION_COLUMNS[e.code];
      if (!spec) continue;
      if (e.code === 'HDM' && extensions.some((x) => x.code === 'HDT')) continue; // true heading preferred
      const field = line.length >= e.last ? line.slice(e.first - 1, e.last) : '';
      const v = /^-?\d+$/.test(field) ? Number(field) * spec.toSi : NaN;
      rows.set(spec.column, v);
      if (e.code === 'HDT' || e.code === 'HDM') headingSeen = e.code;
    }
  }

  if (!sawA && !firstLine.startsWith('A')) {
    warnings.push({ code: 'igc-no-a-record', message: 'The file does not start with an A record (recorder identification); read anyway.' });
  }
  let truncated = false;
  if (shortFixLine > 0 && (ended || shortFixLine !== lastLine)) badFix.add(shortFixLine);
  else if (shortFixLine > 0) {
    // The last fix was cut off mid-record.
    truncated = true;
    warnings.push({
      code: 'file-truncated',
      message: `The file ends in the middle of a fix record at line ${lastLine}: it was probably cut off while being written; that fix is left out.`,
      lines: [lastLine],
    });
  }
  pushTally(warnings, 'igc-bad-fix', `${plural(badFix.count, 'B record')} that could not be read left out`, badFix);
  pushTally(warnings, 'igc-no-fix', `${plural(noFix.count, 'fix', 'fixes')} flagged V (no 3-D GNSS fix) left out`, noFix);
  pushTally(warnings, 'igc-out-of-range', `${plural(outOfRange.count, 'fix', 'fixes')} with a latitude or longitude out of range left out`, outOfRange);

  if (recordsRead === 0) {
    throw new ParseError('the IGC file has no fix (B) records', { hint: 'the recorder may not have had a GNSS fix during the flight' });
  }
  if (!Number.isFinite(dateS)) {
    if (!Number.isFinite(optDate)) {
      throw new ParseError(dateLine > 0 ? 'the HFDTE date header cannot be read' : 'the IGC file has no HFDTE date header', {
        line: dateLine > 0 ? dateLine : undefined,
        hint: 'give the UTC date of the flight (YYYY-MM-DD) as an option',
      });
    }
    dateS = optDate;
    warnings.push({ code: 'igc-date-from-option', message: `The file has no usable HFDTE date; the date given (${opts.date}) is used.` });
  }

  const log = rows.build(
    {
      format: 'igc',
      file,
      warnings,
      meta,
      altDatum: 'unknown',
      reader: { recordsRead, recordsDropped: badFix.count + noFix.count + outOfRange.count + (truncated ? 1 : 0), truncated },
    },
    headingSeen === 'HDM' ? 'magnetic' : 'true',
  );
  for (let i = 0; i < log.t.length; i++) log.t[i] += dateS;
  // Altitude: GNSS preferred; the pressure altitude only when the file has no usable GNSS altitude.
  if (gnssValid > 0) {
    for (let i = 0; i < log.altM.length; i++) if (log.altM[i] === 0) log.altM[i] = NaN;
    log.source.altDatum = altGpsDatum;
    warnings.push({ code: 'altitude-source', message: 'Heights are the GNSS altitudes of the file.' });
  } else {
    log.altM.set(pressAlt);
    log.source.altDatum = 'pressure';
    warnings.push({
      code: 'altitude-source',
      message: 'The file has no GNSS altitudes; heights are its pressure altitudes (ISA, 1013.25 hPa), not heights above sea level.',
    });
  }
  const aircraft = [gliderType, gliderId].map((s) => s.trim()).filter((s) => s.length > 0).join(' ');
  if (aircraft) meta.aircraft = toPlainText(aircraft);
  return log;
}

function afterColon(s: string): string {
  const i = s.indexOf(':');
  return (i >= 0 ? s.slice(i + 1) : s).trim();
}

/** I record: `I NN (SS FF CCC)×NN` — byte ranges of B-record extensions (Appendix A, I record). */
function parseIRecord(line: string, lineNo: number, warnings: LogWarning[]): IgcExtension[] {
  const n = Number(line.slice(1, 3));
  const out: IgcExtension[] = [];
  if (!/^\d{2}$/.test(line.slice(1, 3))) {
    warnings.push({ code: 'igc-bad-i-record', message: `The I record at line ${lineNo} cannot be read; B-record extensions are ignored.`, lines: [lineNo] });
    return out;
  }
  for (let k = 0; k < n; k++) {
    const f = line.slice(3 + 7 * k, 10 + 7 * k);
    const m = /^(\d{2})(\d{2})([A-Z0-9]{3})$/.exec(f);
    if (!m || +m[1] < 36 || +m[2] < +m[1]) {
      warnings.push({ code: 'igc-bad-i-record', message: `The I record at line ${lineNo} is malformed after ${k} extensions; the rest are ignored.`, lines: [lineNo] });
      break;
    }
    out.push({ first: +m[1], last: +m[2], code: m[3] });
  }
  return out;
}
