// Lint and import rules for the whole repository (run from the repository root: `eslint -c test/eslint.config.js .`).
// The import rules make the architecture machine-checked: src/ is a pure engine, renderer/ and main/ sit on top of it
// and only meet through the typed bridge contract in src/bridge/.
import tseslint from 'typescript-eslint';
import pluginVue from 'eslint-plugin-vue';

const nodeModules = ['node:*', 'fs', 'fs/*', 'path', 'os', 'child_process', 'worker_threads', 'crypto', 'url', 'util', 'stream', 'events', 'http', 'https', 'net'];
const engineGlobals = ['window', 'document', 'navigator', 'localStorage', 'sessionStorage', 'process', 'require', 'Buffer', '__dirname', '__filename', 'global'];

export const importRules = {
  engine: {
    'no-restricted-imports': ['error', {
      patterns: [
        { group: nodeModules, message: 'src/ is the pure engine: no Node built-ins outside src/cli and src/node-io.' },
        { group: ['**/node-io', '**/node-io/**'], message: 'src/node-io is Node I/O for src/cli and main/ only; the engine stays pure.' },
        { group: ['electron', 'vue', 'chart.js', 'chart.js/*'], message: 'src/ is the pure engine: no UI or Electron packages.' },
        { group: ['zod'], message: "import z from src/schema/zod.ts (it sets jitless for the desktop CSP)." },
        { group: ['**/renderer', '**/renderer/**', '**/main/**'], message: 'src/ must not import renderer/ or main/ (imports go downward only).' },
      ],
    }],
    'no-restricted-globals': ['error', ...engineGlobals.map((name) => ({ name, message: `src/ is the pure engine: no DOM or Node global '${name}'.` }))],
  },
  cli: {
    'no-restricted-imports': ['error', {
      patterns: [
        { group: ['electron', 'vue', 'chart.js'], message: 'The CLI is headless: no UI or Electron packages.' },
        { group: ['**/renderer', '**/renderer/**', '**/main/**'], message: 'src/cli and src/node-io must not import renderer/ or main/.' },
      ],
    }],
  },
  renderer: {
    'no-restricted-imports': ['error', {
      patterns: [
        { group: [...nodeModules, 'electron'], message: 'renderer/ is browser code: reach the desktop only through the bridge (src/bridge).' },
        { group: ['**/node-io', '**/node-io/**'], message: 'renderer/ is browser code: src/node-io is for src/cli and main/ only.' },
        { group: ['**/main', '**/main/**'], message: 'renderer/ must not import main/: use the typed bridge in src/bridge.' },
      ],
    }],
  },
  main: {
    'no-restricted-imports': ['error', {
      patterns: [
        { group: ['**/renderer', '**/renderer/**', 'vue', 'chart.js'], message: 'main/ must not import renderer/: use the typed bridge in src/bridge.' },
      ],
    }],
  },
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
  { files: ['src/**/*.ts'], ignores: ['src/cli/**', 'src/node-io/**'], rules: importRules.engine },
  { files: ['src/cli/**/*.{ts,mjs}', 'src/node-io/**/*.ts'], rules: importRules.cli },
  { files: ['src/schema/zod.ts'], rules: { 'no-restricted-imports': 'off' } },
  { files: ['renderer/**/*.{ts,vue}'], ignores: ['renderer/vite.config.ts'], rules: importRules.renderer },
  { files: ['main/**/*.{ts,mjs}'], rules: importRules.main },
);
