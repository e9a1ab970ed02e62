// Speed-change episodes on straight legs and the apparent swing of the compass they caused.
import { RAD } from '../constants.js';
import { wrap180, wrap360 } from '../geo/angles.js';
import { accelerationReadingDeg } from '../compass/turningError.js';
import type { CompassTrace } from '../compass/compassTrace.js';
import type { FieldAlongPath } from '../magnetic/fieldAlongPath.js';
import type { FlightState } from '../state/flightState.js';
import type { SpeedEpisode } from './analysisTypes.js';
import { DEFAULT_EPISODES, type EpisodeOptions } from './debriefOptions.js';
import { magneticHeadingAt } from './magneticHeading.js';

const DEG = Math.PI / 180;
/** Below this |expected swing| [deg] the swing ratio is not formed (NaN). */
const MIN_EXPECTED_FOR_RATIO_DEG = 0.5;

/**
 * Finds speed changes on straight legs and measures the compass's apparent swing.
 *
 * Method (ours): an episode is a run of rows with s·accel_long ≥ threshold/2 (s the sign of the change), containing
 * rows with s·accel_long ≥ threshold spread over at least minS; every row must have |turn rate| ≤ straightMaxRateDps,
 * lie outside `turns` and have finite inputs. Measures: peak acceleration (signed); mean ψm (circular); the apparent
 * swing = compass error − deviation part (reading − ψm with the deviation card taken out), peak |value| with its
 * sign over the episode and tailS after it (the card lags), + = the card shows a turn to the right; the model's
 * expectation = the static closed form for linear acceleration wings level (Williams eq. 3–4,
 * accelerationReadingDeg) at the peak acceleration, mean ψm and the dip at the peak row.
 * Expectation to check against (IFH FAA-H-8083-15B ch. 7 "ANDS"; PHYSICS.md §2): northern hemisphere, accelerating
 * on east or west the card shows a turn toward north (on west: to the right), none on north or south headings.
 * @param turns detected turns (rows inside them are never part of an episode)
 * @returns episodes in time order.
 */
// Method: ours (hysteresis on accel_long); expectation from Williams, "Compass Errors" (2001) eq. 3–4.
export function detectSpeedEpisodes(
  state: FlightState, field: FieldAlongPath, compass: CompassTrace,
  turns: ReadonlyArray<{ startIndex: number; endIndex: number }>, opts: EpisodeOptions = DEFAULT_EPISODES,
): SpeedEpisode[] {
  const { n, t, accelLongMs2: acc, turnRateDps: rate, segment: seg } = state;
  const inTurn = new Uint8Array(n);
  for (const tr of turns) inTurn.fill(1, Math.max(0, tr.startIndex), Math.min(n, tr.endIndex + 1));
  const thr = opts.thresholdMs2;
  const ok = (i: number): boolean =>
    inTurn[i] === 0 && Number.isFinite(acc[i]) && Math.abs(rate[i]) <= opts.straightMaxRateDps && Number.isFinite(compass.errorDeg[i]);
  const out: SpeedEpisode[] = [];
  let i = 0;
  while (i < n) {
    if (!(Math.abs(acc[i]) >= thr / 2) || !ok(i)) { // the cheap acceleration test first: most rows are steady
      i++;
      continue;
    }
    const s = acc[i] > 0 ? 1 : -1;
    let j = i;
    while (j + 1 < n && seg[j + 1] === seg[i] && ok(j + 1) && s * acc[j + 1] >= thr / 2) j++;
    let first = -1;
    let last = -1;
    let peak = i;
    for (let k = i; k <= j; k++) {
      if (s * acc[k] >= thr) {
        if (first < 0) first = k;
        last = k;
      }
      if (s * acc[k] > s * acc[peak]) peak = k;
    }
    if (first >= 0 && t[last] - t[first] >= opts.minS) out.push(measureEpisode(state, field, compass, i, j, peak, s, inTurn, opts));
    i = j + 1;
  }
  return out;
}

function measureEpisode(
  state: FlightState, field: FieldAlongPath, compass: CompassTrace, i: number, j: number, peak: number, s: number,
  inTurn: Uint8Array, opts: EpisodeOptions,
): Required<SpeedEpisode> {
  const { t, segment: seg } = state;
  const n = state.n;
  let sn = 0;
  let cs = 0;
  for (let k = i; k <= j; k++) {
    const h = magneticHeadingAt(state, field, compass, k);
    if (!Number.isFinite(h)) continue;
    sn += Math.sin(h * DEG);
    cs += Math.cos(h * DEG);
  }
  const headingMagDeg = wrap360(Math.atan2(sn, cs) * RAD);
  let swing = 0;
  for (let k = i; k < n && seg[k] === seg[i] && inTurn[k] === 0 && t[k] <= t[j] + opts.tailS; k++) {
    const dev = compass.errDeviationDeg[k];
    const v = compass.errorDeg[k] - (Number.isFinite(dev) ? dev : 0);
    if (Number.isFinite(v) && Math.abs(v) > Math.abs(swing)) swing = v;
  }
  const peakAccelMs2 = state.accelLongMs2[peak];
  const dipDeg = field.dipDeg[peak];
  const expected = wrap180(accelerationReadingDeg(headingMagDeg, peakAccelMs2, dipDeg) - headingMagDeg);
  return {
    startIndex: i,
    endIndex: j,
    startT: t[i],
    endT: t[j],
    kind: s > 0 ? 'accelerating' : 'decelerating',
    peakAccelMs2,
    headingMagDeg,
    peakSwingDeg: swing,
    swingDirection: Math.abs(swing) < opts.noneDeg ? 'none' : swing > 0 ? 'right' : 'left',
    expectedSwingDeg: expected,
    durationS: t[j] - t[i],
    dipDeg,
    swingRatio: Math.abs(expected) >= MIN_EXPECTED_FOR_RATIO_DEG ? swing / expected : NaN,
  };
}
