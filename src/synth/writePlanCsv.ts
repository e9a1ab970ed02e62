// The turn plan of a synthetic flight as a plan file (DESIGN.md "Plan file"): one row per intended turn.
import { wrap360 } from '../geo/angles.js';
import type { SynthTruth } from './synthTruth.js';
import { isoUtcMs } from './writeGpx.js';

/**
 * Plan CSV with header `target_mag_deg,not_before_utc`: for every turn and orbit leg, in order, the
 * magnetic heading the script ended it on (true end heading − variationDeg, east +, rounded to 1°) and an
 * anchor time `anchorLeadS` (default 10 s) before the roll-in began, floored to the whole second. Pure.
 */
export function writePlanCsv(truth: SynthTruth, variationDeg: number, anchorLeadS = 10): string {
  const rows = ['target_mag_deg,not_before_utc'];
  for (const leg of truth.legs) {
    if (leg.kind !== 'turn' && leg.kind !== 'orbit') continue;
    if (!(leg.endT > leg.startT)) continue;
    const mag = Math.round(wrap360(leg.headingEndDegTrue - variationDeg)) % 360;
    rows.push(`${String(mag).padStart(3, '0')},${isoUtcMs(Math.floor(leg.startT - anchorLeadS))}`);
  }
  return `${rows.join('\n')}\n`;
}
