// The samples CSV: one row per sample, the contract columns of DESIGN.md first, the error split after them.
import { KT_MS } from '../constants.js';
import { wrap360, wrap180 } from '../geo/angles.js';
import type { FlightAnalysis } from '../flightAnalysis.js';
import { AsciiRowWriter } from './asciiRowWriter.js';

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

/** An angle wrapped to [0, 360) with `digits` decimals; a value that would round to 360 is written as 0. */
function angle360(w: AsciiRowWriter, x: number, digits: number): void {
  if (!Number.isFinite(x)) return;
  const v = wrap360(x);
  w.fixed(Math.round(v * 10 ** digits) >= 360 * 10 ** digits ? 0 : v, digits);
}

/** A signed angle wrapped to (−180, 180] with `digits` decimals. */
function angle180(w: AsciiRowWriter, x: number, digits: number): void {
  if (Number.isFinite(x)) w.fixed(wrap180(x), digits);
}

/** ISO 8601 UTC with milliseconds, e.g. 2026-05-04T10:11:12.500Z; the date part is made once per UTC day. */
function isoTimeWriter(): (w: AsciiRowWriter, tS: number) => void {
  let day = NaN;
  let prefix = '';
  return (w: AsciiRowWriter, tS: number) => {
    if (!Number.isFinite(tS)) return;
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
    w.ascii(prefix);
    w.uint(h, 2);
    w.ascii(':');
    w.uint(m, 2);
    w.ascii(':');
    w.uint(sec, 2);
    w.ascii('.');
    w.uint(rem - sec * 1000, 3);
    w.ascii('Z');
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
  const decoder = new TextDecoder();
  return Array.from(samplesCsvChunks(a), (c) => decoder.decode(c)).join('');
}

/**
 * The samples CSV as byte chunks of about `chunkBytes` (ASCII, the header first), for writing long flights
 * without holding the file as one string or making a string per value. Joined, the chunks are samplesCsv(a).
 */
export function* samplesCsvChunks(a: FlightAnalysis, chunkBytes = 1 << 20): Generator<Uint8Array> {
  const { state: s, field: f, compass: c } = a;
  const w = new AsciiRowWriter(Math.max(chunkBytes, 2048));
  w.ascii([...SAMPLES_CONTRACT_COLUMNS, ...SAMPLES_EXTRA_COLUMNS].join(','));
  w.newline();
  const iso = isoTimeWriter();
  const sigma = s.headingSigmaDeg;
  for (let i = 0; i < s.n; i++) {
    const headingMag = s.headingDegTrue[i] - f.variationDeg[i];
    iso(w, s.t[i]); w.comma();
    w.fixed(s.lat[i], 7); w.comma();
    w.fixed(s.lon[i], 7); w.comma();
    w.fixed(s.altM[i], 1); w.comma();
    w.fixed(s.gsMs[i] / KT_MS, 2); w.comma();
    angle360(w, s.trackDegTrue[i], 2); w.comma();
    angle360(w, s.headingDegTrue[i], 2); w.comma();
    angle360(w, headingMag, 2); w.comma();
    angle180(w, f.variationDeg[i], 3); w.comma();
    w.fixed(f.dipDeg[i], 3); w.comma();
    w.fixed(s.bankDeg[i], 2); w.comma();
    w.fixed(s.turnRateDps[i], 3); w.comma();
    w.fixed(s.accelLongMs2[i], 3); w.comma();
    angle360(w, c.staticDeg[i], 2); w.comma();
    angle360(w, c.readingDeg[i], 2); w.comma();
    angle180(w, c.errorDeg[i], 2); w.comma();
    w.fixed(c.errDipTurnDeg[i], 2); w.comma();
    w.fixed(c.errDipAccelDeg[i], 2); w.comma();
    w.fixed(c.errLagSwirlDeg[i], 2); w.comma();
    w.fixed(c.errDeviationDeg[i], 2); w.comma();
    w.fixed(c.tiltDeg[i], 2); w.comma();
    w.uint(c.unreliable[i]); w.comma();
    w.uint(s.segment[i]); w.comma();
    angle180(w, s.trackDegTrue[i] - s.headingDegTrue[i], 2); w.comma();
    w.fixed(sigma ? sigma[i] : NaN, 2); w.comma();
    angle360(w, windFromDeg(s.windN[i], s.windE[i]), 1); w.comma();
    w.fixed(Math.hypot(s.windN[i], s.windE[i]) / KT_MS, 1);
    w.newline();
    if (w.nearlyFull()) yield w.take();
  }
  yield w.take();
}
