// The app:// file server. References: Electron security checklist item 18 "Avoid usage of the file:// protocol and
// prefer usage of custom protocols"; RFC 3986 §5.2.4 (dot-segment removal) for the traversal cases.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { mkdtempSync, mkdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, relative, sep } from 'node:path';
import fc from 'fast-check';
import { createAppHandler, mimeType, resolveAppFile } from '../../main/app-protocol.ts';
import { contentSecurityPolicy } from '../../main/csp.ts';

let outer: string;
let root: string;
beforeAll(() => {
  outer = mkdtempSync(join(tmpdir(), 'roundwise-proto-'));
  root = join(outer, 'renderer');
  mkdirSync(join(root, 'assets'), { recursive: true });
  writeFileSync(join(root, 'index.html'), '<!doctype html><title>Roundwise</title>');
  writeFileSync(join(root, 'assets', 'app.js'), 'export {}');
  writeFileSync(join(outer, 'secret.txt'), 'outside');
});
afterAll(() => rmSync(outer, { recursive: true, force: true }));

describe('resolveAppFile', () => {
  it('maps app URLs into the renderer folder', () => {
    expect(resolveAppFile(root, 'app://roundwise/')).toBe(join(root, 'index.html'));
    expect(resolveAppFile(root, 'app://roundwise/assets/app.js?v=1#x')).toBe(join(root, 'assets', 'app.js'));
  });
  it('never leaves the renderer folder or serves another host', () => {
    expect(resolveAppFile(root, 'app://roundwise/../secret.txt')).toBe(join(root, 'secret.txt')); // URL parsing removes the dot segment
    expect(resolveAppFile(root, 'app://roundwise/%2e%2e/secret.txt')).toBe(join(root, 'secret.txt')); // so does %2e%2e
    expect(resolveAppFile(root, 'app://roundwise/assets/%2e%2e%2f%2e%2e%2fsecret.txt')).toBeNull();
    expect(resolveAppFile(root, 'app://roundwise/a%00.js')).toBeNull();
    expect(resolveAppFile(root, 'app://roundwise/%E0%A4%A')).toBeNull();
    expect(resolveAppFile(root, 'app://other/index.html')).toBeNull();
    expect(resolveAppFile(root, 'file:///etc/passwd')).toBeNull();
  });
  it('resolves no URL path at all outside the folder (property, fast-check)', () => {
    const segment = fc.constantFrom('..', '.', '%2e%2e', '%2e', '%2f', '%5c', 'assets', 'a b', '%00', '..%2f', '%252e', '\\', '');
    fc.assert(fc.property(fc.array(segment, { maxLength: 8 }), (parts) => {
      const file = resolveAppFile(root, `app://roundwise/${parts.join('/')}`);
      if (file !== null) expect(relative(root, file).split(sep)[0]).not.toBe('..');
    }), { numRuns: 3000 });
  });
  it('knows the types it serves', () => {
    expect(mimeType('a.js')).toMatch(/^text\/javascript/);
    expect(mimeType('a.unknown')).toBe('application/octet-stream');
  });
});

describe('app protocol handler', () => {
  const handler = () => createAppHandler(root);
  it('serves files with the CSP header', async () => {
    const r = await handler()(new Request('app://roundwise/index.html'));
    expect(r.status).toBe(200);
    expect(r.headers.get('content-type')).toMatch(/^text\/html/);
    expect(r.headers.get('content-security-policy')).toBe(contentSecurityPolicy());
    expect(await r.text()).toContain('Roundwise');
  });
  it('answers 404 (still with the CSP) outside the folder and for missing files, 405 for writes', async () => {
    const out = await handler()(new Request('app://roundwise/%2e%2e/secret.txt'));
    expect(out.status).toBe(404);
    expect(out.headers.get('content-security-policy')).toBe(contentSecurityPolicy());
    expect((await handler()(new Request('app://roundwise/assets'))).status).toBe(404);
    expect((await handler()(new Request('app://roundwise/nope.js'))).status).toBe(404);
    expect((await handler()(new Request('app://roundwise/index.html', { method: 'POST', body: 'x' }))).status).toBe(405);
  });
});
