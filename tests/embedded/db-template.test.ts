// The migrated empty database that a first start copies (server/db/template.ts): a copy opens as
// a database with every migration applied and no rows, a folder that already holds something is
// left alone, and the template's key follows the migrations.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { PGlite } from '@electric-sql/pglite';
import { afterAll, describe, expect, it } from 'vitest';
import { MIGRATIONS_FOLDER } from '../../server/db/migrate';
import { copyTemplateIfEmpty, ensureDatabaseTemplate, templateKey, templatePath } from '../../server/db/template';

const dirs: string[] = [];
const tempDir = () => {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lullwatch-template-'));
  dirs.push(dir);
  return dir;
};
afterAll(() => {
  for (const d of dirs) fs.rmSync(d, { recursive: true, force: true });
});

describe('the empty database template', () => {
  it('is copied into a missing folder and opens with every migration applied and no users', { timeout: 300_000 }, async () => {
    expect(await ensureDatabaseTemplate()).toBe(templatePath());
    const dataDir = path.join(tempDir(), 'db');
    expect(copyTemplateIfEmpty(dataDir)).toBe(true);
    const db = new PGlite({ dataDir });
    try {
      const journal = JSON.parse(fs.readFileSync(path.join(MIGRATIONS_FOLDER, 'meta', '_journal.json'), 'utf8')) as { entries: unknown[] };
      const applied = await db.query<{ n: number }>('select count(*)::int as n from drizzle.__drizzle_migrations');
      expect(applied.rows[0].n).toBe(journal.entries.length);
      const users = await db.query<{ n: number }>('select count(*)::int as n from "user"');
      expect(users.rows[0].n).toBe(0);
    } finally {
      await db.close();
    }
  });

  it('leaves a folder that holds anything alone', () => {
    const dataDir = tempDir();
    fs.writeFileSync(path.join(dataDir, 'keep.txt'), 'mine');
    expect(copyTemplateIfEmpty(dataDir)).toBe(false);
    expect(fs.readdirSync(dataDir)).toEqual(['keep.txt']);
  });

  it('has a key of the migrations (and the PGlite version): stable between calls', () => {
    expect(templateKey()).toMatch(/^[0-9a-f]{16}$/);
    expect(templateKey()).toBe(templateKey());
    expect(path.basename(templatePath())).toBe(templateKey());
  });
});
