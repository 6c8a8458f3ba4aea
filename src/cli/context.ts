/** The run context a command's `run` gets: its inputs read through src/node-io and remembered, role maps, warnings. */
import { createHash } from 'node:crypto';
import { basename } from 'node:path';
import { visibleText } from '../diagnostics/index.ts';
import { readFileLimited, type FileIdentity } from '../node-io/index.ts';
import { parseRoleMap, type RoleMap } from '../table/index.ts';
import type { CommandSpec, InputFile, RunContext } from './command.ts';
import { usageError } from './parse.ts';
import type { CliIO } from './io.ts';

/** SHA-256 by Node's crypto (the engine's sha256Hex uses it during a run: main.ts). */
export function nodeSha256(data: Uint8Array): string {
  return createHash('sha256').update(data).digest('hex');
}

class LoadedInput implements InputFile {
  readonly name: string;
  constructor(readonly path: string, readonly bytes: Uint8Array) {
    this.name = basename(path);
  }
  get text(): string {
    return new TextDecoder('utf-8').decode(this.bytes);
  }
  get sha256(): string {
    return nodeSha256(this.bytes);
  }
}

export class CommandRun implements RunContext {
  /** Identities (not contents) of every file read, so outputs can be checked against them. */
  readonly inputs: FileIdentity[] = [];
  readonly date = new Date().toISOString();

  constructor(private readonly spec: CommandSpec, private readonly io: CliIO) {}

  input(path: string, opts: { into?: (bytes: number) => Uint8Array | null } = {}): InputFile {
    const r = readFileLimited(path, opts.into ? { into: opts.into } : {});
    this.inputs.push({ path: r.path, dev: r.dev, ino: r.ino });
    return new LoadedInput(path, r.bytes);
  }

  roleMap(path: string | undefined): Partial<RoleMap> | undefined {
    return path === undefined ? undefined : parseRoleMap(this.input(path).text, path);
  }

  usageError(message: string): Error {
    return usageError(this.spec, message);
  }

  warn(message: string): void {
    this.io.stderr(`roundwise ${this.spec.name}: warning: ${visibleText(message)}\n`);
  }
}
