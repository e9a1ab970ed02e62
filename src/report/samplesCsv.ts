// The samples CSV: one row per sample, the contract columns of DESIGN.md first, the error split after them.
import { KT_MS } from '../constants.js';
import { wrap360, wrap180 } from '../geo/angles.js';
import type { FlightAnalysis } from '../flightAnalysis.js';

/** Contract columns, exactly these names in this order (DESIGN.md "Samples CSV"). */
export const SAMPLES_CONTRACT_COLUMNS = [
  'time_utc',
  'lat_deg',
  'lon_deg',
  'alt_m',
  'groundspeed_kt',
  'track_true_deg',
  'heading_true_deg',
  'heading_mag_deg',
  'variation_deg',
  'dip_deg',
  'bank_deg',
  'turn_rate_dps',
  'accel_long_ms2',
  'compass_static_deg',
  'compass_deg',
  'compass_error_deg',
] as const;

/** Columns that follow the contract: the error split (they add up to compass_error_deg) and flags. */
export const SAMPLES_EXTRA_COLUMNS = [
  'err_dip_turn_deg',
  'err_dip_accel_deg',
  'err_lag_swirl_deg',
  'err_deviation_deg',
  'card_tilt_deg',
  'card_unreliable',
  'segment',
  'drift_deg',
  'heading_sigma_deg',
  'wind_from_deg',
  'wind_kt',
] as const;

function fixed(x: number, digits: number): string {
  return Number.isFinite(x) ? x.toFixed(digits) : '';
}

function angle360(x: number, digits: number): string {
  if (!Number.isFinite(x)) return '';
  const s = wrap360(x).toFixed(digits);
  // Rounding 359.9996 to "360.000" would leave [0, 360): fold it back to zero.
  return Number(s) >= 360 ? (0).toFixed(digits) : s;
}

function angle180(x: number, digits: number): string {
  return Number.isFinite(x) ? wrap180(x).toFixed(digits) : '';
}

/** Direction the wind blows from [deg true] for an air-mass velocity (windN, windE: where it blows to). */
function windFromDeg(windN: number, windE: number): number {
  return Math.hypot(windN, windE) > 0 ? (Math.atan2(-windE, -windN) * 180) / Math.PI : 0;
}

/**
 * Samples CSV text for a whole flight, header first, '\n' line ends. Missing values are empty fields.
 * Angles in [0, 360) except signed quantities; heading_mag = heading_true − variation (east +).
 */
export function samplesCsv(a: FlightAnalysis): string {
  const { state: s, field: f, compass: c } = a;
  const out: string[] = new Array(s.n + 1);
  out[0] = [...SAMPLES_CONTRACT_COLUMNS, ...SAMPLES_EXTRA_COLUMNS].join(',');
  for (let i = 0; i < s.n; i++) {
    const headingMag = s.headingDegTrue[i] - f.variationDeg[i];
    out[i + 1] = [
      new Date(Math.round(s.t[i] * 1000)).toISOString(),
      fixed(s.lat[i], 7),
      fixed(s.lon[i], 7),
      fixed(s.altM[i], 1),
      fixed(s.gsMs[i] / KT_MS, 2),
      angle360(s.trackDegTrue[i], 2),
      angle360(s.headingDegTrue[i], 2),
      angle360(headingMag, 2),
      angle180(f.variationDeg[i], 3),
      fixed(f.dipDeg[i], 3),
      fixed(s.bankDeg[i], 2),
      fixed(s.turnRateDps[i], 3),
      fixed(s.accelLongMs2[i], 3),
      angle360(c.staticDeg[i], 2),
      angle360(c.readingDeg[i], 2),
      angle180(c.errorDeg[i], 2),
      fixed(c.errDipTurnDeg[i], 2),
      fixed(c.errDipAccelDeg[i], 2),
      fixed(c.errLagSwirlDeg[i], 2),
      fixed(c.errDeviationDeg[i], 2),
      fixed(c.tiltDeg[i], 2),
      String(c.unreliable[i]),
      String(s.segment[i]),
      angle180(s.trackDegTrue[i] - s.headingDegTrue[i], 2),
      fixed(s.headingSigmaDeg ? s.headingSigmaDeg[i] : NaN, 2),
      angle360(windFromDeg(s.windN[i], s.windE[i]), 1),
      fixed(Math.hypot(s.windN[i], s.windE[i]) / KT_MS, 1),
    ].join(',');
  }
  return out.join('\n') + '\n';
}
