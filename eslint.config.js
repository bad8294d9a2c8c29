// Lint rules, and the layer rules of DEVELOPERS.md enforced at error level.
import tseslint from 'typescript-eslint';

const nodeBuiltins = ['node:*', 'fs', 'fs/*', 'path', 'os', 'child_process', 'worker_threads', 'crypto', 'stream', 'url', 'util', 'http', 'net', 'readline', 'zlib'];
const layer = (name, patterns) => ({
  group: patterns,
  message: `Layer rule (DEVELOPERS.md): ${name}`,
});

export default tseslint.config(
  { ignores: ['dist/**', 'node_modules/**', 'test-artifacts/**', '.bench-data/**'] },
  ...tseslint.configs.recommended,
  {
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      'no-console': 'off',
    },
  },
  {
    files: ['src/core/**/*.ts'],
    rules: {
      'no-console': 'error',
      '@typescript-eslint/no-restricted-imports': ['error', {
        patterns: [
          layer('src/core is pure: no Node built-ins (do I/O in src/io).', nodeBuiltins),
          layer('src/core may import only src/core.', ['**/io/**', '**/cli/**', '**/ui/**', '**/electron/**', 'electron', 'better-sqlite3', 'chart.js', 'chart.js/*', 'chartjs-plugin-zoom']),
        ],
      }],
    },
  },
  {
    files: ['src/report/**/*.ts'],
    rules: {
      'no-console': 'error',
      '@typescript-eslint/no-restricted-imports': ['error', {
        patterns: [
          layer('src/report is pure: no Node built-ins.', nodeBuiltins),
          layer('src/report may import only src/core.', ['**/io/**', '**/cli/**', '**/ui/**', '**/electron/**', 'electron', 'better-sqlite3']),
        ],
      }],
    },
  },
  {
    files: ['src/io/**/*.ts'],
    rules: {
      '@typescript-eslint/no-restricted-imports': ['error', {
        patterns: [layer('src/io may import only src/core and libraries.', ['**/cli/**', '**/ui/**', '**/electron/**', 'electron'])],
      }],
    },
  },
  {
    files: ['src/cli/**/*.ts'],
    rules: {
      '@typescript-eslint/no-restricted-imports': ['error', {
        patterns: [layer('src/cli may import src/io and src/core only.', ['**/ui/**', '**/electron/**', 'electron'])],
      }],
    },
  },
  {
    files: ['src/ui/**/*.ts'],
    rules: {
      '@typescript-eslint/no-restricted-imports': ['error', {
        patterns: [
          layer('src/ui runs in the sandboxed renderer: no Node built-ins.', nodeBuiltins),
          layer('src/ui may import src/core and types from electron/ipc.ts only.', ['**/io/**', '**/cli/**', 'better-sqlite3', '**/electron/main*', '**/electron/preload*', '**/electron/handlers/**']),
          // The bare `electron` module only (a plain 'electron' pattern would also block ../electron/ipc).
          { regex: '^electron(/.*)?$', message: 'Layer rule (DEVELOPERS.md): src/ui runs in the sandboxed renderer: no electron module.' },
        ],
      }],
    },
  },
  {
    files: ['electron/preload.ts'],
    rules: {
      '@typescript-eslint/no-restricted-imports': ['error', {
        patterns: [layer('the preload may import only electron and ./ipc.', ['**/src/**', '!./ipc', 'node:*', 'fs', 'path'])],
      }],
    },
  },
);
