/**
 * Nothing is fetched from the network at run time: the engine, the UI and the shell contain no network client
 * (fetch, XMLHttpRequest, WebSocket, EventSource, sendBeacon, Node's http(s)/net clients, Electron's net) and no
 * remote URL outside comments. Local addresses (127.0.0.1, localhost) are allowed — browser mode serves the UI
 * there — and so are XML namespace names (www.w3.org), which identify rather than fetch.
 */
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const ROOT = fileURLToPath(new URL('../../../', import.meta.url));
const FOLDERS = ['src', 'renderer', 'main'];
const EXT = /\.(ts|mts|mjs|js|vue|html|css)$/;

function files(dir: string): string[] {
  if (!existsSync(dir)) return [];
  return readdirSync(dir).flatMap((f) => {
    const p = join(dir, f);
    if (f === 'node_modules' || f === 'dist') return [];
    return statSync(p).isDirectory() ? files(p) : EXT.test(f) ? [p] : [];
  });
}

/** Source without comments (block, line and HTML), keeping line count; '//' after ':' (a URL) is not a comment. */
export function stripComments(src: string): string {
  const blank = (m: string) => m.replace(/[^\n]/g, ' ');
  return src
    .replace(/\/\*[\s\S]*?\*\//g, blank)
    .replace(/<!--[\s\S]*?-->/g, blank)
    .replace(/(^|[^:'"`\\])\/\/.*$/gm, (m, pre: string) => pre + blank(m.slice(pre.length)));
}

const CLIENTS: [RegExp, string][] = [
  [/\bfetch\s*\(/, 'fetch'],
  [/\bXMLHttpRequest\b/, 'XMLHttpRequest'],
  [/\bWebSocket\b/, 'WebSocket'],
  [/\bEventSource\b/, 'EventSource'],
  [/\bsendBeacon\b/, 'sendBeacon'],
  [/\bimportScripts\s*\(/, 'importScripts'],
  [/from\s+['"](node:)?(https|net|tls|dgram|dns|http2)['"]/, 'Node network client module'],
  [/\bhttps?\.(get|request)\s*\(/, 'Node http(s) request'],
  [/\bnet\.(request|fetch)\s*\(/, "Electron's net"],
];
const URL_RE = /\b(?:https?|wss?|ftp):\/\/([^/\s'"`)>:]+)/g;
const LOCAL = new Set(['127.0.0.1', 'localhost', '[::1]', 'www.w3.org']);

/** Every network client call and remote URL in the code (comments excluded), as "file:line: what". */
export function networkUses(path: string, text: string): string[] {
  const out: string[] = [];
  stripComments(text).split('\n').forEach((line, k) => {
    for (const [re, what] of CLIENTS) if (re.test(line)) out.push(`${path}:${k + 1}: ${what}`);
    for (const m of line.matchAll(URL_RE)) if (!LOCAL.has(m[1]!)) out.push(`${path}:${k + 1}: remote URL ${m[0]}`);
  });
  return out;
}

describe('no network access at run time', () => {
  it('the scan finds what it must (so a clean result means something)', () => {
    const probe = [
      'const r = await fetch("https://example.org/data.json");',
      'const ws = new WebSocket(url);',
      "import https from 'node:https';",
      '// fetch("https://example.org") in a comment is fine',
      '/* new XMLHttpRequest() */ const x = "http://127.0.0.1:5173/";',
      '<svg xmlns="http://www.w3.org/2000/svg"></svg>',
      '<link href="https://fonts.example.com/a.css">',
    ].join('\n');
    expect(networkUses('probe.ts', probe)).toEqual([
      'probe.ts:1: fetch',
      'probe.ts:1: remote URL https://example.org',
      'probe.ts:2: WebSocket',
      'probe.ts:3: Node network client module',
      'probe.ts:7: remote URL https://fonts.example.com',
    ]);
  });

  it('src/, renderer/ and main/ hold no network client and no remote URL outside comments', () => {
    const all = FOLDERS.flatMap((f) => files(join(ROOT, f)));
    expect(all.length).toBeGreaterThan(20);
    const found = all.flatMap((p) => networkUses(relative(ROOT, p), readFileSync(p, 'utf8')));
    expect(found).toEqual([]);
  });
});
