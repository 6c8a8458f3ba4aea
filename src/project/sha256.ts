/**
 * SHA-256 (NIST FIPS 180-4) in plain TypeScript, synchronous, so the engine can fingerprint a source table in the
 * browser, the worker and the CLI alike without Node's crypto or the asynchronous Web Crypto API.
 */
const K = new Int32Array([
  0x428a2f98, 0x71374491, 0xb5c0fbcf, 0xe9b5dba5, 0x3956c25b, 0x59f111f1, 0x923f82a4, 0xab1c5ed5,
  0xd807aa98, 0x12835b01, 0x243185be, 0x550c7dc3, 0x72be5d74, 0x80deb1fe, 0x9bdc06a7, 0xc19bf174,
  0xe49b69c1, 0xefbe4786, 0x0fc19dc6, 0x240ca1cc, 0x2de92c6f, 0x4a7484aa, 0x5cb0a9dc, 0x76f988da,
  0x983e5152, 0xa831c66d, 0xb00327c8, 0xbf597fc7, 0xc6e00bf3, 0xd5a79147, 0x06ca6351, 0x14292967,
  0x27b70a85, 0x2e1b2138, 0x4d2c6dfc, 0x53380d13, 0x650a7354, 0x766a0abb, 0x81c2c92e, 0x92722c85,
  0xa2bfe8a1, 0xa81a664b, 0xc24b8b70, 0xc76c51a3, 0xd192e819, 0xd6990624, 0xf40e3585, 0x106aa070,
  0x19a4c116, 0x1e376c08, 0x2748774c, 0x34b0bcb5, 0x391c0cb3, 0x4ed8aa4a, 0x5b9cca4f, 0x682e6ff3,
  0x748f82ee, 0x78a5636f, 0x84c87814, 0x8cc70208, 0x90befffa, 0xa4506ceb, 0xbef9a3f7, 0xc67178f2,
]);

/**
 * The platform's SHA-256, when a front end supplies one: the CLI passes Node's crypto, which hashes a 20 MB table
 * several times faster than the code below (test/bench). It must compute exactly this function; the CLI's is checked
 * against the portable code by test/src/cli/outputs.test.ts.
 */
let platform: ((data: Uint8Array) => string) | null = null;

/** Use `impl` for `sha256Hex` until called again with null (a front end sets it for one run and clears it after). */
export function usePlatformSha256(impl: ((data: Uint8Array) => string) | null): void {
  platform = impl;
}

/** Hex SHA-256 of the bytes: the platform's when one was supplied, otherwise `sha256HexPortable`. */
export function sha256Hex(data: Uint8Array): string {
  return platform !== null ? platform(data) : sha256HexPortable(data);
}

/**
 * Hex SHA-256 of the bytes in plain TypeScript. The message is read in place (only the last one or two blocks, with the padding, are
 * copied), in 32-bit integer arithmetic throughout, so a 20 MB table hashes in a fraction of the time a padded copy
 * and DataView reads took (test/bench), and without a second copy of the file in memory.
 */
export function sha256HexPortable(data: Uint8Array): string {
  const H = Int32Array.of(0x6a09e667, 0xbb67ae85, 0x3c6ef372, 0xa54ff53a, 0x510e527f, 0x9b05688c, 0x1f83d9ab, 0x5be0cd19);
  const W = new Int32Array(64);
  const len = data.length;
  const full = len - (len % 64);
  compress(H, W, data, 0, full);
  // The last partial block, the 0x80 byte and the 64-bit big-endian length in bits: one or two more blocks.
  const tail = new Uint8Array(len % 64 < 56 ? 64 : 128);
  tail.set(data.subarray(full));
  tail[len - full] = 0x80;
  const hi = Math.floor(len / 0x20000000); // bits = 8·len; its high 32 bits
  const lo = (len << 3) >>> 0;
  const t = tail.length;
  tail[t - 8] = hi >>> 24; tail[t - 7] = (hi >>> 16) & 255; tail[t - 6] = (hi >>> 8) & 255; tail[t - 5] = hi & 255;
  tail[t - 4] = lo >>> 24; tail[t - 3] = (lo >>> 16) & 255; tail[t - 2] = (lo >>> 8) & 255; tail[t - 1] = lo & 255;
  compress(H, W, tail, 0, t);
  let out = '';
  for (let k = 0; k < 8; k++) out += (H[k]! >>> 0).toString(16).padStart(8, '0');
  return out;
}

/** The SHA-256 compression function over the 64-byte blocks d[from, to). */
function compress(H: Int32Array, W: Int32Array, d: Uint8Array, from: number, to: number): void {
  let h0 = H[0]!, h1 = H[1]!, h2 = H[2]!, h3 = H[3]!, h4 = H[4]!, h5 = H[5]!, h6 = H[6]!, h7 = H[7]!;
  for (let off = from; off < to; off += 64) {
    for (let t = 0; t < 16; t++) {
      const q = off + 4 * t;
      W[t] = (d[q]! << 24) | (d[q + 1]! << 16) | (d[q + 2]! << 8) | d[q + 3]!;
    }
    for (let t = 16; t < 64; t++) {
      const w15 = W[t - 15]!;
      const w2 = W[t - 2]!;
      const s0 = ((w15 >>> 7) | (w15 << 25)) ^ ((w15 >>> 18) | (w15 << 14)) ^ (w15 >>> 3);
      const s1 = ((w2 >>> 17) | (w2 << 15)) ^ ((w2 >>> 19) | (w2 << 13)) ^ (w2 >>> 10);
      W[t] = (W[t - 16]! + s0 + W[t - 7]! + s1) | 0;
    }
    let a = h0, b = h1, c = h2, e = h4, f = h5, g = h6, h = h7, dd = h3;
    for (let t = 0; t < 64; t++) {
      const S1 = ((e >>> 6) | (e << 26)) ^ ((e >>> 11) | (e << 21)) ^ ((e >>> 25) | (e << 7));
      const ch = (e & f) ^ (~e & g);
      const T1 = (h + S1 + ch + K[t]! + W[t]!) | 0;
      const S0 = ((a >>> 2) | (a << 30)) ^ ((a >>> 13) | (a << 19)) ^ ((a >>> 22) | (a << 10));
      const maj = (a & b) ^ (a & c) ^ (b & c);
      const T2 = (S0 + maj) | 0;
      h = g; g = f; f = e; e = (dd + T1) | 0; dd = c; c = b; b = a; a = (T1 + T2) | 0;
    }
    h0 = (h0 + a) | 0; h1 = (h1 + b) | 0; h2 = (h2 + c) | 0; h3 = (h3 + dd) | 0;
    h4 = (h4 + e) | 0; h5 = (h5 + f) | 0; h6 = (h6 + g) | 0; h7 = (h7 + h) | 0;
  }
  H[0] = h0; H[1] = h1; H[2] = h2; H[3] = h3; H[4] = h4; H[5] = h5; H[6] = h6; H[7] = h7;
}

const encoder = typeof TextEncoder === 'function' ? new TextEncoder() : null;

/** UTF-8 bytes of a string (lone surrogates become U+FFFD): TextEncoder where the runtime has it (every one we run on). */
export function utf8Bytes(s: string): Uint8Array {
  if (encoder) return encoder.encode(s);
  return utf8BytesByHand(s);
}

/** The same encoding written out (WHATWG Encoding Standard, UTF-8 encoder), for a runtime without TextEncoder. */
export function utf8BytesByHand(s: string): Uint8Array {
  const out: number[] = [];
  for (let i = 0; i < s.length; i++) {
    let cp = s.charCodeAt(i);
    if (cp >= 0xd800 && cp <= 0xdbff && i + 1 < s.length) {
      const lo = s.charCodeAt(i + 1);
      if (lo >= 0xdc00 && lo <= 0xdfff) { cp = 0x10000 + ((cp - 0xd800) << 10) + (lo - 0xdc00); i++; } else cp = 0xfffd;
    } else if (cp >= 0xd800 && cp <= 0xdfff) cp = 0xfffd;
    if (cp < 0x80) out.push(cp);
    else if (cp < 0x800) out.push(0xc0 | (cp >> 6), 0x80 | (cp & 63));
    else if (cp < 0x10000) out.push(0xe0 | (cp >> 12), 0x80 | ((cp >> 6) & 63), 0x80 | (cp & 63));
    else out.push(0xf0 | (cp >> 18), 0x80 | ((cp >> 12) & 63), 0x80 | ((cp >> 6) & 63), 0x80 | (cp & 63));
  }
  return Uint8Array.from(out);
}
