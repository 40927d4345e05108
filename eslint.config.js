import fs from 'node:fs';
import path from 'node:path';
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';
import { importX } from 'eslint-plugin-import-x';
import { createTypeScriptImportResolver } from 'eslint-import-resolver-typescript';
import pluginQuery from '@tanstack/eslint-plugin-query';
import globals from 'globals';

/** Browser globals that code outside the client must never touch. */
const BROWSER_ONLY_GLOBALS = ['window', 'document', 'navigator', 'localStorage', 'sessionStorage', 'location', 'history'].map((name) => ({
  name,
  message: 'Browser global outside the client: server, jobs, scripts, seed and shared code run in Node.',
}));

/**
 * The project's lint rules for a repository rooted at `rootDir`. The same rules lint the small bad
 * fixtures in tests/lint-fixtures (tests/lint/boundaries.test.ts), so they are shown to fail.
 *
 * Boundaries:
 * - a feature (src/features/<name>) never imports another feature: features share through
 *   src/api, src/lib and src/components, and src/app composes them;
 * - shared/ imports nothing outside shared/ (and no React, Express or database code);
 * - the client never imports server/, jobs/ or seed/;
 * - server/ never imports jobs/ or seed/, except the composition root;
 * - jobs/ uses services, never routes;
 * - no import cycles;
 * - promises in async Express and React code are awaited or handled (type-aware rules).
 */
export function lullwatchConfig(rootDir) {
  const featuresDir = path.join(rootDir, 'src/features');
  const features = fs.existsSync(featuresDir)
    ? fs
        .readdirSync(featuresDir, { withFileTypes: true })
        .filter((d) => d.isDirectory())
        .map((d) => d.name)
    : [];

  return tseslint.config(
    {
      ignores: [
        'dist/**',
        'data/**',
        'node_modules/**',
        'server/db/migrations/**',
        'tests/.artifacts/**',
        'tests/lint-fixtures/**',
        'bench/.out/**',
      ],
    },
    js.configs.recommended,
    ...tseslint.configs.recommended,
    {
      files: ['**/*.{ts,tsx}'],
      plugins: { 'import-x': importX },
      languageOptions: {
        globals: { ...globals.node, ...globals.browser },
        parserOptions: { projectService: true, tsconfigRootDir: rootDir },
      },
      settings: {
        'import-x/extensions': importX.flatConfigs.typescript.settings['import-x/extensions'],
        'import-x/external-module-folders': importX.flatConfigs.typescript.settings['import-x/external-module-folders'],
        'import-x/parsers': importX.flatConfigs.typescript.settings['import-x/parsers'],
        'import-x/resolver-next': [createTypeScriptImportResolver({ project: path.join(rootDir, 'tsconfig.json') })],
      },
      rules: {
        '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
        '@typescript-eslint/no-explicit-any': 'warn',
        '@typescript-eslint/no-floating-promises': 'error',
        // React event handlers may be async (their promise is handled inside); everything else may not.
        '@typescript-eslint/no-misused-promises': ['error', { checksVoidReturn: { attributes: false } }],
        'import-x/no-cycle': ['error', { ignoreExternal: true }],
        'import-x/no-restricted-paths': [
          'error',
          {
            basePath: rootDir,
            zones: [
              ...features.map((feature) => ({
                target: `./src/features/${feature}`,
                from: './src/features',
                except: [`./${feature}`],
                message: 'A feature never imports another feature: share through src/api, src/lib or src/components.',
              })),
              {
                target: './shared',
                from: ['./src', './server', './jobs', './seed', './scripts', './bench', './tests'],
                message: 'shared/ is used by both sides: it imports nothing outside shared/.',
              },
              { target: './src', from: ['./server', './jobs', './seed'], message: 'The client never imports server, job or seed code.' },
              { target: './jobs', from: './server/routes', message: 'jobs/ calls services, never routes.' },
            ],
          },
        ],
      },
    },
    {
      files: ['**/*.js'],
      languageOptions: { globals: { ...globals.node } },
    },
    {
      files: ['src/**/*.{ts,tsx}'],
      plugins: { 'react-hooks': reactHooks },
      rules: {
        ...reactHooks.configs.recommended.rules,
      },
    },
    ...pluginQuery.configs['flat/recommended'].map((c) => ({ ...c, files: ['src/**/*.{ts,tsx}'] })),
    {
      files: ['shared/**/*.ts'],
      rules: {
        'no-restricted-imports': [
          'error',
          { patterns: ['react', 'react-dom', 'react/*', 'express', 'drizzle-orm', 'drizzle-orm/*', 'node:*'] },
        ],
      },
    },
    {
      // The composition root (server/composition-root.ts) is the one server file that wires in
      // the scheduled jobs and the demo seed.
      files: ['server/**/*.{ts,tsx}'],
      ignores: ['server/composition-root.ts'],
      rules: {
        'no-restricted-imports': [
          'error',
          { patterns: [{ group: ['**/jobs/**', '**/seed/**'], message: 'Only server/composition-root.ts wires in jobs/ and seed/.' }] },
        ],
      },
    },
    {
      files: ['server/**/*.{ts,tsx}', 'jobs/**/*.ts', 'shared/**/*.ts', 'scripts/**/*.ts', 'seed/**/*.ts'],
      languageOptions: { globals: { ...globals.node } },
      rules: { 'no-restricted-globals': ['error', ...BROWSER_ONLY_GLOBALS] },
    },
  );
}

export default lullwatchConfig(import.meta.dirname);
