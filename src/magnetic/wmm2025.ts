// The World Magnetic Model 2025 at one point, through the `geomagnetism` package's model code and its
// WMM2025 coefficient file, with our own choice of model, our own validity check and an exact decimal year.
import { requireCjs } from '../util/requireCjs.js';
import wmm2025Coefficients from 'geomagnetism/data/wmm-2025.json' with { type: 'json' };
import { OptionError } from '../errors.js';

const GeomagnetismModel = requireCjs('geomagnetism/lib/model.js') as typeof import('geomagnetism/lib/model.js').default;
type GeomagnetismModel = import('geomagnetism/lib/model.js').default;

/** Model name as printed in reports. */
export const WMM2025_NAME = 'WMM2025';
/** First decimal year of the model's validity (epoch). Source: WMM2025 Technical Report (NOAA NCEI / BGS, 2024). */
export const WMM2025_VALID_FROM_YEAR = 2025.0;
/** End of validity ("expires 31 Dec 2029", i.e. decimal year 2030.0). Source: WMM2025 Technical Report. */
export const WMM2025_VALID_UNTIL_YEAR = 2030.0;
/** Height range of the model above the WGS-84 ellipsoid [m]: −1 km to 850 km. Source: WMM2025 Technical Report. */
export const WMM2025_MIN_ALT_M = -1_000;
export const WMM2025_MAX_ALT_M = 850_000;

/**
 * Main-field elements at one point, geodetic north-east-down frame.
 * xNt north, yNt east, zNt down, hNt = √(X²+Y²), fNt = √(H²+Z²) [nT];
 * variationDeg = declination D = atan2(Y, X) in (−180, 180], east +;
 * dipDeg = inclination I = atan2(Z, H) in [−90, 90], down + (positive in the northern magnetic hemisphere).
 */
export interface PointField {
  xNt: number;
  yNt: number;
  zNt: number;
  hNt: number;
  fNt: number;
  variationDeg: number;
  dipDeg: number;
}

/** Evaluates the field at (latDeg geodetic, lonDeg, altM above the WGS-84 ellipsoid) for one fixed epoch. */
export type FieldEvaluator = (latDeg: number, lonDeg: number, altM: number) => PointField;

/**
 * A small memo of time-carried models, keyed by the exact decimal year. Create one per run with
 * `createWmm2025Memo()` and pass it along; nothing is kept between runs.
 */
export interface Wmm2025Memo {
  models: Map<number, GeomagnetismModel>;
}

/** Most epochs a memo keeps before it starts afresh (a flight needs one). */
const MEMO_MAX_ENTRIES = 16;

/** One year of 365 days [ms]: the `geomagnetism` package's decimal year divides by this (lib/model.js). */
const PACKAGE_YEAR_MS = 365 * 86_400_000;

// The coefficient file carries the package's own validity window (2024-11-13 … 2029-11-13), and getTimedModel
// throws or prints outside it. We open that window fully and check validity ourselves (isWithinWmm2025Validity).
// Never mutated after construction.
const BASE_MODEL = new GeomagnetismModel({
  ...wmm2025Coefficients,
  start_date: new Date(-8.64e15),
  end_date: new Date(8.64e15),
});

const NAN_FIELD: PointField = Object.freeze({
  xNt: NaN,
  yNt: NaN,
  zNt: NaN,
  hNt: NaN,
  fNt: NaN,
  variationDeg: NaN,
  dipDeg: NaN,
});

/** A fresh, empty memo of time-carried models. */
export function createWmm2025Memo(): Wmm2025Memo {
  return { models: new Map() };
}

/**
 * Decimal year of a UTC instant, WMM convention: year + (day-of-year − 1 + fraction of day) / days-in-year
 * (365 or 366). E.g. 2027-07-02T12:00Z → 2027.5. NaN for a non-finite time.
 * Source: WMM2025 Technical Report (decimal year of the date, leap years counted).
 */
export function decimalYearOf(tUnixS: number): number {
  if (!Number.isFinite(tUnixS)) return NaN;
  const ms = tUnixS * 1000;
  const year = new Date(ms).getUTCFullYear();
  const start = Date.UTC(year, 0, 1);
  const end = Date.UTC(year + 1, 0, 1);
  return year + (ms - start) / (end - start);
}

/** True when a decimal year lies in the model's validity, 2025.0 ≤ y < 2030.0. */
export function isWithinWmm2025Validity(decimalYear: number): boolean {
  return decimalYear >= WMM2025_VALID_FROM_YEAR && decimalYear < WMM2025_VALID_UNTIL_YEAR;
}

/**
 * The Date at which the package's 365-day decimal year (lib/model.js getTimedModel:
 * year + ms-since-1-Jan / (365 × 86 400 000)) equals `decimalYear` exactly (to the 1 ms the Date holds,
 * 3e-11 yr). A fraction below 1 spans less than 365 days, so the Date stays inside the same UTC year.
 */
function packageDateFor(decimalYear: number): Date {
  const yearInt = Math.floor(decimalYear);
  return new Date(Date.UTC(yearInt, 0, 1) + (decimalYear - yearInt) * PACKAGE_YEAR_MS);
}

function timedModel(decimalYear: number, memo: Wmm2025Memo | undefined): GeomagnetismModel {
  const cached = memo?.models.get(decimalYear);
  if (cached) return cached;
  // WMM linear secular variation: g(t) = g(t0) + (t − t0)·ġ (WMM2025 Technical Report eq. 9), in getTimedModel.
  const model = BASE_MODEL.getTimedModel(packageDateFor(decimalYear), true);
  if (memo) {
    if (memo.models.size >= MEMO_MAX_ENTRIES) memo.models.clear();
    memo.models.set(decimalYear, model);
  }
  return model;
}

/**
 * The WMM2025 field evaluator for one epoch (decimal year, WMM convention; see decimalYearOf). The model is
 * evaluated outside its validity too (linear secular variation extrapolated): check isWithinWmm2025Validity.
 * Inputs: latDeg geodetic in [−90, 90], lonDeg any, altM above the WGS-84 ellipsoid [m] (model range
 * −1 km … 850 km; evaluated beyond it as well). A non-finite or out-of-range latitude, or a non-finite
 * longitude or height, gives an all-NaN result.
 * Throws OptionError when decimalYear is not finite.
 * Example: wmm2025Evaluator(2027.5)(-80, 240, 100_000).variationDeg ≈ 67.93.
 */
export function wmm2025Evaluator(decimalYear: number, memo?: Wmm2025Memo): FieldEvaluator {
  if (!Number.isFinite(decimalYear)) throw new OptionError('decimalYear', `must be a finite decimal year, got ${decimalYear}`);
  const model = timedModel(decimalYear, memo);
  return (latDeg: number, lonDeg: number, altM: number): PointField => {
    if (!(Math.abs(latDeg) <= 90) || !Number.isFinite(lonDeg) || !Number.isFinite(altM)) return NAN_FIELD;
    // Spherical-harmonic synthesis, degree/order 12, geodetic → geocentric → geodetic rotation
    // (WMM2025 Technical Report sec. 1.2, eqs. 7–17), as implemented by geomagnetism lib/model.js point().
    const e = model.point([latDeg, lonDeg, altM / 1000]);
    return {
      xNt: e.x,
      yNt: e.y,
      zNt: e.z,
      hNt: e.h,
      fNt: e.f,
      variationDeg: e.decl,
      dipDeg: e.incl,
    };
  };
}

/**
 * WMM2025 field at one point and epoch. latDeg geodetic, lonDeg, altM above the WGS-84 ellipsoid [m],
 * decimalYear WMM convention (see decimalYearOf). Units and signs as in PointField. Evaluates outside the
 * validity window too (see isWithinWmm2025Validity). Pass a memo when calling for many points.
 * Throws OptionError for a non-finite decimal year; bad coordinates give NaN.
 * Example: fieldAtPoint(-80, 240, 100_000, 2027.5) → X 5983.98, Y 14760.14, Z −49317.67 nT, D 67.93°, I −72.10°.
 */
export function fieldAtPoint(latDeg: number, lonDeg: number, altM: number, decimalYear: number, memo?: Wmm2025Memo): PointField {
  return wmm2025Evaluator(decimalYear, memo)(latDeg, lonDeg, altM);
}
