/** Argument, file and report plumbing shared by `roundwise regionalize`, `balance` and `aggregate`. */
import { createHash } from 'node:crypto';
import { join } from 'node:path';
import { parseArgs, type ParseArgsConfig } from 'node:util';
import { InputError } from '../../diagnostics/errors.ts';
import type { RoleMap, RowRole, ColumnRole } from '../../table/types.ts';
import { readText, writeFileAtomic } from '../io.ts';
import type { ReportFile } from '../../report/document.ts';

type Options = NonNullable<ParseArgsConfig['options']>;

/** parseArgs with usage mistakes turned into a short refusal that repeats the usage line. */
export function parseCommandArgs<O extends Options>(args: string[], options: O, usage: string) {
  try {
    return parseArgs({ args, options, allowPositionals: true, strict: true });
  } catch (e) {
    const msg = e instanceof Error ? e.message.split('\n')[0]! : String(e);
    throw new InputError('usage', `${msg}\n  usage: ${usage}`);
  }
}

export function requireOne(positionals: string[], what: string, usage: string): string {
  if (positionals.length !== 1) throw new InputError('usage', `expected one ${what} file, got ${positionals.length}\n  usage: ${usage}`);
  return positionals[0]!;
}

export function requireOption(value: string | undefined, name: string, usage: string): string {
  if (value === undefined || value === '') throw new InputError('usage', `--${name} is required\n  usage: ${usage}`);
  return value;
}

/** A number option, refused with its name when it is not a finite number. */
export function numberOption(value: string | undefined, name: string): number | undefined {
  if (value === undefined) return undefined;
  const v = Number(value);
  if (value.trim() === '' || !Number.isFinite(v)) throw new InputError('usage', `--${name} must be a number (got '${value}')`);
  return v;
}

export function readInput(path: string): string {
  try {
    return readText(path);
  } catch (e) {
    const code = (e as { code?: string }).code;
    const why = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'it is a folder' : code === 'EACCES' ? 'permission denied' : 'it cannot be read';
    throw new InputError('file-unreadable', `cannot read the file: ${why}`, { file: path });
  }
}

export function sha256(text: string): string {
  return createHash('sha256').update(text, 'utf8').digest('hex');
}

const ROW_ROLES: RowRole[] = ['labourIncome', 'otherValueAdded', 'imports', 'employment', 'totalInput', 'ignore'];
const COLUMN_ROLES: ColumnRole[] = ['householdConsumption', 'otherFinalDemand', 'totalOutput', 'ignore'];

/** `--map MAP.json`: {"rows": {label: role}, "columns": {label: role}}, checked before it reaches the importer. */
export function readRoleMap(path: string | undefined): Partial<RoleMap> | undefined {
  if (path === undefined) return undefined;
  let raw: unknown;
  try {
    raw = JSON.parse(readInput(path));
  } catch (e) {
    if (e instanceof InputError) throw e;
    throw new InputError('map-json', 'the role map is not valid JSON', { file: path });
  }
  const out: Partial<RoleMap> = {};
  const obj = raw as Record<string, unknown>;
  if (typeof raw !== 'object' || raw === null || Array.isArray(raw)) throw new InputError('map-shape', 'the role map must be an object with "rows" and/or "columns"', { file: path });
  for (const [key, allowed] of [['rows', ROW_ROLES], ['columns', COLUMN_ROLES]] as const) {
    const part = obj[key];
    if (part === undefined) continue;
    if (typeof part !== 'object' || part === null || Array.isArray(part)) throw new InputError('map-shape', `"${key}" must map labels to roles`, { file: path });
    for (const [label, role] of Object.entries(part)) {
      if (!(allowed as readonly string[]).includes(String(role))) {
        throw new InputError('map-role', `role '${String(role)}' for '${label}' is not one of ${allowed.join(', ')}`, { file: path, ...(key === 'rows' ? { rowLabel: label } : { columnLabel: label }) });
      }
    }
    (out as Record<string, unknown>)[key] = part;
  }
  return out;
}

/** Write every file of a result (all contents are built before the first write), each atomically. */
export function writeAll(dir: string, files: ReportFile[]): string[] {
  const paths = files.map((f) => join(dir, f.name));
  files.forEach((f, k) => {
    try {
      writeFileAtomic(paths[k]!, f.content);
    } catch (e) {
      const code = (e as { code?: string }).code ?? 'error';
      throw new InputError('out-unwritable', `cannot write the file (${code}); nothing after it was written`, { file: paths[k]! });
    }
  });
  return paths;
}

export function num(v: number, digits = 6): string {
  if (!Number.isFinite(v)) return '—';
  return Math.abs(v) >= 1e6 || (v !== 0 && Math.abs(v) < 1e-3) ? v.toExponential(digits - 1) : String(Number(v.toPrecision(digits)));
}

/** Fixed-width text table for the terminal. */
export function textTable(header: string[], rows: string[][]): string {
  const widths = header.map((h, k) => Math.max(h.length, ...rows.map((r) => (r[k] ?? '').length)));
  const line = (r: string[]) => r.map((c, k) => (k === 0 ? c.padEnd(widths[k]!) : c.padStart(widths[k]!))).join('  ');
  return [line(header), ...rows.map(line)].join('\n');
}
