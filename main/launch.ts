/**
 * `npm start`: the desktop window when the Electron binary is there, otherwise the same UI in browser mode.
 * 1. If the binary is missing, try `node node_modules/electron/install.js` once, quietly, with a short timeout.
 * 2. Decide (main/launch-plan.ts): desktop, or browser mode with or without a Chromium `--app` window.
 * 3. Desktop: build renderer, main and preload (main/build.ts) and run Electron on the result.
 *    Browser: serve renderer/vite.config.ts on 127.0.0.1 (PORT, default 5178), print one line, open the window.
 */
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, accessSync, constants } from 'node:fs';
import { createRequire } from 'node:module';
import { homedir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { electronConfig } from '../electron.config.ts';
import { BROWSER_CANDIDATES, browserModeLine, findBrowser, planLaunch, shouldTryInstall, type LaunchAction, type LaunchFacts } from './launch-plan.ts';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');
export const DEFAULT_PORT = 5178;
/** Long enough for a reachable download to start, short enough not to stall `npm start` on an offline machine. */
const INSTALL_TIMEOUT_MS = 20_000;

/** The binary's path inside an Electron dist folder, as the electron package's installer lays it out. */
function platformBinary(platform: string): string {
  if (platform === 'darwin') return 'Electron.app/Contents/MacOS/Electron';
  return platform === 'win32' ? 'electron.exe' : 'electron';
}

/**
 * Where the electron package keeps its binary (without requiring the package: its index.js would start a download).
 * ELECTRON_OVERRIDE_DIST_PATH, the package's own variable, points at an Electron installed elsewhere.
 */
export function electronBinaryPath(env: NodeJS.ProcessEnv = process.env): string | null {
  let pkgDir: string;
  try {
    pkgDir = dirname(createRequire(import.meta.url).resolve('electron/package.json'));
  } catch {
    return null;
  }
  const pathFile = join(pkgDir, 'path.txt');
  const rel = existsSync(pathFile) ? readFileSync(pathFile, 'utf8').trim() : platformBinary(process.platform);
  const bin = env.ELECTRON_OVERRIDE_DIST_PATH ? join(env.ELECTRON_OVERRIDE_DIST_PATH, rel) : join(pkgDir, 'dist', rel);
  return existsSync(bin) ? bin : null;
}

/** One quiet attempt at the electron package's own installer. True when it exited cleanly within the timeout. */
export function tryInstallElectron(installer: string = join(root, 'node_modules', 'electron', 'install.js'), timeoutMs = INSTALL_TIMEOUT_MS): boolean {
  if (!existsSync(installer)) return false;
  const r = spawnSync(process.execPath, [installer], { stdio: 'ignore', timeout: timeoutMs, killSignal: 'SIGKILL' });
  return r.status === 0 && !r.error;
}

function executable(p: string): boolean {
  try {
    accessSync(p, constants.X_OK);
    return true;
  } catch {
    return false;
  }
}

function port(env: NodeJS.ProcessEnv): number {
  const p = Number(env.PORT ?? DEFAULT_PORT);
  return Number.isInteger(p) && p > 0 && p < 65536 ? p : DEFAULT_PORT;
}

function browserProfileDir(env: NodeJS.ProcessEnv): string {
  const base = env.XDG_CONFIG_HOME || join(homedir(), '.config');
  return join(base, 'roundwise', 'browser-profile');
}

async function runDesktop(bin: string): Promise<void> {
  const { buildDesktop } = await import('./build.ts');
  await buildDesktop(root);
  const env = { ...process.env };
  delete env.ELECTRON_RUN_AS_NODE;
  const child = spawn(bin, [join(root, electronConfig.outputs.main)], { stdio: 'inherit', env });
  for (const sig of ['SIGINT', 'SIGTERM'] as const) process.on(sig, () => child.kill(sig));
  child.on('exit', (code) => process.exit(code ?? 0));
}

async function runBrowser(action: Extract<LaunchAction, { kind: 'browser' }>): Promise<void> {
  const { createServer } = await import('vite');
  const server = await createServer({
    configFile: join(root, electronConfig.entries.rendererConfig),
    logLevel: 'warn',
    clearScreen: false,
    // 127.0.0.1 only; a taken port moves to the next free one rather than failing `npm start`.
    server: { host: '127.0.0.1', port: port(process.env), strictPort: false, open: false },
  });
  await server.listen();
  const addr = server.httpServer?.address();
  const url = `http://127.0.0.1:${typeof addr === 'object' && addr ? addr.port : port(process.env)}/`;
  console.log(browserModeLine(action, url));

  const stop = async (code: number): Promise<never> => {
    await server.close().catch(() => undefined);
    process.exit(code);
  };
  process.on('SIGINT', () => void stop(0));
  process.on('SIGTERM', () => void stop(0));

  if (!action.openWith) return;
  const profile = browserProfileDir(process.env);
  mkdirSync(profile, { recursive: true });
  const args = [`--app=${url}`, `--user-data-dir=${profile}`, '--no-first-run', '--no-default-browser-check',
    `--window-size=${electronConfig.window.width},${electronConfig.window.height}`];
  // Chromium refuses to start as root without this; only then is it added.
  if (typeof process.getuid === 'function' && process.getuid() === 0) args.push('--no-sandbox');
  const started = Date.now();
  const child = spawn(action.openWith, args, { stdio: 'ignore' });
  child.on('error', () => console.log(`Roundwise: could not start ${action.openWith}; open ${url} in a browser.`));
  child.on('exit', (code) => {
    // Closed after a while: the user closed the app window, so stop. A quick clean exit means the window was handed
    // to a browser already running on that profile: keep serving. A quick failure: say where to go instead.
    if (Date.now() - started > 3000) void stop(0);
    else if (code !== 0) console.log(`Roundwise: the app window did not open; open ${url} in a browser.`);
  });
}

export async function main(): Promise<void> {
  const env = process.env;
  const rendererConfig = join(root, electronConfig.entries.rendererConfig);
  if (!existsSync(rendererConfig)) throw new Error(`the UI is missing (${electronConfig.entries.rendererConfig} not found)`);
  let bin = electronBinaryPath(env);
  let missingBecause: LaunchFacts['missingBecause'];
  if (!bin) {
    if (shouldTryInstall(false, env)) {
      bin = tryInstallElectron() ? electronBinaryPath(env) : null;
      missingBecause = 'install-failed';
    } else {
      missingBecause = 'install-skipped';
    }
  }
  const action = planLaunch({
    electronBinary: bin !== null,
    missingBecause,
    platform: process.platform,
    env,
    browserPath: findBrowser(BROWSER_CANDIDATES, env.PATH ?? '', executable),
  });
  if (action.kind === 'desktop' && bin) await runDesktop(bin);
  else if (action.kind === 'browser') await runBrowser(action);
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  main().catch((err: unknown) => {
    console.error(`Roundwise: could not start: ${err instanceof Error ? err.message : String(err)}`);
    process.exit(1);
  });
}
