// The batch CLI run in process (`main(argv, io)`) with its two streams captured, as the tests of every command use it.
import { main } from '../../src/cli/index.ts';

export interface CliRun {
  code: number;
  out: string;
  err: string;
}

export async function runCli(argv: readonly string[]): Promise<CliRun> {
  let out = '';
  let err = '';
  const code = await main([...argv], { stdout: (s) => { out += s; }, stderr: (s) => { err += s; } });
  return { code, out, err };
}
