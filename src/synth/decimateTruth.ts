// Every k-th row of a simulated truth: fly a scripted pilot at 10 Hz, write the log at 1 Hz.
import { OptionError } from '../errors.js';
import { TRUTH_COLUMNS, type SynthTruth } from './synthTruth.js';

/**
 * Keeps rows 0, k, 2k, … of the truth (k = factor, a whole number ≥ 1); the rate becomes sampleRateHz / k and
 * each leg record's startIndex / endIndex are re-counted on the kept rows (−1 when none falls in the leg).
 * Pure. Throws OptionError for a factor that is not a whole number ≥ 1.
 */
export function decimateTruth(truth: SynthTruth, factor: number): SynthTruth {
  if (!Number.isInteger(factor) || factor < 1) throw new OptionError('factor', `must be a whole number ≥ 1, got ${factor}`);
  const n = Math.ceil(truth.n / factor);
  const out = { n, name: truth.name, sampleRateHz: truth.sampleRateHz / factor } as SynthTruth;
  for (const c of TRUTH_COLUMNS) {
    const a = new Float64Array(n);
    for (let j = 0; j < n; j++) a[j] = truth[c][j * factor];
    out[c] = a;
  }
  out.leg = new Int32Array(n);
  for (let j = 0; j < n; j++) out.leg[j] = truth.leg[j * factor];
  out.legs = truth.legs.map((r) => {
    const a = r.startIndex < 0 ? -1 : Math.ceil(r.startIndex / factor);
    const b = r.endIndex < 0 ? -1 : Math.floor(r.endIndex / factor);
    return { ...r, startIndex: a <= b ? a : -1, endIndex: a <= b ? b : -1 };
  });
  return out;
}
