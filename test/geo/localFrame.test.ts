// Frames against GeographicLib (geographiclib-geodesic 2.2, C. F. F. Karney, J. Geodesy 87, 2013) and
// against the defining WGS-84 constants (NIMA TR8350.2 table 3.1).
import fc from 'fast-check';
import geodesic from 'geographiclib-geodesic';
import { describe, expect, it } from 'vitest';
import { ecefToGeodetic, geodeticToEcef } from '../../src/geo/wgs84.js';
import {
  azimuthOfNedDeg,
  ecefToGeodeticInto,
  ecefToGeodeticNedInto,
  geodeticToEcefInto,
  geodeticToEcefNedInto,
  localAzimuthDistance,
  nedOffsetM,
  nedRotationInto,
  rotateNedBetweenInto,
} from '../../src/geo/localFrame.js';

const geod = geodesic.Geodesic.WGS84;
const angErr = (a: number, b: number): number => Math.abs((((a - b) % 360) + 540) % 360 - 180);

describe('ECEF conversions', () => {
  it('put (0, 0, 0) at (a, 0, 0) and the north pole at (0, 0, b) (WGS-84 a = 6378137, b = 6356752.3142 m, TR8350.2)', () => {
    const out = new Float64Array(3);
    geodeticToEcefInto(0, 0, 0, out, 0);
    expect(out[0]).toBeCloseTo(6378137, 6);
    expect(Math.abs(out[1]) + Math.abs(out[2])).toBeLessThan(1e-6);
    geodeticToEcefInto(90, 0, 0, out, 0);
    expect(out[2]).toBeCloseTo(6356752.3142, 3);
  });
  it('round-trip geodetic → ECEF → geodetic within 1e-9° and 1 mm from −89° to 89° and −500 m to 15 km', () => {
    const out = new Float64Array(3);
    for (let lat = -89; lat <= 89; lat += 7.3) {
      for (const lon of [-179.9, -45, 0, 12.5, 179.9]) {
        for (const h of [-500, 0, 3000, 15000]) {
          geodeticToEcefInto(lat, lon, h, out, 0);
          const back = new Float64Array(3);
          ecefToGeodeticInto(out[0], out[1], out[2], back, 0);
          expect(Math.abs(back[0] - lat)).toBeLessThan(1e-9);
          expect(angErr(back[1], lon)).toBeLessThan(1e-9);
          expect(Math.abs(back[2] - h)).toBeLessThan(1e-3);
        }
      }
    }
  });
});

describe('geodeticToEcef on the axes of the ellipsoid', () => {
  it('puts (0°, 0°, 0 m) at (a, 0, 0) and the north pole at (0, 0, b), b = a(1 − f) = 6 356 752.3142 m (NIMA TR8350.2 table 3.1, 3.3)', () => {
    const e = geodeticToEcef(0, 0, 0);
    expect(e.x).toBeCloseTo(6378137.0, 6);
    expect(Math.abs(e.y) + Math.abs(e.z)).toBeLessThan(1e-6);
    const n = geodeticToEcef(90, 0, 0);
    expect(Math.hypot(n.x, n.y)).toBeLessThan(1e-6);
    expect(n.z).toBeCloseTo(6356752.3142, 3);
    const g = ecefToGeodetic({ x: 0, y: 0, z: 6356752.3142 + 1000 });
    expect(g.latDeg).toBeCloseTo(90, 9);
    expect(g.hM).toBeCloseTo(1000, 3);
  });
});

describe('local NED offsets against GeographicLib geodesics', () => {
  it('give the geodesic azimuth within 0.01° and distance within 1e-4 relative out to 20 km', () => {
    for (const [lat, lon] of [[52.1, -1.3], [-33.9, 151.2], [69.6, 18.9], [0.5, 100]]) {
      for (const azi of [0, 37, 90, 145, 180, 233, 270, 333]) {
        for (const s of [100, 2000, 20000]) {
          const d = geod.Direct(lat, lon, azi, s);
          const r = localAzimuthDistance(lat, lon, d.lat2!, d.lon2!);
          expect(angErr(r.azimuthDeg, azi)).toBeLessThan(0.01);
          expect(Math.abs(r.distanceM - s) / s).toBeLessThan(1e-4);
        }
      }
    }
  });
  it('put a point 100 km away below the tangent plane by about s²/(2R) (≈ 785 m, R ≈ 6371 km)', () => {
    const d = geod.Direct(52, 0, 90, 100000);
    const [, , down] = nedOffsetM(52, 0, 0, d.lat2!, d.lon2!, 0);
    expect(down).toBeGreaterThan(770);
    expect(down).toBeLessThan(800);
  });
});

describe('re-expressing a vector in another point\'s NED frame', () => {
  it('turns a geodesic direction at A into the GeographicLib azimuth at B 300 km away (meridian convergence)', () => {
    const out = new Float64Array(3);
    const ra = new Float64Array(9), rb = new Float64Array(9);
    for (const [lat, lon, azi] of [[55, 10, 90], [60, -20, 45], [-40, 170, 300], [10, 0, 10]]) {
      const line = geod.DirectLine(lat, lon, azi, 300000);
      const b = line.Position(300000);
      // Direction of the geodesic at B, expressed in A's frame: the unit chord of a short step along it.
      const b2 = line.Position(300001);
      const e1 = new Float64Array(3), e2 = new Float64Array(3);
      geodeticToEcefInto(b.lat2!, b.lon2!, 0, e1, 0);
      geodeticToEcefInto(b2.lat2!, b2.lon2!, 0, e2, 0);
      nedRotationInto(lat, lon, ra, 0);
      const dx = e2[0] - e1[0], dy = e2[1] - e1[1], dz = e2[2] - e1[2];
      const vN = ra[0] * dx + ra[1] * dy + ra[2] * dz;
      const vE = ra[3] * dx + ra[4] * dy + ra[5] * dz;
      const vD = ra[6] * dx + ra[7] * dy + ra[8] * dz;
      // In A's frame the direction differs from azi2 by degrees; in B's own frame it is azi2.
      nedRotationInto(b.lat2!, b.lon2!, rb, 0);
      rotateNedBetweenInto(ra, 0, rb, 0, vN, vE, vD, out, 0);
      expect(angErr(azimuthOfNedDeg(out[0], out[1]), b.azi2!)).toBeLessThan(0.001);
      expect(Math.abs(out[2])).toBeLessThan(1e-3);
      if (Math.abs(lat) > 30) expect(angErr(azimuthOfNedDeg(vN, vE), b.azi2!)).toBeGreaterThan(1);
    }
  });
  it('is identity when both frames are the same point', () => {
    const r = new Float64Array(9);
    const out = new Float64Array(3);
    nedRotationInto(47, 8, r, 0);
    rotateNedBetweenInto(r, 0, r, 0, 1, 2, 3, out, 0);
    expect(out[0]).toBeCloseTo(1, 14);
    expect(out[1]).toBeCloseTo(2, 14);
    expect(out[2]).toBeCloseTo(3, 14);
  });
});

describe('azimuthOfNedDeg', () => {
  it('is [0, 360) clockwise from north and NaN for a zero vector', () => {
    expect(azimuthOfNedDeg(1, 0)).toBe(0);
    expect(azimuthOfNedDeg(0, 1)).toBeCloseTo(90, 12);
    expect(azimuthOfNedDeg(-1, -1e-18)).toBeCloseTo(180, 9);
    expect(azimuthOfNedDeg(1, -1e-18)).toBeLessThan(360);
    expect(azimuthOfNedDeg(0, 0)).toBeNaN();
  });
});

/** The plain definition: φ = atan2(z + e² N(φ) sin φ, p) iterated to its fixed point (from memory; TR8350.2 §4). */
function fixedPointGeodetic(x: number, y: number, z: number): [number, number, number] {
  const a = 6378137, f = 1 / 298.257223563, e2 = f * (2 - f);
  const p = Math.hypot(x, y);
  let lat = Math.atan2(z, p * (1 - e2));
  for (let k = 0; k < 30; k++) {
    const s = Math.sin(lat);
    lat = Math.atan2(z + (e2 * a * s) / Math.sqrt(1 - e2 * s * s), p);
  }
  const s = Math.sin(lat), c = Math.cos(lat);
  return [lat / (Math.PI / 180), Math.atan2(y, x) / (Math.PI / 180), p * c + z * s - a * Math.sqrt(1 - e2 * s * s)];
}

describe('ECEF → geodetic by two Bowring steps', () => {
  it('agrees with the fixed-point iteration run to convergence within 1e-12° and 1e-7 m, −1 km to 20 km, all latitudes', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -90, max: 90, noNaN: true }),
        fc.double({ min: -180, max: 180, noNaN: true }),
        fc.double({ min: -1000, max: 20000, noNaN: true }),
        (lat, lon, h) => {
          const e = new Float64Array(3), g = new Float64Array(3);
          geodeticToEcefInto(lat, lon, h, e, 0);
          ecefToGeodeticInto(e[0], e[1], e[2], g, 0);
          const r = fixedPointGeodetic(e[0], e[1], e[2]);
          expect(Math.abs(g[0] - r[0])).toBeLessThan(1e-12);
          expect(angErr(g[1], r[1])).toBeLessThan(1e-12);
          expect(Math.abs(g[2] - r[2])).toBeLessThan(1e-7);
        },
      ),
      { numRuns: 5000, seed: 3 },
    );
  });
  it('gives the poles and the equator exactly: (0, 0, b + 1000) → 90°, 1000 m; (a, 0, 0) → 0°, 0°, 0 m (WGS-84 a, b from TR8350.2)', () => {
    const g = new Float64Array(3);
    ecefToGeodeticInto(0, 0, -(6356752.314245 + 1000), g, 0);
    expect(g[0]).toBe(-90);
    expect(g[2]).toBeCloseTo(1000, 6);
    ecefToGeodeticInto(6378137, 0, 0, g, 0);
    expect(g[0]).toBe(0);
    expect(g[1]).toBe(0);
    expect(Math.abs(g[2])).toBeLessThan(1e-9);
  });
});

describe('the combined position-and-frame helpers', () => {
  it('ecefToGeodeticNedInto writes what ecefToGeodeticInto and nedRotationInto write (to 1e-15: sines from the vector, not from degrees)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -89.9, max: 89.9, noNaN: true }),
        fc.double({ min: -180, max: 180, noNaN: true }),
        fc.double({ min: -500, max: 15000, noNaN: true }),
        (lat, lon, h) => {
          const e = new Float64Array(3), g1 = new Float64Array(3), g2 = new Float64Array(3), r1 = new Float64Array(9), r2 = new Float64Array(9);
          geodeticToEcefInto(lat, lon, h, e, 0);
          ecefToGeodeticInto(e[0], e[1], e[2], g1, 0);
          ecefToGeodeticNedInto(e[0], e[1], e[2], g2, 0, r2, 0);
          expect(Array.from(g2)).toEqual(Array.from(g1));
          nedRotationInto(g1[0], g1[1], r1, 0);
          for (let k = 0; k < 9; k++) expect(Math.abs(r2[k] - r1[k])).toBeLessThan(1e-15);
        },
      ),
      { numRuns: 2000, seed: 5 },
    );
  });
  it('geodeticToEcefNedInto writes exactly what geodeticToEcefInto and nedRotationInto write', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -90, max: 90, noNaN: true }),
        fc.double({ min: -360, max: 360, noNaN: true }),
        fc.double({ min: -500, max: 15000, noNaN: true }),
        (lat, lon, h) => {
          const e1 = new Float64Array(3), e2 = new Float64Array(3), r1 = new Float64Array(9), r2 = new Float64Array(9);
          geodeticToEcefInto(lat, lon, h, e1, 0);
          nedRotationInto(lat, lon, r1, 0);
          geodeticToEcefNedInto(lat, lon, h, e2, 0, r2, 0);
          expect(Array.from(e2)).toEqual(Array.from(e1));
          expect(Array.from(r2)).toEqual(Array.from(r1));
        },
      ),
      { numRuns: 1000, seed: 6 },
    );
  });
});

describe('nedOffsetM with its kept reference frame', () => {
  it('equals the plain ECEF difference rotated at A (geodeticToEcefInto, nedRotationInto) exactly, whichever A came before', () => {
    const plain = (la: number, lo: number, ha: number, lb: number, lob: number, hb: number): number[] => {
      const ea = new Float64Array(3), eb = new Float64Array(3), r = new Float64Array(9);
      geodeticToEcefInto(la, lo, ha, ea, 0);
      geodeticToEcefInto(lb, lob, hb, eb, 0);
      nedRotationInto(la, lo, r, 0);
      const dx = eb[0] - ea[0], dy = eb[1] - ea[1], dz = eb[2] - ea[2];
      return [r[0] * dx + r[1] * dy + r[2] * dz, r[3] * dx + r[4] * dy + r[5] * dz, r[6] * dx + r[7] * dy + r[8] * dz];
    };
    const pt = fc.tuple(fc.double({ min: -89, max: 89, noNaN: true }), fc.double({ min: -180, max: 180, noNaN: true }), fc.double({ min: -100, max: 3000, noNaN: true }));
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.integer({ min: 0, max: 2 }), pt), { minLength: 1, maxLength: 30 }), fc.array(pt, { minLength: 3, maxLength: 3 }), (calls, refs) => {
        for (const [k, [lb, lob, hb]] of calls) {
          const [la, lo, ha] = refs[k];
          expect(nedOffsetM(la, lo, ha, lb, lob, hb)).toEqual(plain(la, lo, ha, lb, lob, hb));
        }
      }),
      { numRuns: 500, seed: 9 },
    );
  });
});
