// Inferring a turn's target when there is no plan: nearest multiple of 30° or of 45°, confidence from the distance.
import { describe, expect, it } from 'vitest';
import { DEFAULT_TARGET_CANDIDATES_DEG, inferTargetHeading } from '../../src/analysis/inferTarget.js';

describe('inferTargetHeading (candidates: multiples of 30° and 45°, common practice)', () => {
  it('the default candidates are the 16 headings 000 030 045 060 090 … 330', () => {
    expect(DEFAULT_TARGET_CANDIDATES_DEG).toEqual([0, 30, 45, 60, 90, 120, 135, 150, 180, 210, 225, 240, 270, 300, 315, 330]);
  });
  it('a heading on a candidate is inferred with confidence 1', () => {
    expect(inferTargetHeading(270)).toEqual({ targetMagDeg: 270, confidence: 1, distanceDeg: 0 });
  });
  it('093 → 090, 3° into a 30° gap: confidence 1 − 3/15 = 0.8', () => {
    const r = inferTargetHeading(93);
    expect(r.targetMagDeg).toBe(90);
    expect(r.confidence).toBeCloseTo(0.8, 12);
  });
  it('wraps through north: 357 and 362 both → 000', () => {
    expect(inferTargetHeading(357).targetMagDeg).toBe(0);
    expect(inferTargetHeading(362).targetMagDeg).toBe(0);
  });
  it('halfway between two candidates has confidence 0 (52.5 between 045 and 060)', () => {
    expect(inferTargetHeading(52.5).confidence).toBeCloseTo(0, 12);
  });
  it('honours custom candidates (cardinals only): 100 → 090 with confidence 1 − 10/45', () => {
    const r = inferTargetHeading(100, [0, 90, 180, 270]);
    expect(r.targetMagDeg).toBe(90);
    expect(r.confidence).toBeCloseTo(1 - 10 / 45, 12);
  });
  it('a NaN heading gives a NaN target with confidence 0', () => {
    const r = inferTargetHeading(NaN);
    expect(Number.isNaN(r.targetMagDeg)).toBe(true);
    expect(r.confidence).toBe(0);
  });
});
