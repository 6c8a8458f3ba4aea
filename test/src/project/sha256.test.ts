import { describe, it, expect } from 'vitest';
import { createHash } from 'node:crypto';
import fc from 'fast-check';
import { sha256Hex, sha256HexPortable, usePlatformSha256, utf8Bytes, utf8BytesByHand } from '../../../src/project/sha256.ts';

const ascii = (s: string) => Uint8Array.from(s, (c) => c.charCodeAt(0));

describe('SHA-256', () => {
  it('matches the NIST FIPS 180-4 example messages', () => {
    // Example digests published with FIPS 180-4 (NIST CSRC "Examples with intermediate values", SHA-256).
    expect(sha256HexPortable(ascii('abc'))).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
    expect(sha256HexPortable(ascii('abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq'))).toBe('248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1');
    expect(sha256HexPortable(new Uint8Array(0))).toBe('e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855');
  });
  it('agrees with Node’s crypto on random inputs across block boundaries', () => {
    fc.assert(fc.property(fc.uint8Array({ minLength: 0, maxLength: 300 }), (bytes) => {
      expect(sha256HexPortable(bytes)).toBe(createHash('sha256').update(bytes).digest('hex'));
    }), { numRuns: 300 });
  });
  it('agrees with Node’s crypto on a message of many blocks (bytes with the top bit set included)', () => {
    const big = new Uint8Array(1_000_003);
    for (let k = 0; k < big.length; k++) big[k] = (k * 2654435761) >>> 24;
    expect(sha256HexPortable(big)).toBe(createHash('sha256').update(big).digest('hex'));
  });
  it('sha256Hex uses a platform implementation while one is set, and the portable code after', () => {
    const bytes = ascii('abc');
    usePlatformSha256(() => 'from the platform');
    try {
      expect(sha256Hex(bytes)).toBe('from the platform');
    } finally {
      usePlatformSha256(null);
    }
    expect(sha256Hex(bytes)).toBe(sha256HexPortable(bytes));
  });
  it('UTF-8 encoding agrees with TextEncoder, by hand too', () => {
    fc.assert(fc.property(fc.string({ unit: 'binary' }), (s) => {
      const want = Array.from(new TextEncoder().encode(s));
      expect(Array.from(utf8Bytes(s))).toEqual(want);
      expect(Array.from(utf8BytesByHand(s))).toEqual(want);
    }), { numRuns: 300 });
    expect(Array.from(utf8Bytes('\ud800x'))).toEqual(Array.from(new TextEncoder().encode('\ud800x')));
    expect(Array.from(utf8BytesByHand('\ud800x'))).toEqual(Array.from(new TextEncoder().encode('\ud800x')));
  });
});
