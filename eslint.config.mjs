// Lint: typescript-eslint's recommended rules, and the rule that keeps the core pure: no
// `vscode`, no file system, no Node built-ins under extension/core.
import js from '@eslint/js';
import tseslint from 'typescript-eslint';

const NODE_BUILTINS = ['assert', 'buffer', 'child_process', 'crypto', 'events', 'fs', 'fs/promises', 'http', 'https', 'module', 'net', 'os', 'path', 'process', 'stream', 'url', 'util', 'worker_threads', 'zlib'];

export default tseslint.config(
  { ignores: ['dist/**', 'node_modules/**', 'test/e2e/code-server/**', '**/*.cjs'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_' }],
      '@typescript-eslint/no-non-null-assertion': 'off',
    },
  },
  {
    files: ['extension/core/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          paths: ['vscode', ...NODE_BUILTINS].map((name) => ({ name, message: 'extension/core is pure: hosts pass what it needs through interfaces.' })),
          patterns: [{ group: ['node:*'], message: 'extension/core is pure: no Node built-ins.' }],
        },
      ],
      'no-restricted-globals': ['error', { name: 'process', message: 'extension/core is pure.' }, { name: 'require', message: 'extension/core is pure.' }, { name: 'Buffer', message: 'extension/core is pure.' }],
    },
  },
);
