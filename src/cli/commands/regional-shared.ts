/** Argument, file and report plumbing shared by `roundwise regionalize`, `balance` and `aggregate`. */
import { createHash } from 'node:crypto';
import { join } from 'node:path';
import { parseArgs, type ParseArgsConfig } from 'node:util';
import { InputError } from '../../diagnostics/index.ts';
import { parseRoleMap, type RoleMap } from '../../table/index.ts';
import { readInputFile, writeFileAtomic } from '../io.ts';
import type { ReportFile } from '../../report/index.ts';

type Options = NonNullable<ParseArgsConfig['options']>;

/** parseArgs with usage mistakes turned into a short refusal that repeats the usage line. */
export function parseCommandArgs<O extends Options>(args: string[], options: O, usage: string) {
  try {
    return parseArgs({ args, options, allowPositionals: true, strict: true });
  } catch (e) {
    const msg = e instanceof Error ? e.message.split('\n')[0]! : String(e);
    throw new InputError('usage', msg, {}, `usage: ${usage}`);
  }
}

export function requireOne(positionals: string[], what: string, usage: string): string {
  if (positionals.length !== 1) throw new InputError('usage', `expected one ${what} file, got ${positionals.length}`, {}, `usage: ${usage}`);
  return positionals[0]!;
}

export function requireOption(value: string | undefined, name: string, usage: string): string {
  if (value === undefined || value === '') throw new InputError('usage', `--${name} is required`, {}, `usage: ${usage}`);
  return value;
}

/** A number option, refused with its name when it is not a finite number. */
export function numberOption(value: string | undefined, name: string): number | undefined {
  if (value === undefined) return undefined;
  const v = Number(value);
  if (value.trim() === '' || !Number.isFinite(v)) throw new InputError('usage', `--${name} must be a number (got '${value}')`);
  return v;
}

/** A small input file as UTF-8 text (the shared reader checks the size limit first). */
export function readInput(path: string): string {
  return readInputFile(path).toString('utf8');
}

export function sha256(text: string): string {
  return createHash('sha256').update(text, 'utf8').digest('hex');
}

/** `--map MAP.json`, read and checked by the table importer's own role-map parser. */
export function readRoleMap(path: string | undefined): Partial<RoleMap> | undefined {
  return path === undefined ? undefined : parseRoleMap(readInput(path), path);
}

/** Write every file of a result (all contents are built before the first write), each atomically. */
export function writeAll(dir: string, files: ReportFile[]): string[] {
  const paths = files.map((f) => join(dir, f.name));
  files.forEach((f, k) => writeFileAtomic(paths[k]!, f.content));
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
