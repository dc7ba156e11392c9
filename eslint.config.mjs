// Lint: typescript-eslint's recommended rules; the rule that keeps the core pure (no `vscode`,
// no file system, no Node built-ins under extension/core); and the layers of the core, each
// folder importing only the folders below it.
import { builtinModules } from 'node:module';
import js from '@eslint/js';
import tseslint from 'typescript-eslint';

const NODE_BUILTINS = builtinModules.filter((name) => !name.startsWith('_'));

// The core's layers, bottom up. A folder may import its own files and any folder of a lower rank.
const LAYERS = [
  ['model'],
  ['text', 'numeric'],
  ['scan', 'parse'],
  ['schema'],
  ['block'],
  ['analysis'],
  ['engine'],
  ['charts'],
  ['report'],
];
const rankOf = new Map(LAYERS.flatMap((folders, rank) => folders.map((f) => [f, rank])));
const ALL_FOLDERS = [...rankOf.keys()];
const pure = {
  paths: ['vscode', ...NODE_BUILTINS].map((name) => ({ name, message: 'extension/core is pure: hosts pass what it needs through interfaces.' })),
  patterns: [{ group: ['node:*'], message: 'extension/core is pure: no Node built-ins.' }],
};
const layerRules = ALL_FOLDERS.map((folder) => {
  const above = ALL_FOLDERS.filter((f) => f !== folder && rankOf.get(f) >= rankOf.get(folder));
  return {
    files: [`extension/core/${folder}/**/*.ts`],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          paths: pure.paths,
          patterns: [
            ...pure.patterns,
            ...(above.length > 0 ? [{ group: above.map((f) => `../${f}/*`), message: `extension/core/${folder} may import only the layers below it (see eslint.config.mjs).` }] : []),
            { group: ['../*.js', '../index.js'], message: 'Import the module you need, not an entry point.' },
          ],
        },
      ],
    },
  };
});

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
    // Node scripts in plain JavaScript.
    files: ['**/*.mjs'],
    languageOptions: { globals: { process: 'readonly', console: 'readonly', Buffer: 'readonly', URL: 'readonly', setTimeout: 'readonly', clearTimeout: 'readonly' } },
  },
  {
    files: ['extension/core/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', pure],
      'no-restricted-globals': ['error', { name: 'process', message: 'extension/core is pure.' }, { name: 'require', message: 'extension/core is pure.' }, { name: 'Buffer', message: 'extension/core is pure.' }],
    },
  },
  ...layerRules,
);
