// Lint and import rules for the whole repository (`npm run lint`, or any editor's ESLint integration).
// The import rules make the architecture machine-checked: src/ is a pure engine in layers that import only downward,
// each folder entered through its index.ts; renderer/ and main/ sit on top of it and only meet through the typed
// bridge contract in src/bridge/. test/src/architecture.test.ts shows each rule refusing a wrong import.
import tseslint from 'typescript-eslint';
import pluginVue from 'eslint-plugin-vue';

/**
 * Engine folders (src/<folder>/), lowest layer first. A folder imports only folders of lower layers: never a folder
 * above it, never a peer in its own layer. bridge is the typed contract between the UI and the desktop shell (types,
 * validators, file limits); it needs only the base layer, so it sits just above it, where every layer could use it.
 */
export const ENGINE_LAYERS = [
  ['diagnostics', 'schema'],
  ['csv', 'linalg', 'bridge'],
  ['table'],
  ['model', 'classification'],
  ['scenario', 'regional'],
  ['report', 'project', 'sut'],
  ['uncertainty'],
  ['deliverables'],
  ['study', 'node-io'],
  ['cli'],
];
export const ENGINE_FOLDERS = ENGINE_LAYERS.flat();

/** Folders whose files are each public. bridge: the sandboxed preload must bundle only the bridge files it uses. */
export const OPEN_FOLDERS = ['bridge'];

/**
 * Engine folders allowed Node built-ins (everything else in src/ runs in the browser and the worker too). node-io is
 * the file I/O of src/cli and main/: a peer of study, so no engine folder but cli can import it.
 */
export const NODE_FOLDERS = ['cli', 'node-io'];

/**
 * Engine folders that renderer/ and src/cli/commands/ may import values from (type-only imports are always allowed):
 * the study layer, the typed bridge contract, and the zod wrapper (a library, not engine logic).
 */
export const FRONT_END_ENGINE = ['study', 'bridge', 'schema'];

const nodeModules = ['node:*', 'fs', 'fs/*', 'path', 'os', 'child_process', 'worker_threads', 'crypto', 'url', 'util', 'stream', 'events', 'http', 'https', 'net'];
const engineGlobals = ['window', 'document', 'navigator', 'localStorage', 'sessionStorage', 'process', 'require', 'Buffer', '__dirname', '__filename', 'global'];

const engineGlobalsRule = ['error', ...engineGlobals.map((name) => ({ name, message: `src/ is the pure engine: no DOM or Node global '${name}'.` }))];

const layerOf = (folder) => ENGINE_LAYERS.findIndex((layer) => layer.includes(folder));
const alternatives = (folders) => `(?:${folders.join('|')})`;

/** Relative import from inside src/<folder>/ that reaches another engine folder. */
const fromEngine = (folders) => `^(?:\\.\\./)+${alternatives(folders)}(?:/|$)`;
/** Relative import from inside src/<folder>/ that reaches past another folder's index.ts. */
const engineInternal = (folders) => `^(?:\\.\\./)+${alternatives(folders)}/(?!index\\.ts$)`;
/** Import from outside src/ that reaches past an engine folder's index.ts. */
const outsideInternal = (folders) => `(?:^|/)src/${alternatives(folders)}/(?!index\\.ts$)`;
/** Import from outside src/ that reaches an engine folder at all. */
const outsideAny = (folders) => `(?:^|/)src/${alternatives(folders)}(?:/|$)`;

const indexed = ENGINE_FOLDERS.filter((f) => !OPEN_FOLDERS.includes(f));
const indexMessage = 'Import another engine folder only through its index.ts (its public API).';

/** no-restricted-imports patterns for one engine folder: layering and index-only access. */
export function engineFolderPatterns(folder) {
  const level = layerOf(folder);
  const notBelow = ENGINE_FOLDERS.filter((f) => f !== folder && layerOf(f) >= level);
  const others = indexed.filter((f) => f !== folder);
  const patterns = [];
  if (notBelow.length > 0) {
    patterns.push({
      regex: fromEngine(notBelow),
      message: `Engine layers import downward only: src/${folder} may import ${ENGINE_LAYERS.slice(0, level).flat().join(', ') || 'no other engine folder'} (order in eslint.config.js ENGINE_LAYERS).`,
    });
  }
  if (others.length > 0) patterns.push({ regex: engineInternal(others), message: indexMessage });
  return patterns;
}

/** Patterns refusing internals of engine folders (all but `own`) for code outside src/. */
function outsidePatterns(own = null) {
  return [{ regex: outsideInternal(indexed.filter((f) => f !== own)), message: indexMessage }];
}

const uiPackages = ['electron', 'vue', 'chart.js', 'chart.js/*'];
const outerPatterns = {
  engine: [
    { group: nodeModules, message: 'src/ is the pure engine: no Node built-ins outside src/cli and src/node-io.' },
    { group: uiPackages, message: 'src/ is the pure engine: no UI or Electron packages.' },
    { group: ['zod'], message: 'import z from src/schema (it sets jitless for the desktop CSP).' },
    { group: ['**/renderer', '**/renderer/**', '**/main/**'], message: 'src/ must not import renderer/ or main/ (imports go downward only).' },
  ],
  node: [
    { group: uiPackages, message: 'The CLI is headless: no UI or Electron packages.' },
    { group: ['zod'], message: 'import z from src/schema (it sets jitless for the desktop CSP).' },
    { group: ['**/renderer', '**/renderer/**', '**/main/**'], message: 'src/cli and src/node-io must not import renderer/ or main/.' },
  ],
  renderer: [
    { group: [...nodeModules, 'electron'], message: 'renderer/ is browser code: reach the desktop only through the bridge (src/bridge).' },
    { group: ['**/main', '**/main/**'], message: 'renderer/ must not import main/: use the typed bridge in src/bridge.' },
    { regex: outsideAny(['cli']), message: 'renderer/ must not import the CLI.' },
    { regex: outsideAny(['node-io']), message: 'renderer/ is browser code: src/node-io is for src/cli and main/ only.' },
  ],
  main: [
    { group: ['**/renderer', '**/renderer/**', 'vue', 'chart.js'], message: 'main/ must not import renderer/: use the typed bridge in src/bridge.' },
  ],
};

const restrict = (patterns) => ({ 'no-restricted-imports': ['error', { patterns }] });

/**
 * The front-end rule for renderer/ (`where` 'outside') and src/cli/commands/ (`where` 'engine'): values only from the
 * `allowed` engine folders, types from anywhere. A separate rule id, so it adds to the rules above instead of replacing them.
 */
export function frontEndRule(where, allowed = FRONT_END_ENGINE) {
  const refused = ENGINE_FOLDERS.filter((f) => !allowed.includes(f) && !NODE_FOLDERS.includes(f));
  const patterns = refused.length === 0 ? [] : [{
    regex: where === 'outside' ? outsideAny(refused) : fromEngine(refused),
    allowTypeImports: true,
    message: `The UI and the CLI commands reach the engine through ${allowed.map((f) => `src/${f}`).join(', ')}.`,
  }];
  return { '@typescript-eslint/no-restricted-imports': ['error', { patterns }] };
}

/** Import rules by file group; exported so the architecture test can check them. */
export const importRules = {
  engine: (folder) => ({
    ...restrict([...(NODE_FOLDERS.includes(folder) ? outerPatterns.node : outerPatterns.engine), ...engineFolderPatterns(folder)]),
    'no-restricted-globals': NODE_FOLDERS.includes(folder) ? 'off' : engineGlobalsRule,
  }),
  unplaced: {
    ...restrict([...outerPatterns.engine, { regex: fromEngine(ENGINE_FOLDERS), message: 'Place this src/ folder in ENGINE_LAYERS (eslint.config.js) before it imports other engine folders.' }]),
    'no-restricted-globals': engineGlobalsRule,
  },
  renderer: restrict([...outerPatterns.renderer, ...outsidePatterns()]),
  main: restrict([...outerPatterns.main, ...outsidePatterns()]),
  // Tests enter engine folders through index.ts too; a test under test/src/<folder>/ may import that folder's own
  // modules (white-box tests of one module). Benchmarks and fixture generators (test/bench, test/fixtures) may import anything.
  test: (own) => restrict(outsidePatterns(own)),
};

export default tseslint.config(
  { ignores: ['node_modules/**', '.vite/**', 'dist/**', 'test-output/**', 'bench-results/**', '**/*.d.ts'] },
  ...tseslint.configs.recommended,
  ...pluginVue.configs['flat/recommended'],
  {
    files: ['**/*.vue'],
    languageOptions: { parserOptions: { parser: tseslint.parser, sourceType: 'module' } },
  },
  {
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      'vue/max-attributes-per-line': 'off',
      'vue/singleline-html-element-content-newline': 'off',
      'vue/multi-word-component-names': 'off',
      'vue/html-self-closing': 'off',
    },
  },
  // A folder missing from ENGINE_LAYERS may import no other engine folder until it is placed in the order.
  { files: ['src/**/*.{ts,mjs}'], rules: importRules.unplaced },
  ...ENGINE_FOLDERS.map((folder) => ({ files: [`src/${folder}/**/*.{ts,mjs}`], rules: importRules.engine(folder) })),
  { files: ['src/schema/zod.ts'], rules: { 'no-restricted-imports': 'off' } },
  { files: ['renderer/**/*.{ts,vue}'], ignores: ['renderer/vite.config.ts'], rules: { ...importRules.renderer, ...frontEndRule('outside') } },
  { files: ['src/cli/commands/**/*.ts'], rules: frontEndRule('engine') },
  { files: ['main/**/*.{ts,mjs}'], rules: importRules.main },
  { files: ['test/**/*.ts'], ignores: ['test/bench/**', 'test/fixtures/**'], rules: importRules.test(null) },
  ...ENGINE_FOLDERS.map((folder) => ({ files: [`test/src/${folder}/**/*.ts`], rules: importRules.test(folder) })),
);
