import { describe, expect, it } from 'vitest';
import { fmtCount, fmtDuration, fmtHeading, fmtLatLon, fmtNumber, fmtSignedDeg, fmtUtcDateTime, fmtUtcTime } from '../../src/report/pilotFormat.js';
import { fmtBank, fmtVariation } from '../../src/report/sections/glanceSection.js';

describe('pilot formats', () => {
  // common practice: headings are written with three digits, 360 as 000 on a card.
  it('writes headings as three whole digits in [000°, 359°]', () => {
    expect(fmtHeading(4.6)).toBe('005°');
    expect(fmtHeading(359.7)).toBe('000°');
    expect(fmtHeading(-10)).toBe('350°');
    expect(fmtHeading(90)).toBe('090°');
    expect(fmtHeading(NaN)).toBe('–');
  });

  it('shows the sign of a signed angle always, with a true minus, and no "−0"', () => {
    expect(fmtSignedDeg(12.34)).toBe('+12.3°');
    expect(fmtSignedDeg(-4)).toBe('\u22124.0°');
    expect(fmtSignedDeg(-0.04)).toBe('0.0°');
    expect(fmtNumber(-0.004, 2)).toBe('0.00');
  });

  // Oracle: ISO 8601 via Date.UTC; 1 h 2 min 3 s = 3723 s.
  it('prints UTC times and durations', () => {
    const t = Date.UTC(2026, 4, 4, 10, 11, 12) / 1000;
    expect(fmtUtcTime(t)).toBe('10:11:12Z');
    expect(fmtUtcDateTime(t)).toBe('2026-05-04 10:11:12 UTC');
    expect(fmtDuration(3723)).toBe('1:02:03');
    expect(fmtDuration(59.6)).toBe('1:00');
  });

  it('groups counts by thousands', () => {
    expect(fmtCount(108000)).toBe('108,000');
    expect(fmtCount(999)).toBe('999');
    expect(fmtCount(1234567)).toBe('1,234,567');
  });

  // 52.5° = 52°30′; 0.75° = 45′ (60 minutes per degree).
  it('prints positions as degrees and decimal minutes with hemisphere letters', () => {
    expect(fmtLatLon(52.5, -0.75)).toBe('52°30.00′ N 000°45.00′ W');
    expect(fmtLatLon(-33.999999, 151.2)).toBe('34°00.00′ S 151°12.00′ E');
  });

  // Conventions of the brief: variation east +; bank right wing down +.
  it('names the side of variation and bank instead of a bare sign', () => {
    expect(fmtVariation(-3.24)).toBe('3.2° W');
    expect(fmtVariation(0.4)).toBe('0.4° E');
    expect(fmtVariation(0.01)).toBe('0.0°');
    expect(fmtBank(17.6)).toBe('18° R');
    expect(fmtBank(-12)).toBe('12° L');
  });
});
