// Numbers and short ASCII text written straight into byte chunks, for the CSV writers of long flights:
// no string per field, so a 108,000-sample file makes no garbage per value.
//
// The hot loops call the free functions (bytes, position in → new position out) on the writer's `buf` and
// `pos`; the class wraps them for code that writes a few fields. Numbers use fixed decimals (0–9), rounded
// half away from zero on the scaled binary value (Math.round of |x|·10^d): this agrees with
// Number.prototype.toFixed except at exact binary ties, and never prints "-0". A non-finite number writes
// nothing (an empty CSV field).

const POW10 = [1, 10, 100, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9];
const CH_0 = 48;
const CH_MINUS = 45;
const CH_DOT = 46;
const CH_COMMA = 44;
const CH_NL = 10;
/** 2^31: below it, integers fit an int32 and the digits come from integer arithmetic. */
const INT31 = 2147483648;

/** "00", "01", … "99" as byte pairs: DIGIT_PAIRS[2k], DIGIT_PAIRS[2k + 1] are the two digits of k. */
const DIGIT_PAIRS = new Uint8Array(200);
for (let k = 0; k < 100; k++) {
  DIGIT_PAIRS[2 * k] = CH_0 + Math.floor(k / 10);
  DIGIT_PAIRS[2 * k + 1] = CH_0 + (k % 10);
}

/** Number of decimal digits of an integer 0 ≤ v < 2^31 (1 for 0). */
function digitCount31(v: number): number {
  if (v < 100_000) return v < 10 ? 1 : v < 100 ? 2 : v < 1000 ? 3 : v < 10_000 ? 4 : 5;
  return v < 1e6 ? 6 : v < 1e7 ? 7 : v < 1e8 ? 8 : v < 1e9 ? 9 : 10;
}

/** Writes the `width` lowest decimal digits of an integer 0 ≤ v < 2^31 ending just before buf[end]. */
function digitsBefore(buf: Uint8Array, end: number, v: number, width: number): void {
  let x = v | 0;
  let q = end;
  let left = width;
  while (left >= 2) {
    const two = x % 100;
    x = (x / 100) | 0;
    buf[--q] = DIGIT_PAIRS[2 * two + 1];
    buf[--q] = DIGIT_PAIRS[2 * two];
    left -= 2;
  }
  if (left === 1) buf[--q] = CH_0 + (x % 10);
}

/**
 * Writes a non-negative integer with at least `width` digits (zero-padded) at buf[pos]; returns the new
 * position. Same digits as the reference `uintReference` for every input (that one is used outside 0 ≤ v < 2^31).
 */
export function writeUint(buf: Uint8Array, pos: number, v: number, width = 1): number {
  if (!(v >= 0 && v < INT31)) return uintReference(buf, pos, v, width);
  const x = Math.floor(v);
  const len = Math.max(digitCount31(x), width);
  digitsBefore(buf, pos + len, x, len);
  return pos + len;
}

/**
 * Math.round(a) for 0 ≤ a < 2^31 − 1, the same value. floor(a + 0.5) is one too high only where the
 * addition rounds up across an integer (a just below k − 0.5, e.g. 0.49999999999999994), which the
 * comparison undoes; r − 0.5 is exact. Math.round itself is several times slower in V8's optimised code.
 */
export function roundNonNegative31(a: number): number {
  const r = (a + 0.5) | 0;
  return r - 0.5 > a ? r - 1 : r;
}

/**
 * Writes the rounded scaled value r = round(|x|·10^decimals) (0 ≤ r < 2^31) as fixed decimals at buf[pos],
 * with a leading "-" when `negative` and r ≠ 0; returns the new position. The digits of r are made from the
 * end with int32 arithmetic, two at a time from a table, the point set in after `decimals` of them.
 */
export function writeScaled31(buf: Uint8Array, pos: number, negative: boolean, r: number, decimals: number): number {
  let p = pos;
  if (negative && r !== 0) buf[p++] = CH_MINUS;
  const scale = POW10[decimals];
  // Integer digits: those of floor(r / 10^decimals), at least one.
  const intDigits = r < 10 * scale ? 1 : r < 100 * scale ? 2 : r < 1000 * scale ? 3 : Math.max(1, digitCount31(r) - decimals);
  const end = p + intDigits + (decimals > 0 ? decimals + 1 : 0);
  let x = r | 0;
  let q = end;
  let k = decimals;
  for (; k >= 2; k -= 2) {
    const two = x % 100;
    x = (x / 100) | 0;
    buf[--q] = DIGIT_PAIRS[2 * two + 1];
    buf[--q] = DIGIT_PAIRS[2 * two];
  }
  if (k === 1) {
    buf[--q] = CH_0 + (x % 10);
    x = (x / 10) | 0;
  }
  if (decimals > 0) buf[--q] = CH_DOT;
  while (x >= 100) {
    const two = x % 100;
    x = (x / 100) | 0;
    buf[--q] = DIGIT_PAIRS[2 * two + 1];
    buf[--q] = DIGIT_PAIRS[2 * two];
  }
  if (x >= 10) {
    buf[--q] = DIGIT_PAIRS[2 * x + 1];
    buf[--q] = DIGIT_PAIRS[2 * x];
  } else buf[--q] = CH_0 + x;
  return end;
}

/** Writes an integer 0 ≤ v < 100 as exactly two digits at buf[pos]; returns pos + 2. */
export function writeTwoDigits(buf: Uint8Array, pos: number, v: number): number {
  buf[pos] = DIGIT_PAIRS[2 * v];
  buf[pos + 1] = DIGIT_PAIRS[2 * v + 1];
  return pos + 2;
}

/**
 * Writes x with exactly `decimals` decimals at buf[pos] (nothing for NaN or ±Infinity); returns the new
 * position. Byte for byte the reference `fixedReference`: the scaled value is rounded to the same integer,
 * and only the digits are made differently (writeScaled31; the reference is used from 2^31 − 1 up).
 */
export function writeFixed(buf: Uint8Array, pos: number, x: number, decimals: number): number {
  if (!Number.isFinite(x)) return pos;
  const a = Math.abs(x) * POW10[decimals];
  if (!(a < INT31 - 1)) return fixedReference(buf, pos, x, decimals);
  let r = (a + 0.5) | 0; // roundNonNegative31(a), written out
  if (r - 0.5 > a) r--;
  return writeScaled31(buf, pos, x < 0, r, decimals);
}

/** The plain digit loop the fast writers must match: floor(v) with at least `width` digits, made by % 10. */
export function uintReference(buf: Uint8Array, pos: number, v: number, width = 1): number {
  const digits = new Uint8Array(24);
  let p = pos;
  let k = 0;
  let x = Math.floor(v);
  do {
    digits[k++] = x % 10;
    x = Math.floor(x / 10);
  } while (x > 0);
  while (k < width) digits[k++] = 0;
  while (k > 0) buf[p++] = CH_0 + digits[--k];
  return p;
}

/**
 * The plain fixed-decimals writer the fast one must match (see writeFixed). Where |x|·10^decimals is 2^53
 * or more (no value of a flight comes near: beyond it the digits would not be exact, and at overflow to
 * Infinity the digit loop would never end) nothing is written, as for NaN: the field is left empty.
 */
export function fixedReference(buf: Uint8Array, pos: number, x: number, decimals: number): number {
  if (!Number.isFinite(x)) return pos;
  let p = pos;
  const scale = POW10[decimals];
  if (!(Math.abs(x) * scale < 2 ** 53)) return pos;
  const r = Math.round(Math.abs(x) * scale);
  if (x < 0 && r !== 0) buf[p++] = CH_MINUS;
  if (decimals === 0) return uintReference(buf, p, r);
  const int = Math.floor(r / scale);
  p = uintReference(buf, p, int);
  buf[p++] = CH_DOT;
  return uintReference(buf, p, r - int * scale, decimals);
}

/**
 * Appends ASCII to a chunk of `chunkBytes`; `take()` hands over the filled part when the chunk is nearly
 * full or at the end. `buf` and `pos` are public for the row loops that write with writeFixed/writeUint.
 */
export class AsciiRowWriter {
  buf: Uint8Array;
  pos = 0;

  constructor(private readonly chunkBytes = 1 << 20) {
    this.buf = new Uint8Array(chunkBytes);
  }

  /** True when fewer than `reserve` bytes are left in the chunk (a row of ours is under 400 bytes). */
  nearlyFull(reserve = 1024): boolean {
    return this.pos > this.chunkBytes - reserve;
  }

  /** The bytes written so far (a view on a chunk that is then no longer written to); a new chunk starts. */
  take(): Uint8Array {
    const out = this.buf.subarray(0, this.pos);
    this.buf = new Uint8Array(this.chunkBytes);
    this.pos = 0;
    return out;
  }

  ascii(text: string): void {
    for (let i = 0; i < text.length; i++) this.buf[this.pos++] = text.charCodeAt(i);
  }

  comma(): void {
    this.buf[this.pos++] = CH_COMMA;
  }

  newline(): void {
    this.buf[this.pos++] = CH_NL;
  }

  /** A non-negative integer with at least `width` digits (zero-padded). */
  uint(v: number, width = 1): void {
    this.pos = writeUint(this.buf, this.pos, v, width);
  }

  /** x with exactly `decimals` decimals; nothing for NaN or ±Infinity. |x|·10^decimals must stay below 2^53. */
  fixed(x: number, decimals: number): void {
    this.pos = writeFixed(this.buf, this.pos, x, decimals);
  }
}
