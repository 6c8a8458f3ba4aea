/**
 * The Content-Security-Policy of the desktop window, sent as a response header with every file of the app origin
 * (main/app-protocol.ts), so it holds even if a page's own <meta> policy were removed. Scripts, workers, fetches and
 * fonts only from the app itself; no plugins, frames, forms or <base> rewriting.
 * Scripts also allow 'wasm-unsafe-eval' (WebAssembly compilation only) for the engine's kernel.
 * Styles allow 'unsafe-inline' because Vue style bindings and chart.js set inline styles; scripts never do.
 */
export const CSP_DIRECTIVES: Readonly<Record<string, readonly string[]>> = {
  'default-src': ["'none'"],
  // 'wasm-unsafe-eval' lets the engine compile its own WebAssembly kernel (src/linalg/wasm-gemm.ts); it does not
  // allow eval or new Function for JavaScript (CSP Level 3).
  'script-src': ["'self'", "'wasm-unsafe-eval'"],
  'worker-src': ["'self'"],
  'style-src': ["'self'", "'unsafe-inline'"],
  'img-src': ["'self'", 'data:', 'blob:'],
  'font-src': ["'self'"],
  'connect-src': ["'self'"],
  'manifest-src': ["'self'"],
  'object-src': ["'none'"],
  'frame-src': ["'none'"],
  'child-src': ["'none'"],
  'base-uri': ["'none'"],
  'form-action': ["'none'"],
  'frame-ancestors': ["'none'"],
};

export function contentSecurityPolicy(directives: Readonly<Record<string, readonly string[]>> = CSP_DIRECTIVES): string {
  return Object.entries(directives).map(([k, v]) => `${k} ${v.join(' ')}`).join('; ');
}

/** Headers sent with every app file, besides its Content-Type. */
export function securityHeaders(): Record<string, string> {
  return {
    'Content-Security-Policy': contentSecurityPolicy(),
    'X-Content-Type-Options': 'nosniff',
    'Cross-Origin-Opener-Policy': 'same-origin',
    'Referrer-Policy': 'no-referrer',
  };
}
