/**
 * Files the importer can read from their bytes without decoding them (index.ts `importTableBytes`): plain ASCII
 * (no byte above 0x7F, so each byte is one character of the UTF-8 text and byte offsets are character offsets),
 * without quotes (so records are lines and fields the text between delimiters: grid.ts ByteGrid), without NUL (the
 * text path refuses those with a located message), with line feeds (a file of lone CRs is split by other rules).
 */
import { SAMPLE_CHARS } from './dialect.ts';
import { SAMPLE as BINARY_SAMPLE_CHARS } from './text.ts';

/** The bytes of a plain file, and its whole text when a message needs it (decoded then). */
export interface PlainBytes {
  bytes: Uint8Array;
  text: () => string;
}

/** The most characters the dialect rules read from the start of a file (openTableText, bar its search for numbers). */
const HEAD_CHARS = Math.max(SAMPLE_CHARS, BINARY_SAMPLE_CHARS);

const utf8 = new TextDecoder('utf-8');

/**
 * Plain (module comment): no byte above 0x7F, no quote (0x22), no NUL, and a line feed somewhere. One pass, four
 * bytes at a time where they are aligned (a zero byte in a word w is found by (w − 0x01010101) & ~w & 0x80808080,
 * the usual test; a quote as a zero byte of w ^ 0x22222222).
 */
function plain(bytes: Uint8Array): boolean {
  const n = bytes.length;
  let lf = false;
  const byte = (c: number): boolean => {
    if (c === 10) lf = true;
    return c > 0x7f || c === 34 || c === 0;
  };
  let k = 0;
  for (; k < n && ((bytes.byteOffset + k) & 3) !== 0; k++) if (byte(bytes[k]!)) return false;
  const words = new Uint32Array(bytes.buffer, bytes.byteOffset + k, (n - k) >> 2);
  for (let i = 0; i < words.length; i++) {
    const w = words[i]!;
    const q = w ^ 0x22222222;
    const l = w ^ 0x0a0a0a0a;
    if (((w | ((w - 0x01010101) & ~w) | ((q - 0x01010101) & ~q)) & 0x80808080) !== 0) return false;
    if (!lf && ((l - 0x01010101) & ~l & 0x80808080) !== 0) lf = true;
  }
  for (k += words.length << 2; k < n; k++) if (byte(bytes[k]!)) return false;
  return lf;
}

/**
 * The text of the file's head — its first HEAD_CHARS characters and the rest of the line they end in, or the whole
 * file — when the file is plain (above) and the head holds more than white space (the text path's "empty" test reads
 * the whole file); otherwise null.
 */
export function plainHead(bytes: Uint8Array): string | null {
  if (!plain(bytes)) return null;
  let lf = -1;
  for (let p = HEAD_CHARS; p < bytes.length; p++) if (bytes[p] === 10) { lf = p; break; }
  const head = utf8.decode(lf < 0 ? bytes : bytes.subarray(0, lf + 1));
  return /\S/.test(head) ? head : null;
}
