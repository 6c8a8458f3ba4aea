// The import rules of test/eslint.config.js, checked on deliberately wrong code (common practice, no source:
// these are the project's own architecture rules, so the "reference" is the rule text itself).
import { describe, it, expect } from 'vitest';
import { ESLint } from 'eslint';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('../..', import.meta.url));
const eslint = new ESLint({ cwd: root, overrideConfigFile: 'test/eslint.config.js' });

async function ruleIds(code: string, filePath: string): Promise<string[]> {
  const [result] = await eslint.lintText(code, { filePath });
  return (result?.messages ?? []).map((m) => m.ruleId ?? m.message);
}

describe('import rules', () => {
  it('refuses renderer → main', async () => {
    expect(await ruleIds("import { x } from '../main/window.ts';\nexport const y = x;\n", 'renderer/bad.ts')).toContain('no-restricted-imports');
  });
  it('refuses main → renderer', async () => {
    expect(await ruleIds("import { x } from '../renderer/App.ts';\nexport const y = x;\n", 'main/bad.ts')).toContain('no-restricted-imports');
  });
  it('refuses Node built-ins in the engine', async () => {
    expect(await ruleIds("import { readFileSync } from 'node:fs';\nexport const y = readFileSync;\n", 'src/model/bad.ts')).toContain('no-restricted-imports');
  });
  it('refuses DOM and Node globals in the engine', async () => {
    expect(await ruleIds('export const y = document.title;\n', 'src/model/bad.ts')).toContain('no-restricted-globals');
    expect(await ruleIds('export const y = process.argv;\n', 'src/table/bad.ts')).toContain('no-restricted-globals');
  });
  it('refuses the engine importing the UI', async () => {
    expect(await ruleIds("import { x } from '../../renderer/state.ts';\nexport const y = x;\n", 'src/model/bad.ts')).toContain('no-restricted-imports');
  });
  it('routes zod through src/schema/zod.ts (jitless under the desktop CSP)', async () => {
    expect(await ruleIds("import { z } from 'zod';\nexport const y = z;\n", 'src/table/bad.ts')).toContain('no-restricted-imports');
    expect(await ruleIds("import { z } from '../schema/zod.ts';\nexport const y = z;\n", 'src/table/ok.ts')).toEqual([]);
  });
  it('allows Node built-ins in the CLI and the engine in the renderer', async () => {
    expect(await ruleIds("import { readFileSync } from 'node:fs';\nexport const y = readFileSync;\n", 'src/cli/ok.ts')).toEqual([]);
    expect(await ruleIds("import { luFactor } from '../src/linalg/index.ts';\nexport const y = luFactor;\n", 'renderer/ok.ts')).toEqual([]);
  });
  it('keeps src/node-io (Node file I/O) for the CLI and main/ only', async () => {
    const fsImport = "import { readFileSync } from 'node:fs';\nexport const y = readFileSync;\n";
    expect(await ruleIds(fsImport, 'src/node-io/ok.ts')).toEqual([]);
    expect(await ruleIds("import { writeFileAtomic } from '../node-io/index.ts';\nexport const y = writeFileAtomic;\n", 'src/cli/ok.ts')).toEqual([]);
    expect(await ruleIds("import { writeFileAtomic } from '../src/node-io/index.ts';\nexport const y = writeFileAtomic;\n", 'main/ok.ts')).toEqual([]);
    expect(await ruleIds("import { writeFileAtomic } from '../node-io/index.ts';\nexport const y = writeFileAtomic;\n", 'src/model/bad.ts')).toContain('no-restricted-imports');
    expect(await ruleIds("import { writeFileAtomic } from '../../src/node-io/index.ts';\nexport const y = writeFileAtomic;\n", 'renderer/state/bad.ts')).toContain('no-restricted-imports');
  });
});
