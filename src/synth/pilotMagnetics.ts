// The Earth's field as a scripted pilot (and the perceived compass) sees it: WMM2025 or a constant field.
import { DEG } from '../constants.js';
import { OptionError } from '../errors.js';
import { decimalYearOf, wmm2025Evaluator, type FieldEvaluator, type PointField } from '../magnetic/wmm2025.js';

/**
 * Where the field comes from: the World Magnetic Model 2025 at the flight's start epoch, or a constant field
 * (variation east +, dip down +, horizontal intensity hNt default 20 000 nT) for tests and what-if lessons.
 */
export type PilotMagnetics =
  | { kind: 'wmm2025' }
  | { kind: 'constant'; variationDeg: number; dipDeg: number; hNt?: number };

/**
 * A field evaluator (lat, lon [deg], height above the ellipsoid [m]) → field elements (X north, Y east, Z down
 * [nT], variation east +, dip down +). WMM2025: one epoch, the decimal year of t0 (the secular change over a
 * lesson, ~0.01°/h, is below the model's own accuracy). Constant: X = H cos D, Y = H sin D, Z = H tan(dip).
 * Throws OptionError for a constant field with a non-finite value or |dip| ≥ 90.
 */
export function pilotFieldEvaluator(m: PilotMagnetics, t0: number): FieldEvaluator {
  if (m.kind === 'wmm2025') return wmm2025Evaluator(decimalYearOf(t0));
  const hNt = m.hNt ?? 20000;
  if (!Number.isFinite(m.variationDeg)) throw new OptionError('magnetics.variationDeg', `must be finite, got ${m.variationDeg}`);
  if (!(Math.abs(m.dipDeg) < 90)) throw new OptionError('magnetics.dipDeg', `must be in (−90, 90), got ${m.dipDeg}`);
  if (!(hNt > 0)) throw new OptionError('magnetics.hNt', `must be > 0, got ${hNt}`);
  const zNt = hNt * Math.tan(m.dipDeg * DEG);
  const f: PointField = {
    xNt: hNt * Math.cos(m.variationDeg * DEG),
    yNt: hNt * Math.sin(m.variationDeg * DEG),
    zNt,
    hNt,
    fNt: Math.hypot(hNt, zNt),
    variationDeg: m.variationDeg,
    dipDeg: m.dipDeg,
  };
  return () => f;
}
