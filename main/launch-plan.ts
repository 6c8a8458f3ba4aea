/**
 * What `npm start` does, decided from a few facts about the machine. Pure, so every branch is unit-tested:
 * the desktop window when the Electron binary is there and a window can be shown; otherwise the same UI in browser
 * mode on 127.0.0.1, opened in a Chromium `--app` window when one is found and a window can be shown, else the URL.
 */
export interface LaunchFacts {
  /** The Electron binary exists (after at most one quiet install attempt). */
  electronBinary: boolean;
  /** Why the binary is missing, for the one-line message: 'install-failed', 'install-skipped' or 'not-installed'. */
  missingBecause?: 'install-failed' | 'install-skipped' | 'not-installed';
  platform: string;
  env: Readonly<Record<string, string | undefined>>;
  /** A Chromium-family browser for the `--app` window, or null. */
  browserPath: string | null;
}

export type LaunchAction =
  | { kind: 'desktop' }
  | { kind: 'browser'; reason: string; openWith: string | null };

export function isCI(env: LaunchFacts['env']): boolean {
  const ci = env.CI;
  return ci !== undefined && ci !== '' && ci !== '0' && ci.toLowerCase() !== 'false';
}

/** A graphical session: always on macOS and Windows; on Linux and BSDs only with an X11 or Wayland display. */
export function hasDisplay(platform: string, env: LaunchFacts['env']): boolean {
  if (platform === 'darwin' || platform === 'win32') return true;
  return Boolean(env.DISPLAY || env.WAYLAND_DISPLAY);
}

/** Try `node node_modules/electron/install.js` once, unless the binary is there or the user asked not to. */
export function shouldTryInstall(electronBinary: boolean, env: LaunchFacts['env']): boolean {
  if (electronBinary) return false;
  const skip = env.ELECTRON_SKIP_BINARY_DOWNLOAD;
  return !(skip !== undefined && skip !== '' && skip !== '0');
}

const MISSING: Record<NonNullable<LaunchFacts['missingBecause']>, string> = {
  'install-failed': 'the Electron binary is not installed and could not be downloaded',
  'install-skipped': 'the Electron binary is not installed and ELECTRON_SKIP_BINARY_DOWNLOAD is set',
  'not-installed': 'the Electron binary is not installed',
};

export function planLaunch(f: LaunchFacts): LaunchAction {
  const ci = isCI(f.env);
  const display = hasDisplay(f.platform, f.env);
  const forcedBrowser = f.env.ROUNDWISE_MODE === 'browser';
  const windowOk = !ci && display;
  if (f.electronBinary && windowOk && !forcedBrowser) return { kind: 'desktop' };
  let reason: string;
  if (forcedBrowser) reason = 'ROUNDWISE_MODE=browser is set';
  else if (!f.electronBinary) reason = MISSING[f.missingBecause ?? 'not-installed'];
  else if (ci) reason = 'CI is set, so no window is opened';
  else reason = 'there is no display to open a window on';
  return { kind: 'browser', reason, openWith: windowOk ? f.browserPath : null };
}

/** The one line `npm start` prints in browser mode. */
export function browserModeLine(action: Extract<LaunchAction, { kind: 'browser' }>, url: string): string {
  const where = action.openWith ? `opening ${url} in an app window` : `open ${url} in a browser`;
  return `Roundwise: desktop window not available (${action.reason}); browser mode: ${where}.`;
}

/** The first executable among `candidates` (absolute paths, or names searched on PATH). */
export function findBrowser(candidates: readonly string[], pathVar: string, exists: (p: string) => boolean, sepChar = ':'): string | null {
  for (const c of candidates) {
    if (c.startsWith('/')) {
      if (exists(c)) return c;
      continue;
    }
    for (const dir of pathVar.split(sepChar)) {
      if (!dir) continue;
      const p = `${dir.replace(/\/$/, '')}/${c}`;
      if (exists(p)) return p;
    }
  }
  return null;
}

export const BROWSER_CANDIDATES = ['/usr/bin/chromium', 'chromium', 'chromium-browser', 'google-chrome', 'google-chrome-stable'] as const;
