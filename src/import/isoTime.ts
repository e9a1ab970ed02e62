// ISO 8601 / RFC 3339 date-times and times of day to seconds since the Unix epoch (UTC).
import { asciiScratch, parseIsoBytes, parseTimeOfDayBytes } from './asciiFields.js';
import { daysFromCivil, daysInMonth } from './civilDays.js';

// Extended format date-time, as ISO 8601-1:2019 §5.4.2 and RFC 3339 §5.6 write it:
// YYYY-MM-DD, 'T' (RFC 3339 §5.6 also allows a space), hh:mm[:ss[.fraction]], then Z, ±hh:mm, ±hhmm or ±hh.
const ISO_DATE_TIME =
  /^\s*(\d{4})-(\d{2})-(\d{2})[Tt ](\d{2}):(\d{2})(?::(\d{2})(?:[.,](\d+))?)?\s*(?:([Zz])|([+-])(\d{2})(?::?(\d{2}))?)?\s*$/;

const TIME_OF_DAY = /^\s*(\d{1,2}):(\d{2})(?::(\d{2})(?:[.,](\d+))?)?\s*$/;

/**
 * Parses an ISO 8601 extended-format date-time (e.g. `2026-05-04T10:11:12.5Z`, `2026-05-04 12:11:12+02:00`)
 * to seconds since 1970-01-01T00:00:00Z, keeping fractional seconds exactly as written (not rounded to ms).
 * A value without a zone designator is local time `noZoneOffsetMin` minutes east of UTC (0: taken as UTC).
 * Returns NaN for anything else (bad syntax, month 13, 31 April, minute 60, offset beyond ±18 h).
 * Leap second 60 is accepted and lands on the next minute's 0 s (Unix time has no leap seconds).
 */
export function parseIsoDateTime(text: string, noZoneOffsetMin = 0): number {
  const bytes = asciiScratch(text);
  if (bytes) {
    const fast = parseIsoBytes(bytes, 0, text.length, noZoneOffsetMin);
    if (fast === fast) return fast; // not NaN: written without blanks, read by character codes
  }
  return parseIsoDateTimeByPattern(text, noZoneOffsetMin);
}

/**
 * parseIsoDateTime the general way, by its regular expression (blanks around the parts, long fractions):
 * the definition the byte reader parseIsoBytes is held equal to in the tests.
 */
export function parseIsoDateTimeByPattern(text: string, noZoneOffsetMin = 0): number {
  const m = ISO_DATE_TIME.exec(text);
  if (!m) return NaN;
  const year = +m[1];
  const month = +m[2];
  const day = +m[3];
  const hour = +m[4];
  const minute = +m[5];
  const second = m[6] !== undefined ? +m[6] : 0;
  if (month < 1 || month > 12 || day < 1 || day > daysInMonth(year, month)) return NaN;
  if (hour > 23 || minute > 59 || second > 60) return NaN;
  let offsetMin = noZoneOffsetMin;
  if (m[8] !== undefined) offsetMin = 0;
  else if (m[9] !== undefined) {
    const oh = +m[10];
    const om = m[11] !== undefined ? +m[11] : 0;
    if (oh > 18 || om > 59) return NaN;
    offsetMin = (m[9] === '-' ? -1 : 1) * (oh * 60 + om);
  }
  const fraction = m[7] !== undefined ? Number(`0.${m[7]}`) : 0;
  const whole = daysFromCivil(year, month, day) * 86400 + hour * 3600 + minute * 60 + second;
  return whole + fraction - offsetMin * 60;
}

/** Whether an ISO 8601 date-time string carries a zone designator (Z or a numeric offset). */
export function isoHasZone(text: string): boolean {
  const m = ISO_DATE_TIME.exec(text);
  return m !== null && (m[8] !== undefined || m[9] !== undefined);
}

/**
 * Parses a time of day `h:mm`, `hh:mm:ss` or `hh:mm:ss.fff` to seconds after midnight [0, 86401).
 * Returns NaN for bad syntax or out-of-range fields.
 */
export function parseTimeOfDay(text: string): number {
  const bytes = asciiScratch(text);
  if (bytes) {
    const fast = parseTimeOfDayBytes(bytes, 0, text.length);
    if (fast === fast) return fast;
  }
  return parseTimeOfDayByPattern(text);
}

/** parseTimeOfDay the general way, by its regular expression: the definition parseTimeOfDayBytes is held equal to in the tests. */
export function parseTimeOfDayByPattern(text: string): number {
  const m = TIME_OF_DAY.exec(text);
  if (!m) return NaN;
  const hour = +m[1];
  const minute = +m[2];
  const second = m[3] !== undefined ? +m[3] : 0;
  if (hour > 23 || minute > 59 || second > 60) return NaN;
  const fraction = m[4] !== undefined ? Number(`0.${m[4]}`) : 0;
  return hour * 3600 + minute * 60 + second + fraction;
}

/** Parses a calendar date `YYYY-MM-DD` to seconds since the epoch at 00:00 UTC of that day; NaN if invalid. */
export function parseIsoDate(text: string): number {
  const m = /^\s*(\d{4})-(\d{2})-(\d{2})\s*$/.exec(text);
  if (!m) return NaN;
  const year = +m[1];
  const month = +m[2];
  const day = +m[3];
  if (month < 1 || month > 12 || day < 1 || day > daysInMonth(year, month)) return NaN;
  return daysFromCivil(year, month, day) * 86400;
}
