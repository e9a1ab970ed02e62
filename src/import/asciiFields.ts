// Numbers and times read by byte codes: in place from the bytes of a text file (ASCII fields of UTF-8
// text, with no string per field: the reading of large delimited logs), and for the string readers of
// parseNumber.ts and isoTime.ts through a scratch copy. Each reader gives NaN for anything outside its
// plain form, and the caller then decodes the field and takes the general (string) way, so the result is
// always what the string readers of parseNumber.ts and isoTime.ts give.
import { daysFromCivil, daysInMonth } from './civilDays.js';

/** Longest text the string readers copy into the scratch buffer to read it by byte codes. */
const SCRATCH_CHARS = 64;
const scratch = new Uint8Array(SCRATCH_CHARS);

/**
 * The text as bytes in a shared scratch buffer, for the string readers (parseDecimal, parseIsoDateTime,
 * parseTimeOfDay) to use the byte readers here: undefined when it is longer than 64 characters or not
 * ASCII (then they take their regular expressions). Valid until the next call.
 */
export function asciiScratch(text: string): Uint8Array | undefined {
  const n = text.length;
  if (n > SCRATCH_CHARS) return undefined;
  for (let i = 0; i < n; i++) {
    const c = text.charCodeAt(i);
    if (c > 127) return undefined;
    scratch[i] = c;
  }
  return scratch;
}

/** Powers of ten that are exact doubles (10^0 … 10^22). */
const EXACT_POW10 = Array.from({ length: 23 }, (_, k) => 10 ** k);

/** Byte of the decimal point '.' and of the decimal comma ','. */
export const POINT = 46;
export const COMMA = 44;

/**
 * The plain form `[+-]digits[.digits]` of bytes[start, end) with at most 15 digits in all: the digits form
 * an exact integer m, and m / 10^f (f fraction digits) is one correctly rounded division, equal to what
 * Number() gives for the same text (the exact fast path of W. D. Clinger, "How to read floating point
 * numbers accurately", PLDI 1990). NaN for anything else: empty, blanks, an exponent, more digits, junk.
 */
export function parsePlainDecimalBytes(bytes: Uint8Array, start: number, end: number, pointByte: number): number {
  let i = start;
  let negative = false;
  let c = bytes[i];
  if (c === 45 /* - */ || c === 43 /* + */) {
    negative = c === 45;
    i++;
  }
  let mantissa = 0;
  let digits = 0;
  let fractionDigits = -1;
  for (; i < end; i++) {
    c = bytes[i] - 48;
    if (c >= 0 && c <= 9) {
      mantissa = mantissa * 10 + c;
      digits++;
      if (fractionDigits >= 0) fractionDigits++;
    } else if (c === pointByte - 48 && fractionDigits < 0) {
      fractionDigits = 0;
    } else {
      return NaN;
    }
  }
  if (digits === 0 || digits > 15) return NaN;
  const v = fractionDigits > 0 ? mantissa / EXACT_POW10[fractionDigits] : mantissa;
  return negative ? -v : v;
}

/** The two-digit number at bytes[i], or −1. */
function twoDigits(bytes: Uint8Array, i: number): number {
  const a = bytes[i] - 48;
  const b = bytes[i + 1] - 48;
  return a < 0 || a > 9 || b < 0 || b > 9 ? -1 : a * 10 + b;
}

/**
 * An ISO 8601-1:2019 §5.4.2 extended-format date-time written without blanks around it, in bytes[start, end):
 * `YYYY-MM-DD`, `T`, `t` or a space (RFC 3339 §5.6), `hh:mm[:ss[.fraction]]` (point or comma, at most 15
 * fraction digits), then `Z`, `±hh:mm`, `±hhmm`, `±hh` or no zone (then local time `noZoneOffsetMin` east of
 * UTC), to seconds since the Unix epoch; NaN for anything else. The same grammar, checks and arithmetic as
 * parseIsoDateTime (isoTime.ts), whose regular expression is the general way.
 */
export function parseIsoBytes(bytes: Uint8Array, start: number, end: number, noZoneOffsetMin: number): number {
  const s = start;
  if (end - s < 16 || bytes[s + 4] !== 45 || bytes[s + 7] !== 45 || bytes[s + 13] !== 58) return NaN;
  const sep = bytes[s + 10];
  if (sep !== 84 /* T */ && sep !== 116 /* t */ && sep !== 32) return NaN;
  const y1 = twoDigits(bytes, s);
  const y2 = twoDigits(bytes, s + 2);
  const month = twoDigits(bytes, s + 5);
  const day = twoDigits(bytes, s + 8);
  const hour = twoDigits(bytes, s + 11);
  const minute = twoDigits(bytes, s + 14);
  if (y1 < 0 || y2 < 0 || month < 0 || day < 0 || hour < 0 || minute < 0) return NaN;
  let i = s + 16;
  let second = 0;
  let fraction = 0;
  if (i < end && bytes[i] === 58 /* : */) {
    second = twoDigits(bytes, i + 1);
    if (second < 0 || i + 3 > end) return NaN;
    i += 3;
    if (i < end && (bytes[i] === 46 || bytes[i] === 44)) {
      let num = 0;
      let k = 0;
      for (i++; i < end; i++, k++) {
        const v = bytes[i] - 48;
        if (v < 0 || v > 9) break;
        num = num * 10 + v;
      }
      if (k === 0 || k > 15) return NaN;
      // One correctly rounded division, as Number('0.…') gives.
      fraction = num / 10 ** k;
    }
  }
  let offsetMin = noZoneOffsetMin;
  if (i < end) {
    const z = bytes[i];
    if (z === 90 /* Z */ || z === 122 /* z */) {
      offsetMin = 0;
      i++;
    } else if (z === 43 /* + */ || z === 45 /* - */) {
      const oh = twoDigits(bytes, i + 1);
      if (oh < 0 || i + 3 > end) return NaN;
      i += 3;
      let om = 0;
      if (i < end && bytes[i] === 58) i++;
      if (i < end) {
        om = twoDigits(bytes, i);
        if (om < 0 || i + 2 > end) return NaN;
        i += 2;
      }
      if (oh > 18 || om > 59) return NaN;
      offsetMin = (z === 45 ? -1 : 1) * (oh * 60 + om);
    } else return NaN;
  }
  if (i !== end) return NaN;
  const year = y1 * 100 + y2;
  if (month < 1 || month > 12 || day < 1 || day > daysInMonth(year, month) || hour > 23 || minute > 59 || second > 60) return NaN;
  const whole = daysFromCivil(year, month, day) * 86400 + hour * 3600 + minute * 60 + second;
  return whole + fraction - offsetMin * 60;
}

/**
 * A time of day `h:mm`, `hh:mm`, `hh:mm:ss` or `hh:mm:ss.fff` (point or comma, at most 15 fraction digits)
 * written without blanks in bytes[start, end), to seconds after midnight; NaN for anything else. The
 * grammar, range checks and arithmetic of parseTimeOfDay (isoTime.ts).
 */
export function parseTimeOfDayBytes(bytes: Uint8Array, start: number, end: number): number {
  let i = start;
  const h0 = bytes[i] - 48;
  if (!(h0 >= 0 && h0 <= 9)) return NaN;
  let hour = h0;
  i++;
  const h1 = bytes[i] - 48;
  if (i < end && h1 >= 0 && h1 <= 9) {
    hour = h0 * 10 + h1;
    i++;
  }
  if (!(i < end && bytes[i] === 58)) return NaN;
  const minute = twoDigits(bytes, i + 1);
  if (minute < 0 || i + 3 > end) return NaN;
  i += 3;
  let second = 0;
  let fraction = 0;
  if (i < end) {
    if (bytes[i] !== 58) return NaN;
    second = twoDigits(bytes, i + 1);
    if (second < 0 || i + 3 > end) return NaN;
    i += 3;
    if (i < end) {
      if (bytes[i] !== 46 && bytes[i] !== 44) return NaN;
      let num = 0;
      let k = 0;
      for (i++; i < end; i++, k++) {
        const v = bytes[i] - 48;
        if (v < 0 || v > 9) return NaN;
        num = num * 10 + v;
      }
      if (k === 0 || k > 15) return NaN;
      fraction = num / 10 ** k;
    }
  }
  if (hour > 23 || minute > 59 || second > 60) return NaN;
  return hour * 3600 + minute * 60 + second + fraction;
}
