/**
 * Stands in for the brotli decoder fontkit imports to read WOFF2 fonts (src/cli/bundle.mjs and the renderer's Vite
 * config alias it): the brief embeds TrueType files only, and the decoder is the largest module of both bundles.
 */
export default function brotliDecompress(): never {
  throw new Error('WOFF2 fonts are not supported: the brief embeds TrueType fonts');
}
