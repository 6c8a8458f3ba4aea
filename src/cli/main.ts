/**
 * The batch CLI: `roundwise <command> …`. This folder is the one place in src/ allowed Node built-ins.
 * Refused input (InputError) prints a short located message and exits 2; no stack trace reaches the user.
 */
import { formatLocated, isInputError } from '../diagnostics/index.ts';
import { processIO, type CliIO } from './io.ts';
import * as analyze from './commands/analyze.ts';
import * as scenario from './commands/scenario.ts';
import * as regionalize from './commands/regionalize.ts';
import * as balance from './commands/balance.ts';
import * as aggregate from './commands/aggregate.ts';

type Command = { run: (args: string[], io: CliIO) => Promise<number> };

const COMMANDS: Record<string, { cmd: Command; summary: string }> = {
  analyze: { cmd: analyze, summary: 'analyze TABLE.csv [--map MAP.json] [--json] [--out DIR]   coefficients, viability, multipliers' },
  scenario: { cmd: scenario, summary: 'scenario TABLE.csv --shock SHOCK.csv [--map MAP.json] [--json] [--out DIR]   demand-shock effects' },
  regionalize: { cmd: regionalize, summary: 'regionalize NATIONAL.csv --employment EMP.csv --method slq|cilq|flq [--delta 0.3] [--map MAP.json] [--json] [--out DIR]' },
  balance: { cmd: balance, summary: 'balance MATRIX.csv --rows ROWS.csv --columns COLS.csv [--table] [--tolerance T] [--max-iterations K] [--json] [--out DIR]   RAS balancing' },
  aggregate: { cmd: aggregate, summary: 'aggregate TABLE.csv --groups GROUPS.csv [--map MAP.json] [--json] [--out DIR]   merge sectors' },
};

export function usage(): string {
  return ['usage: roundwise <command> [options]', '', ...Object.values(COMMANDS).map((c) => `  roundwise ${c.summary}`), ''].join('\n');
}

export async function main(argv: string[], io: CliIO = processIO): Promise<number> {
  const [name, ...rest] = argv;
  if (!name || name === '--help' || name === '-h' || name === 'help') {
    io.stdout(usage());
    return name ? 0 : 1;
  }
  const entry = COMMANDS[name];
  if (!entry) {
    io.stderr(`roundwise: unknown command '${name}'\n${usage()}`);
    return 1;
  }
  try {
    return await entry.cmd.run(rest, io);
  } catch (e) {
    if (isInputError(e)) {
      io.stderr(`roundwise ${name}: ${formatLocated(e)}\n`);
      return 2;
    }
    const msg = e instanceof Error ? e.message : String(e);
    io.stderr(`roundwise ${name}: internal error: ${msg.split('\n')[0]}\n`);
    return 70;
  }
}
