// Compass profile parsing: defaults, documented origins, range checks naming the field and its range.
import { describe, expect, it } from 'vitest';
import {
  COMPASS_PROFILE_FIELDS, DEFAULT_COMPASS_PROFILE, parseCompassProfile,
} from '../../src/compass/compassProfile.js';
import { OptionError } from '../../src/errors.js';

describe('parseCompassProfile', () => {
  it('an empty object gives the documented defaults', () => {
    expect(parseCompassProfile({})).toEqual(DEFAULT_COMPASS_PROFILE);
  });

  it('takes given fields and keeps the others at their defaults', () => {
    const p = parseCompassProfile({ name: 'Fenbird 2 panel compass', periodS: 3, dampingRatio: 0.9, swirlCoupling: 0 });
    expect(p).toMatchObject({ name: 'Fenbird 2 panel compass', periodS: 3, dampingRatio: 0.9, swirlCoupling: 0, tiltLimitDeg: 18 });
  });

  it('the tilt limit default is the handbook 18° (FAA PHAK FAA-H-8083-25A p. 7-23)', () => {
    expect(DEFAULT_COMPASS_PROFILE.tiltLimitDeg).toBe(18);
    expect(COMPASS_PROFILE_FIELDS.tiltLimitDeg.origin).toBe('handbook');
  });

  it('says honestly that period, damping, swirl and tilt lag are estimates (PHYSICS §1.6: no open source found)', () => {
    for (const f of ['periodS', 'dampingRatio', 'swirlTimeConstantS', 'swirlCoupling', 'tiltLagS'] as const) {
      expect(COMPASS_PROFILE_FIELDS[f].origin).toBe('derived estimate');
    }
  });

  it('rejects an out-of-range value with an OptionError naming the field and the range', () => {
    const bad = () => parseCompassProfile({ dampingRatio: 9 });
    expect(bad).toThrow(OptionError);
    expect(bad).toThrow(/dampingRatio.*\[0\.05, 5\]/);
    expect(() => parseCompassProfile({ periodS: 0 })).toThrow(/periodS.*\[0\.2, 60\] s/);
    expect(() => parseCompassProfile({ tiltLimitDeg: 120 })).toThrow(/tiltLimitDeg/);
  });

  it('rejects wrong types, unknown fields and non-objects', () => {
    expect(() => parseCompassProfile({ periodS: '4' })).toThrow(/periodS.*finite number/);
    expect(() => parseCompassProfile({ periodS: NaN })).toThrow(/periodS/);
    expect(() => parseCompassProfile({ perodS: 4 })).toThrow(/perodS.*unknown field/);
    expect(() => parseCompassProfile({ cautionZoneUnreliable: 1 })).toThrow(/cautionZoneUnreliable/);
    expect(() => parseCompassProfile([1, 2])).toThrow(OptionError);
    expect(() => parseCompassProfile(null)).toThrow(OptionError);
  });

  it('rejects a residual dip at or above the reference dip (no pendulosity could give it)', () => {
    expect(() => parseCompassProfile({ residualDipDeg: 19, refVerticalNt: 5000, refHorizontalNt: 20000 })).toThrow(/residualDipDeg/);
  });
});
