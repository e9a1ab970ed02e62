// ISO 8601 / RFC 3339 date-times and times of day to seconds since the Unix epoch (UTC).

// Extended format date-time, as ISO 8601-1:2019 §5.4.2 and RFC 3339 §5.6 write it:
// YYYY-MM-DD, 'T' (RFC 3339 §5.6 also allows a space), hh:mm[:ss[.fraction]], then Z, ±hh:mm, ±hhmm or ±hh.
const ISO_DATE_TIME =
  /^\s*(\d{4})-(\d{2})-(\d{2})[Tt ](\d{2}):(\d{2})(?::(\d{2})(?:[.,](\d+))?)?\s*(?:([Zz])|([+-])(\d{2})(?::?(\d{2}))?)?\s*$/;

const TIME_OF_DAY = /^\s*(\d{1,2}):(\d{2})(?::(\d{2})(?:[.,](\d+))?)?\s*$/;

const DAYS_IN_MONTH = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

/** Days in a month of the proleptic Gregorian calendar (month 1–12). */
export function daysInMonth(year: number, month: number): number {
  const leap = (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0;
  return month === 2 && leap ? 29 : DAYS_IN_MONTH[month - 1];
}

/**
 * Days from 1970-01-01 to a proleptic Gregorian date (month 1–12), without a Date object: the
 * days_from_civil algorithm of H. Hinnant, "chrono-Compatible Low-Level Date Algorithms" (2013).
 */
export function daysFromCivil(year: number, month: number, day: number): number {
  const y = month <= 2 ? year - 1 : year;
  const era = Math.floor(y / 400);
  const yoe = y - era * 400;
  const doy = Math.floor((153 * (month + (month > 2 ? -3 : 9)) + 2) / 5) + day - 1;
  const doe = yoe * 365 + Math.floor(yoe / 4) - Math.floor(yoe / 100) + doy;
  return era * 146097 + doe - 719468;
}

/** Digit value of the character at i, or −1. */
function digitAt(text: string, i: number): number {
  const c = text.charCodeAt(i) - 48;
  return c >= 0 && c <= 9 ? c : -1;
}

/** The two-digit number at i, or −1. */
function twoDigitsAt(text: string, i: number): number {
  const a = digitAt(text, i);
  const b = digitAt(text, i + 1);
  return a < 0 || b < 0 ? -1 : a * 10 + b;
}

/**
 * The exact layout receivers and our own writers use, `YYYY-MM-DDThh:mm:ss[.fraction]Z`, in text[start, end),
 * read by character codes (no regular expression, no substring); NaN for anything else, which then goes
 * the general way (parseIsoDateTime).
 */
function parseIsoUtcSpan(text: string, start: number, end: number): number {
  const len = end - start;
  const s = start;
  if (len < 20 || text.charCodeAt(end - 1) !== 90 /* Z */ || text.charCodeAt(s + 4) !== 45 || text.charCodeAt(s + 7) !== 45 ||
    text.charCodeAt(s + 10) !== 84 /* T */ || text.charCodeAt(s + 13) !== 58 || text.charCodeAt(s + 16) !== 58) return NaN;
  const y1 = twoDigitsAt(text, s);
  const y2 = twoDigitsAt(text, s + 2);
  const month = twoDigitsAt(text, s + 5);
  const day = twoDigitsAt(text, s + 8);
  const hour = twoDigitsAt(text, s + 11);
  const minute = twoDigitsAt(text, s + 14);
  const second = twoDigitsAt(text, s + 17);
  if (y1 < 0 || y2 < 0 || month < 0 || day < 0 || hour < 0 || minute < 0 || second < 0) return NaN;
  const year = y1 * 100 + y2;
  if (month < 1 || month > 12 || day < 1 || day > daysInMonth(year, month) || hour > 23 || minute > 59 || second > 60) return NaN;
  let fraction = 0;
  if (len > 20) {
    if (text.charCodeAt(s + 19) !== 46 /* . */ || len === 21 || len > 36) return NaN;
    // The fraction as an integer over a power of ten: one correctly rounded division, as Number('0.…') gives.
    let num = 0;
    for (let i = s + 20; i < end - 1; i++) {
      const v = digitAt(text, i);
      if (v < 0) return NaN;
      num = num * 10 + v;
    }
    fraction = num / 10 ** (len - 21);
  }
  return daysFromCivil(year, month, day) * 86400 + hour * 3600 + minute * 60 + second + fraction;
}

/**
 * Parses an ISO 8601 extended-format date-time (e.g. `2026-05-04T10:11:12.5Z`, `2026-05-04 12:11:12+02:00`)
 * to seconds since 1970-01-01T00:00:00Z, keeping fractional seconds exactly as written (not rounded to ms).
 * A value without a zone designator is local time `noZoneOffsetMin` minutes east of UTC (0: taken as UTC).
 * Returns NaN for anything else (bad syntax, month 13, 31 April, minute 60, offset beyond ±18 h).
 * Leap second 60 is accepted and lands on the next minute's 0 s (Unix time has no leap seconds).
 */
export function parseIsoDateTime(text: string, noZoneOffsetMin = 0): number {
  const fast = parseIsoUtcSpan(text, 0, text.length);
  if (fast === fast) return fast; // not NaN: the common YYYY-MM-DDThh:mm:ss[.f…]Z layout
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
