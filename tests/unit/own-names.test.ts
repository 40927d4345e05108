import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

// Issue 17: labels and shapes that echoed other programs were renamed. None of the old names may
// come back anywhere in the repository's own code, tests and notes (the words are the issue's own list).
const ROOT = path.resolve(import.meta.dirname, '../..');
const FORBIDDEN: { words: RegExp; why: string }[] = [
  // The name in words or in code (WaveLabPage); the old address /wave-lab stays, as a redirect.
  { words: /wave[\s_]*lab/i, why: 'the section is the Wave calculator' },
  { words: /mail[\s_-]*catcher/i, why: 'say "local mailbox"' },
  { words: /\/v1\/forecast/i, why: 'the forecast exchange is GET /exchange/sea-state (docs/domain.md#forecast-service)' },
];
const TEXT_FILE = /\.(ts|tsx|js|mjs|cjs|json|css|html|md|sql)$/;

function filesUnder(dir: string): string[] {
  const out: string[] = [];
  for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, entry.name);
    if (entry.isDirectory()) out.push(...filesUnder(p));
    else if (TEXT_FILE.test(entry.name)) out.push(p);
  }
  return out;
}

/** `file:line: text` of every line that holds a forbidden name. */
function findings(file: string, text: string): string[] {
  const out: string[] = [];
  text.split('\n').forEach((line, i) => {
    for (const f of FORBIDDEN) if (f.words.test(line)) out.push(`${path.relative(ROOT, file)}:${i + 1}: ${line.trim()} (${f.why})`);
  });
  return out;
}

describe('no old names in the repository (issue 17)', () => {
  it('finds each old name when it is there (the check can fail)', () => {
    expect(findings('x.ts', "label: 'Wave lab'")).toHaveLength(1);
    expect(findings('x.ts', 'export function WaveLabPage()')).toHaveLength(1);
    expect(findings('x.ts', 'the local Mail-Catcher')).toHaveLength(1);
    expect(findings('x.ts', "new URL('v1/forecast', base); // GET /v1/forecast?lat=")).toHaveLength(1);
    expect(findings('x.ts', "label: 'Wave calculator', mailbox, /exchange/sea-state, redirect('/wave-lab')")).toEqual([]);
  });

  it('holds none of them', () => {
    // Every folder of ours but this file, which spells the old names to test the check.
    const files = [
      ...['src', 'server', 'shared', 'jobs', 'scripts', 'seed', 'bench', 'tests', 'docs'].flatMap((d) => filesUnder(path.join(ROOT, d))),
      path.join(ROOT, 'README.md'),
      path.join(ROOT, 'DEVELOPERS.md'),
    ].filter((f) => f !== import.meta.filename && !f.includes(`${path.sep}.artifacts${path.sep}`));
    expect(files.length).toBeGreaterThan(100);
    const found = files.flatMap((f) => findings(f, fs.readFileSync(f, 'utf8')));
    expect(found).toEqual([]);
  });
});
