/**
 * Where the desktop window may go. Pure functions over URL strings, so the rules are unit-tested without Electron.
 * The window only ever shows the app's own origin (app://roundwise/…); vetted https links go to the system browser;
 * everything else (file://, http:, other hosts, javascript:, data:) is refused.
 */
import { electronConfig } from '../electron.config.ts';

export const APP_SCHEME = electronConfig.origin.scheme;
export const APP_HOST = electronConfig.origin.host;
/** The URL the window loads. */
export const APP_ENTRY_URL = `${APP_SCHEME}://${APP_HOST}/index.html`;

export interface LinkRule {
  readonly host: string;
  readonly pathPrefix: string;
}

function parse(url: string): URL | null {
  try {
    return new URL(url);
  } catch {
    return null;
  }
}

/**
 * True for a URL of the app's own origin. Compared by scheme and host: WHATWG URL gives custom schemes an
 * opaque origin ("null"), so comparing `origin` strings would accept any other custom-scheme URL too.
 */
export function isAppUrl(url: string | undefined | null): boolean {
  if (!url) return false;
  const u = parse(url);
  return u !== null && u.protocol === `${APP_SCHEME}:` && u.hostname === APP_HOST && u.username === '' && u.password === '' && u.port === '';
}

/** True for an https link on the vetted list (exact host, path prefix, no credentials, default port). */
export function isVettedExternal(url: string, rules: readonly LinkRule[] = electronConfig.externalLinks): boolean {
  const u = parse(url);
  if (!u || u.protocol !== 'https:' || u.username !== '' || u.password !== '' || u.port !== '') return false;
  return rules.some((r) => u.hostname === r.host && u.pathname.startsWith(r.pathPrefix));
}

export type NavigationDecision = 'stay' | 'external' | 'deny';

/**
 * What to do when the page tries to navigate (will-navigate, will-redirect, a link, window.open):
 * 'stay' lets an in-app navigation through (only for will-navigate within our origin; window.open never gets it),
 * 'external' cancels it and opens the vetted link in the system browser, 'deny' cancels it.
 */
export function navigationDecision(url: string, opts: { newWindow: boolean; rules?: readonly LinkRule[] } = { newWindow: false }): NavigationDecision {
  if (isAppUrl(url)) return opts.newWindow ? 'deny' : 'stay';
  if (isVettedExternal(url, opts.rules)) return 'external';
  return 'deny';
}

/**
 * Requests the window's session may make: only the app origin and in-page data (data:, blob: created by the page,
 * devtools when open). Anything reaching for the network (http, https, ws, ftp) or the file system is cancelled,
 * so nothing is fetched from the network at run time.
 */
export function isAllowedRequest(url: string): boolean {
  if (isAppUrl(url)) return true;
  const u = parse(url);
  if (!u) return false;
  if (u.protocol === 'data:' || u.protocol === 'devtools:') return true;
  if (u.protocol === 'blob:') return isAppUrl(url.slice('blob:'.length));
  return false;
}
