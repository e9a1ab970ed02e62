// NMEA 0183 logs (receiver output captured to a file) to FlightLog columns, one epoch per fix time.
//
// Sentences used (NMEA 0183 v4.11 sentence descriptions [field layouts from memory, checked in the tests
// against hand-built sentences]): RMC (time, status, position, speed over ground in knots, course over
// ground true, date), GGA (time, position, fix quality, MSL altitude), GNS (time, position, mode
// indicators, MSL altitude), GLL (position, time, status), VTG (course true/magnetic, speed knots/km/h),
// HDT (heading true), HDM (heading magnetic), HDG (magnetic sensor heading + deviation), GST (position
// error standard deviations), ZDA (date). Sentences of one epoch (same UTC time) become one row; untimed
// sentences (VTG, HDT, HDM, HDG) join the epoch they follow.
import { KT_MS } from '../constants.js';
import { ParseError } from '../errors.js';
import type { FlightLog, LogWarning } from '../log/flightLog.js';
import { LineTally, plural, pushTally } from '../log/logWarnings.js';
import { forEachLine } from './forEachLine.js';
import { parseIsoDate } from './isoTime.js';
import { GrowingFloat64, LogBuilder } from './logBuilder.js';
import { checkSentence, nmeaAngle, nmeaDate, nmeaTimeOfDay } from './nmeaSentence.js';
import { parseDecimal } from './parseNumber.js';

/** Options of the NMEA reader. */
export interface NmeaOptions {
  /** Date YYYY-MM-DD (UTC) of the first fix, for logs without RMC or ZDA sentences. */
  date?: string;
}

/** The sentences of one fix time, gathered until the time changes. Reused: one per reader. */
class Epoch {
  tod = NaN;
  line = 0;
  lat = NaN;
  lon = NaN;
  altM = NaN;
  gsMs = NaN;
  trackDeg = NaN;
  headingTrue = NaN;
  headingMag = NaN;
  hAccM = NaN;
  dateS = NaN;
  positionSentences = 0;
  firstLine = 0;

  reset(tod: number, line: number): void {
    this.tod = tod;
    this.firstLine = line;
    this.line = 0;
    this.lat = this.lon = this.altM = this.gsMs = this.trackDeg = NaN;
    this.headingTrue = this.headingMag = this.hAccM = this.dateS = NaN;
    this.positionSentences = 0;
  }

  /** A valid position from a sentence at `line`; the first one of the epoch wins. */
  position(lat: number, lon: number, line: number): void {
    this.positionSentences++;
    if (Number.isFinite(this.lat) || !Number.isFinite(lat) || !Number.isFinite(lon)) return;
    this.lat = lat;
    this.lon = lon;
    this.line = line;
  }
}

const num = (s: string | undefined) => parseDecimal(s);

/**
 * Line-by-line NMEA reader: feed lines with `line(text, lineNo)`, then `finish(endedWithNewline)`.
 * Holds typed-array columns only (no object per sentence or row). Local state: one per file.
 */
export class NmeaLineSink {
  private readonly rows = new LogBuilder(4096);
  private readonly headingMag = new GrowingFloat64(4096);
  private readonly epoch = new Epoch();
  private readonly badChecksum = new LineTally();
  private readonly notSentence = new LineTally();
  private readonly noFix = new LineTally();
  private readonly badField = new LineTally();
  private noChecksum = 0;
  private sentences = 0;
  private epochs = 0;
  private prevTod = NaN;
  private dayOffset = 0;
  private epochDay = 0;
  /** (row index, date anchor [s]) pairs: t = anchor + provisional time for rows from that index on. */
  private readonly anchorRow: number[] = [];
  private readonly anchorS: number[] = [];
  private pendingText = '';
  private pendingLineNo = 0;
  private checked = 0;
  private headingTrueSeen = false;
  private headingMagSeen = false;
  private readonly optionDateS: number;

  constructor(
    private readonly file: string,
    private readonly opts: NmeaOptions = {},
  ) {
    this.optionDateS = opts.date !== undefined ? parseIsoDate(opts.date) : NaN;
  }

  /**
   * One line of the log. Lines are processed one behind, so that `finish` can tell a last line cut off
   * mid-sentence (no line break after it, and failing or lacking its checksum) from a complete one.
   */
  line(text: string, lineNo: number): void {
    if (this.pendingLineNo > 0) this.process(this.pendingText, this.pendingLineNo, true);
    this.pendingText = text;
    this.pendingLineNo = lineNo;
  }

  private process(text: string, lineNo: number, complete: boolean): boolean {
    if (text.trim() === '') return true;
    const s = checkSentence(text);
    if (!s.ok) {
      if (!complete) return false;
      if (s.reason === 'not-a-sentence') this.notSentence.add(lineNo);
      else this.badChecksum.add(lineNo);
      return true;
    }
    if (!s.checksum && !complete && this.checked > 0) return false;
    if (!s.checksum) this.noChecksum++;
    else this.checked++;
    if (s.talker === 'P') return true;
    this.sentences++;
    this.sentence(s.formatter, s.fields, lineNo);
    return true;
  }

  private sentence(formatter: string, f: string[], lineNo: number): void {
    switch (formatter) {
      case 'RMC': {
        // RMC: 0 time, 1 status A/V, 2-3 lat, 4-5 lon, 6 SOG kt, 7 COG true, 8 date ddmmyy, 9-10 variation, 11 mode.
        if (!this.timed(f[0], lineNo)) return;
        const e = this.epoch;
        const mode = f[11] ?? '';
        if (f[1] === 'A' && mode !== 'N') e.position(nmeaAngle(f[2], f[3], 2), nmeaAngle(f[4], f[5], 3), lineNo);
        else e.positionSentences++;
        const sog = num(f[6]);
        if (Number.isFinite(sog) && !Number.isFinite(e.gsMs)) e.gsMs = sog * KT_MS;
        const cog = num(f[7]);
        if (Number.isFinite(cog) && !Number.isFinite(e.trackDeg)) e.trackDeg = cog;
        const d = nmeaDate(f[8] ?? '');
        if (Number.isFinite(d)) e.dateS = d;
        else if ((f[8] ?? '') !== '') this.badField.add(lineNo);
        return;
      }
      case 'GGA': {
        // GGA: 0 time, 1-2 lat, 3-4 lon, 5 quality (0 = invalid), 6 satellites, 7 HDOP, 8 altitude MSL, 9 'M'.
        if (!this.timed(f[0], lineNo)) return;
        const e = this.epoch;
        const q = num(f[5]);
        if (Number.isFinite(q) && q > 0) {
          e.position(nmeaAngle(f[1], f[2], 2), nmeaAngle(f[3], f[4], 3), lineNo);
          const alt = num(f[8]);
          if (Number.isFinite(alt) && !Number.isFinite(e.altM)) e.altM = alt;
        } else e.positionSentences++;
        return;
      }
      case 'GNS': {
        // GNS: 0 time, 1-2 lat, 3-4 lon, 5 mode per constellation (N = no fix), 6 sats, 7 HDOP, 8 altitude MSL.
        if (!this.timed(f[0], lineNo)) return;
        const e = this.epoch;
        const mode = f[5] ?? '';
        if (/[^N]/.test(mode) && mode.length > 0) {
          e.position(nmeaAngle(f[1], f[2], 2), nmeaAngle(f[3], f[4], 3), lineNo);
          const alt = num(f[8]);
          if (Number.isFinite(alt) && !Number.isFinite(e.altM)) e.altM = alt;
        } else e.positionSentences++;
        return;
      }
      case 'GLL': {
        // GLL: 0-1 lat, 2-3 lon, 4 time, 5 status A/V, 6 mode.
        if (!this.timed(f[4], lineNo)) return;
        if (f[5] === 'A' && (f[6] ?? '') !== 'N') this.epoch.position(nmeaAngle(f[0], f[1], 2), nmeaAngle(f[2], f[3], 3), lineNo);
        else this.epoch.positionSentences++;
        return;
      }
      case 'VTG': {
        // VTG: course true,T, course magnetic,M, speed knots,N, speed km/h,K (NMEA 2.x+); pre-2.0 layout has no letters.
        if (!Number.isFinite(this.epoch.tod)) return;
        const lettered = f[1] === 'T' || f[3] === 'M' || f[5] === 'N';
        const cog = num(f[0]);
        const kt = num(lettered ? f[4] : f[2]);
        const kmh = num(lettered ? f[6] : f[3]);
        const e = this.epoch;
        if (Number.isFinite(cog) && !Number.isFinite(e.trackDeg)) e.trackDeg = cog;
        if (!Number.isFinite(e.gsMs)) {
          if (Number.isFinite(kt)) e.gsMs = kt * KT_MS;
          else if (Number.isFinite(kmh)) e.gsMs = kmh / 3.6;
        }
        return;
      }
      case 'HDT': {
        const h = num(f[0]);
        if (Number.isFinite(this.epoch.tod) && Number.isFinite(h)) {
          this.epoch.headingTrue = h;
          this.headingTrueSeen = true;
        }
        return;
      }
      case 'HDM': {
        const h = num(f[0]);
        if (Number.isFinite(this.epoch.tod) && Number.isFinite(h)) {
          this.epoch.headingMag = h;
          this.headingMagSeen = true;
        }
        return;
      }
      case 'HDG': {
        // HDG: magnetic sensor heading, deviation, E/W, variation, E/W. Magnetic = sensor + deviation (east +).
        const sensor = num(f[0]);
        const dev = num(f[1]);
        const devSigned = Number.isFinite(dev) ? (f[2] === 'W' ? -dev : dev) : 0;
        if (Number.isFinite(this.epoch.tod) && Number.isFinite(sensor)) {
          this.epoch.headingMag = sensor + devSigned;
          this.headingMagSeen = true;
        }
        return;
      }
      case 'GST': {
        // GST: 0 time, 1 RMS, 2-4 error ellipse, 5 sigma lat [m], 6 sigma lon [m], 7 sigma alt [m].
        if (!this.timed(f[0], lineNo)) return;
        const sLat = num(f[5]);
        const sLon = num(f[6]);
        if (Number.isFinite(sLat) && Number.isFinite(sLon)) this.epoch.hAccM = Math.sqrt((sLat * sLat + sLon * sLon) / 2);
        return;
      }
      case 'ZDA': {
        // ZDA: 0 time, 1 day, 2 month, 3 year (4 digits), 4-5 local zone.
        if (!this.timed(f[0], lineNo)) return;
        const d = parseIsoDate(`${f[3]}-${(f[2] ?? '').padStart(2, '0')}-${(f[1] ?? '').padStart(2, '0')}`);
        if (Number.isFinite(d)) this.epoch.dateS = d;
        return;
      }
      default:
        return;
    }
  }

  /** Moves to the epoch of a time field; false when the field is unreadable (counted). */
  private timed(field: string | undefined, lineNo: number): boolean {
    const tod = nmeaTimeOfDay(field ?? '');
    if (!Number.isFinite(tod)) {
      if ((field ?? '') !== '') this.badField.add(lineNo);
      return false;
    }
    if (tod !== this.epoch.tod) {
      this.flush();
      // Sentences come in time order; a time more than 12 h earlier than the last is the next UTC day.
      if (Number.isFinite(this.prevTod) && tod < this.prevTod - 43200) this.dayOffset++;
      this.prevTod = tod;
      this.epochDay = this.dayOffset;
      this.epoch.reset(tod, lineNo);
    }
    return true;
  }

  private flush(): void {
    const e = this.epoch;
    if (!Number.isFinite(e.tod)) return;
    if (Number.isFinite(e.dateS)) {
      this.anchorRow.push(this.rows.length);
      this.anchorS.push(e.dateS - this.epochDay * 86400);
    }
    if (e.positionSentences > 0) this.epochs++;
    if (Number.isFinite(e.lat)) {
      this.rows.addRow(e.tod + this.epochDay * 86400, e.lat, e.lon, e.altM, e.line);
      if (Number.isFinite(e.gsMs) || this.rows.has('gsMs')) this.rows.set('gsMs', e.gsMs);
      if (Number.isFinite(e.trackDeg) || this.rows.has('trackDegTrue')) this.rows.set('trackDegTrue', e.trackDeg);
      if (this.headingTrueSeen) this.rows.set('headingDeg', e.headingTrue);
      if (Number.isFinite(e.hAccM) || this.rows.has('hAccM')) this.rows.set('hAccM', e.hAccM);
      this.headingMag.push(e.headingMag);
    } else if (e.positionSentences > 0) {
      this.noFix.add(e.firstLine);
    }
    e.tod = NaN;
  }

  /** The log; `endedWithNewline` false means the text stopped mid-line (a failing last line is the cut). */
  finish(endedWithNewline: boolean): FlightLog {
    const warnings: LogWarning[] = [];
    let truncated = false;
    if (this.pendingLineNo > 0) {
      const lineNo = this.pendingLineNo;
      this.pendingLineNo = 0;
      if (!this.process(this.pendingText, lineNo, endedWithNewline)) {
        truncated = true;
        warnings.push({
          code: 'file-truncated',
          message: `The file ends in the middle of a sentence at line ${lineNo}: it was probably cut off while being written; that sentence is left out.`,
          lines: [lineNo],
        });
      }
    }
    this.flush();
    pushTally(warnings, 'nmea-bad-checksum', `${plural(this.badChecksum.count, 'sentence')} with a wrong checksum ignored`, this.badChecksum);
    pushTally(warnings, 'nmea-not-a-sentence', `${plural(this.notSentence.count, 'line')} that are not NMEA sentences ignored`, this.notSentence);
    pushTally(warnings, 'nmea-no-fix', `${plural(this.noFix.count, 'fix time')} without a valid position (receiver reported no fix) left out`, this.noFix);
    pushTally(warnings, 'nmea-bad-field', `${plural(this.badField.count, 'sentence')} with an unreadable time or date field ignored`, this.badField);
    if (this.noChecksum > 0) {
      warnings.push({ code: 'nmea-no-checksum', message: `${plural(this.noChecksum, 'sentence')} without a checksum accepted unchecked.`, count: this.noChecksum });
    }
    if (this.sentences === 0) {
      throw new ParseError('no NMEA 0183 sentence in the file could be read', {
        hint: this.badChecksum.count > 0 ? `${this.badChecksum.count} sentences fail their checksum` : 'expected lines like $GPRMC,...*hh',
      });
    }
    if (this.rows.length === 0) {
      throw new ParseError('the NMEA log has no position fix (RMC, GGA, GNS or GLL with a valid fix)', {
        hint: 'the receiver may not have had a fix while logging',
      });
    }
    if (this.anchorS.length === 0) {
      if (!Number.isFinite(this.optionDateS)) {
        throw new ParseError('the NMEA log has no date (no RMC or ZDA sentence)', {
          hint: 'give the UTC date of the first fix (YYYY-MM-DD) as an option',
        });
      }
      this.anchorRow.push(0);
      this.anchorS.push(this.optionDateS);
      warnings.push({ code: 'nmea-date-from-option', message: `The log has no date; the date given (${this.opts.date}) is used.` });
    }
    const headingRef = this.headingTrueSeen ? 'true' : 'magnetic';
    const log = this.rows.build(
      {
        format: 'nmea',
        file: this.file,
        warnings,
        meta: {},
        altDatum: 'msl', // GGA/GNS antenna altitude is above mean sea level (geoid), per their field descriptions
        reader: { recordsRead: this.epochs, recordsDropped: this.noFix.count, truncated },
      },
      headingRef,
    );
    if (!this.headingTrueSeen && this.headingMagSeen) {
      log.headingDeg = this.headingMag.finish();
      log.headingRef = 'magnetic';
    }
    // Dates: rows before the first dated epoch take the first anchor; later rows the latest one.
    let k = 0;
    for (let i = 0; i < log.t.length; i++) {
      while (k + 1 < this.anchorRow.length && this.anchorRow[k + 1] <= i) k++;
      log.t[i] += this.anchorS[k];
    }
    return log;
  }
}

/**
 * Reads an NMEA 0183 log (format 'nmea'): one row per fix time with a valid position; lat/lon [deg],
 * altM [m above MSL] from GGA/GNS, gsMs and trackDegTrue from RMC/VTG, headingDeg from HDT (true) or
 * HDM/HDG (magnetic), hAccM from GST. Checksums are verified (bad ones counted with their lines).
 * The date comes from RMC (or ZDA); the UTC day rolls over at midnight.
 * @throws ParseError when no sentence can be read, there is no fix, or no date (and `opts.date` is not given).
 */
export function parseNmea(text: string, file: string, opts: NmeaOptions = {}): FlightLog {
  const sink = new NmeaLineSink(file, opts);
  const ended = forEachLine(text, (line, lineNo) => sink.line(line, lineNo));
  return sink.finish(ended);
}
