// `npm start` decision table (the project's own rule, DEVELOPERS.md "Desktop shell": desktop window when the Electron
// binary is there; otherwise one line and browser mode on 127.0.0.1, in a Chromium --app window when one is found,
// never a window under CI or without a display).
import { describe, it, expect } from 'vitest';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { browserModeLine, findBrowser, hasDisplay, isCI, planLaunch, shouldTryInstall, type LaunchFacts } from '../../main/launch-plan.ts';
import { electronBinaryPath, tryInstallElectron } from '../../main/launch.ts';

const facts = (over: Partial<LaunchFacts>): LaunchFacts => ({
  electronBinary: false, platform: 'linux', env: { DISPLAY: ':0' }, browserPath: '/usr/bin/chromium', ...over,
});

describe('planLaunch', () => {
  it('runs the desktop app when the binary is present and a window can be shown', () => {
    expect(planLaunch(facts({ electronBinary: true }))).toEqual({ kind: 'desktop' });
    expect(planLaunch(facts({ electronBinary: true, platform: 'darwin', env: {} }))).toEqual({ kind: 'desktop' });
    expect(planLaunch(facts({ electronBinary: true, env: { WAYLAND_DISPLAY: 'wayland-0' } }))).toEqual({ kind: 'desktop' });
  });

  it('falls back to browser mode in an app window when the binary is missing', () => {
    expect(planLaunch(facts({ missingBecause: 'install-failed' }))).toEqual({
      kind: 'browser', reason: 'the Electron binary is not installed and could not be downloaded', openWith: '/usr/bin/chromium',
    });
  });

  it('only prints the URL without a browser, without a display, or under CI', () => {
    expect(planLaunch(facts({ browserPath: null }))).toMatchObject({ kind: 'browser', openWith: null });
    expect(planLaunch(facts({ env: {} }))).toMatchObject({ kind: 'browser', openWith: null });
    expect(planLaunch(facts({ env: { DISPLAY: ':0', CI: 'true' } }))).toMatchObject({ kind: 'browser', openWith: null });
  });

  it('never opens a desktop window under CI or without a display, and says why', () => {
    expect(planLaunch(facts({ electronBinary: true, env: { CI: '1', DISPLAY: ':0' } }))).toEqual({ kind: 'browser', reason: 'CI is set, so no window is opened', openWith: null });
    expect(planLaunch(facts({ electronBinary: true, env: {} }))).toEqual({ kind: 'browser', reason: 'there is no display to open a window on', openWith: null });
  });

  it('honours ROUNDWISE_MODE=browser', () => {
    expect(planLaunch(facts({ electronBinary: true, env: { DISPLAY: ':0', ROUNDWISE_MODE: 'browser' } }))).toMatchObject({ kind: 'browser', openWith: '/usr/bin/chromium' });
  });

  it('prints one line naming the reason and the URL', () => {
    const a = planLaunch(facts({ missingBecause: 'install-skipped', browserPath: null }));
    if (a.kind !== 'browser') throw new Error('expected browser mode');
    const line = browserModeLine(a, 'http://127.0.0.1:5178/');
    expect(line).not.toContain('\n');
    expect(line).toMatch(/desktop window not available \(.*ELECTRON_SKIP_BINARY_DOWNLOAD.*\).*http:\/\/127\.0\.0\.1:5178\//);
  });
});

describe('environment facts', () => {
  it('reads CI and display variables', () => {
    expect(isCI({ CI: 'true' })).toBe(true);
    expect(isCI({ CI: '1' })).toBe(true);
    expect(isCI({ CI: 'false' })).toBe(false);
    expect(isCI({ CI: '' })).toBe(false);
    expect(isCI({})).toBe(false);
    expect(hasDisplay('linux', {})).toBe(false);
    expect(hasDisplay('win32', {})).toBe(true);
  });
  it('tries the installer once unless the binary is there or the download is switched off', () => {
    expect(shouldTryInstall(false, {})).toBe(true);
    expect(shouldTryInstall(true, {})).toBe(false);
    expect(shouldTryInstall(false, { ELECTRON_SKIP_BINARY_DOWNLOAD: '1' })).toBe(false);
    expect(shouldTryInstall(false, { ELECTRON_SKIP_BINARY_DOWNLOAD: '0' })).toBe(true);
  });
  it('finds the first browser by absolute path or on PATH', () => {
    const present = new Set(['/opt/bin/google-chrome', '/usr/local/bin/chromium-browser']);
    const exists = (p: string) => present.has(p);
    expect(findBrowser(['/usr/bin/chromium', 'chromium', 'chromium-browser', 'google-chrome'], '/opt/bin:/usr/local/bin', exists)).toBe('/usr/local/bin/chromium-browser');
    expect(findBrowser(['/usr/bin/chromium', 'google-chrome'], '/opt/bin/', exists)).toBe('/opt/bin/google-chrome');
    expect(findBrowser(['chromium'], '', exists)).toBeNull();
  });
});

describe('tryInstallElectron', () => {
  it('reports success, failure, a missing installer, and gives up after the timeout', () => {
    const dir = mkdtempSync(join(tmpdir(), 'roundwise-install-'));
    try {
      const script = (name: string, body: string) => {
        const p = join(dir, name);
        writeFileSync(p, body);
        return p;
      };
      expect(tryInstallElectron(script('ok.js', 'process.exit(0)'), 5000)).toBe(true);
      expect(tryInstallElectron(script('fail.js', 'process.exit(1)'), 5000)).toBe(false);
      expect(tryInstallElectron(join(dir, 'missing.js'), 5000)).toBe(false);
      const started = Date.now();
      expect(tryInstallElectron(script('hang.js', 'setTimeout(() => {}, 60000)'), 300)).toBe(false);
      expect(Date.now() - started).toBeLessThan(10_000); // a bound on hanging, not a speed measurement
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

describe('electronBinaryPath', () => {
  it('honours ELECTRON_OVERRIDE_DIST_PATH and reports a missing binary as null', () => {
    const dir = mkdtempSync(join(tmpdir(), 'roundwise-electron-'));
    try {
      expect(electronBinaryPath({ ELECTRON_OVERRIDE_DIST_PATH: dir })).toBeNull();
      const name = process.platform === 'win32' ? 'electron.exe' : process.platform === 'darwin' ? 'Electron.app/Contents/MacOS/Electron' : 'electron';
      mkdirSync(dirname(join(dir, name)), { recursive: true });
      writeFileSync(join(dir, name), '');
      expect(electronBinaryPath({ ELECTRON_OVERRIDE_DIST_PATH: dir })).toBe(join(dir, name));
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
