import type { CliIO } from '../io.ts';

/** `roundwise balance` — not built yet. */
export async function run(_args: string[], io: CliIO): Promise<number> {
  io.stderr('roundwise balance: not available yet\n');
  return 3;
}
