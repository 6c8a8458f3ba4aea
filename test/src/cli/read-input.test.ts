// Every command reads its inputs through one reader (src/node-io readFileLimited, via the run context): a missing file, a folder and an
// oversized file (a sparse file over the importer's stated limit, MAX_TABLE_BYTES) are located one-line refusals,
// for a table and for the small side files alike (common practice, no source: the limit is the project's own).
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync, truncateSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { MAX_TABLE_BYTES } from '../../../src/table/index.ts';
import { runCli } from '../../support/cli.ts';

let dir: string;
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'rw-read-'));
  writeFileSync(join(dir, 'huge.csv'), '');
  truncateSync(join(dir, 'huge.csv'), MAX_TABLE_BYTES + 1); // sparse: no disk space used
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const run = (...args: string[]) => runCli(args);

describe('CLI input files', () => {
  it('an oversized side file is refused by its size, before it is read', async () => {
    const r = await run('regionalize', 'sample-data/national-table.csv', '--employment', join(dir, 'huge.csv'), '--method', 'slq');
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/huge\.csv.*limit/);
    expect(r.err.trim().split('\n').length).toBeLessThanOrEqual(3);
    const s = await run('scenario', 'sample-data/fernhollow-county.csv', '--shock', join(dir, 'huge.csv'));
    expect(s.code).toBe(2);
    expect(s.err).toMatch(/huge\.csv.*limit/);
  });

  it('a folder and a missing file are named as such', async () => {
    const folder = await run('aggregate', dir, '--groups', 'sample-data/fernhollow-groups.csv');
    expect(folder.code).toBe(2);
    expect(folder.err).toMatch(/is a folder, not a file/);
    const missing = await run('analyze', join(dir, 'absent.csv'));
    expect(missing.code).toBe(2);
    expect(missing.err).toMatch(/absent\.csv: no such file/);
  });
  it('devices and FIFOs as table, --map or --project are refused at once, without reading or blocking', async () => {
    const { execFileSync } = await import('node:child_process');
    const fifo = join(dir, 'pipe.csv');
    execFileSync('mkfifo', [fifo]);
    const runs = [
      ['analyze', fifo],
      ['analyze', 'sample-data/fernhollow-county.csv', '--map', '/dev/zero'],
      ['scenario', 'sample-data/fernhollow-county.csv', '--shock', 'sample-data/fernhollow-food-plant.csv', '--project', '/dev/zero'],
    ];
    for (const args of runs) {
      const r = await run(...args);
      expect(r.code, r.err).toBe(2);
      expect(r.err).toMatch(/not a regular file/);
    }
  });
});
