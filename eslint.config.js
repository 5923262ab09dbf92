import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';

export default tseslint.config(
  { ignores: ['dist/**', 'node_modules/**', 'data/**', 'drizzle/**', 'test-results/**', '.tmp/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      '@typescript-eslint/no-explicit-any': 'warn',
    },
  },
  {
    files: ['src/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks },
    rules: {
      'react-hooks/rules-of-hooks': 'error',
      'react-hooks/exhaustive-deps': 'warn',
      'no-restricted-imports': ['error', { patterns: [{ group: ['**/server/**', 'drizzle-orm', 'drizzle-orm/*', 'express'], message: 'The client must not import server code.' }] }],
    },
  },
  {
    // The engine is pure: no I/O, no clock, no hidden randomness, no framework.
    files: ['shared/engine/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', { patterns: [
        { group: ['**/server/**', '**/src/**', 'react', 'react-*', 'express', 'drizzle-orm', 'drizzle-orm/*', 'node:*', 'fs', 'path', 'crypto'], message: 'shared/engine is pure: it may import only itself, mathjs, jstat and types from shared/schemas.' },
      ] }],
      'no-restricted-properties': ['error',
        { object: 'Math', property: 'random', message: 'Use the seeded generator passed in.' },
        { object: 'Date', property: 'now', message: 'The engine has no clock.' },
      ],
    },
  },
);
