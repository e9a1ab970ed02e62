// GPX 1.1 text from a FlightLog: one track, track points with elevation and UTC time to the millisecond.
import type { FlightLog } from '../log/flightLog.js';

/** Options of writeGpx. splitAtGapS: start a new trkseg where consecutive times differ by more (default: never). */
export interface GpxWriteOptions {
  creator?: string;
  splitAtGapS?: number;
}

/**
 * Escapes text for XML 1.0 character data and attribute values (W3C XML 1.0 §2.4, §2.2): & < > " ' become
 * entity references, and characters XML 1.0 does not allow (C0 controls other than tab, LF, CR; lone
 * surrogates; U+FFFE, U+FFFF) are dropped.
 */
export function escapeXml(text: string): string {
  return text
    .replace(/[^\t\n\r\u0020-\uD7FF\uE000-\uFFFD\u{10000}-\u{10FFFF}]/gu, '')
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&apos;');
}

/** UTC seconds → ISO 8601 with milliseconds, rounded to the nearest ms (Date would truncate 0.0999999 s to 099). */
export function isoUtcMs(t: number): string {
  return new Date(Math.round(t * 1000)).toISOString();
}

/**
 * Writes a FlightLog as GPX 1.1 (Topografix schema http://www.topografix.com/GPX/1/1): metadata (name,
 * desc = meta.comment, author = meta.pilot, time of the first fix), one trk (name, desc naming the aircraft,
 * src = meta.device) with trkseg/trkpt lat, lon (7 decimals, ~1 cm), ele (2 decimals, m) and time.
 * Rows without a finite lat/lon are left out; a NaN ele or time is omitted from its point. Pure.
 */
export function writeGpx(log: FlightLog, opts: GpxWriteOptions = {}): string {
  const meta = log.source.meta;
  const creator = opts.creator ?? 'compass-debrief synth';
  const gap = opts.splitAtGapS ?? Infinity;
  const out: string[] = [];
  out.push('<?xml version="1.0" encoding="UTF-8"?>');
  out.push(
    `<gpx version="1.1" creator="${escapeXml(creator)}" xmlns="http://www.topografix.com/GPX/1/1"` +
      ' xmlns:xsi="http://www.w3.org/2001/XMLSchema-instance"' +
      ' xsi:schemaLocation="http://www.topografix.com/GPX/1/1 http://www.topografix.com/GPX/1/1/gpx.xsd">',
  );
  out.push('  <metadata>');
  if (meta.name !== undefined) out.push(`    <name>${escapeXml(meta.name)}</name>`);
  if (meta.comment !== undefined) out.push(`    <desc>${escapeXml(meta.comment)}</desc>`);
  if (meta.pilot !== undefined) out.push(`    <author><name>${escapeXml(meta.pilot)}</name></author>`);
  const firstT = log.t.find((t) => Number.isFinite(t));
  if (firstT !== undefined) out.push(`    <time>${isoUtcMs(firstT)}</time>`);
  out.push('  </metadata>');
  out.push('  <trk>');
  if (meta.name !== undefined) out.push(`    <name>${escapeXml(meta.name)}</name>`);
  if (meta.aircraft !== undefined) out.push(`    <desc>Aircraft: ${escapeXml(meta.aircraft)}</desc>`);
  if (meta.device !== undefined) out.push(`    <src>${escapeXml(meta.device)}</src>`);
  out.push('    <trkseg>');
  let prevT = NaN;
  for (let i = 0; i < log.t.length; i++) {
    const lat = log.lat[i];
    const lon = log.lon[i];
    if (!Number.isFinite(lat) || !Number.isFinite(lon)) continue;
    const t = log.t[i];
    if (Number.isFinite(prevT) && Number.isFinite(t) && t - prevT > gap) out.push('    </trkseg>', '    <trkseg>');
    if (Number.isFinite(t)) prevT = t;
    let pt = `      <trkpt lat="${lat.toFixed(7)}" lon="${lon.toFixed(7)}">`;
    if (Number.isFinite(log.altM[i])) pt += `<ele>${log.altM[i].toFixed(2)}</ele>`;
    if (Number.isFinite(t)) pt += `<time>${isoUtcMs(t)}</time>`;
    out.push(`${pt}</trkpt>`);
  }
  out.push('    </trkseg>');
  out.push('  </trk>');
  out.push('</gpx>');
  return `${out.join('\n')}\n`;
}
