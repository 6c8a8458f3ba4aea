// Navigation and request rules. References: Electron security checklist items 13 "Disable or limit navigation",
// 14 "Disable or limit creation of new windows", 15 "Do not use shell.openExternal with untrusted content",
// 18 "Avoid usage of the file:// protocol"; WHATWG URL Standard §4 (origin of a non-special scheme is opaque).
import { describe, it, expect } from 'vitest';
import { APP_ENTRY_URL, isAllowedRequest, isAppUrl, isVettedExternal, navigationDecision } from '../../main/navigation.ts';

describe('app origin', () => {
  it('accepts our own scheme and host only', () => {
    expect(isAppUrl(APP_ENTRY_URL)).toBe(true);
    expect(isAppUrl('app://roundwise/assets/index-abc.js')).toBe(true);
    expect(isAppUrl('app://evil/index.html')).toBe(false);
    expect(isAppUrl('app://roundwise.evil.com/index.html')).toBe(false);
    expect(isAppUrl('app://user:pw@roundwise/index.html')).toBe(false);
    expect(isAppUrl('app://roundwise:8080/index.html')).toBe(false);
    expect(isAppUrl('file:///work/dist/renderer/index.html')).toBe(false);
    expect(isAppUrl('http://127.0.0.1:5178/')).toBe(false);
    expect(isAppUrl('not a url')).toBe(false);
    expect(isAppUrl(undefined)).toBe(false);
  });
  it('does not rely on URL.origin, which is "null" for every custom-scheme URL', () => {
    expect(new URL('app://evil/').origin).toBe(new URL(APP_ENTRY_URL).origin);
    expect(isAppUrl('app://evil/')).toBe(false);
  });
});

describe('external links', () => {
  it('opens only vetted https links', () => {
    expect(isVettedExternal('https://doi.org/10.1017/CBO9780511626982')).toBe(true);
    expect(isVettedExternal('http://doi.org/10.1017/x')).toBe(false);
    expect(isVettedExternal('https://doi.org.evil.com/x')).toBe(false);
    expect(isVettedExternal('https://evil.com/?u=https://doi.org/')).toBe(false);
    expect(isVettedExternal('https://user@doi.org/x')).toBe(false);
    expect(isVettedExternal('https://doi.org:8443/x')).toBe(false);
    expect(isVettedExternal('file:///etc/passwd')).toBe(false);
    expect(isVettedExternal('javascript:alert(1)')).toBe(false);
    expect(isVettedExternal('https://example.org/docs/a', [{ host: 'example.org', pathPrefix: '/docs/' }])).toBe(true);
    expect(isVettedExternal('https://example.org/other', [{ host: 'example.org', pathPrefix: '/docs/' }])).toBe(false);
  });
});

describe('navigationDecision', () => {
  it('stays inside the app, sends vetted links out, refuses the rest', () => {
    expect(navigationDecision('app://roundwise/index.html#/scenarios')).toBe('stay');
    expect(navigationDecision('https://doi.org/10.1017/x')).toBe('external');
    expect(navigationDecision('https://example.com/')).toBe('deny');
    expect(navigationDecision('file:///home/user/county.csv')).toBe('deny');
    expect(navigationDecision('data:text/html,<script>1</script>')).toBe('deny');
  });
  it('never opens a second app window', () => {
    expect(navigationDecision('app://roundwise/index.html', { newWindow: true })).toBe('deny');
    expect(navigationDecision('https://doi.org/10.1017/x', { newWindow: true })).toBe('external');
  });
});

describe('isAllowedRequest', () => {
  it('lets app files and in-page data through and cancels the network', () => {
    expect(isAllowedRequest('app://roundwise/assets/engine.worker.js')).toBe(true);
    expect(isAllowedRequest('data:image/png;base64,iVBORw0KGgo=')).toBe(true);
    expect(isAllowedRequest('blob:app://roundwise/1b2c')).toBe(true);
    expect(isAllowedRequest('devtools://devtools/bundled/inspector.html')).toBe(true);
    expect(isAllowedRequest('blob:https://evil.com/1b2c')).toBe(false);
    expect(isAllowedRequest('https://fonts.example.com/a.woff2')).toBe(false);
    expect(isAllowedRequest('http://127.0.0.1:5178/')).toBe(false);
    expect(isAllowedRequest('ws://127.0.0.1:5178/')).toBe(false);
    expect(isAllowedRequest('file:///etc/passwd')).toBe(false);
  });
});
