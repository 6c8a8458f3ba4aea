import type { CliIO } from '../io.ts';

/** `roundwise analyze` — not built yet. */
export async function run(_args: string[], io: CliIO): Promise<number> {
  io.stderr('roundwise analyze: not available yet\n');
  return 3;
}
