/**
 * What a command is: one declarative spec (name, one-line summary, the positional file, options each with a one-line
 * help text, what --out writes) and a `run` that turns parsed arguments into a result. Parsing, help texts, usage
 * errors, reading inputs, writing outputs and printing are the framework's (parse.ts, context.ts, output.ts,
 * main.ts), the same for every command.
 */
import type { ReportFile } from '../report/index.ts';
import type { RoleMap } from '../table/index.ts';

export type OptionSpec =
  | { type: 'boolean'; help: string }
  | { type: 'string'; value: string; help: string; required?: boolean; choices?: readonly string[] }
  /** A string option that may be given several times (`--activity A.csv --activity B.csv`); its value is a list. */
  | { type: 'strings'; value: string; help: string }
  /** A number option; `check` returns what is wrong with a value (a usage error) or null. */
  | { type: 'number'; value: string; help: string; check?: (v: number) => string | null };

export type OptionSpecs = Record<string, OptionSpec>;

type ValueOf<S extends OptionSpec> = S extends { type: 'boolean' } ? boolean
  : S extends { type: 'number' } ? number | undefined
  : S extends { type: 'strings' } ? string[]
  : S extends { required: true } ? string
  : string | undefined;

/** Options every command has: --json, --out DIR and --no-bom (and --help, handled before `run`). */
export interface CommonValues {
  json: boolean;
  out: string | undefined;
  /** CSV reports without the UTF-8 byte-order mark. */
  'no-bom': boolean;
}

export type Values<O extends OptionSpecs> = { [K in keyof O]: ValueOf<O[K]> } & CommonValues;

/** An input file of this run, read through src/node-io and remembered so no output of the run can replace it. */
export interface InputFile {
  /** As the user gave it. */
  path: string;
  /** The file name without folders (what reports name as their source). */
  name: string;
  bytes: Uint8Array;
  /** The bytes decoded as UTF-8 (invalid bytes replaced); the importers report encoding problems themselves. */
  readonly text: string;
  /** Hex SHA-256 of the file's bytes: the one source-hash rule of every report. */
  readonly sha256: string;
}

export interface RunContext {
  /** Read an input file (size limit, regular files only; refusals are located); `into` as in src/node-io's reader. */
  input(path: string, opts?: { into?: (bytes: number) => Uint8Array | null }): InputFile;
  /** `--map MAP.json`, read and checked by the table importer's role-map parser (located messages). */
  roleMap(path: string | undefined): Partial<RoleMap> | undefined;
  /** A usage mistake found while running (e.g. two options that do not go together): exit 1 with the usage line. */
  usageError(message: string): Error;
  /** A warning line on stderr ("roundwise analyze: warning: …"). */
  warn(message: string): void;
  /** ISO 8601 date-time of the run, for every report of it. */
  date: string;
}

/** A file at a path the user named (e.g. `--project FILE`), written with the reports, under the same checks. */
export interface NamedFile {
  path: string;
  /** Text (written as UTF-8) or bytes (a PDF brief, an XLSX workbook). */
  content: string | Uint8Array;
}

export interface CommandResult {
  /** The text summary (printed without --json). */
  summary(): string;
  /** The JSON object (printed with --json); the framework adds `files` and `staleFiles` when it wrote any. */
  json(): Record<string, unknown>;
  /** Reports for `--out DIR` (only asked for when --out is given). */
  reports?: ReportFile[];
  files?: NamedFile[];
}

export interface CommandSpec<O extends OptionSpecs = OptionSpecs> {
  name: string;
  /** One line for the main help: what the command gives. */
  summary: string;
  positional: { name: string; help: string };
  /** A second positional file, required when given (e.g. the use table after the supply table). */
  second?: { name: string; help: string };
  options: O;
  /** What `--out DIR` writes (one line). */
  outHelp: string;
  /** Paragraphs of --help below the option list (methods, sources, file formats). */
  notes?: string[];
  run(args: { input: string; second?: string; values: Values<O> }, ctx: RunContext): CommandResult | Promise<CommandResult>;
}

/** Declare a command; `const` keeps literal option types so `values` is typed from the spec. */
export function defineCommand<const O extends OptionSpecs>(spec: CommandSpec<O>): CommandSpec<O> {
  return spec;
}
