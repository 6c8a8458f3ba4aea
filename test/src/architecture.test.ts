// The import rules of eslint.config.js, checked on deliberately wrong code (common practice, no source:
// these are the project's own architecture rules, so the "reference" is the rule text itself).
import { describe, it, expect } from 'vitest';
import { ESLint } from 'eslint';
import tseslint from 'typescript-eslint';
import { fileURLToPath } from 'node:url';
// @ts-expect-error -- the lint config is plain JavaScript without type declarations
import { ENGINE_LAYERS, frontEndRule } from '../../eslint.config.js';

const root = fileURLToPath(new URL('../..', import.meta.url));
const eslint = new ESLint({ cwd: root, overrideConfigFile: 'eslint.config.js' });

async function ruleIds(code: string, filePath: string, linter = eslint): Promise<string[]> {
  const [result] = await linter.lintText(code, { filePath });
  return (result?.messages ?? []).map((m) => m.ruleId ?? m.message);
}

/** One import of `spec` from a file at `filePath`, used so the unused-variable rule stays quiet. */
const importing = (spec: string) => `import { x } from '${spec}';\nexport const y = x;\n`;
const importingType = (spec: string) => `import type { X } from '${spec}';\nexport type Y = X;\n`;

describe('import rules', () => {
  it('refuses renderer → main', async () => {
    expect(await ruleIds(importing('../main/window.ts'), 'renderer/bad.ts')).toContain('no-restricted-imports');
  });
  it('refuses main → renderer', async () => {
    expect(await ruleIds(importing('../renderer/App.ts'), 'main/bad.ts')).toContain('no-restricted-imports');
  });
  it('refuses Node built-ins in the engine', async () => {
    expect(await ruleIds("import { readFileSync } from 'node:fs';\nexport const y = readFileSync;\n", 'src/model/bad.ts')).toContain('no-restricted-imports');
  });
  it('refuses DOM and Node globals in the engine', async () => {
    expect(await ruleIds('export const y = document.title;\n', 'src/model/bad.ts')).toContain('no-restricted-globals');
    expect(await ruleIds('export const y = process.argv;\n', 'src/table/bad.ts')).toContain('no-restricted-globals');
  });
  it('refuses the engine importing the UI', async () => {
    expect(await ruleIds(importing('../../renderer/state.ts'), 'src/model/bad.ts')).toContain('no-restricted-imports');
  });
  it('routes zod through src/schema (jitless under the desktop CSP)', async () => {
    expect(await ruleIds("import { z } from 'zod';\nexport const y = z;\n", 'src/table/bad.ts')).toContain('no-restricted-imports');
    expect(await ruleIds("import { z } from 'zod';\nexport const y = z;\n", 'src/cli/bad.ts')).toContain('no-restricted-imports');
    expect(await ruleIds("import { z } from '../schema/index.ts';\nexport const y = z;\n", 'src/table/ok.ts')).toEqual([]);
  });
  it('allows Node built-ins and process in the CLI and the study layer in the renderer', async () => {
    expect(await ruleIds("import { readFileSync } from 'node:fs';\nexport const y = readFileSync;\n", 'src/cli/ok.ts')).toEqual([]);
    expect(await ruleIds('export const y = process.argv;\n', 'src/cli/ok.ts')).toEqual([]);
    expect(await ruleIds(importing('../src/study/index.ts'), 'renderer/ok.ts')).toEqual([]);
  });
});

describe('engine layers import downward only', () => {
  it('orders the engine folders diagnostics/schema → … → study → cli', () => {
    expect(ENGINE_LAYERS).toEqual([
      ['diagnostics', 'schema'], ['csv', 'linalg', 'bridge'], ['table'], ['model', 'classification'], ['scenario', 'regional'],
      ['report', 'project', 'sut'], ['uncertainty'], ['deliverables'], ['study', 'node-io'], ['cli'],
    ]);
  });
  it.each([
    ['src/table/bad.ts', '../report/index.ts'],
    ['src/regional/bad.ts', '../report/index.ts'],
    ['src/linalg/bad.ts', '../table/index.ts'],
    ['src/model/bad.ts', '../scenario/index.ts'],
    ['src/report/bad.ts', '../study/index.ts'],
    ['src/study/bad.ts', '../cli/index.ts'],
    ['src/uncertainty/bad.ts', '../study/index.ts'],
    ['src/report/bad.ts', '../uncertainty/index.ts'],
    ['src/sut/bad.ts', '../study/index.ts'],
    ['src/deliverables/bad.ts', '../study/index.ts'],
    ['src/report/bad.ts', '../deliverables/index.ts'],
    ['src/classification/bad.ts', '../regional/index.ts'],
    ['src/diagnostics/bad.ts', '../schema/index.ts'],
  ])('refuses %s importing %s (upward or sideways)', async (file, spec) => {
    expect(await ruleIds(importing(spec), file)).toContain('no-restricted-imports');
  });
  it.each([
    ['src/scenario/bad.ts', '../regional/index.ts'],
    ['src/regional/bad.ts', '../scenario/index.ts'],
    ['src/project/bad.ts', '../report/index.ts'],
    ['src/sut/bad.ts', '../report/index.ts'],
    ['src/classification/bad.ts', '../model/index.ts'],
  ])('refuses peers of one layer importing each other: %s → %s', async (file, spec) => {
    expect(await ruleIds(importing(spec), file)).toContain('no-restricted-imports');
  });
  it.each([
    ['src/table/ok.ts', '../csv/index.ts'],
    ['src/model/ok.ts', '../table/index.ts'],
    ['src/scenario/ok.ts', '../model/index.ts'],
    ['src/report/ok.ts', '../scenario/index.ts'],
    ['src/study/ok.ts', '../report/index.ts'],
    ['src/sut/ok.ts', '../regional/index.ts'],
    ['src/study/ok.ts', '../sut/index.ts'],
    ['src/scenario/ok.ts', '../classification/index.ts'],
    ['src/cli/commands/ok.ts', '../../study/index.ts'],
    ['src/cli/ok.ts', '../table/index.ts'],
  ])('allows %s importing %s (downward)', async (file, spec) => {
    expect(await ruleIds(importing(spec), file)).toEqual([]);
  });
  it('refuses an engine folder that is not placed in the order from importing the engine', async () => {
    expect(await ruleIds(importing('../table/index.ts'), 'src/unplaced/bad.ts')).toContain('no-restricted-imports');
    expect(await ruleIds('export const y = document.title;\n', 'src/unplaced/bad.ts')).toContain('no-restricted-globals');
  });
});

describe('folders are entered through their index.ts', () => {
  it('refuses another folder\'s internals from inside the engine', async () => {
    expect(await ruleIds(importing('../model/prepared.ts'), 'src/scenario/bad.ts')).toContain('no-restricted-imports');
    expect(await ruleIds(importing('../../model/analysis.ts'), 'src/cli/commands/bad.ts')).toContain('no-restricted-imports');
  });
  it('allows a folder\'s own modules', async () => {
    expect(await ruleIds(importing('./prepared.ts'), 'src/model/ok.ts')).toEqual([]);
    expect(await ruleIds(importing('../io.ts'), 'src/cli/commands/ok.ts')).toEqual([]);
  });
  it('refuses engine internals from the UI, the shell and shared tests', async () => {
    expect(await ruleIds(importing('../src/model/analysis.ts'), 'renderer/bad.ts')).toContain('no-restricted-imports');
    expect(await ruleIds(importing('../src/diagnostics/errors.ts'), 'main/bad.ts')).toContain('no-restricted-imports');
    expect(await ruleIds(importing('../../src/table/types.ts'), 'test/support/bad.ts')).toContain('no-restricted-imports');
    expect(await ruleIds(importing('../../src/cli/main.ts'), 'test/renderer/bad.test.ts')).toContain('no-restricted-imports');
  });
  it('lets a test under test/src/<folder>/ import that folder\'s modules, and only that folder\'s', async () => {
    expect(await ruleIds(importing('../../../src/model/prepared.ts'), 'test/src/model/ok.test.ts')).toEqual([]);
    expect(await ruleIds(importing('../../../src/table/types.ts'), 'test/src/model/bad.test.ts')).toContain('no-restricted-imports');
  });
  it('keeps every bridge file public (the sandboxed preload bundles only what it uses)', async () => {
    expect(await ruleIds(importing('../src/bridge/contract.ts'), 'main/ok.ts')).toEqual([]);
    expect(await ruleIds(importing('../../src/bridge/files.ts'), 'renderer/bridge/ok.ts')).toEqual([]);
  });
});

describe('front ends through one engine layer (FRONT_END_ENGINE)', () => {
  // The same rule as eslint.config.js builds, with only src/study and src/bridge allowed.
  const studyOnly = new ESLint({
    cwd: root,
    overrideConfigFile: true,
    overrideConfig: [
      { files: ['**/*.ts'], languageOptions: { parser: tseslint.parser }, plugins: { '@typescript-eslint': tseslint.plugin } },
      { files: ['renderer/**/*.ts'], rules: frontEndRule('outside', ['study', 'bridge']) },
      { files: ['src/cli/commands/**/*.ts'], rules: frontEndRule('engine', ['study', 'bridge']) },
    ],
  });
  it('refuses values from other engine folders, from the UI and from CLI commands', async () => {
    expect(await ruleIds(importing('../src/model/index.ts'), 'renderer/bad.ts', studyOnly)).toContain('@typescript-eslint/no-restricted-imports');
    expect(await ruleIds(importing('../../model/index.ts'), 'src/cli/commands/bad.ts', studyOnly)).toContain('@typescript-eslint/no-restricted-imports');
  });
  it('allows the study layer, the bridge and type-only imports', async () => {
    expect(await ruleIds(importing('../src/study/index.ts'), 'renderer/ok.ts', studyOnly)).toEqual([]);
    expect(await ruleIds(importing('../src/bridge/contract.ts'), 'renderer/ok.ts', studyOnly)).toEqual([]);
    expect(await ruleIds(importingType('../src/model/index.ts'), 'renderer/ok.ts', studyOnly)).toEqual([]);
    expect(await ruleIds(importing('../io.ts'), 'src/cli/commands/ok.ts', studyOnly)).toEqual([]);
  });
  it('is switched on in the repository\'s own config: the UI and the CLI commands reach the engine only through src/study', async () => {
    expect(await ruleIds(importing('../src/model/index.ts'), 'renderer/bad.ts')).toContain('@typescript-eslint/no-restricted-imports');
    expect(await ruleIds(importing('../../table/index.ts'), 'src/cli/commands/bad.ts')).toContain('@typescript-eslint/no-restricted-imports');
    expect(await ruleIds(importing('../../study/index.ts'), 'src/cli/commands/ok.ts')).toEqual([]);
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
