// The window's Content-Security-Policy. References: CSP Level 3 (W3C), directive names and 'none'/'self' keywords;
// Electron security checklist item 7 "Define a Content Security Policy".
import { describe, it, expect } from 'vitest';
import { contentSecurityPolicy, securityHeaders } from '../../main/csp.ts';

function directives(policy: string): Map<string, string[]> {
  return new Map(policy.split(';').map((d) => d.trim().split(/\s+/)).map(([k, ...v]) => [k ?? '', v]));
}

describe('Content-Security-Policy', () => {
  const d = directives(contentSecurityPolicy());
  it('denies by default and allows scripts and workers from the app only', () => {
    expect(d.get('default-src')).toEqual(["'none'"]);
    // Only our own scripts; WebAssembly compilation (CSP Level 3 'wasm-unsafe-eval') for the engine's kernel, no JS eval.
    expect(d.get('script-src')).toEqual(["'self'", "'wasm-unsafe-eval'"]);
    expect(d.get('worker-src')).toEqual(["'self'"]);
    expect(d.get('connect-src')).toEqual(["'self'"]);
  });
  it('never allows inline or evaluated scripts, remote hosts, plugins, frames or forms', () => {
    const all = [...d.values()].flat();
    expect(d.get('script-src')).not.toContain("'unsafe-inline'");
    expect(all).not.toContain("'unsafe-eval'");
    expect(all.some((s) => /^(https?:|wss?:|\*)/.test(s))).toBe(false);
    for (const k of ['object-src', 'frame-src', 'base-uri', 'form-action', 'frame-ancestors']) expect(d.get(k)).toEqual(["'none'"]);
  });
  it('is sent with the hardening headers', () => {
    const h = securityHeaders();
    expect(h['Content-Security-Policy']).toBe(contentSecurityPolicy());
    expect(h['X-Content-Type-Options']).toBe('nosniff');
  });
});
