/**
 * Validators for every message that crosses the bridge. The main process runs each IPC call's arguments through
 * these before touching a file; nothing from the renderer is trusted (a compromised page could send anything).
 * Pure and DOM/Node-free, so they are unit-tested in isolation and shared with the preload.
 */
import { z } from '../schema/index.ts';
import type { ExportKind, FileKind, RecentEntry } from './contract.ts';
import { MAX_SAVE_CHARS } from './files.ts';

export type Validated<T> = { ok: true; value: T } | { ok: false; message: string };

/** Longest suggested file name accepted (before sanitising); file systems allow 255 bytes per name. */
export const MAX_NAME_CHARS = 200;
/** Longest path or recent-entry reference accepted (Linux PATH_MAX). */
export const MAX_PATH_CHARS = 4096;
/** How many recent projects are kept. */
export const MAX_RECENT = 10;

const fileKind = z.enum(['table', 'project'] satisfies FileKind[]);
const exportKind = z.enum(['csv', 'txt', 'png', 'json', 'pdf', 'xlsx'] satisfies ExportKind[]);
const name = z.string().min(1, 'empty file name').max(MAX_NAME_CHARS, `file name longer than ${MAX_NAME_CHARS} characters`);
const content = z.string().max(MAX_SAVE_CHARS, 'content larger than the save limit');
const path = z.string().min(1, 'empty path').max(MAX_PATH_CHARS, 'path too long').refine((p) => !p.includes('\0'), 'path contains a NUL character');

/** Base64 alphabet with padding, optionally behind a `data:image/png;base64,` prefix (what canvas.toDataURL gives). */
const BASE64 = /^[A-Za-z0-9+/]*={0,2}$/;
const PNG_DATA_URL = /^data:image\/png;base64,/;

/** The 8-byte PNG signature, base64-encoded: every PNG starts with these 12 characters (ISO/IEC 15948, 5.2). */
const PNG_SIGNATURE_B64 = 'iVBORw0KGgo';

export function stripDataUrl(b64: string): string {
  return b64.replace(PNG_DATA_URL, '');
}

/** True when `b64` is well-formed base64 of a PNG file. */
export function isPngBase64(b64: string): boolean {
  const body = stripDataUrl(b64);
  return body.length % 4 === 0 && BASE64.test(body) && body.startsWith(PNG_SIGNATURE_B64);
}

/**
 * The first bytes of each binary export, base64-encoded (each prefix is a multiple of 3 bytes, so its encoding is a
 * fixed string): "%PDF-1" (ISO 32000-1, 7.5.2) and a zip local file header "PK\x03\x04" plus two version bytes
 * ("PK\x03\x04\x14\x00" or "\x0a\x00": an XLSX is a zip package, ECMA-376 Part 2) — checked as a regular expression.
 */
const SIGNATURES_B64: Partial<Record<ExportKind, RegExp>> = {
  png: new RegExp(`^${PNG_SIGNATURE_B64}`),
  pdf: /^JVBERi0x/,
  xlsx: /^UEsDB[A-Za-z0-9+/]/,
};

/** True when `content` is well-formed base64 of a file of the binary export `kind` (true for the text kinds). */
export function isExportContent(kind: ExportKind, content: string): boolean {
  const sig = SIGNATURES_B64[kind];
  if (!sig) return true;
  const body = kind === 'png' ? stripDataUrl(content) : content;
  return body.length % 4 === 0 && BASE64.test(body) && sig.test(body);
}

function check<T>(schema: z.ZodType<T>, args: unknown, what: string): Validated<T> {
  const r = schema.safeParse(args);
  if (r.success) return { ok: true, value: r.data };
  const issue = r.error.issues[0];
  const at = issue && issue.path.length ? ` (argument ${issue.path.map(String).join('.')})` : '';
  return { ok: false, message: `${what}: ${issue?.message ?? 'invalid arguments'}${at}` };
}

export const argSchemas = {
  openFile: z.tuple([fileKind]),
  saveProject: z.tuple([name, content, path.optional()]),
  exportFile: z.tuple([name, exportKind, content]).refine(([, kind, body]) => isExportContent(kind, body), {
    message: 'content is not base64 of a file of that kind (png, pdf or xlsx)',
    path: [2],
  }),
  recentProjects: z.tuple([]),
  openRecent: z.tuple([path]),
  setDirty: z.tuple([z.boolean()]),
  autosave: z.tuple([content.nullable()]),
  recoverAutosave: z.tuple([]),
  discardRecovered: z.tuple([]),
} as const;

export type ArgsOf<K extends keyof typeof argSchemas> = z.infer<(typeof argSchemas)[K]>;

/** Validate the argument list of one IPC message. */
export function validateArgs<K extends keyof typeof argSchemas>(channel: K, args: unknown): Validated<ArgsOf<K>> {
  return check(argSchemas[channel] as unknown as z.ZodType<ArgsOf<K>>, args, channel);
}

// Characters Windows, macOS or Linux refuse in a file name, plus control characters.
const UNSAFE_NAME_CHARS = /[<>:"/\\|?*\u0000-\u001f\u007f]/g;
const WINDOWS_RESERVED = /^(con|prn|aux|nul|com[1-9]|lpt[1-9])(\..*)?$/i;

/**
 * Turn a suggested name (often built from a scenario or sector label) into a safe bare file name: no folders,
 * no reserved characters or device names, no leading dots, trimmed to MAX_NAME_CHARS. Never empty.
 */
export function sanitizeFileName(suggested: string, fallback = 'roundwise'): string {
  let s = suggested.normalize('NFC').replace(UNSAFE_NAME_CHARS, '-').replace(/\s+/g, ' ').trim();
  s = s.replace(/^[.\s]+/, '').replace(/[.\s]+$/, '');
  if (WINDOWS_RESERVED.test(s)) s = `_${s}`;
  if (s.length > MAX_NAME_CHARS) s = s.slice(0, MAX_NAME_CHARS).trim();
  return s || fallback;
}

const recentEntry = z.object({ name: z.string().min(1).max(MAX_NAME_CHARS * 2), ref: path, when: z.string().max(40) });

/** Parse the stored recent-projects list, dropping damaged entries rather than failing: it is a convenience, not data. */
export function parseRecentList(raw: unknown): RecentEntry[] {
  if (!Array.isArray(raw)) return [];
  const out: RecentEntry[] = [];
  for (const item of raw) {
    const r = recentEntry.safeParse(item);
    if (r.success && !out.some((e) => e.ref === r.data.ref)) out.push(r.data);
    if (out.length === MAX_RECENT) break;
  }
  return out;
}

/** Put `entry` first, drop an older entry with the same ref, cap the list. */
export function addRecent(list: readonly RecentEntry[], entry: RecentEntry): RecentEntry[] {
  return [entry, ...list.filter((e) => e.ref !== entry.ref)].slice(0, MAX_RECENT);
}
