import type { CliIO } from '../io.ts';

/** `roundwise scenario` — not built yet. */
export async function run(_args: string[], io: CliIO): Promise<number> {
  io.stderr('roundwise scenario: not available yet\n');
  return 3;
}
