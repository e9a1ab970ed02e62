// NMEA 0183 sentence mechanics: checksum, talker and formatter, field splitting, angles and times.
//
// Source: NMEA 0183 Standard for Interfacing Marine Electronic Devices (v4.11), §5.2 sentence structure
// ("$" or "!", address field of talker identifier + sentence formatter, "," delimited data fields,
// "*hh" checksum) and §5.2.1.3 checksum: "the 8-bit Exclusive OR of all characters in the sentence,
// including ',' delimiters, between but not including the '$' or '!' and the '*' delimiters",
// written as two hexadecimal characters. [Section numbers from memory.]

/** Result of checking one line. */
export type SentenceCheck =
  | { ok: true; talker: string; formatter: string; fields: string[]; checksum: boolean }
  | { ok: false; reason: 'not-a-sentence' | 'bad-checksum' | 'no-checksum-field' };

/** XOR of the character codes of `s` from `start` to `end` (exclusive). */
export function nmeaXor(s: string, start: number, end: number): number {
  let x = 0;
  for (let i = start; i < end; i++) x ^= s.charCodeAt(i) & 0xff;
  return x;
}

/**
 * Checks and splits one NMEA 0183 sentence. Text before the first '$' or '!' on the line (a logger's
 * own timestamp, say) is ignored. A sentence with "*hh" must match its checksum; a sentence without one
 * is accepted with `checksum: false` (checksums were optional in early versions of the standard).
 * Any two-letter talker (GP, GN, GL, GA, GB, BD, II, HC, IN, ...) is accepted; proprietary `$P...`
 * sentences come back with talker 'P' and are usually ignored by the caller.
 */
export function checkSentence(line: string): SentenceCheck {
  let start = line.indexOf('$');
  const bang = line.indexOf('!');
  if (start < 0 || (bang >= 0 && bang < start)) start = bang;
  if (start < 0) return { ok: false, reason: 'not-a-sentence' };
  const star = line.indexOf('*', start);
  let end = line.length;
  let checksum = false;
  if (star >= 0) {
    const hex = line.slice(star + 1, star + 3);
    if (!/^[0-9A-Fa-f]{2}$/.test(hex)) return { ok: false, reason: 'bad-checksum' };
    if (parseInt(hex, 16) !== nmeaXor(line, start + 1, star)) return { ok: false, reason: 'bad-checksum' };
    end = star;
    checksum = true;
  }
  const body = line.slice(start + 1, end).trimEnd();
  const m = /^(P|[A-Z]{2})([A-Z0-9]{3,}),/.exec(body);
  if (!m) return { ok: false, reason: 'not-a-sentence' };
  return { ok: true, talker: m[1], formatter: m[2].slice(0, 3), fields: body.split(',').slice(1), checksum };
}

/** NMEA latitude `ddmm.mmmm` with N/S, or longitude `dddmm.mmmm` with E/W, to degrees; NaN if malformed. */
export function nmeaAngle(field: string, hemi: string, degDigits: 2 | 3): number {
  const m = /^(\d+)(\d{2}(?:\.\d*)?)$/.exec(field);
  if (!m || m[1].length > degDigits) return NaN;
  const deg = +m[1];
  const min = +m[2];
  if (min >= 60) return NaN;
  const v = deg + min / 60;
  if (hemi === 'N' || hemi === 'E') return v;
  if (hemi === 'S' || hemi === 'W') return -v;
  return NaN;
}

/** NMEA UTC time `hhmmss` or `hhmmss.sss` to seconds after midnight; NaN if malformed. */
export function nmeaTimeOfDay(field: string): number {
  const m = /^(\d{2})(\d{2})(\d{2}(?:\.\d*)?)$/.exec(field);
  if (!m) return NaN;
  const h = +m[1];
  const mi = +m[2];
  const s = +m[3];
  if (h > 23 || mi > 59 || s >= 61) return NaN;
  return h * 3600 + mi * 60 + s;
}

/** NMEA RMC date `ddmmyy` to 00:00 UTC of that day [s]; two-digit years 80-99 → 19YY, else 20YY. NaN if malformed. */
export function nmeaDate(field: string): number {
  const m = /^(\d{2})(\d{2})(\d{2})$/.exec(field);
  if (!m) return NaN;
  const d = +m[1];
  const mo = +m[2];
  const yy = +m[3];
  const y = yy >= 80 ? 1900 + yy : 2000 + yy;
  if (mo < 1 || mo > 12 || d < 1 || d > new Date(Date.UTC(y, mo, 0)).getUTCDate()) return NaN;
  return Date.UTC(y, mo - 1, d) / 1000;
}
