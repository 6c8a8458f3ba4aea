/**
 * Serves the built UI (dist/renderer) under app://roundwise/ — Electron's recommended alternative to file://
 * (security checklist: "use a custom protocol"). Only files inside the renderer folder are served, each with the
 * CSP and hardening headers; anything else is a 404. Uses the web Request/Response types only, so test/main
 * calls the handler directly in Node.
 */
import { readFile, stat } from 'node:fs/promises';
import { extname, join, normalize, relative, isAbsolute, sep } from 'node:path';
import { APP_HOST, APP_SCHEME } from './navigation.ts';
import { securityHeaders } from './csp.ts';

const MIME: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.csv': 'text/csv; charset=utf-8',
  '.txt': 'text/plain; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.ico': 'image/x-icon',
  '.woff2': 'font/woff2',
  '.woff': 'font/woff',
  '.wasm': 'application/wasm',
  '.map': 'application/json; charset=utf-8',
};

/** The file under `root` that an app:// URL names, or null for anything outside it or not ours. */
export function resolveAppFile(root: string, url: string): string | null {
  let u: URL;
  try {
    u = new URL(url);
  } catch {
    return null;
  }
  if (u.protocol !== `${APP_SCHEME}:` || u.hostname !== APP_HOST) return null;
  let rel: string;
  try {
    rel = decodeURIComponent(u.pathname);
  } catch {
    return null;
  }
  if (rel.includes('\0')) return null;
  if (rel === '/' || rel === '') rel = '/index.html';
  const file = normalize(join(root, rel));
  const inside = relative(root, file);
  if (inside === '' || inside.startsWith(`..${sep}`) || inside === '..' || isAbsolute(inside)) return null;
  return file;
}

export function mimeType(file: string): string {
  return MIME[extname(file).toLowerCase()] ?? 'application/octet-stream';
}

/** The protocol handler: GET only, files inside `root` only, always with the security headers. */
export function createAppHandler(root: string) {
  return async (request: Request): Promise<Response> => {
    const headers = securityHeaders();
    if (request.method !== 'GET' && request.method !== 'HEAD') return new Response('method not allowed', { status: 405, headers });
    const file = resolveAppFile(root, request.url);
    if (!file) return new Response('not found', { status: 404, headers });
    try {
      if (!(await stat(file)).isFile()) return new Response('not found', { status: 404, headers });
      const body = await readFile(file);
      return new Response(request.method === 'HEAD' ? null : new Uint8Array(body), { status: 200, headers: { ...headers, 'Content-Type': mimeType(file) } });
    } catch {
      return new Response('not found', { status: 404, headers });
    }
  };
}
