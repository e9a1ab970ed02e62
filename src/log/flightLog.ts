// The FlightLog: one recorded flight as typed columns, SI units, UTC. Every importer produces one.

/** Formats the importers understand (open standards or plain delimited text). */
export type LogFormat = 'gpx' | 'csv' | 'igc' | 'nmea' | 'fit' | 'kml';

/**
 * A note about the input that the user must see: a repair, a dropped record, a doubtful value.
 * `code` is a stable machine name (kebab-case); `message` is one plain sentence for a pilot;
 * `lines` lists the source lines (or record numbers) concerned, where they apply.
 */
export interface LogWarning {
  code: string;
  message: string;
  lines?: number[];
  count?: number;
}

/** Counts of what reading and cleaning did to the records, for the report's log-health section. */
export interface LogHealth {
  recordsRead: number;
  samplesKept: number;
  duplicateTimes: number;
  outOfOrder: number;
  positionSpikes: number;
  invalidValues: number;
  gaps: number;
  truncated: boolean;
}

/**
 * Counts a format reader hands to the cleaner: records it saw (sample records: track points, data rows,
 * fixes), records it dropped itself as unusable (each also reported in a LogWarning), and whether the
 * input stopped before its proper end (cut off, or broken so that reading had to stop).
 */
export interface ReaderCounts {
  recordsRead: number;
  recordsDropped: number;
  truncated: boolean;
}

/** Text fields a log or an option may carry (names, comments). Never markup: escape before display. */
export interface LogMeta {
  name?: string;
  aircraft?: string;
  pilot?: string;
  device?: string;
  comment?: string;
}

/**
 * One row per sample, all columns the same length; a missing value is NaN in its row.
 * t: seconds since 1970-01-01T00:00:00Z (UTC, fractional); lat/lon: WGS-84 degrees;
 * altM: metres above the log's vertical datum (ellipsoid or mean sea level, as `altDatum` says).
 * line: source line (text formats) or record number (binary formats) of each row, 1-based.
 */
export interface FlightLog {
  source: {
    format: LogFormat;
    file: string;
    warnings: LogWarning[];
    meta: LogMeta;
    altDatum: 'ellipsoid' | 'msl' | 'pressure' | 'unknown';
    /** What the reader saw before cleaning (optional; set by the importers, read by cleanLog). */
    reader?: ReaderCounts;
  };
  t: Float64Array;
  lat: Float64Array;
  lon: Float64Array;
  altM: Float64Array;
  line: Int32Array;
  /** Optional columns, present only when the log records them (NaN where a row lacks a value). */
  gsMs?: Float64Array;
  trackDegTrue?: Float64Array;
  headingDeg?: Float64Array;
  headingRef?: 'true' | 'magnetic';
  rollDeg?: Float64Array;
  pitchDeg?: Float64Array;
  tasMs?: Float64Array;
  iasMs?: Float64Array;
  hAccM?: Float64Array;
  /**
   * A planned route or waypoint list carried by the file (GPX rte/rtept, else wpt), not flown samples:
   * lat/lon [deg WGS-84] in file order, `names` ('' where a point has none). Optional; set by importers.
   */
  route?: LogRoute;
}

/** A route or list of waypoints from a log file (see FlightLog.route). */
export interface LogRoute {
  name?: string;
  lat: Float64Array;
  lon: Float64Array;
  names: string[];
}

/** Names of the optional numeric columns of a FlightLog. */
export const OPTIONAL_COLUMNS = ['gsMs', 'trackDegTrue', 'headingDeg', 'rollDeg', 'pitchDeg', 'tasMs', 'iasMs', 'hAccM'] as const;
export type OptionalColumn = (typeof OPTIONAL_COLUMNS)[number];

/** Number of samples in a log. */
export function logLength(log: FlightLog): number {
  return log.t.length;
}
