// Test-side NMEA 0183 checksum: XOR of the characters between '$' and '*' (NMEA 0183 §5.2.1.3),
// written independently of src/import/nmeaSentence.ts and checked against published example sentences.

/** `$` + body + `*hh` with the checksum of body. */
export function withChecksum(body: string): string {
  let x = 0;
  for (const ch of body) x ^= ch.charCodeAt(0);
  return `$${body}*${x.toString(16).toUpperCase().padStart(2, '0')}`;
}
