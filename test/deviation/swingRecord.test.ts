import { describe, expect, it } from 'vitest';
import { ParseError } from '../../src/errors.js';
import { DEVIATION_SIGN_CONVENTION, parseSwingRecord, swingReport, type SwingRow } from '../../src/deviation/swingRecord.js';

/** NGA Handbook of Magnetic Compass Adjustment art. 501 example, as a swing: compass heading and deviation (E +). */
const NGA_501: [number, number][] = [
  [0, 10.5], [45, 20.0], [90, 11.5], [135, -1.2], [180, -5.5], [225, -8.0], [270, -12.5], [315, -6.8],
];
/** compass + deviation = magnetic (NGA art. 501 "east deviation plus"). */
const ngaRows: SwingRow[] = NGA_501.map(([compass, dev]) => ({ compassDeg: compass, headingMagDeg: (compass + dev + 360) % 360 }));

function parseError(text: string): ParseError {
  try {
    parseSwingRecord(text);
  } catch (err) {
    expect(err).toBeInstanceOf(ParseError);
    return err as ParseError;
  }
  throw new Error('parseSwingRecord accepted the text');
}

describe('parseSwingRecord', () => {
  it('reads heading_mag_deg and compass_deg in any order and case, skipping comments, blank lines and other columns', () => {
    const text = '# swing, Fenbird 2, engine running\r\nCompass_Deg, note ,HEADING_MAG_DEG\r\n355,north,0\r\n\r\n28,,30\r\n61,x,60\r\n93,,90\r\n119,,120\r\n# end\r\n';
    const rows = parseSwingRecord(text);
    expect(rows.map((r) => [r.headingMagDeg, r.compassDeg])).toEqual([[0, 355], [30, 28], [60, 61], [90, 93], [120, 119]]);
    expect(rows.map((r) => r.line)).toEqual([3, 5, 6, 7, 8]);
  });

  it('reads 360 as 000', () => {
    const rows = parseSwingRecord('heading_mag_deg,compass_deg\n360,359\n90,88\n180,181\n270,271\n45,44\n');
    expect(rows[0].headingMagDeg).toBe(0);
  });

  it('names the line of a value that is not a heading', () => {
    const e = parseError('heading_mag_deg,compass_deg\n0,1\n\n# note\n90,abc\n');
    expect(e.line).toBe(5);
    expect(e.message).toContain('compass_deg');
    expect(e.message).toContain('abc');
    expect(parseError('heading_mag_deg,compass_deg\n0,1\n361,2\n').line).toBe(3);
    expect(parseError('heading_mag_deg,compass_deg\n0,1\n-5,2\n').line).toBe(3);
    expect(parseError('heading_mag_deg,compass_deg\n0,\n').line).toBe(2);
  });

  it('rejects a header without both columns, an empty file, and fewer than 5 headings', () => {
    expect(parseError('heading,compass\n0,1\n').line).toBe(1);
    expect(parseError('heading_mag_deg\n0\n').message).toContain('compass_deg');
    expect(parseError('').message).toContain('header');
    expect(parseError('heading_mag_deg,compass_deg\n"0,1\n').message).toContain('malformed');
    expect(parseError('heading_mag_deg,compass_deg\n0,1\n90,91\n180,181\n270,269\n').message).toContain('at least 5');
  });
});

describe('swingReport', () => {
  const r = swingReport(ngaRows);

  it('states the sign convention: deviation = magnetic − compass, easterly +', () => {
    expect(r.sign_convention).toBe('deviation = magnetic − compass, easterly +; compass + deviation = magnetic');
    expect(r.sign_convention).toBe(DEVIATION_SIGN_CONVENTION);
    // Compass 355 when the magnetic heading is 000: 5° east (355 + 5 = 360).
    const rows = [[0, 355], [90, 87], [180, 181], [270, 272], [45, 43]].map(([m, c]) => ({ headingMagDeg: m, compassDeg: c }));
    expect(swingReport(rows).rows[0].deviation_deg).toBeCloseTo(5, 12);
  });

  it('fits the NGA art. 501 swing by least squares: A 1.0, B 11.94, C 7.96, D 5.0, E 1.5 (closed forms B 12, C 8)', () => {
    expect(r.A_deg).toBeCloseTo(1.0, 10);
    expect(r.B_deg).toBeCloseTo(11.94, 2);
    expect(r.C_deg).toBeCloseTo(7.96, 2);
    expect(r.D_deg).toBeCloseTo(5.0, 10);
    expect(r.E_deg).toBeCloseTo(1.5, 10);
    expect(r.rows.map((x) => x.deviation_deg)).toEqual(NGA_501.map(([, d]) => expect.closeTo(d, 10)));
  });

  it('gives residuals that are observed − fitted, one per row, small for this swing', () => {
    expect(r.residuals_deg).toHaveLength(8);
    for (const x of r.rows) expect(Math.abs(x.residual_deg)).toBeLessThan(0.15);
    // Least squares: residuals are orthogonal to the constant term (they sum to zero).
    expect(r.residuals_deg.reduce((a, b) => a + b, 0)).toBeCloseTo(0, 10);
  });

  it('flags headings beyond the 10° limit of 14 CFR 25.1327(b), and not those at exactly 10°', () => {
    expect(r.max_abs_deviation_deg).toBeCloseTo(20.0, 10);
    expect(r.limit_deg).toBe(10);
    expect(r.over_limit.map((o) => o.compass_deg)).toEqual([0, 45, 90, 270]);
    expect(r.over_limit[1].heading_mag_deg).toBeCloseTo(65, 10);
    const atLimit = [[10, 0], [100, 90], [180, 180], [270, 270], [45, 45], [135, 135]].map(([m, c]) => ({ headingMagDeg: m, compassDeg: c }));
    const s = swingReport(atLimit);
    expect(s.max_abs_deviation_deg).toBeCloseTo(10, 12);
    expect(s.over_limit).toEqual([]);
  });

  it('finds the largest deviation of the fitted curve between the swung headings', () => {
    expect(r.max_abs_fitted_deviation_deg).toBeGreaterThanOrEqual(20);
    expect(r.max_fitted_at_compass_deg).toBeGreaterThan(30);
    expect(r.max_fitted_at_compass_deg).toBeLessThan(60);
  });

  it('carries a 12-line correction card every 30°', () => {
    expect(r.card).toHaveLength(12);
    expect(r.card[3].fly_mag_deg).toBe(90);
  });

  it('wraps deviations through north: magnetic 002 on compass 358 is 4° east, not 356° west', () => {
    const rows = [[2, 358], [92, 90], [182, 180], [272, 270], [47, 45]].map(([m, c]) => ({ headingMagDeg: m, compassDeg: c }));
    const s = swingReport(rows);
    expect(s.rows[0].deviation_deg).toBeCloseTo(4, 12);
    // Five rows, five unknowns: the fit passes through every row, the wrapped one included.
    for (const x of s.residuals_deg) expect(Math.abs(x)).toBeLessThan(1e-9);
  });

  it('throws ParseError when the compass headings cannot determine A–E', () => {
    const rows = [[0, 0], [0, 0], [90, 91], [90, 91], [180, 181], [180, 182]].map(([m, c]) => ({ headingMagDeg: m, compassDeg: c }));
    expect(() => swingReport(rows)).toThrow(ParseError);
  });

  it('runs end to end from CSV text: a 12-point swing of an invented aircraft', () => {
    // Invented swing of "Fenbird 2": deviation generated by A..E = 0.5, −3, 2, 1, −0.5 (5-term model, exact).
    const c = { a: 0.5, b: -3, cc: 2, d: 1, e: -0.5 };
    const lines = ['heading_mag_deg,compass_deg'];
    const compass = Array.from({ length: 12 }, (_, k) => 30 * k);
    for (const h of compass) {
      const x = (h * Math.PI) / 180;
      const dev = c.a + c.b * Math.sin(x) + c.cc * Math.cos(x) + c.d * Math.sin(2 * x) + c.e * Math.cos(2 * x);
      lines.push(`${((h + dev + 360) % 360).toFixed(10)},${h}`);
    }
    const s = swingReport(parseSwingRecord(lines.join('\n')));
    expect(s.A_deg).toBeCloseTo(0.5, 8);
    expect(s.B_deg).toBeCloseTo(-3, 8);
    expect(s.C_deg).toBeCloseTo(2, 8);
    expect(s.D_deg).toBeCloseTo(1, 8);
    expect(s.E_deg).toBeCloseTo(-0.5, 8);
    expect(Math.max(...s.residuals_deg.map(Math.abs))).toBeLessThan(1e-8);
    expect(s.over_limit).toEqual([]);
  });
});
