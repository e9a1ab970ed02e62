import { createHash, randomBytes } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { base64, cspScriptHash, sha256 } from '../../src/report/sha256.js';

const hex = (b: Uint8Array) => Buffer.from(b).toString('hex');
const utf8 = (s: string) => new TextEncoder().encode(s);

describe('sha256', () => {
  // Source: FIPS PUB 180-2, appendix B (SHA-256 examples) and NIST CSRC example values.
  it('matches the FIPS 180-2 examples', () => {
    expect(hex(sha256(utf8('abc')))).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
    expect(hex(sha256(utf8('abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq')))).toBe(
      '248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1',
    );
    expect(hex(sha256(new Uint8Array(0)))).toBe('e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855');
  });

  // Oracle: Node's OpenSSL-backed createHash('sha256'), every length around the 64-byte block and padding edges.
  it('agrees with node:crypto for every length from 0 to 300 bytes and for a 1 MB message', () => {
    for (let len = 0; len <= 300; len++) {
      const msg = randomBytes(len);
      expect(hex(sha256(msg))).toBe(createHash('sha256').update(msg).digest('hex'));
    }
    const big = randomBytes(1 << 20);
    expect(hex(sha256(big))).toBe(createHash('sha256').update(big).digest('hex'));
  });
});

describe('base64 and the CSP hash source', () => {
  // Oracle: Node's Buffer base64 encoder (RFC 4648 §4, padded).
  it('base64 agrees with Buffer for lengths 0 to 10 (all three padding cases)', () => {
    for (let len = 0; len <= 10; len++) {
      const b = randomBytes(len);
      expect(base64(b)).toBe(Buffer.from(b).toString('base64'));
    }
  });

  // Oracle: CSP Level 3 §2.3.1 hash-source = "'sha256-" base64(SHA-256(UTF-8 text)) "'", computed with node:crypto.
  it("cspScriptHash is 'sha256-<base64 digest of the UTF-8 text>', non-ASCII included", () => {
    const text = "console.log('Höhe 3° ±');";
    expect(cspScriptHash(text)).toBe(`'sha256-${createHash('sha256').update(text, 'utf8').digest('base64')}'`);
  });
});
