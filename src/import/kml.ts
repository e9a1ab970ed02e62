// KML 2.2 timed tracks (gx:Track, also inside gx:MultiTrack) to FlightLog columns, over XML events (xmlEvents.ts:
// a fast scanner of plain documents, else saxes).
//
// Source: OGC KML 2.2 (OGC 07-147r2) and Google's KML extension namespace gx (kml/ext/2.2) reference:
// a <gx:Track> holds <when> elements (xsd:dateTime) and, in the same order and number, <gx:coord>
// elements "longitude latitude altitude" separated by spaces (degrees WGS-84, metres); <altitudeMode>
// absolute "interprets the altitude as a value in meters above sea level", while the default clampToGround
// (and relativeToGround) do not give heights above sea level [wording from memory]. A <LineString> has
// coordinates but no times and cannot be used. Broken XML: reading stops at the first well-formedness error
// (XML 1.0 §1.2) and keeps the complete points before it.
import { ParseError } from '../errors.js';
import type { FlightLog, LogWarning } from '../log/flightLog.js';
import { LineTally, plural, pushTally } from '../log/logWarnings.js';
import { parseIsoDateTime } from './isoTime.js';
import { LogBuilder } from './logBuilder.js';
import { parseDecimal } from './parseNumber.js';
import { toPlainText } from './plainText.js';
import { readXml, type XmlHandlers, type XmlReading, type XmlStop } from './xmlEvents.js';

function localName(name: string): string {
  const colon = name.indexOf(':');
  return colon < 0 ? name : name.slice(colon + 1);
}

/** One gx:Track being read: its times and coordinates in order. */
interface TrackInProgress {
  when: number[];
  coords: Array<[number, number, number, number]>; // lon, lat, alt, line
  altitudeMode: string;
}

/**
 * Reads the gx:Track elements of a KML 2.2 document into a FlightLog (format 'kml'): t from <when>,
 * lon/lat/alt from <gx:coord>, paired by position; altM only with altitudeMode absolute (msl),
 * else NaN with a warning. line = line of each <gx:coord>. First Document/Placemark name → meta.name.
 * @throws ParseError when the document has no gx:Track (an untimed LineString gets its own hint).
 */
export function parseKml(text: string, file: string): FlightLog {
  return readXml(text, () => new KmlReading(file));
}

/**
 * The state of one reading of a KML document: the handlers of its XML events, and the FlightLog made at
 * the end. A class, as in gpx.ts, so that its compiled methods carry over from one file of a batch to the next.
 */
class KmlReading implements XmlReading<FlightLog>, XmlHandlers {
  readonly handlers: XmlHandlers = this;
  private readonly rows = new LogBuilder();
  private readonly warnings: LogWarning[] = [];
  private readonly mismatch = new LineTally();
  private readonly badCoord = new LineTally();
  private readonly stack: string[] = [];
  private rootSeen = false;
  private rootClosed = false;
  private track: TrackInProgress | undefined;
  private tracks = 0;
  private lineStrings = 0;
  private nonAbsolute = 0;
  private name: string | undefined;
  private desc: string | undefined;
  private capture: string | undefined;
  private captured = '';
  private tagLine = 1;
  private trackLine = 0;
  private lastComplete = 0;
  private pointsSeen = 0;

  constructor(private readonly file: string) {}

  private flushTrack(complete: boolean): void {
    const track = this.track;
    if (!track) return;
    const n = Math.min(track.when.length, track.coords.length);
    if (complete && track.when.length !== track.coords.length) this.mismatch.add(this.trackLine);
    const absolute = track.altitudeMode === 'absolute';
    if (!absolute && n > 0) this.nonAbsolute++;
    for (let i = 0; i < n; i++) {
      const [lon, lat, alt, line] = track.coords[i];
      this.rows.addRow(track.when[i], lat, lon, absolute ? alt : NaN, line);
    }
    this.pointsSeen += Math.max(track.when.length, track.coords.length);
    this.track = undefined;
  }

  openStart(line: number): void {
    this.tagLine = line;
  }

  open(tagName: string): void {
    const n = localName(tagName);
    if (!this.rootSeen) {
      this.rootSeen = true;
      if (n !== 'kml') throw new ParseError(`the XML document's root element is <${tagName}>, not <kml>`, { line: this.tagLine });
    }
    const stack = this.stack;
    const parent = stack.length > 0 ? stack[stack.length - 1] : '';
    stack.push(n);
    if (n === 'Track') {
      this.tracks++;
      this.trackLine = this.tagLine;
      this.track = { when: [], coords: [], altitudeMode: 'clampToGround' };
    } else if (n === 'LineString') this.lineStrings++;
    if ((this.track && (n === 'when' || n === 'coord' || n === 'altitudeMode')) || ((n === 'name' || n === 'description') && (parent === 'Document' || parent === 'Placemark'))) {
      this.capture = n;
      this.captured = '';
    }
  }

  text(chunk: string): void {
    if (this.capture !== undefined) this.captured += chunk;
  }

  close(tagName: string, line: number): void {
    const n = localName(tagName);
    this.stack.pop();
    const track = this.track;
    if (this.capture !== undefined && this.capture === n) {
      const captured = this.captured;
      if (n === 'when' && track) track.when.push(parseIsoDateTime(captured.trim(), 0));
      else if (n === 'coord' && track) {
        const parts = captured.trim().split(/\s+/);
        const lon = parseDecimal(parts[0]);
        const lat = parseDecimal(parts[1]);
        const alt = parts.length > 2 ? parseDecimal(parts[2]) : NaN;
        if (!Number.isFinite(lon) || !Number.isFinite(lat)) this.badCoord.add(this.tagLine);
        track.coords.push([lon, lat, alt, this.tagLine]);
        this.lastComplete = line;
      } else if (n === 'altitudeMode' && track) track.altitudeMode = captured.trim();
      else if (n === 'name' && this.name === undefined) this.name = toPlainText(captured);
      else if (n === 'description' && this.desc === undefined) this.desc = toPlainText(captured);
      this.capture = undefined;
    }
    if (n === 'Track') this.flushTrack(true);
    if (this.stack.length === 0) this.rootClosed = true;
  }

  finish(xmlError: XmlStop | undefined): FlightLog {
    const truncated = xmlError !== undefined && !this.rootClosed;
    if (truncated) this.flushTrack(false);
    const { rows, warnings, mismatch, badCoord, rootSeen, tracks, lineStrings, lastComplete, nonAbsolute, pointsSeen, name, desc, file } = this;
    if (!rootSeen) throw new ParseError('no XML element found', { hint: 'expected a KML 2.2 document starting with <kml>' });
    if (xmlError && rows.length === 0) {
      throw new ParseError(`the KML file is not well-formed XML: ${xmlError.message}`, { line: xmlError.line });
    }
    if (rows.length === 0) {
      if (tracks > 0) throw new ParseError(`the KML file's ${plural(tracks, 'gx:Track')} hold no timed points`, { hint: 'each <when> needs a matching <gx:coord>' });
      throw new ParseError(lineStrings > 0 ? 'the KML file holds only an untimed path (LineString), no times' : 'the KML file holds no timed track (gx:Track)', {
        hint: 'a flight log needs a time for each position: export the flight as a KML gx:Track, GPX track, IGC or CSV with times',
      });
    }
    if (xmlError && truncated) {
      warnings.push({
        code: xmlError.atEnd ? 'file-truncated' : 'xml-broken',
        message: `${xmlError.atEnd ? `The file ends before the KML document is complete (line ${xmlError.line}: ${xmlError.message}): it was probably cut off while being written` : `The XML is broken at line ${xmlError.line} (${xmlError.message}); reading stopped there`}. The flight is analysed up to the last complete point (ending on line ${lastComplete}).`,
        lines: [xmlError.line],
      });
    }
    pushTally(warnings, 'kml-count-mismatch', 'gx:Track with different numbers of <when> and <gx:coord>; only the pairs were used', mismatch);
    pushTally(warnings, 'kml-bad-coord', `${plural(badCoord.count, 'gx:coord')} that could not be read`, badCoord);
    if (nonAbsolute > 0) {
      warnings.push({
        code: 'kml-altitude-mode',
        message: 'The track is not in altitudeMode absolute, so its heights are not heights above sea level and are not used.',
      });
    }
    return rows.build({
      format: 'kml',
      file,
      warnings,
      meta: { name, comment: desc },
      altDatum: nonAbsolute > 0 ? 'unknown' : 'msl',
      reader: { recordsRead: pointsSeen, recordsDropped: pointsSeen - rows.length, truncated },
    });
  }
}
