import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

// Issue 17: every script in package.json is listed in the README ("Every npm script"), and the
// README lists no script that does not exist (the old `npm run seed` pointed at a missing file).
const ROOT = path.resolve(import.meta.dirname, '../..');

/** Script names in the rows of the README's "Every npm script" table. */
export function readmeScripts(readme: string): string[] {
  const start = readme.indexOf('### Every npm script');
  if (start < 0) throw new Error('README.md has no "### Every npm script" section');
  const rest = readme.slice(start);
  const end = rest.slice(1).search(/\n#{1,3} /);
  const section = end < 0 ? rest : rest.slice(0, end + 1);
  const names: string[] = [];
  for (const line of section.split('\n')) {
    const m = /^\|\s*`npm (?:run ([\w:.-]+)|(start|test))\b[^`]*`\s*\|/.exec(line);
    if (m) names.push(m[1] ?? m[2]);
  }
  return names;
}

describe('README lists every npm script (issue 17)', () => {
  it('reads the table rows (the check can fail)', () => {
    const table =
      '### Every npm script\n\n| script | what |\n|---|---|\n| `npm start` | a |\n| `npm run db:backup [file]` | b |\n| `npm test` | c |\n\n## Next\n| `npm run later` | d |\n';
    expect(readmeScripts(table)).toEqual(['start', 'db:backup', 'test']);
  });

  it('lists exactly the scripts of package.json', () => {
    const pkg = JSON.parse(fs.readFileSync(path.join(ROOT, 'package.json'), 'utf8')) as { scripts: Record<string, string> };
    const listed = readmeScripts(fs.readFileSync(path.join(ROOT, 'README.md'), 'utf8'));
    expect([...listed].sort()).toEqual(Object.keys(pkg.scripts).sort());
    expect(new Set(listed).size).toBe(listed.length);
  });

  it('has no script that runs a file that is not there', () => {
    const pkg = JSON.parse(fs.readFileSync(path.join(ROOT, 'package.json'), 'utf8')) as { scripts: Record<string, string> };
    for (const [name, command] of Object.entries(pkg.scripts)) {
      for (const m of command.matchAll(/\btsx(?: watch)? ([\w./-]+\.ts)\b/g)) {
        expect(fs.existsSync(path.join(ROOT, m[1])), `${name}: ${m[1]}`).toBe(true);
      }
    }
  });
});
