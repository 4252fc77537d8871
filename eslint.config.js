// @ts-check
import js from '@eslint/js';
import tseslint from 'typescript-eslint';

export default tseslint.config(
  { ignores: ['dist/**', '.tsbuild/**', 'node_modules/**', 'coverage/**'] },
  js.configs.recommended,
  ...tseslint.configs.strict,
  {
    files: ['**/*.{ts,tsx}'],
    rules: {
      '@typescript-eslint/consistent-type-imports': 'error',
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_' }],
    },
  },
  {
    // The grading core stays pure: no platform globals sneak in through lint gaps either.
    files: ['src/domain/**/*.ts'],
    rules: {
      'no-restricted-globals': [
        'error',
        'window',
        'document',
        'indexedDB',
        'fetch',
        'localStorage',
        'process',
      ],
      'no-restricted-imports': ['error', { patterns: ['node:*', 'fs', 'path', 'preact*', 'idb', 'comlink'] }],
    },
  },
);
