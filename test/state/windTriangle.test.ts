// The wind triangle against worked examples computed by hand from the handbook relations
// (WCA = asin(crosswind / TAS), GS = TAS cos WCA − headwind):
//  - PHYSICS.md check 28, the forum worked example: wind from 045 at 30 kt, TAS 100, tracks 000/120/240
//    → GS 76.5 / 87.9 / 128.7 kt;
//  - PHYSICS.md check 29, KITPLANES "Finding TAS from GPS Data": TAS 100, wind 20 kt from 270, headings
//    N/E/S/W → GS 102.0 / 120 / 102.0 / 80 kt.
import { describe, expect, it } from 'vitest';
import { headingForTrack, trackForHeading } from '../../src/state/windTriangle.js';

const KT = 1852 / 3600;

describe('headingForTrack (check 28)', () => {
  it('wind 045/30, TAS 100: tracks 000, 120, 240 → GS 76.5, 87.9, 128.7 kt (±0.05)', () => {
    const gs = [0, 120, 240].map((tr) => headingForTrack(100 * KT, tr, 45, 30 * KT).gsMs / KT);
    expect(Math.abs(gs[0] - 76.5)).toBeLessThan(0.05);
    expect(Math.abs(gs[1] - 87.9)).toBeLessThan(0.05);
    expect(Math.abs(gs[2] - 128.7)).toBeLessThan(0.05);
    // RMS of the three ground speeds is 100.24 kt: averaging ground speeds is not the TAS (PHYSICS.md §5).
    expect(Math.sqrt((gs[0] ** 2 + gs[1] ** 2 + gs[2] ** 2) / 3)).toBeCloseTo(100.24, 1);
  });
  it('corrects into the wind: wind from the right (045) on track 000 → heading 012.2 (asin(21.21/100))', () => {
    const r = headingForTrack(100 * KT, 0, 45, 30 * KT);
    expect(r.headingDegTrue).toBeCloseTo((Math.asin(30 * Math.SQRT1_2 / 100) * 180) / Math.PI, 9);
    expect(r.wcaDeg).toBeGreaterThan(0);
  });
  it('is NaN when the crosswind exceeds the TAS', () => {
    expect(headingForTrack(20, 0, 90, 25).gsMs).toBeNaN();
  });
});

describe('trackForHeading (check 29, KITPLANES)', () => {
  it('TAS 100, wind 270/20: headings N/E/S/W → GS 102.0/120/102.0/80 kt (±0.1)', () => {
    const gs = [0, 90, 180, 270].map((h) => trackForHeading(100 * KT, h, 270, 20 * KT).gsMs / KT);
    [102.0, 120, 102.0, 80].forEach((g, k) => expect(Math.abs(gs[k] - g)).toBeLessThan(0.1));
  });
  it('drifts downwind: heading 000 in a westerly → track east of north, drift +11.3° (atan(20/100))', () => {
    const r = trackForHeading(100 * KT, 0, 270, 20 * KT);
    expect(r.driftDeg).toBeCloseTo((Math.atan(0.2) * 180) / Math.PI, 9);
  });
  it('inverts headingForTrack', () => {
    for (const tr of [0, 33, 190, 359]) {
      const h = headingForTrack(55, tr, 250, 12);
      const back = trackForHeading(55, h.headingDegTrue, 250, 12);
      expect(Math.abs(((back.trackDegTrue - tr + 540) % 360) - 180)).toBeLessThan(1e-9);
      expect(back.gsMs).toBeCloseTo(h.gsMs, 9);
    }
  });
});
