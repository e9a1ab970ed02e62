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

/** x with `digits` decimals (toFixed), '' for a missing value. */
const fixed = (x: number, digits: number): string => (Number.isFinite(x) ? x.toFixed(digits) : '');

function angle360(x: number, digits: number): string {
  if (!Number.isFinite(x)) return '';
  const w = wrap360(x);
  // Rounding 359.9996 to "360.000" would leave [0, 360): fold it back to zero.
  const text = w.toFixed(digits);
  return Number(text) >= 360 ? (0).toFixed(digits) : text;
}

function angle180(x: number, digits: number): string {
  return Number.isFinite(x) ? wrap180(x).toFixed(digits) : '';
}

/** ISO 8601 UTC with milliseconds; the date part is made once per UTC day. */
function isoTimeWriter(): (tS: number) => string {
  let day = NaN;
  let prefix = '';
  return (tS: number) => {
    const ms = Math.round(tS * 1000);
    const d = Math.floor(ms / 86_400_000);
    if (d !== day) {
      day = d;
      prefix = new Date(d * 86_400_000).toISOString().slice(0, 11);
    }
    let rem = ms - d * 86_400_000;
    const h = Math.floor(rem / 3_600_000);
    rem -= h * 3_600_000;
    const m = Math.floor(rem / 60_000);
    rem -= m * 60_000;
    const sec = Math.floor(rem / 1000);
    const milli = rem - sec * 1000;
    return `${prefix}${h < 10 ? '0' : ''}${h}:${m < 10 ? '0' : ''}${m}:${sec < 10 ? '0' : ''}${sec}.${milli < 10 ? '00' : milli < 100 ? '0' : ''}${milli}Z`;
  };
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
  return Array.from(samplesCsvChunks(a)).join('');
}

/**
 * The samples CSV as text chunks of `rowsPerChunk` rows each (the header first), for writing long flights
 * without holding the whole file as one string. Joined, the chunks are exactly samplesCsv(a).
 */
export function* samplesCsvChunks(a: FlightAnalysis, rowsPerChunk = 20_000): Generator<string> {
  const { state: s, field: f, compass: c } = a;
  yield [...SAMPLES_CONTRACT_COLUMNS, ...SAMPLES_EXTRA_COLUMNS].join(',') + '\n';
  const iso = isoTimeWriter();
  let out: string[] = [];
  const sigma = s.headingSigmaDeg;
  // One reused row array: no array per sample (this writer runs over every sample of long flights).
  const row: string[] = new Array(27);
  for (let i = 0; i < s.n; i++) {
    const headingMag = s.headingDegTrue[i] - f.variationDeg[i];
    row[0] = iso(s.t[i]);
    row[1] = fixed(s.lat[i], 7);
    row[2] = fixed(s.lon[i], 7);
    row[3] = fixed(s.altM[i], 1);
    row[4] = fixed(s.gsMs[i] / KT_MS, 2);
    row[5] = angle360(s.trackDegTrue[i], 2);
    row[6] = angle360(s.headingDegTrue[i], 2);
    row[7] = angle360(headingMag, 2);
    row[8] = angle180(f.variationDeg[i], 3);
    row[9] = fixed(f.dipDeg[i], 3);
    row[10] = fixed(s.bankDeg[i], 2);
    row[11] = fixed(s.turnRateDps[i], 3);
    row[12] = fixed(s.accelLongMs2[i], 3);
    row[13] = angle360(c.staticDeg[i], 2);
    row[14] = angle360(c.readingDeg[i], 2);
    row[15] = angle180(c.errorDeg[i], 2);
    row[16] = fixed(c.errDipTurnDeg[i], 2);
    row[17] = fixed(c.errDipAccelDeg[i], 2);
    row[18] = fixed(c.errLagSwirlDeg[i], 2);
    row[19] = fixed(c.errDeviationDeg[i], 2);
    row[20] = fixed(c.tiltDeg[i], 2);
    row[21] = String(c.unreliable[i]);
    row[22] = String(s.segment[i]);
    row[23] = angle180(s.trackDegTrue[i] - s.headingDegTrue[i], 2);
    row[24] = fixed(sigma ? sigma[i] : NaN, 2);
    row[25] = angle360(windFromDeg(s.windN[i], s.windE[i]), 1);
    row[26] = fixed(Math.hypot(s.windN[i], s.windE[i]) / KT_MS, 1);
    out.push(row.join(','));
    if (out.length === rowsPerChunk) {
      out.push('');
      yield out.join('\n');
      out = [];
    }
  }
  if (out.length > 0) {
    out.push('');
    yield out.join('\n');
  }
}
