// Number and time formats of the printed page (pilot units). Missing values print as an en dash.

const MISSING = '–';
const MINUS = '\u2212';

/** Fixed decimals with a true minus sign; '–' for NaN/∞. */
export function fmtNumber(x: number, decimals: number, unit = ''): string {
  if (!Number.isFinite(x)) return MISSING;
  const s = Math.abs(x).toFixed(decimals);
  const neg = x < 0 && Number(s) !== 0;
  return `${neg ? MINUS : ''}${s}${unit}`;
}

/** A whole count with comma grouping: 108000 → "108,000". */
export function fmtCount(n: number): string {
  if (!Number.isFinite(n)) return MISSING;
  return String(Math.round(n)).replace(/\B(?=(\d{3})+(?!\d))/g, ',');
}

/** A direction as pilots write it: three digits, whole degrees, [0, 360): 4.6 → "005°", 359.7 → "000°". */
export function fmtHeading(deg: number): string {
  if (!Number.isFinite(deg)) return MISSING;
  const r = ((Math.round(deg) % 360) + 360) % 360;
  return `${String(r).padStart(3, '0')}°`;
}

/** A signed angle with its sign always shown: +12.3°, −4.0°, 0.0°. */
export function fmtSignedDeg(deg: number, decimals = 1): string {
  if (!Number.isFinite(deg)) return MISSING;
  const s = fmtNumber(deg, decimals, '°');
  return deg > 0 && Number(Math.abs(deg).toFixed(decimals)) !== 0 ? `+${s}` : s;
}

/** UTC clock time hh:mm:ss from UTC seconds (ISO 8601 time of day, "Z" appended). */
export function fmtUtcTime(tUtc: number): string {
  if (!Number.isFinite(tUtc)) return MISSING;
  return `${new Date(Math.round(tUtc) * 1000).toISOString().slice(11, 19)}Z`;
}

/** UTC date and time "2026-05-04 10:11:12 UTC". */
export function fmtUtcDateTime(tUtc: number): string {
  if (!Number.isFinite(tUtc)) return MISSING;
  const iso = new Date(Math.round(tUtc) * 1000).toISOString();
  return `${iso.slice(0, 10)} ${iso.slice(11, 19)} UTC`;
}

/** A duration as h:mm:ss (or m:ss under an hour). */
export function fmtDuration(s: number): string {
  if (!Number.isFinite(s)) return MISSING;
  const total = Math.round(Math.abs(s));
  const h = Math.floor(total / 3600);
  const m = Math.floor((total % 3600) / 60);
  const sec = String(total % 60).padStart(2, '0');
  return h > 0 ? `${h}:${String(m).padStart(2, '0')}:${sec}` : `${m}:${sec}`;
}

/** Degrees and decimal minutes, hemisphere letters: 52.5 → "52°30.00′ N"; longitudes with 3 degree digits. */
export function fmtLatLon(latDeg: number, lonDeg: number): string {
  if (!Number.isFinite(latDeg) || !Number.isFinite(lonDeg)) return MISSING;
  return `${dm(latDeg, 2, 'N', 'S')} ${dm(lonDeg, 3, 'E', 'W')}`;
}

function dm(deg: number, degDigits: number, pos: string, neg: string): string {
  const a = Math.abs(deg);
  let d = Math.floor(a);
  let m = Number(((a - d) * 60).toFixed(2));
  if (m >= 60) {
    d += 1;
    m = 0;
  }
  return `${String(d).padStart(degDigits, '0')}°${m.toFixed(2).padStart(5, '0')}′ ${deg < 0 ? neg : pos}`;
}
