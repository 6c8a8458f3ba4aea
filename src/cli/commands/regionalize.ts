import type { CliIO } from '../io.ts';

/** `roundwise regionalize` — not built yet. */
export async function run(_args: string[], io: CliIO): Promise<number> {
  io.stderr('roundwise regionalize: not available yet\n');
  return 3;
}
