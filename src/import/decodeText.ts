// Bytes of a text log to a string: UTF-8 (BOM dropped) or UTF-16 when a byte-order mark says so.

/**
 * Decodes a text file's bytes. A UTF-16 byte-order mark (FF FE little-endian, FE FF big-endian,
 * Unicode Standard §23.8) selects UTF-16; otherwise UTF-8, with invalid sequences replaced by U+FFFD.
 */
export function decodeText(bytes: Uint8Array): string {
  if (bytes.length >= 2 && bytes[0] === 0xff && bytes[1] === 0xfe) return new TextDecoder('utf-16le').decode(bytes.subarray(2));
  if (bytes.length >= 2 && bytes[0] === 0xfe && bytes[1] === 0xff) return new TextDecoder('utf-16be').decode(bytes.subarray(2));
  const text = new TextDecoder('utf-8').decode(bytes);
  return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
}

/** Whether the bytes start with a UTF-16 byte-order mark. */
export function hasUtf16Bom(bytes: Uint8Array): boolean {
  return bytes.length >= 2 && ((bytes[0] === 0xff && bytes[1] === 0xfe) || (bytes[0] === 0xfe && bytes[1] === 0xff));
}
