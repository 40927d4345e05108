import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';

export default tseslint.config(
  { ignores: ['dist/**', 'data/**', 'node_modules/**', 'server/db/migrations/**', 'tests/.artifacts/**', 'bench/.out/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    files: ['**/*.{ts,tsx}'],
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
      ...reactHooks.configs.recommended.rules,
    },
  },
  {
    // shared/ is used by both sides: it must not reach into the client, the server or the jobs.
    files: ['shared/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', { patterns: ['**/src/**', '**/server/**', '**/jobs/**', 'react', 'express', 'drizzle-orm', 'drizzle-orm/*'] }],
    },
  },
  {
    files: ['src/**/*.{ts,tsx}'],
    rules: {
      'no-restricted-imports': ['error', { patterns: ['**/server/**', '**/jobs/**'] }],
    },
  },
);
