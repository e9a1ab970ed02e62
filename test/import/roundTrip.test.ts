// Round trip: one synthetic flight (a circle across the equator and the prime meridian, across UTC
// midnight) written in every format and read back through readLogFile (detection, reader, cleaner).
// Tolerances are each format's own resolution (half a unit of its last written digit):
// IGC 0.001 minute of arc (FAI IGC technical specification, Appendix A B record) and whole metres;
// NMEA 0183 minutes with 4 decimals (as our writer writes them) and 0.1 m; GPX/CSV/KML 7 decimals of a
// degree (src/synth writers and ours); FIT semicircles (2^31 per 180°) and altitude scale 5 (0.2 m).
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readLogFile } from '../../src/import/readLog.js';
import type { FlightLog, LogFormat } from '../../src/log/flightLog.js';
import { FT_M, KT_MS } from '../../src/constants.js';
import { writeGpx } from '../../src/synth/writeGpx.js';
import { writeCsv } from '../../src/synth/writeCsv.js';
import { writeIgc } from './writers/igcWriter.js';
import { writeNmea } from './writers/nmeaWriter.js';
import { writeKml } from './writers/kmlWriter.js';
import { writeFit } from './writers/fitWriter.js';

const N = 600;
const T0 = Date.UTC(2026, 4, 4, 23, 55, 0) / 1000; // 5 minutes before UTC midnight

function syntheticFlight(): FlightLog {
  const t = new Float64Array(N);
  const lat = new Float64Array(N);
  const lon = new Float64Array(N);
  const altM = new Float64Array(N);
  const gsMs = new Float64Array(N);
  const track = new Float64Array(N);
  const rDeg = 0.01;
  const w = (2 * Math.PI) / N; // one circle in N seconds
  const mPerDeg = 111_320; // metres per degree near the equator, enough for a speed column
  for (let i = 0; i < N; i++) {
    t[i] = T0 + i;
    lat[i] = 0.004 + rDeg * Math.sin(w * i);
    lon[i] = -0.003 + rDeg * Math.cos(w * i);
    altM[i] = 300 + 50 * Math.sin(3 * w * i);
    gsMs[i] = rDeg * w * mPerDeg;
    track[i] = (((-w * i * 180) / Math.PI) % 360 + 360 + 360) % 360; // counter-clockwise: track decreases
  }
  return {
    source: { format: 'csv', file: 'synthetic', warnings: [], meta: { name: 'Round trip' }, altDatum: 'msl' },
    t,
    lat,
    lon,
    altM,
    line: Int32Array.from({ length: N }, (_, i) => i + 1),
    gsMs,
    trackDegTrue: track,
  };
}

const flight = syntheticFlight();
const dir = mkdtempSync(join(tmpdir(), 'cd-roundtrip-'));

interface Case {
  format: LogFormat;
  file: string;
  bytes: () => Uint8Array | string;
  latLonDeg: number;
  altM: number;
  tS: number;
  gsMs?: number;
}

const halfMinuteUnit = (decimals: number) => (0.5 * 10 ** -decimals) / 60;
const CASES: Case[] = [
  { format: 'gpx', file: 'rt.gpx', bytes: () => writeGpx(flight), latLonDeg: 0.5e-7, altM: 0.005, tS: 0.0005 },
  { format: 'csv', file: 'rt.csv', bytes: () => writeCsv(flight, { altUnit: 'ft', velocity: true }), latLonDeg: 0.5e-7, altM: 0.05 * FT_M, tS: 0.0005, gsMs: 0.005 * KT_MS },
  { format: 'igc', file: 'rt.igc', bytes: () => writeIgc(flight), latLonDeg: halfMinuteUnit(3), altM: 0.5, tS: 0 },
  { format: 'nmea', file: 'rt.nmea', bytes: () => writeNmea(flight), latLonDeg: halfMinuteUnit(4), altM: 0.05, tS: 0.005, gsMs: 0.005 * KT_MS },
  { format: 'kml', file: 'rt.kml', bytes: () => writeKml(flight), latLonDeg: 0.5e-7, altM: 0.005, tS: 0.0005 },
  {
    format: 'fit',
    file: 'rt.fit',
    bytes: () => writeFit(Array.from({ length: N }, (_, i) => ({ t: flight.t[i], lat: flight.lat[i], lon: flight.lon[i], altM: flight.altM[i], gsMs: flight.gsMs![i] }))),
    latLonDeg: 180 / 2 ** 31,
    altM: 0.1,
    tS: 0,
    gsMs: 0.0005,
  },
];

describe('round trip: the same flight in every format reads back within the format precision', () => {
  for (const c of CASES) {
    it(`${c.format}: ${N} fixes across midnight, the equator and the prime meridian`, async () => {
      const path = join(dir, c.file);
      writeFileSync(path, c.bytes());
      const { log, health } = await readLogFile(path);
      expect(log.source.format).toBe(c.format);
      expect(health.samplesKept).toBe(N);
      let maxPos = 0;
      let maxAlt = 0;
      let maxT = 0;
      let maxGs = 0;
      for (let i = 0; i < N; i++) {
        maxPos = Math.max(maxPos, Math.abs(log.lat[i] - flight.lat[i]), Math.abs(log.lon[i] - flight.lon[i]));
        maxAlt = Math.max(maxAlt, Math.abs(log.altM[i] - flight.altM[i]));
        maxT = Math.max(maxT, Math.abs(log.t[i] - flight.t[i]));
        if (c.gsMs !== undefined) maxGs = Math.max(maxGs, Math.abs(log.gsMs![i] - flight.gsMs![i]));
      }
      const slack = 1e-9; // binary floating point on top of the decimal resolution
      expect(maxPos).toBeLessThanOrEqual(c.latLonDeg + slack);
      expect(maxAlt).toBeLessThanOrEqual(c.altM + slack);
      expect(maxT).toBeLessThanOrEqual(c.tS + slack);
      if (c.gsMs !== undefined) expect(maxGs).toBeLessThanOrEqual(c.gsMs + slack);
      // Sign of every hemisphere survives (the circle crosses both zero lines).
      expect(log.lat.some((v) => v < 0) && log.lat.some((v) => v > 0)).toBe(true);
      expect(log.lon.some((v) => v < 0) && log.lon.some((v) => v > 0)).toBe(true);
    });
  }
});
