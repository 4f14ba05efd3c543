import next from 'eslint-config-next';
import tseslint from 'typescript-eslint';

const config = [
  { ignores: ['.next/**', '.next-test/**', 'node_modules/**', '.data/**', 'test-results/**', 'playwright-report/**'] },
  ...next,
  {
    files: ['**/*.ts', '**/*.tsx'],
    plugins: { '@typescript-eslint': tseslint.plugin },
    // Unused imports and variables are errors: dead code is deleted, not left to mislead.
    rules: { '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_', ignoreRestSiblings: true }] },
  },
];

export default config;
