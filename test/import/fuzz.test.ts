// Property-based fuzzing of every reader (fast-check): 10,000 mutated inputs per format, made from a small
// valid seed by byte flips, truncation, garbage insertion, deletion and line shuffles. Contract under test
// (DESIGN.md: "every failure prints one clear line"): a reader either returns a well-formed FlightLog or
// throws a ParseError — never any other exception — and cleanLog accepts whatever a reader returns.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { ParseError } from '../../src/errors.js';
import { parseLogBytes } from '../../src/import/parseLog.js';
import { cleanLog } from '../../src/log/cleanLog.js';
import { OPTIONAL_COLUMNS, type FlightLog, type LogFormat } from '../../src/log/flightLog.js';
import { withChecksum } from './writers/nmeaChecksum.js';
import { writeFit } from './writers/fitWriter.js';

const RUNS = 10_000;
const enc = (s: string) => new TextEncoder().encode(s);
const T0 = Date.UTC(2026, 4, 4, 10, 0, 0) / 1000;

const SEEDS: Record<LogFormat, Uint8Array> = {
  gpx: enc(`<?xml version="1.0"?>
<gpx version="1.1" creator="fuzz" xmlns="http://www.topografix.com/GPX/1/1"><metadata><name>n</name></metadata>
<rte><rtept lat="52.5" lon="-0.2"><name>A</name></rtept></rte>
<trk><name>t</name><trkseg>
<trkpt lat="52.5" lon="-0.25"><ele>10</ele><time>2026-05-04T10:00:00Z</time><extensions><speed>40</speed></extensions></trkpt>
<trkpt lat="52.5001" lon="-0.2501"><ele>11</ele><time>2026-05-04T10:00:01Z</time></trkpt>
<trkpt lat="52.5002" lon="-0.2502"><time>2026-05-04T10:00:02.5+00:00</time></trkpt>
</trkseg></trk></gpx>
`),
  csv: enc('time_utc,lat_deg,lon_deg,alt_ft,gs_kt,heading_mag_deg,bank_deg\n2026-05-04T10:00:00Z,52.5,-0.25,1000,90,270,0\n2026-05-04T10:00:01Z,52.5001,-0.2501,1010,91,271,5\n2026-05-04T10:00:02Z,52.5002,-0.2502,1020,92,272,10\n'),
  igc: enc(
    'AXXXFEN fuzz\r\nHFDTEDATE:040526,01\r\nHFPLTPILOTINCHARGE:P. Okonkwo-Lindqvist\r\nI033638FXA3941TAS4244HDT\r\n' +
      'B1000005230000N00015000WA0010000120035150270\r\nB1000015230010N00015010WA0010100121034151271\r\nB1000025230020N00015020WA0010200122033152272\r\n',
  ),
  nmea: enc(
    [
      withChecksum('GPRMC,100000.00,A,5230.0000,N,00015.0000,W,90.0,270.0,040526,,,A'),
      withChecksum('GPGGA,100000.00,5230.0000,N,00015.0000,W,1,10,0.8,300.0,M,47.0,M,,'),
      withChecksum('HCHDM,268.0,M'),
      withChecksum('GPRMC,100001.00,A,5230.0010,N,00015.0010,W,90.0,270.0,040526,,,A'),
      withChecksum('GPVTG,270.0,T,268.0,M,90.0,N,166.7,K,A'),
      withChecksum('GPRMC,100002.00,A,5230.0020,N,00015.0020,W,90.0,270.0,040526,,,A'),
    ].join('\r\n') + '\r\n',
  ),
  fit: writeFit(
    [0, 1, 2].map((i) => ({ t: T0 + i, lat: 52.5 + i * 1e-4, lon: -0.25, altM: 300 + i, gsMs: 45 })),
    [0, 1].map((i) => ({ t: T0 + i, rollDeg: 10, pitchDeg: 2 })),
  ),
  kml: enc(`<?xml version="1.0"?><kml xmlns="http://www.opengis.net/kml/2.2" xmlns:gx="http://www.google.com/kml/ext/2.2"><Document><name>k</name><Placemark>
<gx:Track><altitudeMode>absolute</altitudeMode><when>2026-05-04T10:00:00Z</when><when>2026-05-04T10:00:01Z</when>
<gx:coord>-0.25 52.5 300</gx:coord><gx:coord>-0.2501 52.5001 301</gx:coord></gx:Track></Placemark></Document></kml>
`),
};

type Mutation =
  | { kind: 'flip'; pos: number; bit: number }
  | { kind: 'truncate'; pos: number }
  | { kind: 'insert'; pos: number; bytes: Uint8Array }
  | { kind: 'delete'; pos: number; len: number }
  | { kind: 'swapLines'; a: number; b: number }
  | { kind: 'repeatLine'; a: number };

const mutation: fc.Arbitrary<Mutation> = fc.oneof(
  fc.record({ kind: fc.constant('flip' as const), pos: fc.nat(), bit: fc.integer({ min: 0, max: 7 }) }),
  fc.record({ kind: fc.constant('truncate' as const), pos: fc.nat() }),
  fc.record({
    kind: fc.constant('insert' as const),
    pos: fc.nat(),
    bytes: fc.oneof(fc.uint8Array({ minLength: 1, maxLength: 12 }), fc.constantFrom(...['<', '>', '&', '"', ',', ';', '\n', '\r', '*', '$', 'B', '-', '.', ':', 'e9', 'NaN', '<trkpt>', '</gx:Track>'].map(enc))),
  }),
  fc.record({ kind: fc.constant('delete' as const), pos: fc.nat(), len: fc.integer({ min: 1, max: 24 }) }),
  fc.record({ kind: fc.constant('swapLines' as const), a: fc.nat(), b: fc.nat() }),
  fc.record({ kind: fc.constant('repeatLine' as const), a: fc.nat() }),
);

function splitLines(b: Uint8Array): Uint8Array[] {
  const out: Uint8Array[] = [];
  let s = 0;
  for (let i = 0; i < b.length; i++) {
    if (b[i] === 10) {
      out.push(b.subarray(s, i + 1));
      s = i + 1;
    }
  }
  if (s < b.length) out.push(b.subarray(s));
  return out;
}

function concat(parts: Uint8Array[]): Uint8Array {
  const out = new Uint8Array(parts.reduce((n, p) => n + p.length, 0));
  let o = 0;
  for (const p of parts) {
    out.set(p, o);
    o += p.length;
  }
  return out;
}

function mutate(seed: Uint8Array, ms: Mutation[]): Uint8Array {
  let b = seed.slice();
  for (const m of ms) {
    const n = b.length;
    switch (m.kind) {
      case 'flip':
        if (n > 0) b[m.pos % n] ^= 1 << m.bit;
        break;
      case 'truncate':
        b = b.slice(0, m.pos % (n + 1));
        break;
      case 'insert': {
        const p = m.pos % (n + 1);
        b = concat([b.subarray(0, p), m.bytes, b.subarray(p)]);
        break;
      }
      case 'delete': {
        const p = m.pos % (n + 1);
        b = concat([b.subarray(0, p), b.subarray(Math.min(n, p + m.len))]);
        break;
      }
      case 'swapLines': {
        const lines = splitLines(b);
        if (lines.length > 1) {
          const i = m.a % lines.length;
          const j = m.b % lines.length;
          [lines[i], lines[j]] = [lines[j], lines[i]];
          b = concat(lines);
        }
        break;
      }
      case 'repeatLine': {
        const lines = splitLines(b);
        if (lines.length > 0) {
          const i = m.a % lines.length;
          lines.splice(i, 0, lines[i]);
          b = concat(lines);
        }
        break;
      }
    }
  }
  return b;
}

/** Structural invariants of any FlightLog a reader returns. */
function checkLog(log: FlightLog): void {
  const n = log.t.length;
  for (const col of [log.lat, log.lon, log.altM, log.line]) expect(col.length).toBe(n);
  for (const name of OPTIONAL_COLUMNS) if (log[name]) expect(log[name]!.length).toBe(n);
  const { log: clean, health } = cleanLog(log);
  expect(health.samplesKept).toBe(clean.t.length);
  for (let i = 1; i < clean.t.length; i++) expect(clean.t[i]).toBeGreaterThan(clean.t[i - 1]);
}

/** Reads one input; returns 'read' or 'refused' (a ParseError). Any other exception fails the property. */
function tryRead(bytes: Uint8Array, format: LogFormat | undefined): 'read' | 'refused' {
  let log: FlightLog;
  try {
    log = parseLogBytes(bytes, 'fuzz', format ? { format } : {});
  } catch (err) {
    if (err instanceof ParseError) return 'refused';
    throw err;
  }
  checkLog(log);
  return 'read';
}

describe('fuzzing: every reader fails only with ParseError', () => {
  for (const format of Object.keys(SEEDS) as LogFormat[]) {
    it(`${format}: ${RUNS} mutated inputs, no other exception`, () => {
      tryRead(SEEDS[format], format); // the unmutated input itself reads
      expect(parseLogBytes(SEEDS[format], 'seed', { format }).t.length).toBeGreaterThan(1);
      const outcomes = { read: 0, refused: 0 };
      fc.assert(
        fc.property(fc.array(mutation, { minLength: 1, maxLength: 4 }), (ms) => {
          outcomes[tryRead(mutate(SEEDS[format], ms), format)]++;
        }),
        { numRuns: RUNS, seed: 20260504 },
      );
      // Both paths are exercised: damaged files that are still read (with warnings) and refusals.
      expect(outcomes.read).toBeGreaterThan(RUNS / 20);
      expect(outcomes.refused).toBeGreaterThan(RUNS / 200);
    });
  }

  it(`format detection on ${RUNS} mutated inputs of any format, no other exception`, () => {
    const seeds = Object.values(SEEDS);
    fc.assert(
      fc.property(fc.nat(seeds.length - 1), fc.array(mutation, { minLength: 1, maxLength: 4 }), (k, ms) => {
        tryRead(mutate(seeds[k], ms), undefined);
      }),
      { numRuns: RUNS, seed: 4052026 },
    );
  });

  it('random bytes of any length are refused with a ParseError or read', () => {
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 512 }), (bytes) => {
        tryRead(bytes, undefined);
      }),
      { numRuns: 2000, seed: 7 },
    );
  });
});
