/**
 * The one argument parser (node:util parseArgs, strict) and the help texts, both built from the command specs.
 * Every usage mistake is an InputError with code 'usage' (exit 1) whose hint is the command's usage line.
 */
import { parseArgs } from 'node:util';
import { InputError } from '../diagnostics/index.ts';
import type { CommandSpec, OptionSpec, OptionSpecs, Values } from './command.ts';

/** Options every command has, after its own. */
function allOptions(spec: CommandSpec): [string, OptionSpec][] {
  return [
    ...Object.entries(spec.options),
    ['json', { type: 'boolean', help: 'print one JSON object on stdout instead of the summary' }],
    ['out', { type: 'string', value: 'DIR', help: spec.outHelp }],
    ['no-bom', { type: 'boolean', help: 'write the CSV reports without the UTF-8 byte-order mark (by default they start with one, so spreadsheet programs on Windows read "–", "−" and accented letters right)' }],
  ];
}

function optionText(name: string, o: OptionSpec): string {
  if (o.type === 'boolean') return `--${name}`;
  return `--${name} ${o.type === 'string' && o.choices ? o.choices.join('|') : o.value}`;
}

/** An option in the usage line: required ones bare, others in brackets; a repeatable one followed by "…". */
function usageText(name: string, o: OptionSpec): string {
  if (o.type === 'string' && o.required) return optionText(name, o);
  return `[${optionText(name, o)}]${o.type === 'strings' ? '…' : ''}`;
}

function positionalNames(spec: CommandSpec): string {
  return spec.second ? `${spec.positional.name} ${spec.second.name}` : spec.positional.name;
}

/** "roundwise analyze TABLE.csv [--map MAP.json] … [--json] [--out DIR]": every option, required ones unbracketed. */
export function usageLine(spec: CommandSpec): string {
  const opts = allOptions(spec).map(([name, o]) => usageText(name, o));
  return `roundwise ${spec.name} ${positionalNames(spec)} ${opts.join(' ')}`;
}

/** `roundwise <command> --help`: usage, summary, then one line per option. */
export function commandHelp(spec: CommandSpec): string {
  const rows: [string, string][] = [
    [spec.positional.name, spec.positional.help],
    ...(spec.second ? [[spec.second.name, spec.second.help] as [string, string]] : []),
    ...allOptions(spec).map(([name, o]): [string, string] => [optionText(name, o), (o.type === 'string' && o.required ? '(required) ' : '') + (o.type === 'strings' ? '(may be given more than once) ' : '') + o.help]),
    ['-h, --help', 'show this help'],
  ];
  const width = Math.max(...rows.map(([l]) => l.length)) + 2;
  return [
    `usage: ${usageLine(spec)}`,
    '',
    `${spec.summary[0]!.toUpperCase()}${spec.summary.slice(1)}.`,
    '',
    ...rows.map(([l, h]) => `  ${l.padEnd(width)}${h}`),
    ...(spec.notes?.length ? ['', ...spec.notes] : []),
    '',
  ].join('\n');
}

/** `roundwise --help`: every command with all its options, and the exit codes. */
export function mainHelp(specs: readonly CommandSpec[]): string {
  return [
    'usage: roundwise <command> [options]',
    '',
    ...specs.flatMap((s) => [`  ${usageLine(s)}`, `      ${s.summary}`]),
    '',
    "'roundwise <command> --help' explains each option of a command.",
    'Exit status: 0 done, 1 usage error, 2 refused input (a located one-line message), 70 internal error.',
    '',
  ].join('\n');
}

export function usageError(spec: CommandSpec, message: string): InputError {
  return new InputError('usage', message, {}, `usage: ${usageLine(spec)}`);
}

/** True when the arguments ask for help (before a `--` that ends the options). */
export function wantsHelp(argv: readonly string[]): boolean {
  const end = argv.indexOf('--');
  return (end < 0 ? argv : argv.slice(0, end)).some((a) => a === '--help' || a === '-h');
}

/** parseArgs' own wording made short and the same for every command. */
function parseArgsMessage(e: unknown, spec: CommandSpec): string {
  const err = e as { code?: string; message?: string };
  const msg = String(err.message ?? e).split('\n')[0]!;
  const named = /'(-[^' ]+)/.exec(msg)?.[1];
  if (err.code === 'ERR_PARSE_ARGS_UNKNOWN_OPTION' && named) return `unknown option '${named}'`;
  if (err.code === 'ERR_PARSE_ARGS_INVALID_OPTION_VALUE' && named) {
    const opt = allOptions(spec).find(([n]) => n === named.replace(/^--?/, ''))?.[1];
    if (/does not take an argument/.test(msg)) return `${named} takes no value`;
    return `${named} needs a value${opt && opt.type !== 'boolean' ? ` (${opt.value})` : ''}`;
  }
  return msg.replace(/^./, (c) => c.toLowerCase());
}

/**
 * `--paths -Other` as `--paths=-Other`: a value may start with one '-' (a sector label, a negative number), which
 * parseArgs alone refuses as ambiguous. A following `--word` stays an option (`--paths=--x` passes such a value).
 */
function joinDashValues(argv: readonly string[], all: [string, OptionSpec][]): string[] {
  const valued = new Set(all.filter(([, o]) => o.type !== 'boolean').map(([n]) => `--${n}`));
  const out: string[] = [];
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i]!;
    if (a === '--') {
      out.push(...argv.slice(i));
      break;
    }
    const next = argv[i + 1];
    if (valued.has(a) && next !== undefined && /^-(?!-)./.test(next) && next !== '-h') {
      out.push(`${a}=${next}`);
      i++;
    } else out.push(a);
  }
  return out;
}

/** Parse `argv` (after the command name) against `spec`; usage mistakes throw usageError. */
export function parseCommandArgs<O extends OptionSpecs>(spec: CommandSpec<O>, argv: readonly string[]): { input: string; second?: string; values: Values<O> } {
  const all = allOptions(spec as CommandSpec);
  let parsed;
  try {
    parsed = parseArgs({
      args: joinDashValues(argv, all),
      allowPositionals: true,
      strict: true,
      options: Object.fromEntries(all.map(([name, o]) => [name, { type: o.type === 'boolean' ? 'boolean' : 'string', ...(o.type === 'strings' ? { multiple: true } : {}) } as const])),
    });
  } catch (e) {
    throw usageError(spec as CommandSpec, parseArgsMessage(e, spec as CommandSpec));
  }
  const { positionals } = parsed;
  const raw = parsed.values as Record<string, string | string[] | boolean | undefined>;
  const fail = (message: string) => usageError(spec as CommandSpec, message);
  if (positionals.length === 0) throw fail(`no ${spec.positional.name} given`);
  if (spec.second) {
    if (positionals.length === 1) throw fail(`no ${spec.second.name} given after ${spec.positional.name}`);
    if (positionals.length > 2) throw fail(`two files expected (${positionalNames(spec as CommandSpec)}), got ${positionals.length}: ${positionals.map((p) => `'${p}'`).join(', ')}`);
  } else if (positionals.length > 1) throw fail(`one ${spec.positional.name} expected, got ${positionals.length}: ${positionals.map((p) => `'${p}'`).join(', ')}`);
  const values: Record<string, unknown> = {};
  for (const [name, o] of all) {
    const v = raw[name];
    if (o.type === 'boolean') {
      values[name] = v === true;
      continue;
    }
    if (o.type === 'strings') {
      const list = (v as string[] | undefined) ?? [];
      if (list.some((s) => s.trim() === '')) throw fail(`--${name} needs a value (${o.value})`);
      values[name] = list;
      continue;
    }
    if (v === undefined) {
      if (o.type === 'string' && o.required) throw fail(`--${name} ${o.value} is required`);
      values[name] = undefined;
      continue;
    }
    const s = String(v);
    if (s.trim() === '') throw fail(`--${name} needs a value (${o.value})`);
    if (o.type === 'string') {
      if (o.choices && !o.choices.includes(s)) throw fail(`--${name} must be ${o.choices.slice(0, -1).join(', ')} or ${o.choices.at(-1)} (got '${s}')`);
      values[name] = s;
    } else {
      const n = Number(s);
      if (!Number.isFinite(n)) throw fail(`--${name} must be a number (got '${s}')`);
      const wrong = o.check?.(n);
      if (wrong) throw fail(`--${name} ${wrong} (got '${s}')`);
      values[name] = n;
    }
  }
  return { input: positionals[0]!, ...(spec.second ? { second: positionals[1]! } : {}), values: values as Values<O> };
}
