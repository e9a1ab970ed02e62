// Numbers and short ASCII text written straight into byte chunks, for the CSV writers of long flights:
// no string per field, so a 108,000-sample file makes no garbage per value.

const POW10 = [1, 10, 100, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9];
const CH_0 = 48;
const CH_MINUS = 45;
const CH_DOT = 46;
const CH_COMMA = 44;
const CH_NL = 10;

/**
 * Appends ASCII to a chunk of `chunkBytes`; `take()` hands over the filled part when the chunk is nearly
 * full or at the end. Numbers use fixed decimals (0–9), rounded half away from zero on the scaled binary
 * value (Math.round of |x|·10^d): this agrees with Number.prototype.toFixed except at exact binary ties,
 * and never prints "-0". A non-finite number writes nothing (an empty CSV field).
 */
export class AsciiRowWriter {
  private buf: Uint8Array;
  private pos = 0;
  private readonly digits = new Uint8Array(24);

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
    let k = 0;
    let x = Math.floor(v);
    do {
      this.digits[k++] = x % 10;
      x = Math.floor(x / 10);
    } while (x > 0);
    while (k < width) this.digits[k++] = 0;
    while (k > 0) this.buf[this.pos++] = CH_0 + this.digits[--k];
  }

  /** x with exactly `decimals` decimals; nothing for NaN or ±Infinity. |x|·10^decimals must stay below 2^53. */
  fixed(x: number, decimals: number): void {
    if (!Number.isFinite(x)) return;
    const scale = POW10[decimals];
    const r = Math.round(Math.abs(x) * scale);
    if (x < 0 && r !== 0) this.buf[this.pos++] = CH_MINUS;
    if (decimals === 0) {
      this.uint(r);
      return;
    }
    const int = Math.floor(r / scale);
    this.uint(int);
    this.buf[this.pos++] = CH_DOT;
    this.uint(r - int * scale, decimals);
  }
}
