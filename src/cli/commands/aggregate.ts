import type { CliIO } from '../io.ts';

/** `roundwise aggregate` — not built yet. */
export async function run(_args: string[], io: CliIO): Promise<number> {
  io.stderr('roundwise aggregate: not available yet\n');
  return 3;
}
