// Walking the message structure of a FIT file without decoding it: how far its complete messages reach.
//
// Source: Garmin FIT SDK, "FIT Protocol" (Flexible and Interoperable Data Transfer), §3.3 file structure:
// file header (byte 0 header size 12 or 14, bytes 4-7 data size little-endian, bytes 8-11 ".FIT"),
// data records, 2-byte CRC; §4.1 record header: bit 7 = 0 normal header (bit 6 definition message,
// bit 5 developer data flag, bits 0-3 local message type), bit 7 = 1 compressed timestamp header (bits 5-6
// local message type); §4.2 definition message: reserved, architecture, global message number (2 bytes),
// number of fields, 3 bytes per field (number, size, base type), then with the developer flag a count and
// 3 bytes per developer field. A data message is its header plus the sizes its definition lists.

/** What the structure walk found. */
export interface FitExtent {
  headerSize: number;
  /** Data size the header declares [bytes]. */
  declaredDataSize: number;
  /** Bytes of data up to the end of the last complete message [bytes]. */
  completeDataSize: number;
  /** Number of complete messages (definition and data). */
  messages: number;
  /** Whether the walk stopped at a malformed message or at bytes that end mid-message. */
  stoppedEarly: boolean;
}

/**
 * Walks the records of a FIT file from its header to the end of its declared data or of the bytes
 * available, whichever comes first, and reports the end of the last complete message.
 * Returns undefined when the bytes do not start with a FIT file header.
 */
export function fitExtent(bytes: Uint8Array): FitExtent | undefined {
  if (bytes.length < 12) return undefined;
  const headerSize = bytes[0];
  if ((headerSize !== 12 && headerSize !== 14) || bytes.length < headerSize) return undefined;
  if (bytes[8] !== 0x2e || bytes[9] !== 0x46 || bytes[10] !== 0x49 || bytes[11] !== 0x54) return undefined;
  const declaredDataSize = (bytes[4] | (bytes[5] << 8) | (bytes[6] << 16) | (bytes[7] << 24)) >>> 0;
  const end = Math.min(bytes.length, headerSize + declaredDataSize);
  const sizes = new Int32Array(16).fill(-1); // data message size per local message type, -1 = undefined
  let p = headerSize;
  let messages = 0;
  let stoppedEarly = false;
  while (p < end) {
    const h = bytes[p];
    if ((h & 0x80) !== 0) {
      const size = sizes[(h >> 5) & 0x03];
      if (size < 0 || p + 1 + size > end) {
        stoppedEarly = true;
        break;
      }
      p += 1 + size;
    } else if ((h & 0x40) !== 0) {
      if (p + 6 > end) {
        stoppedEarly = true;
        break;
      }
      const nFields = bytes[p + 5];
      let q = p + 6 + 3 * nFields;
      let size = 0;
      for (let k = 0; k < nFields && p + 6 + 3 * k + 1 < end; k++) size += bytes[p + 6 + 3 * k + 1];
      if ((h & 0x20) !== 0) {
        if (q + 1 > end) {
          stoppedEarly = true;
          break;
        }
        const nDev = bytes[q];
        for (let k = 0; k < nDev && q + 1 + 3 * k + 1 < end; k++) size += bytes[q + 1 + 3 * k + 1];
        q += 1 + 3 * nDev;
      }
      if (q > end) {
        stoppedEarly = true;
        break;
      }
      sizes[h & 0x0f] = size;
      p = q;
    } else {
      const size = sizes[h & 0x0f];
      if (size < 0 || p + 1 + size > end) {
        stoppedEarly = true;
        break;
      }
      p += 1 + size;
    }
    messages++;
  }
  return { headerSize, declaredDataSize, completeDataSize: p - headerSize, messages, stoppedEarly };
}
