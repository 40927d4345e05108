// The lint rules that keep the code's boundaries (eslint.config.js), shown to fail on small bad
// fixtures: a cross-feature import, an import cycle, a floating promise, a browser global in
// server code, and a job importing a route. The fixtures are a miniature repository in
// tests/lint-fixtures, linted with the same `lullwatchConfig` that `npm run lint` uses; the clean
// files beside them must raise nothing, so the rules do not fire on everything.
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { ESLint, type Linter } from 'eslint';
import { beforeAll, describe, expect, it } from 'vitest';

const root = path.resolve(import.meta.dirname, '../lint-fixtures');
const configUrl = pathToFileURL(path.resolve(import.meta.dirname, '../../eslint.config.js')).href;

let byFile: Map<string, Linter.LintMessage[]>;

beforeAll(async () => {
  const { lullwatchConfig } = (await import(configUrl)) as { lullwatchConfig: (rootDir: string) => Linter.Config[] };
  const eslint = new ESLint({ cwd: root, overrideConfigFile: true, overrideConfig: lullwatchConfig(root) });
  const results = await eslint.lintFiles(['.']);
  byFile = new Map(results.map((r) => [path.relative(root, r.filePath).split(path.sep).join('/'), r.messages]));
}, 120_000);

const rules = (file: string): string[] => {
  const messages = byFile.get(file);
  if (!messages) throw new Error(`${file} was not linted`);
  return messages.map((m) => m.ruleId ?? `fatal: ${m.message}`);
};

describe('npm run lint refuses', () => {
  it('a feature importing another feature', () => {
    expect(rules('src/features/alpha/uses-beta.ts')).toEqual(['import-x/no-restricted-paths']);
  });

  it('an import cycle (both files of it)', () => {
    expect(rules('shared/cycle-a.ts')).toEqual(['import-x/no-cycle']);
    expect(rules('shared/cycle-b.ts')).toEqual(['import-x/no-cycle']);
  });

  it('a floating promise', () => {
    expect(rules('server/floating.ts')).toEqual(['@typescript-eslint/no-floating-promises']);
  });

  it('window in server code', () => {
    expect(rules('server/uses-window.ts')).toEqual(['no-restricted-globals']);
  });

  it('a job importing a route', () => {
    expect(rules('jobs/uses-route.ts')).toEqual(['import-x/no-restricted-paths']);
  });

  it('and nothing in the clean fixtures', () => {
    for (const file of ['src/features/beta/labels.ts', 'shared/clean.ts', 'server/awaited.ts', 'server/routes/plan.ts']) {
      expect({ file, rules: rules(file) }).toEqual({ file, rules: [] });
    }
  });
});
