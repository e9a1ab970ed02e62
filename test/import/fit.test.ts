// FIT reader. Oracles: the FIT Protocol (Garmin FIT SDK): header size 14, ".FIT" at bytes 8-11, data size
// at bytes 4-7, CRC-16 over the file; the CRC is CRC-16/ARC (poly 0x8005 reflected, init 0), whose
// catalogue check value over "123456789" is 0xBB3D (Greg Cook, Catalogue of parametrised CRC algorithms);
// FIT Profile scales (semicircles: 2^31 = 180°; altitude scale 5 offset 500 m; speed scale 1000; attitude
// radians scale 10430.38). Files are written by fit-file-parser's encoder (test/import/writers/fitWriter.ts).
import { describe, expect, it } from 'vitest';
import { FitEncoder } from 'fit-file-parser/encoder';
import { parseFit } from '../../src/import/fit.js';
import { fitExtent } from '../../src/import/fitStructure.js';
import { detectFormat } from '../../src/import/detectFormat.js';
import { ParseError } from '../../src/errors.js';
import { writeFit, type FitFix } from './writers/fitWriter.js';

const T0 = Date.UTC(2026, 4, 4, 10, 0, 0) / 1000;
const fixes: FitFix[] = [0, 1, 2, 3, 4].map((i) => ({ t: T0 + i, lat: 52.5 + i * 1e-4, lon: -0.25 - i * 2e-4, altM: 300 + i, gsMs: 45 + i * 0.5 }));
const SEMICIRCLE_DEG = 180 / 2 ** 31;

describe('the test FIT writer follows the FIT Protocol', () => {
  it('uses CRC-16/ARC (catalogue check value 0xBB3D) and a 14-byte ".FIT" header with the data size', () => {
    expect(FitEncoder.calculateCRC(new TextEncoder().encode('123456789'))).toBe(0xbb3d);
    const bytes = writeFit(fixes);
    expect(bytes[0]).toBe(14);
    expect(String.fromCharCode(...bytes.slice(8, 12))).toBe('.FIT');
    const dataSize = bytes[4] | (bytes[5] << 8) | (bytes[6] << 16) | (bytes[7] << 24);
    expect(bytes.length).toBe(14 + dataSize + 2);
    // A CRC over data followed by its own little-endian CRC is 0 (property of CRC-16/ARC).
    expect(FitEncoder.calculateCRC(bytes)).toBe(0);
    expect(detectFormat(bytes)).toBe('fit');
  });
});

describe('parseFit', () => {
  const log = parseFit(writeFit(fixes), 'a.fit');

  it('reads record timestamps, positions (within one semicircle), altitude and speed', () => {
    expect(Array.from(log.t)).toEqual(fixes.map((f) => f.t));
    for (let i = 0; i < fixes.length; i++) {
      expect(Math.abs(log.lat[i] - fixes[i].lat)).toBeLessThanOrEqual(SEMICIRCLE_DEG);
      expect(Math.abs(log.lon[i] - fixes[i].lon)).toBeLessThanOrEqual(SEMICIRCLE_DEG);
      expect(log.altM[i]).toBeCloseTo(fixes[i].altM, 6); // scale 5: 0.2 m steps, exact for whole metres
      expect(log.gsMs![i]).toBeCloseTo(fixes[i].gsMs, 6);
    }
    expect(Array.from(log.line)).toEqual([1, 2, 3, 4, 5]);
    expect(log.source.format).toBe('fit');
  });

  it('gives records the roll and pitch of aviation_attitude samples at their time', () => {
    const att = fixes.map((f, i) => ({ t: f.t, rollDeg: -10 + 5 * i, pitchDeg: 2 + i }));
    const l = parseFit(writeFit(fixes, att), 'att.fit');
    for (let i = 0; i < fixes.length; i++) {
      // radians · 10430.38 stored as an integer: resolution 0.0055°.
      expect(l.rollDeg![i]).toBeCloseTo(att[i].rollDeg, 2);
      expect(l.pitchDeg![i]).toBeCloseTo(att[i].pitchDeg, 2);
    }
  });

  it('reads a file cut off mid-message up to its last complete message and says so', () => {
    const whole = writeFit(fixes);
    const cut = whole.slice(0, whole.length - 2 - 5); // CRC and 5 bytes of the last record gone
    const ext = fitExtent(cut)!;
    expect(ext.stoppedEarly).toBe(true);
    const l = parseFit(cut, 'cut.fit');
    expect(l.t.length).toBe(4);
    expect(l.source.reader?.truncated).toBe(true);
    expect(l.source.warnings.find((w) => w.code === 'file-truncated')).toBeDefined();
  });

  it('reads a file whose CRC does not match, with a warning', () => {
    const bytes = writeFit(fixes);
    bytes[bytes.length - 1] ^= 0xff;
    const l = parseFit(bytes, 'crc.fit');
    expect(l.t.length).toBe(5);
    expect(l.source.warnings.find((w) => w.code === 'fit-crc-mismatch')).toBeDefined();
  });

  it('leaves out records without a position and names them by record number', () => {
    const l = parseFit(writeFit([...fixes.slice(0, 2), { ...fixes[2], lat: NaN, lon: NaN }, ...fixes.slice(3)]), 'gap.fit');
    // The writer encodes the missing position as the sint32 invalid value (FIT Protocol base types).
    expect(Array.from(l.line)).toEqual([1, 2, 4, 5]);
    expect(l.source.warnings.find((w) => w.code === 'fit-no-position')?.lines).toEqual([3]);
  });

  it('refuses bytes that are not FIT', () => {
    expect(() => parseFit(new Uint8Array(40), 'x.fit')).toThrow(ParseError);
  });
});
