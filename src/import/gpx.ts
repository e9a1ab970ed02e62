// GPX 1.1 (and 1.0) track reader: trk/trkseg/trkpt to FlightLog columns, over XML events (xmlEvents.ts: a fast
// scanner of plain documents, else the saxes streaming XML parser).
//
// Source: GPX 1.1 Schema Documentation, topografix.com/GPX/1/1 (gpx.xsd). What this reader relies on:
// - "all coordinates are relative to the WGS84 datum. All measurements are in metric units."
// - trkpt is a wptType with attributes lat (latitudeType, -90.0 <= value <= 90.0) and
//   lon (longitudeType, -180.0 <= value < 180.0), "Decimal degrees, WGS84 datum".
// - <ele> "Elevation (in meters) of the point." The schema does not name the vertical datum. Its
//   <geoidheight> ("Height (in meters) of geoid (mean sea level) above WGS84 earth ellipsoid. As defined
//   in NMEA GGA message") implies receivers write the GGA altitude, which is above mean sea level; so we
//   record altDatum 'msl' (an assumption, common practice of receivers, not a schema rule).
// - <time> "Date and time in are in Univeral Coordinated Time (UTC), not local time! Conforms to ISO 8601
//   specification for date/time representation. Fractional seconds are allowed for millisecond timing in
//   tracklogs." A time without a zone designator is therefore read as UTC.
// - trkseg: "A Track Segment holds a list of Track Points which are logically connected in order."
//   All segments of all tracks are read, in file order; the cleaner sorts by time.
// A broken document: XML 1.0 (W3C, 5th ed.) §1.2 says that after a fatal (well-formedness) error the
// processor "MUST NOT continue normal processing", so reading stops at the first error and the flight is
// analysed up to the last complete track point before it, with a warning naming the line.
import { ParseError } from '../errors.js';
import type { FlightLog, LogWarning } from '../log/flightLog.js';
import { LineTally, plural, pushTally } from '../log/logWarnings.js';
import { parseIsoDateTime } from './isoTime.js';
import { LogBuilder } from './logBuilder.js';
import { parseDecimal } from './parseNumber.js';
import { toPlainText } from './plainText.js';
import { attributeValue, readXml, type XmlHandlers, type XmlReading, type XmlStop } from './xmlEvents.js';

function localName(name: string): string {
  const colon = name.indexOf(':');
  return colon < 0 ? name : name.slice(colon + 1);
}

/** Text children collected from the current track point. */
interface PointText {
  line: number;
  lat: number;
  lon: number;
  ele?: string;
  time?: string;
  speed?: string;
  course?: string;
}

/**
 * Reads the track points of a GPX 1.1 (or 1.0) document into a FlightLog (format 'gpx').
 * t from <time> (UTC), lat/lon [deg WGS-84] from the attributes, altM [m] from <ele> (NaN when absent),
 * line = 1-based line of each <trkpt> tag. Points without <time> are dropped and reported with their lines.
 * Track name/desc (else metadata name/desc) become meta.name/comment as plain text; `creator` meta.device.
 * A document cut off or broken mid-way keeps its complete points and gets a warning naming the line
 * (source.reader.truncated = true).
 * @throws ParseError when the text is not a GPX document, or it has no timed track point.
 */
export function parseGpx(text: string, file: string): FlightLog {
  return readXml(text, () => new GpxReading(file));
}

/**
 * The state of one reading of a GPX document: the handlers of its XML events, and the FlightLog made at
 * the end. A class, not closures made per reading: its methods are the same functions for every file, so
 * V8 keeps their compiled code from one flight to the next (closures made per file were compiled anew
 * for each file of a batch, about 40 ms of compiler time per flight).
 */
class GpxReading implements XmlReading<FlightLog>, XmlHandlers {
  readonly handlers: XmlHandlers = this;
  private readonly rows = new LogBuilder();
  private readonly warnings: LogWarning[] = [];
  private readonly noTime = new LineTally();
  private readonly stack: string[] = [];
  private rootSeen = false;
  private rootClosed = false;
  private version = '';
  private creator = '';
  private trackName: string | undefined;
  private trackDesc: string | undefined;
  private metaName: string | undefined;
  private metaDesc: string | undefined;
  private pointsSeen = 0;
  private routeOrWaypoints = 0;
  private lastCompleteLine = 0;
  private point: PointText | undefined;
  private tagStartLine = 1;
  private capture: string | undefined;
  private captured = '';
  private authorName: string | undefined;
  private trackSrc: string | undefined;
  // Route (first rte) and waypoints (wpt): kept apart from the samples, in file order.
  private readonly routeLat: number[] = [];
  private readonly routeLon: number[] = [];
  private readonly routeNames: string[] = [];
  private readonly wptLat: number[] = [];
  private readonly wptLon: number[] = [];
  private readonly wptNames: string[] = [];
  private routeName: string | undefined;
  private routesSeen = 0;
  private pendingMark: { route: boolean; name: string } | undefined;

  constructor(private readonly file: string) {}

  openStart(line: number): void {
    this.tagStartLine = line;
  }

  open(tagName: string, attrNames: readonly string[], attrValues: readonly string[]): void {
    const stack = this.stack;
    const name = localName(tagName);
    const parent = stack.length > 0 ? stack[stack.length - 1] : '';
    if (!this.rootSeen) {
      this.rootSeen = true;
      if (name !== 'gpx') {
        throw new ParseError(`the XML document's root element is <${tagName}>, not <gpx>`, {
          line: this.tagStartLine,
          hint: 'expected a GPX 1.1 track log',
        });
      }
      this.version = attributeValue(attrNames, attrValues, 'version') ?? '';
      this.creator = attributeValue(attrNames, attrValues, 'creator') ?? '';
    }
    stack.push(name);
    if (name === 'trkpt' && parent === 'trkseg') {
      this.pointsSeen++;
      this.point = {
        line: this.tagStartLine,
        lat: parseDecimal(attributeValue(attrNames, attrValues, 'lat')),
        lon: parseDecimal(attributeValue(attrNames, attrValues, 'lon')),
      };
      return;
    }
    if (name === 'rte' && parent === 'gpx') this.routesSeen++;
    if ((name === 'rtept' && parent === 'rte' && this.routesSeen === 1) || (name === 'wpt' && parent === 'gpx')) {
      this.routeOrWaypoints++;
      const lat = parseDecimal(attributeValue(attrNames, attrValues, 'lat'));
      const lon = parseDecimal(attributeValue(attrNames, attrValues, 'lon'));
      const isRoute = name === 'rtept';
      (isRoute ? this.routeLat : this.wptLat).push(lat);
      (isRoute ? this.routeLon : this.wptLon).push(lon);
      (isRoute ? this.routeNames : this.wptNames).push('');
      this.pendingMark = { route: isRoute, name: '' };
      return;
    } else if (name === 'rtept') this.routeOrWaypoints++;
    if (this.pendingMark && name === 'name' && (parent === 'rtept' || parent === 'wpt')) {
      this.startCapture('mark/name');
      return;
    }
    if (name === 'name' && parent === 'rte' && this.routesSeen === 1 && this.routeName === undefined) {
      this.startCapture('rte/name');
      return;
    }
    if (this.point && parent === 'trkpt' && (name === 'ele' || name === 'time')) {
      this.startCapture(name);
      return;
    }
    // Ground speed and course: GPX 1.0 <speed> (m/s) and <course> (degrees true) as trkpt children, and
    // the same names inside <extensions> (e.g. Garmin TrackPointExtension v2 speed m/s, course degrees).
    if (this.point && (name === 'speed' || name === 'course') && stack.includes('trkpt')) {
      this.startCapture(name);
      return;
    }
    if (name === 'name' && parent === 'author' && stack[stack.length - 3] === 'metadata') {
      this.startCapture('author/name');
      return;
    }
    if (name === 'src' && parent === 'trk') {
      this.startCapture('trk/src');
      return;
    }
    const grand = stack.length > 2 ? stack[stack.length - 3] : '';
    if ((name === 'name' || name === 'desc') && ((parent === 'trk' && grand === 'gpx') || parent === 'metadata')) {
      this.startCapture(`${parent}/${name}`);
    }
  }

  private startCapture(what: string): void {
    this.capture = what;
    this.captured = '';
  }

  text(chunk: string): void {
    if (this.capture !== undefined) this.captured += chunk;
  }

  close(tagName: string, line: number): void {
    const name = localName(tagName);
    const stack = this.stack;
    stack.pop();
    const capture = this.capture;
    if (capture !== undefined) {
      const point = this.point;
      const captured = this.captured;
      if (point && capture === 'ele') point.ele = captured;
      else if (point && capture === 'time') point.time = captured;
      else if (point && capture === 'speed' && point.speed === undefined) point.speed = captured;
      else if (point && capture === 'course' && point.course === undefined) point.course = captured;
      else if (capture === 'mark/name' && this.pendingMark) {
        const names = this.pendingMark.route ? this.routeNames : this.wptNames;
        names[names.length - 1] = toPlainText(captured) ?? '';
      } else if (capture === 'rte/name') this.routeName = toPlainText(captured);
      else if (capture === 'author/name' && this.authorName === undefined) this.authorName = toPlainText(captured);
      else if (capture === 'trk/src' && this.trackSrc === undefined) this.trackSrc = toPlainText(captured);
      else if (capture === 'trk/name' && this.trackName === undefined) this.trackName = toPlainText(captured);
      else if (capture === 'trk/desc' && this.trackDesc === undefined) this.trackDesc = toPlainText(captured);
      else if (capture === 'metadata/name' && this.metaName === undefined) this.metaName = toPlainText(captured);
      else if (capture === 'metadata/desc' && this.metaDesc === undefined) this.metaDesc = toPlainText(captured);
      this.capture = undefined;
    }
    const point = this.point;
    if (name === 'trkpt' && point && stack[stack.length - 1] === 'trkseg') {
      this.lastCompleteLine = line;
      if (point.time === undefined || point.time.trim() === '') this.noTime.add(point.line);
      else {
        const rows = this.rows;
        const ele = parseDecimal(point.ele);
        // A <time> that does not parse becomes NaN here; the cleaner drops and reports it with its line.
        rows.addRow(parseIsoDateTime(point.time, 0), point.lat, point.lon, ele, point.line);
        const speed = parseDecimal(point.speed);
        if (Number.isFinite(speed) || rows.has('gsMs')) rows.set('gsMs', speed);
        const course = parseDecimal(point.course);
        if (Number.isFinite(course) || rows.has('trackDegTrue')) rows.set('trackDegTrue', course);
      }
      this.point = undefined;
    }
    if (name === 'rtept' || name === 'wpt') this.pendingMark = undefined;
    if (stack.length === 0) this.rootClosed = true;
  }

  finish(xmlError: XmlStop | undefined): FlightLog {
    const { rows, warnings, noTime, point, rootSeen, rootClosed, lastCompleteLine, pointsSeen, routeOrWaypoints, version, creator, file } = this;
    const { trackName, trackDesc, metaName, metaDesc, authorName, trackSrc, routeLat, routeLon, routeNames, routeName, wptLat, wptLon, wptNames } = this;
    const incompletePoint = point !== undefined ? 1 : 0;
    const truncated = xmlError !== undefined && !rootClosed;
    if (!rootSeen) {
      throw new ParseError('no XML element found', {
        line: xmlError?.line,
        hint: 'expected a GPX 1.1 document starting with <gpx>',
      });
    }
    if (xmlError && rows.length === 0) {
      throw new ParseError(`the GPX file is not well-formed XML: ${xmlError.message}`, {
        line: xmlError.line,
        hint: 'no complete track point comes before this place',
      });
    }

    if (xmlError && truncated) {
      const cut = point ? `; the track point begun at line ${point.line} is incomplete and was left out` : '';
      const what = xmlError.atEnd
        ? `The file ends before the GPX document is complete (line ${xmlError.line}: ${xmlError.message}): it was probably cut off while being written`
        : `The XML is broken at line ${xmlError.line} (${xmlError.message}); reading stopped there`;
      warnings.push({
        code: xmlError.atEnd ? 'file-truncated' : 'xml-broken',
        message: `${what}${cut}. The flight is analysed up to the last complete track point (ending on line ${lastCompleteLine}).`,
        lines: [xmlError.line],
      });
    } else if (xmlError) {
      warnings.push({
        code: 'trailing-data',
        message: `Unreadable data after the end of the GPX document at line ${xmlError.line} (${xmlError.message}) was ignored.`,
        lines: [xmlError.line],
      });
    }
    pushTally(warnings, 'no-time', `${plural(noTime.count, 'track point')} without a <time> left out`, noTime);

    if (rows.length === 0) {
      if (pointsSeen > 0) {
        throw new ParseError(`none of the ${plural(pointsSeen, 'track point')} has a <time>`, {
          hint: 'a track drawn in a planning tool has no times; use the track the receiver recorded in flight',
        });
      }
      throw new ParseError('the GPX file has no track points (<trk>/<trkseg>/<trkpt>)', {
        hint:
          routeOrWaypoints > 0
            ? 'it holds only a route or waypoints, which carry no flight times; use the recorded track'
            : 'use the track log the receiver recorded in flight',
      });
    }
    if (version !== '' && version !== '1.1' && version !== '1.0') {
      warnings.push({ code: 'gpx-version', message: `GPX version "${version}" is not 1.1 or 1.0; read as GPX 1.1.` });
    }

    const log = rows.build({
      format: 'gpx',
      file,
      warnings,
      meta: {
        name: trackName ?? metaName,
        comment: trackDesc ?? metaDesc,
        pilot: authorName,
        device: trackSrc ?? (creator !== '' ? toPlainText(creator) : undefined),
      },
      altDatum: 'msl',
      reader: {
        recordsRead: pointsSeen,
        recordsDropped: noTime.count + incompletePoint,
        truncated,
      },
    });
    if (routeLat.length > 0) {
      log.route = { name: routeName, lat: Float64Array.from(routeLat), lon: Float64Array.from(routeLon), names: routeNames };
    } else if (wptLat.length > 0) {
      log.route = { lat: Float64Array.from(wptLat), lon: Float64Array.from(wptLon), names: wptNames };
    }
    return log;
  }
}
