// The fast number writers of the CSV against the plain writer they replaced (kept here verbatim as the
// oracle: src/report/asciiRowWriter.ts at commit 430faca), byte for byte, over random doubles including
// rounding ties, huge and tiny values, −0, NaN and ±Infinity; and the whole samples CSV against the
// row loop of that commit.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { KT_MS } from '../../src/constants.js';
import { wrap180, wrap360 } from '../../src/geo/angles.js';
import type { FlightAnalysis } from '../../src/flightAnalysis.js';
import { AsciiRowWriter, fixedReference, roundNonNegative31, uintReference, writeFixed, writeUint } from '../../src/report/asciiRowWriter.js';
import { samplesCsv, samplesCsvChunks, SAMPLES_CONTRACT_COLUMNS, SAMPLES_EXTRA_COLUMNS } from '../../src/report/samplesCsv.js';
import { syntheticFlight } from './syntheticFlight.js';

/** The writer of commit 430faca, unchanged: the reference the fast writers must match byte for byte. */
class PlainRowWriter {
  private buf: Uint8Array;
  private pos = 0;
  private readonly digits = new Uint8Array(24);
  constructor(private readonly chunkBytes = 1 << 20) {
    this.buf = new Uint8Array(chunkBytes);
  }
  nearlyFull(reserve = 1024): boolean {
    return this.pos > this.chunkBytes - reserve;
  }
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
    this.buf[this.pos++] = 44;
  }
  newline(): void {
    this.buf[this.pos++] = 10;
  }
  uint(v: number, width = 1): void {
    let k = 0;
    let x = Math.floor(v);
    do {
      this.digits[k++] = x % 10;
      x = Math.floor(x / 10);
    } while (x > 0);
    while (k < width) this.digits[k++] = 0;
    while (k > 0) this.buf[this.pos++] = 48 + this.digits[--k];
  }
  fixed(x: number, decimals: number): void {
    if (!Number.isFinite(x)) return;
    const scale = [1, 10, 100, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9][decimals];
    const r = Math.round(Math.abs(x) * scale);
    if (x < 0 && r !== 0) this.buf[this.pos++] = 45;
    if (decimals === 0) {
      this.uint(r);
      return;
    }
    const int = Math.floor(r / scale);
    this.uint(int);
    this.buf[this.pos++] = 46;
    this.uint(r - int * scale, decimals);
  }
}

const latin1 = (b: Uint8Array) => Buffer.from(b).toString('latin1');
const plainFixed = (x: number, d: number) => {
  const w = new PlainRowWriter(4096);
  w.fixed(x, d);
  return latin1(w.take());
};
const fastFixed = (x: number, d: number) => {
  const buf = new Uint8Array(4096);
  return latin1(buf.subarray(0, writeFixed(buf, 0, x, d)));
};

/** Doubles of every kind the CSV can meet: flight values, exact ties x.xx5, huge, tiny, specials. */
const anyDouble = fc.oneof(
  fc.double({ min: -1000, max: 1000 }),
  // Any double, NaN, ±Infinity, −0 and subnormals included, up to 1e290 in size: beyond that |x|·10^9 is
  // infinite, where the plain writer's digit loop never ends (its contract: |x|·10^d below 2^53).
  fc.double().filter((x) => !(Math.abs(x) > 1e290)),
  fc.integer({ min: -2_000_000, max: 2_000_000 }).map((k) => (k + 0.5) / 1000), // ties at the 3rd decimal (as binary)
  fc.integer({ min: -20_000, max: 20_000 }).map((k) => k / 100 + 0.005), // x.xx5
  fc.double({ min: 1e5, max: 1e12 }),
  fc.double({ min: -1e-6, max: 1e-6 }),
  fc.constantFrom(-0, 0, NaN, Infinity, -Infinity, 0.5, -0.5, 1.005, 2.675, 359.995, 214.74836475, 2 ** 31, 2 ** 53, 1e21, -1e280),
);

describe('fast fixed-decimal writer (writeFixed) against the plain writer of commit 430faca', () => {
  it('writes the same bytes for every double and 0–9 decimals within the plain writer\'s contract, |x|·10^d below 2^53 (fast-check, 20,000 cases)', () => {
    fc.assert(
      fc.property(anyDouble, fc.integer({ min: 0, max: 9 }), (x, d) => {
        if (Math.abs(x) * 10 ** d >= 2 ** 53) expect(fastFixed(x, d)).toBe('');
        else expect(fastFixed(x, d)).toBe(plainFixed(x, d));
      }),
      { numRuns: 20_000, seed: 430 },
    );
  });

  it('writes the same bytes where |x|·10^d lies at 2^31 and just around it (where the fast path hands over)', () => {
    for (const d of [0, 2, 7]) {
      for (const base of [2 ** 31 - 1, 2 ** 31, 2 ** 31 - 0.5, 2 ** 31 - 1.5]) {
        for (const x of [base / 10 ** d, -base / 10 ** d, (base + 1) / 10 ** d]) expect(fastFixed(x, d)).toBe(plainFixed(x, d));
      }
    }
  });

  it('agrees with the in-source reference fixedReference, and with toFixed away from binary ties (ECMA-262 Number.prototype.toFixed)', () => {
    fc.assert(
      fc.property(fc.double({ min: -1e6, max: 1e6, noNaN: true }), fc.integer({ min: 0, max: 7 }), (x, d) => {
        const buf = new Uint8Array(64);
        expect(fastFixed(x, d)).toBe(latin1(buf.subarray(0, fixedReference(buf, 0, x, d))));
        const scaled = Math.abs(x) * 10 ** d;
        if (Math.abs(scaled - Math.floor(scaled) - 0.5) > 1e-6) expect(fastFixed(x, d)).toBe(x.toFixed(d).replace(/^-(0\.?0*)$/, '$1'));
      }),
      { numRuns: 5000, seed: 7 },
    );
  });

  it('leaves the field empty where |x|·10^d reaches 2^53 (digits no longer exact; at overflow the digit loop used to hang)', () => {
    // Oracle: IEEE 754 binary64 holds every integer below 2^53 exactly and not all above it.
    expect(fastFixed(1e300, 7)).toBe('');
    expect(fastFixed(-1e300, 2)).toBe('');
    expect(fastFixed(2 ** 53 / 1e7, 7)).toBe('');
    expect(fastFixed(12345678901.25, 2)).toBe('12345678901.25'); // below 2^53 after scaling: written
  });

  it('never writes "-0": −0 and negatives rounding to zero are written unsigned (the plain writer\'s rule)', () => {
    expect(fastFixed(-0, 2)).toBe('0.00');
    expect(fastFixed(-0.004, 2)).toBe('0.00');
    expect(fastFixed(-0.005, 2)).toBe('-0.01'); // 0.005·100 = 0.5000000000000001 in binary: rounds away
    expect(fastFixed(NaN, 2)).toBe('');
    expect(fastFixed(-Infinity, 1)).toBe('');
  });

  it('rounds as Math.round does, also just below each k − 0.5 where floor(a + 0.5) would be one too high', () => {
    const below = (v: number) => v - Math.max(Number.MIN_VALUE, Math.abs(v) * Number.EPSILON) / 2;
    for (let k = 0; k <= 31; k++) {
      for (const a of [2 ** k - 0.5, below(2 ** k - 0.5), 2 ** k, below(2 ** k), 2 ** k + 0.5]) {
        if (a >= 0 && a < 2 ** 31 - 1) expect(roundNonNegative31(a)).toBe(Math.round(a));
      }
    }
    expect(roundNonNegative31(0.49999999999999994)).toBe(0);
    fc.assert(
      fc.property(fc.double({ min: 0, max: 2 ** 31 - 2, noNaN: true }), (a) => {
        expect(roundNonNegative31(a)).toBe(Math.round(a));
      }),
      { numRuns: 20_000, seed: 31 },
    );
  });
});

describe('fast integer writer (writeUint) against the plain writer', () => {
  it('writes the same digits for every value and width, the plain loop taking over outside 0 ≤ v < 2^31', () => {
    fc.assert(
      fc.property(
        fc.oneof(fc.integer({ min: 0, max: 2 ** 31 - 1 }), fc.integer({ min: 0, max: 999 }), fc.double({ min: 0, max: 1e6, noNaN: true }), fc.constantFrom(2 ** 31, 2 ** 40, 0)),
        fc.integer({ min: 1, max: 4 }),
        (v, width) => {
          const w = new PlainRowWriter(4096);
          w.uint(v, width);
          const buf = new Uint8Array(64);
          expect(latin1(buf.subarray(0, writeUint(buf, 0, v, width)))).toBe(latin1(w.take()));
          expect(latin1(buf.subarray(0, uintReference(buf, 0, v, width)))).toBe(latin1(buf.subarray(0, writeUint(buf, 0, v, width))));
        },
      ),
      { numRuns: 5000, seed: 5 },
    );
  });

  it('keeps the AsciiRowWriter methods writing what the plain writer wrote', () => {
    const fast = new AsciiRowWriter(4096);
    const plain = new PlainRowWriter(4096);
    for (const w of [fast, plain]) {
      w.ascii('a,b');
      w.newline();
      w.fixed(-12.345, 2);
      w.comma();
      w.uint(7, 3);
    }
    expect(latin1(fast.take())).toBe(latin1(plain.take()));
  });
});

describe('geo/angles wraps, which skip the remainder where |deg| < 360, against the plain remainder definition', () => {
  it('give bit-identical results (Object.is, so −0 counts) for any double', () => {
    // Oracle: the definitions as first written (ECMA-262 % then the [0, 360) shift).
    const plain360 = (d: number) => {
      const r = d % 360;
      const w = r < 0 ? r + 360 : r;
      return w === 360 ? 0 : w + 0;
    };
    const plain180 = (d: number) => {
      const w = plain360(d);
      return w > 180 ? w - 360 : w;
    };
    fc.assert(
      fc.property(fc.oneof(fc.double(), fc.double({ min: -720, max: 720 }), fc.constantFrom(-360, 360, -180, 180, -0, 0, 359.99999999999994, -1e-20)), (x) => {
        expect(Object.is(wrap360(x), plain360(x))).toBe(true);
        expect(Object.is(wrap180(x), plain180(x))).toBe(true);
      }),
      { numRuns: 20_000, seed: 360 },
    );
  });
});

/** The samples CSV row loop of commit 430faca on the plain writer (the oracle for the whole file). */
function plainSamplesCsv(a: FlightAnalysis): string {
  const { state: s, field: f, compass: c } = a;
  const w = new PlainRowWriter(1 << 22);
  const angle360 = (x: number, d: number) => {
    if (!Number.isFinite(x)) return;
    const v = wrap360(x);
    w.fixed(Math.round(v * 10 ** d) >= 360 * 10 ** d ? 0 : v, d);
  };
  const angle180 = (x: number, d: number) => {
    if (Number.isFinite(x)) w.fixed(wrap180(x), d);
  };
  const iso = (tS: number) => {
    if (!Number.isFinite(tS)) return;
    const ms = Math.round(tS * 1000);
    const d = Math.floor(ms / 86_400_000);
    let rem = ms - d * 86_400_000;
    const h = Math.floor(rem / 3_600_000);
    rem -= h * 3_600_000;
    const m = Math.floor(rem / 60_000);
    rem -= m * 60_000;
    const sec = Math.floor(rem / 1000);
    w.ascii(new Date(d * 86_400_000).toISOString().slice(0, 11));
    w.uint(h, 2); w.ascii(':'); w.uint(m, 2); w.ascii(':'); w.uint(sec, 2); w.ascii('.'); w.uint(rem - sec * 1000, 3); w.ascii('Z');
  };
  const windFrom = (n: number, e: number) => (Math.hypot(n, e) > 0 ? (Math.atan2(-e, -n) * 180) / Math.PI : 0);
  w.ascii([...SAMPLES_CONTRACT_COLUMNS, ...SAMPLES_EXTRA_COLUMNS].join(','));
  w.newline();
  const parts: string[] = [];
  for (let i = 0; i < s.n; i++) {
    iso(s.t[i]); w.comma();
    w.fixed(s.lat[i], 7); w.comma(); w.fixed(s.lon[i], 7); w.comma(); w.fixed(s.altM[i], 1); w.comma();
    w.fixed(s.gsMs[i] / KT_MS, 2); w.comma();
    angle360(s.trackDegTrue[i], 2); w.comma(); angle360(s.headingDegTrue[i], 2); w.comma();
    angle360(s.headingDegTrue[i] - f.variationDeg[i], 2); w.comma(); angle180(f.variationDeg[i], 3); w.comma();
    w.fixed(f.dipDeg[i], 3); w.comma(); w.fixed(s.bankDeg[i], 2); w.comma(); w.fixed(s.turnRateDps[i], 3); w.comma();
    w.fixed(s.accelLongMs2[i], 3); w.comma(); angle360(c.staticDeg[i], 2); w.comma(); angle360(c.readingDeg[i], 2); w.comma();
    angle180(c.errorDeg[i], 2); w.comma(); w.fixed(c.errDipTurnDeg[i], 2); w.comma(); w.fixed(c.errDipAccelDeg[i], 2); w.comma();
    w.fixed(c.errLagSwirlDeg[i], 2); w.comma(); w.fixed(c.errDeviationDeg[i], 2); w.comma(); w.fixed(c.tiltDeg[i], 2); w.comma();
    w.uint(c.unreliable[i]); w.comma(); w.uint(s.segment[i]); w.comma();
    angle180(s.trackDegTrue[i] - s.headingDegTrue[i], 2); w.comma();
    w.fixed(s.headingSigmaDeg ? s.headingSigmaDeg[i] : NaN, 2); w.comma();
    angle360(windFrom(s.windN[i], s.windE[i]), 1); w.comma();
    w.fixed(Math.hypot(s.windN[i], s.windE[i]) / KT_MS, 1);
    w.newline();
    if (w.nearlyFull()) parts.push(latin1(w.take()));
  }
  parts.push(latin1(w.take()));
  return parts.join('');
}

describe('samples CSV against the row loop of commit 430faca', () => {
  it('is byte-identical on a synthetic flight, including times across midnight', () => {
    const a = syntheticFlight({ durationS: 1200, hz: 5, t0Utc: Date.UTC(2026, 4, 4, 23, 55) / 1000 + 0.05 });
    expect(samplesCsv(a)).toBe(plainSamplesCsv(a));
  });

  it('is byte-identical with NaN holes, −0, ties, headings at 360 and values of every size planted in the columns', () => {
    const a = syntheticFlight({ durationS: 300, hz: 2 });
    const cols = [a.state.lat, a.state.altM, a.state.trackDegTrue, a.state.headingDegTrue, a.state.windN, a.state.windE, a.field.variationDeg, a.compass.errorDeg, a.compass.tiltDeg, a.state.t];
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.nat(cols.length - 1), fc.nat(a.state.n - 1), anyDouble.filter((x) => Math.abs(x) < 1e9)), { maxLength: 60 }), (plants) => {
        const saved = plants.map(([k, i]) => cols[k][i]);
        plants.forEach(([k, i, x]) => (cols[k][i] = k === cols.length - 1 ? a.state.t[i] + (Number.isFinite(x) ? x % 1 : x) : x));
        try {
          expect(samplesCsv(a)).toBe(plainSamplesCsv(a));
        } finally {
          plants.forEach(([k, i], j) => (cols[k][i] = saved[j]));
        }
      }),
      { numRuns: 40, seed: 27 },
    );
    // And the same bytes in small chunks (the writer's chunk boundaries move with the row lengths).
    expect(Buffer.concat(Array.from(samplesCsvChunks(a, 2048))).toString('latin1')).toBe(plainSamplesCsv(a));
  });
});
