import { describe, expect, it } from 'vitest';
import { OptionError } from '../../src/errors.js';
import { radiiOfCurvatureM } from '../../src/geo/wgs84.js';
import {
  ZONE_BLACKOUT,
  ZONE_CAUTION,
  ZONE_NONE,
  computeFieldAlongPath,
  zoneOfHorizontalIntensity,
} from '../../src/magnetic/fieldAlongPath.js';
import { decimalYearOf, wmm2025Evaluator } from '../../src/magnetic/wmm2025.js';

const DEG = Math.PI / 180;

interface Path {
  t: Float64Array;
  lat: Float64Array;
  lon: Float64Array;
  altM: Float64Array;
}

/**
 * A synthetic 10 Hz flight: 10-minute blocks of climbing straight flight, standard-rate right turns,
 * descending straight flight and steep (6°/s) left turns; height kept in 100 m … 12 km; turned back
 * before 88.5° of latitude. Dead reckoning on the WGS-84 radii of curvature.
 */
function syntheticFlight(lat0: number, lon0: number, n: number, speedMs: number, t0: number): Path {
  const p: Path = { t: new Float64Array(n), lat: new Float64Array(n), lon: new Float64Array(n), altM: new Float64Array(n) };
  let la = lat0;
  let lo = lon0;
  let h = 300;
  let hdg = 30;
  const dt = 0.1;
  for (let i = 0; i < n; i++) {
    p.t[i] = t0 + i * dt;
    p.lat[i] = la;
    p.lon[i] = lo;
    p.altM[i] = h;
    const block = Math.floor(i / 6000) % 4;
    hdg += (block === 1 ? 3 : block === 3 ? -6 : 0) * dt;
    h = Math.min(12_000, Math.max(100, h + (block === 0 ? 10 : block === 2 ? -8 : 0) * dt));
    if (la > 88.5 && Math.cos(hdg * DEG) > 0) hdg = 180 - hdg;
    const { meridianM, primeVerticalM } = radiiOfCurvatureM(la);
    la += ((speedMs * Math.cos(hdg * DEG) * dt) / meridianM) / DEG;
    lo += ((speedMs * Math.sin(hdg * DEG) * dt) / (primeVerticalM * Math.cos(la * DEG))) / DEG;
    if (lo > 180) lo -= 360;
    if (lo < -180) lo += 360;
  }
  return p;
}

/** Largest differences between the knot expansion and direct WMM evaluation at every sample. */
function maxErrors(path: Path): { dDeg: number; iDeg: number; comp: number; minH: number } {
  const { field } = computeFieldAlongPath(path.t, path.lat, path.lon, path.altM);
  const direct = wmm2025Evaluator(field.decimalYear);
  let dDeg = 0;
  let iDeg = 0;
  let comp = 0;
  let minH = Infinity;
  for (let i = 0; i < field.n; i++) {
    const p = direct(path.lat[i], path.lon[i], path.altM[i]);
    let d = Math.abs(p.variationDeg - field.variationDeg[i]);
    if (d > 180) d = 360 - d;
    dDeg = Math.max(dDeg, d);
    iDeg = Math.max(iDeg, Math.abs(p.dipDeg - field.dipDeg[i]));
    comp = Math.max(comp, Math.abs(p.xNt - field.xNt[i]), Math.abs(p.yNt - field.yNt[i]), Math.abs(p.zNt - field.zNt[i]));
    minH = Math.min(minH, p.hNt);
  }
  return { dDeg, iDeg, comp, minH };
}

const T_2027_5 = Date.UTC(2027, 6, 2, 12) / 1000;

describe('computeFieldAlongPath agrees with direct WMM2025 evaluation at every sample', () => {
  // Oracle: the WMM2025 model itself (fieldAtPoint path through the geomagnetism package), evaluated directly.
  it('on a 3-hour, 108 000-sample mid-latitude flight with turns and climbs to 12 km: D and I within 1e-4°', () => {
    const e = maxErrors(syntheticFlight(52, -1, 108_000, 60, T_2027_5));
    expect(e.dDeg).toBeLessThan(1e-4);
    expect(e.iDeg).toBeLessThan(1e-4);
    expect(e.comp).toBeLessThan(0.05);
  });

  it('on a 3-hour polar flight in the caution zone (H down to ~2300 nT): D and I within 0.002°', () => {
    const e = maxErrors(syntheticFlight(80, -96, 108_000, 120, T_2027_5));
    expect(e.minH).toBeLessThan(6000);
    expect(e.dDeg).toBeLessThan(0.002);
    expect(e.iDeg).toBeLessThan(0.002);
  });

  it('on a 3-hour flight over the dip-pole region into the blackout zone (H < 1000 nT): D and I within 0.01°', () => {
    const e = maxErrors(syntheticFlight(86, -150, 108_000, 200, T_2027_5));
    expect(e.minH).toBeLessThan(1000);
    expect(e.dDeg).toBeLessThan(0.01);
    expect(e.iDeg).toBeLessThan(0.01);
  });

  it('across the antimeridian: D and I within 1e-4°', () => {
    const path = syntheticFlight(-45, 179.5, 36_000, 250, T_2027_5);
    let crossed = false;
    for (let i = 1; i < path.lon.length; i++) if (Math.abs(path.lon[i] - path.lon[i - 1]) > 180) crossed = true;
    expect(crossed).toBe(true);
    const e = maxErrors(path);
    expect(e.dDeg).toBeLessThan(1e-4);
    expect(e.iDeg).toBeLessThan(1e-4);
  });
});

describe('WMM weak-field zones (H < 2000 nT blackout, 2000 ≤ H < 6000 nT caution)', () => {
  // Source: WMM2025 Technical Report zone definitions; test points from WMM2025_TestValues.txt (PHYSICS.md check 25):
  // 89N 121W 28 km 2025.0 H 1504.3 nT → blackout; 80N 96W 48 km 2025.0 H 2164.3 nT → caution.
  it('classifies H at the thresholds exactly', () => {
    expect(zoneOfHorizontalIntensity(1999.999)).toBe(ZONE_BLACKOUT);
    expect(zoneOfHorizontalIntensity(2000)).toBe(ZONE_CAUTION);
    expect(zoneOfHorizontalIntensity(5999.999)).toBe(ZONE_CAUTION);
    expect(zoneOfHorizontalIntensity(6000)).toBe(ZONE_NONE);
    expect(zoneOfHorizontalIntensity(NaN)).toBe(ZONE_NONE);
  });

  function still(latDeg: number, lonDeg: number, altM: number, t0: number, n: number): Path {
    return {
      t: Float64Array.from({ length: n }, (_, i) => t0 + i),
      lat: new Float64Array(n).fill(latDeg),
      lon: new Float64Array(n).fill(lonDeg),
      altM: new Float64Array(n).fill(altM),
    };
  }
  const t2025 = Date.UTC(2025, 0, 1) / 1000;

  it('flags 89N 121W 28 km (H 1504.3 nT) as blackout, with its UTC span in the warning', () => {
    // Three samples of one second centred on 2025.0 so that the path's epoch is 2025.0 exactly.
    const p = still(89, -121, 28_000, t2025 - 1, 3);
    const { field, warnings } = computeFieldAlongPath(p.t, p.lat, p.lon, p.altM);
    expect(field.decimalYear).toBe(2025);
    expect(Math.abs(field.hNt[1] - 1504.3)).toBeLessThanOrEqual(0.05);
    expect(Array.from(field.zone)).toEqual([ZONE_BLACKOUT, ZONE_BLACKOUT, ZONE_BLACKOUT]);
    const w = warnings.find((x) => x.code === 'field-blackout-zone');
    expect(w?.count).toBe(3);
    expect(w?.message).toContain('2024-12-31T23:59:59.000Z to 2025-01-01T00:00:01.000Z');
    expect(warnings.some((x) => x.code === 'field-caution-zone')).toBe(false);
  });

  it('flags 80N 96W 48 km (H 2164.3 nT) as caution, not blackout', () => {
    const p = still(80, -96, 48_000, t2025 - 1, 3);
    const { field, warnings } = computeFieldAlongPath(p.t, p.lat, p.lon, p.altM);
    expect(Math.abs(field.hNt[1] - 2164.3)).toBeLessThanOrEqual(0.05);
    expect(field.zone[1]).toBe(ZONE_CAUTION);
    expect(warnings.map((x) => x.code)).toEqual(['field-caution-zone']);
  });

  it('reports separate spans when a path leaves and re-enters a zone', () => {
    const p = still(80, -96, 48_000, t2025, 6);
    p.lat.set([50, 50], 2); // two samples far south, out of the zone
    const { field, warnings } = computeFieldAlongPath(p.t, p.lat, p.lon, p.altM);
    expect(Array.from(field.zone)).toEqual([1, 1, 0, 0, 1, 1]);
    const w = warnings.find((x) => x.code === 'field-caution-zone');
    expect(w?.count).toBe(4);
    expect(w?.message.match(/ to /g)).toHaveLength(2);
  });

  it('gives no zone warning in mid latitudes', () => {
    const p = still(52, 0, 500, T_2027_5, 10);
    const { field, warnings } = computeFieldAlongPath(p.t, p.lat, p.lon, p.altM);
    expect(field.zone.every((z) => z === ZONE_NONE)).toBe(true);
    expect(warnings).toEqual([]);
  });
});

describe('epoch, validity and bad rows', () => {
  it('uses the decimal year of the middle of the finite times', () => {
    const t = Float64Array.from([NaN, Date.UTC(2026, 0, 1) / 1000, Date.UTC(2026, 0, 3) / 1000]);
    const z = new Float64Array(3).fill(10);
    const { field } = computeFieldAlongPath(t, z, z, z);
    expect(field.decimalYear).toBeCloseTo(decimalYearOf(Date.UTC(2026, 0, 2) / 1000), 12);
    expect(field.model).toBe('WMM2025');
    expect(Number.isFinite(field.variationDeg[0])).toBe(true); // position valid, time not needed per row
  });

  it('warns outside 2025.0–2030.0 and still evaluates', () => {
    const t = Float64Array.from([Date.UTC(2031, 3, 1) / 1000]);
    const one = Float64Array.from([45]);
    const { field, warnings } = computeFieldAlongPath(t, one, Float64Array.from([7]), Float64Array.from([1000]));
    expect(warnings.map((w) => w.code)).toContain('field-outside-model-validity');
    expect(Number.isFinite(field.variationDeg[0])).toBe(true);
  });

  it('leaves rows without a usable position NaN and counts them', () => {
    const t = Float64Array.from([0, 1, 2, 3].map((i) => T_2027_5 + i));
    const lat = Float64Array.from([50, NaN, 95, 50]);
    const lon = Float64Array.from([0, 0, 0, NaN]);
    const alt = new Float64Array(4).fill(100);
    const { field, warnings } = computeFieldAlongPath(t, lat, lon, alt);
    expect(Number.isFinite(field.variationDeg[0])).toBe(true);
    for (const i of [1, 2, 3]) {
      expect(field.variationDeg[i]).toBeNaN();
      expect(field.hNt[i]).toBeNaN();
      expect(field.zone[i]).toBe(ZONE_NONE);
    }
    expect(warnings.find((w) => w.code === 'field-invalid-position')?.count).toBe(3);
  });

  it('warns once for samples outside the model height range', () => {
    const t = Float64Array.from([T_2027_5, T_2027_5 + 1]);
    const { warnings } = computeFieldAlongPath(t, Float64Array.from([50, 50]), Float64Array.from([0, 0]), Float64Array.from([-2000, 0]));
    expect(warnings.find((w) => w.code === 'field-height-outside-model')?.count).toBe(1);
  });

  it('returns empty columns for an empty path and warns when no time is finite', () => {
    const e = new Float64Array(0);
    const r = computeFieldAlongPath(e, e, e, e);
    expect(r.field.n).toBe(0);
    expect(r.warnings).toEqual([]);
    const nan = Float64Array.from([NaN]);
    const r2 = computeFieldAlongPath(nan, Float64Array.from([1]), Float64Array.from([1]), Float64Array.from([1]));
    expect(r2.warnings.map((w) => w.code)).toEqual(['field-no-time']);
    expect(r2.field.variationDeg[0]).toBeNaN();
  });

  it('fills the declination uncertainty column (0.26° floor, larger where H is weak)', () => {
    const t = Float64Array.from([T_2027_5, T_2027_5 + 1]);
    const { field } = computeFieldAlongPath(t, Float64Array.from([0, 85]), Float64Array.from([20, -100]), Float64Array.from([0, 0]));
    const s = field.variationSigmaDeg as Float64Array;
    expect(s[0]).toBeGreaterThan(0.26);
    expect(s[0]).toBeLessThan(0.4);
    expect(s[1]).toBeGreaterThan(1);
  });

  it('throws OptionError for columns of unequal length or a knot spacing outside 100 m … 50 km', () => {
    const a = new Float64Array(3);
    expect(() => computeFieldAlongPath(a, a, a, new Float64Array(2))).toThrow(OptionError);
    expect(() => computeFieldAlongPath(a, a, a, a, { knotSpacingM: 50 })).toThrow(OptionError);
    expect(() => computeFieldAlongPath(a, a, a, a, { knotSpacingM: NaN })).toThrow(OptionError);
  });
});
