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
import { attributeValue, readXml, type XmlReading, type XmlStop } from './xmlEvents.js';

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
  return readXml(text, () => gpxReading(file));
}

/** The state of one reading of a GPX document: the handlers of its XML events, and the FlightLog made at the end. */
function gpxReading(file: string): XmlReading<FlightLog> {
  const rows = new LogBuilder();
  const warnings: LogWarning[] = [];
  const noTime = new LineTally();
  const stack: string[] = [];
  let rootSeen = false;
  let rootClosed = false;
  let version = '';
  let creator = '';
  let trackName: string | undefined;
  let trackDesc: string | undefined;
  let metaName: string | undefined;
  let metaDesc: string | undefined;
  let pointsSeen = 0;
  let routeOrWaypoints = 0;
  let lastCompleteLine = 0;
  let point: PointText | undefined;
  let tagStartLine = 1;
  let capture: string | undefined;
  let captured = '';
  let authorName: string | undefined;
  let trackSrc: string | undefined;
  // Route (first rte) and waypoints (wpt): kept apart from the samples, in file order.
  const routeLat: number[] = [];
  const routeLon: number[] = [];
  const routeNames: string[] = [];
  const wptLat: number[] = [];
  const wptLon: number[] = [];
  const wptNames: string[] = [];
  let routeName: string | undefined;
  let routesSeen = 0;
  let pendingMark: { route: boolean; name: string } | undefined;

  const openStart = (line: number) => {
    tagStartLine = line;
  };
  const open = (tagName: string, attrNames: readonly string[], attrValues: readonly string[]) => {
    const attr = (key: string) => attributeValue(attrNames, attrValues, key);
    const name = localName(tagName);
    const parent = stack.length > 0 ? stack[stack.length - 1] : '';
    if (!rootSeen) {
      rootSeen = true;
      if (name !== 'gpx') {
        throw new ParseError(`the XML document's root element is <${tagName}>, not <gpx>`, {
          line: tagStartLine,
          hint: 'expected a GPX 1.1 track log',
        });
      }
      version = attr('version') ?? '';
      creator = attr('creator') ?? '';
    }
    stack.push(name);
    if (name === 'trkpt' && parent === 'trkseg') {
      pointsSeen++;
      point = {
        line: tagStartLine,
        lat: parseDecimal(attr('lat')),
        lon: parseDecimal(attr('lon')),
      };
      return;
    }
    if (name === 'rte' && parent === 'gpx') routesSeen++;
    if ((name === 'rtept' && parent === 'rte' && routesSeen === 1) || (name === 'wpt' && parent === 'gpx')) {
      routeOrWaypoints++;
      const lat = parseDecimal(attr('lat'));
      const lon = parseDecimal(attr('lon'));
      const isRoute = name === 'rtept';
      (isRoute ? routeLat : wptLat).push(lat);
      (isRoute ? routeLon : wptLon).push(lon);
      (isRoute ? routeNames : wptNames).push('');
      pendingMark = { route: isRoute, name: '' };
      return;
    } else if (name === 'rtept') routeOrWaypoints++;
    if (pendingMark && name === 'name' && (parent === 'rtept' || parent === 'wpt')) {
      capture = 'mark/name';
      captured = '';
      return;
    }
    if (name === 'name' && parent === 'rte' && routesSeen === 1 && routeName === undefined) {
      capture = 'rte/name';
      captured = '';
      return;
    }
    if (point && parent === 'trkpt' && (name === 'ele' || name === 'time')) {
      capture = name;
      captured = '';
      return;
    }
    // Ground speed and course: GPX 1.0 <speed> (m/s) and <course> (degrees true) as trkpt children, and
    // the same names inside <extensions> (e.g. Garmin TrackPointExtension v2 speed m/s, course degrees).
    if (point && (name === 'speed' || name === 'course') && stack.includes('trkpt')) {
      capture = name;
      captured = '';
      return;
    }
    if (name === 'name' && parent === 'author' && stack[stack.length - 3] === 'metadata') {
      capture = 'author/name';
      captured = '';
      return;
    }
    if (name === 'src' && parent === 'trk') {
      capture = 'trk/src';
      captured = '';
      return;
    }
    const grand = stack.length > 2 ? stack[stack.length - 3] : '';
    if ((name === 'name' || name === 'desc') && ((parent === 'trk' && grand === 'gpx') || parent === 'metadata')) {
      capture = `${parent}/${name}`;
      captured = '';
    }
  };
  const onText = (chunk: string) => {
    if (capture !== undefined) captured += chunk;
  };
  const close = (tagName: string, line: number) => {
    const name = localName(tagName);
    stack.pop();
    if (capture !== undefined) {
      if (point && capture === 'ele') point.ele = captured;
      else if (point && capture === 'time') point.time = captured;
      else if (point && capture === 'speed' && point.speed === undefined) point.speed = captured;
      else if (point && capture === 'course' && point.course === undefined) point.course = captured;
      else if (capture === 'mark/name' && pendingMark) {
        const names = pendingMark.route ? routeNames : wptNames;
        names[names.length - 1] = toPlainText(captured) ?? '';
      } else if (capture === 'rte/name') routeName = toPlainText(captured);
      else if (capture === 'author/name' && authorName === undefined) authorName = toPlainText(captured);
      else if (capture === 'trk/src' && trackSrc === undefined) trackSrc = toPlainText(captured);
      else if (capture === 'trk/name' && trackName === undefined) trackName = toPlainText(captured);
      else if (capture === 'trk/desc' && trackDesc === undefined) trackDesc = toPlainText(captured);
      else if (capture === 'metadata/name' && metaName === undefined) metaName = toPlainText(captured);
      else if (capture === 'metadata/desc' && metaDesc === undefined) metaDesc = toPlainText(captured);
      capture = undefined;
    }
    if (name === 'trkpt' && point && stack[stack.length - 1] === 'trkseg') {
      lastCompleteLine = line;
      if (point.time === undefined || point.time.trim() === '') noTime.add(point.line);
      else {
        const ele = parseDecimal(point.ele);
        // A <time> that does not parse becomes NaN here; the cleaner drops and reports it with its line.
        rows.addRow(parseIsoDateTime(point.time, 0), point.lat, point.lon, ele, point.line);
        const speed = parseDecimal(point.speed);
        if (Number.isFinite(speed) || rows.has('gsMs')) rows.set('gsMs', speed);
        const course = parseDecimal(point.course);
        if (Number.isFinite(course) || rows.has('trackDegTrue')) rows.set('trackDegTrue', course);
      }
      point = undefined;
    }
    if (name === 'rtept' || name === 'wpt') pendingMark = undefined;
    if (stack.length === 0) rootClosed = true;
  };
  return { handlers: { openStart, open, text: onText, close }, finish };

  function finish(xmlError: XmlStop | undefined): FlightLog {
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
