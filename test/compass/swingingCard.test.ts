// A card that loses its directive force near reversal swings round: those samples are flagged unreliable.
import { describe, expect, it } from 'vitest';
import { simulateFlight } from '../../src/synth/simulateFlight.js';
import { truthToFlightState } from '../../src/synth/truthToFlightState.js';
import { computeFieldAlongPath } from '../../src/magnetic/fieldAlongPath.js';
import { simulateCompass, SWINGING_CARD_DEG } from '../../src/compass/simulateCompass.js';
import { DEFAULT_COMPASS_PROFILE } from '../../src/compass/compassProfile.js';
import { COMPASS_FLAG_SWINGING } from '../../src/compass/compassTrace.js';
import { cardReversalBankDeg } from '../../src/compass/turningError.js';
import { wrap180 } from '../../src/geo/angles.js';
import { KT_MS } from '../../src/constants.js';

describe('a card swinging round after reversal', () => {
  // 61 N 150 W: dip about 74°, so the card loses its directive force at a bank of 90 − 74 = 16° (PHYSICS.md §1.4, check 8).
  const truth = simulateFlight({
    start: { t0: Date.UTC(2026, 7, 10, 12, 0, 0) / 1000, latDeg: 61.2, lonDeg: -149.9, altM: 1200, headingDegTrue: 0, tasMs: 105 * KT_MS },
    // A standard-rate turn at 105 kt banks about 16°: right on the reversal bank, where the card has almost no directive force.
    legs: [{ kind: 'straight', durationS: 30 }, { kind: 'turn', direction: 'right', byDeg: 360, rateDps: 3 }, { kind: 'straight', durationS: 60 }],
  });
  const state = truthToFlightState(truth);
  const { field } = computeFieldAlongPath(state.t, state.lat, state.lon, state.altM);
  const c = simulateCompass(state, field, DEFAULT_COMPASS_PROFILE);

  it('happens in a standard-rate turn at dip 74, banked at the reversal bank 90 − dip', () => {
    expect(Math.abs(cardReversalBankDeg(field.dipDeg[0]) - 16)).toBeLessThan(1);
    let swinging = 0;
    for (let i = 0; i < c.n; i++) if (((c.flags?.[i] ?? 0) & COMPASS_FLAG_SWINGING) !== 0) swinging++;
    expect(swinging).toBeGreaterThan(0);
  });

  it('flags as unreliable every sample where the simulated card is more than SWINGING_CARD_DEG from its equilibrium', () => {
    for (let i = 0; i < c.n; i++) {
      if (Math.abs(wrap180(c.dynamicDeg[i] - c.staticDeg[i])) > SWINGING_CARD_DEG) expect(c.unreliable[i]).toBe(1);
    }
  });

  it('does not flag the straight flight after the card has settled', () => {
    for (let i = c.n - 20; i < c.n; i++) expect(c.unreliable[i]).toBe(0);
  });
});
