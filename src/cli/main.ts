/**
 * The batch CLI: `roundwise <command> …`. Each command is one spec (src/cli/commands/*.ts); this file parses, runs,
 * writes and prints the same way for all of them.
 * Exit status: 0 done; 1 usage error (unknown command or option, missing or bad argument); 2 refused input (an
 * InputError: a short located message, nothing written); 70 internal error. No stack trace reaches the user.
 */
import { formatLocated, InputError, isInputError } from '../diagnostics/index.ts';
import type { CommandSpec } from './command.ts';
import { usePlatformSha256 } from '../project/index.ts';
import { CommandRun, nodeSha256 } from './context.ts';
import { stopParallelKernels } from './parallel.ts';
import { errnoCode, fsReason } from '../node-io/index.ts';
import { processIO, type CliIO } from './io.ts';
import { writeOutputs } from './output.ts';
import { commandHelp, mainHelp, parseCommandArgs, wantsHelp } from './parse.ts';
import { jsonText, terminalText } from './terminal.ts';
import { analyze } from './commands/analyze.ts';
import { scenario } from './commands/scenario.ts';
import { regionalize } from './commands/regionalize.ts';
import { balance } from './commands/balance.ts';
import { aggregate } from './commands/aggregate.ts';
import { sut } from './commands/sut.ts';

export const COMMANDS: readonly CommandSpec[] = [analyze, scenario, regionalize, balance, aggregate, sut] as unknown as CommandSpec[];

export function usage(): string {
  return mainHelp(COMMANDS);
}

const EXIT = { ok: 0, usage: 1, refused: 2, internal: 70 } as const;

/**
 * What the launcher does when standard output or error cannot take what a run writes (their 'error' event): a reader
 * that closed the pipe (`roundwise … --json | head`) has what it wanted, so the run ends quietly with its own status;
 * any other failure (a full disk behind `> file`) is said in one line, in the one table's words (src/node-io), and
 * ends the run as a refused write does. Never Node's unhandled 'error' event with its stack trace.
 */
export function outputStreamFailed(err: unknown, stream: 'standard output' | 'standard error', argv: readonly string[], status: number): { message: string | null; code: number } {
  if (errnoCode(err) === 'EPIPE') return { message: null, code: status };
  const command = COMMANDS.find((c) => c.name === argv[0]);
  return { message: `roundwise${command ? ` ${command.name}` : ''}: ${stream}: cannot write: ${fsReason(err)}\n`, code: EXIT.refused };
}

function commandList(): string {
  return `usage: roundwise <command> [options]; the commands are ${COMMANDS.map((c) => c.name).join(', ')} ('roundwise --help' lists their options)`;
}

function refusal(prefix: string, e: InputError, io: CliIO): number {
  io.stderr(`${prefix}: ${formatLocated(e)}\n`);
  return e.code === 'usage' ? EXIT.usage : EXIT.refused;
}

export async function main(argv: string[], io: CliIO = processIO): Promise<number> {
  const [name, ...rest] = argv;
  if (name === '--help' || name === '-h' || name === 'help') {
    const spec = COMMANDS.find((c) => c.name === rest[0]);
    io.stdout(spec ? commandHelp(spec) : usage());
    return EXIT.ok;
  }
  if (name === undefined) return refusal('roundwise', new InputError('usage', 'no command given', {}, commandList()), io);
  const spec = COMMANDS.find((c) => c.name === name);
  if (!spec) return refusal('roundwise', new InputError('usage', `unknown command '${name}'`, {}, commandList()), io);
  return runCommand(spec, rest, io);
}

async function runCommand(spec: CommandSpec, argv: string[], io: CliIO): Promise<number> {
  const prefix = `roundwise ${spec.name}`;
  if (wantsHelp(argv)) {
    io.stdout(commandHelp(spec));
    return EXIT.ok;
  }
  const run = new CommandRun(spec, io);
  // Source fingerprints by Node's crypto for this run (the same function, faster than the engine's portable code).
  usePlatformSha256(nodeSha256);
  try {
    const args = parseCommandArgs(spec, argv);
    const result = await spec.run(args, run);
    const out = args.values.out;
    const written = writeOutputs(out, out === undefined ? [] : result.reports ?? [], result.files ?? [], run.inputs, { bom: !args.values['no-bom'] });
    if (written.stale.length) {
      run.warn(`${written.stale.length} Roundwise report files in ${out} are from an earlier run and were not rewritten: ${written.stale.join(', ')} (left in place; remove them if they no longer apply)`);
    }
    if (args.values.json) {
      io.stdout(jsonText({
        ...result.json(),
        ...(written.files.length ? { files: written.files } : {}),
        ...(written.stale.length ? { staleFiles: written.stale } : {}),
      }));
    } else {
      const wrote = written.files.length ? `\nWrote ${written.files.length} file${written.files.length > 1 ? 's' : ''}:\n${written.files.map((f) => `  ${f}`).join('\n')}\n` : '';
      io.stdout(terminalText(result.summary() + wrote));
    }
    return EXIT.ok;
  } catch (e) {
    if (isInputError(e)) return refusal(prefix, e, io);
    const msg = e instanceof Error ? e.message : String(e);
    io.stderr(`${prefix}: internal error: ${terminalText(msg.split('\n')[0]!)}\n`);
    return EXIT.internal;
  } finally {
    usePlatformSha256(null);
    // Helper threads a command started early (startHelpersFor) and did not stop itself, e.g. after a refusal.
    await stopParallelKernels();
  }
}
