// A migrated, empty embedded database made once (by `npm run build`, or by the first `npm start`
// that finds none) and copied into an empty data folder when a server opens it: creating an
// embedded database (initdb inside PGlite) and migrating it is most of a cold start, copying a
// made one takes a fraction of it. The template is kept per PGlite version and per migrations
// content, so a new migration or a new PGlite makes a new one; the server then migrates the copy
// as usual (nothing left to apply). A data folder that already holds a database is never touched.
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { createRequire } from 'node:module';
import { PGlite } from '@electric-sql/pglite';
import { drizzle } from 'drizzle-orm/pglite';
import { migrate } from 'drizzle-orm/pglite/migrator';
import { MIGRATIONS_FOLDER } from './migrate';

const ROOT = path.resolve(import.meta.dirname, '..', '..');
/** Where templates are kept (a build cache beside the installed packages; not in the repository). */
export const TEMPLATE_ROOT = path.join(ROOT, 'node_modules', '.cache', 'lullwatch-db-template');

function filesUnder(dir: string): string[] {
  return fs
    .readdirSync(dir, { withFileTypes: true })
    .flatMap((e) => (e.isDirectory() ? filesUnder(path.join(dir, e.name)) : [path.join(dir, e.name)]))
    .sort();
}

/** The folder of the package.json above a file of an installed package. */
function packageRoot(file: string): string {
  let dir = path.dirname(file);
  while (!fs.existsSync(path.join(dir, 'package.json'))) {
    const up = path.dirname(dir);
    if (up === dir) throw new Error(`no package.json above ${file}`);
    dir = up;
  }
  return dir;
}

/** Key of the current template: the PGlite version and every migration file's name and content. */
export function templateKey(): string {
  const hash = crypto.createHash('sha256');
  // The installed PGlite's own version (its package.json is not among the package's exports).
  const pgliteEntry = createRequire(import.meta.url).resolve('@electric-sql/pglite');
  const pgliteVersion = (JSON.parse(fs.readFileSync(path.join(packageRoot(pgliteEntry), 'package.json'), 'utf8')) as { version: string })
    .version;
  hash.update(`pglite ${pgliteVersion}\n`);
  for (const file of filesUnder(MIGRATIONS_FOLDER)) {
    hash.update(path.relative(MIGRATIONS_FOLDER, file));
    hash.update('\0');
    hash.update(fs.readFileSync(file));
    hash.update('\0');
  }
  return hash.digest('hex').slice(0, 16);
}

/** Folder of the current template (it may not exist yet). */
export function templatePath(): string {
  return path.join(TEMPLATE_ROOT, templateKey());
}

/**
 * Makes the current template when it is missing: a new embedded database in a temporary folder,
 * migrated, closed, then renamed into place (so a half-made template is never used). Older
 * templates are removed. Returns the template's folder.
 */
export async function ensureDatabaseTemplate(log: (message: string) => void = () => {}): Promise<string> {
  const target = templatePath();
  if (fs.existsSync(path.join(target, 'PG_VERSION'))) return target;
  fs.mkdirSync(TEMPLATE_ROOT, { recursive: true });
  log('Making the empty database template (once per migrations change)...');
  const tmp = fs.mkdtempSync(path.join(TEMPLATE_ROOT, 'making-'));
  try {
    const pglite = new PGlite({ dataDir: tmp });
    await pglite.waitReady;
    await migrate(drizzle({ client: pglite, casing: 'snake_case' }), { migrationsFolder: MIGRATIONS_FOLDER });
    await pglite.close();
    try {
      fs.renameSync(tmp, target);
    } catch (err) {
      // Another process made it meanwhile: use theirs.
      if (!fs.existsSync(path.join(target, 'PG_VERSION'))) throw err;
    }
  } finally {
    fs.rmSync(tmp, { recursive: true, force: true });
  }
  for (const name of fs.readdirSync(TEMPLATE_ROOT)) {
    if (name !== path.basename(target) && !name.startsWith('making-'))
      fs.rmSync(path.join(TEMPLATE_ROOT, name), { recursive: true, force: true });
  }
  return target;
}

/**
 * Copies the current template into `dataDir` when that folder is missing or empty and the
 * template exists. Returns true when it copied (false also when the copy failed: the folder is then
 * as before, and the server creates the database itself). The copy goes to a sibling folder first and is
 * renamed into place, so a crash mid-copy leaves no half database behind.
 */
export function copyTemplateIfEmpty(dataDir: string): boolean {
  if (fs.existsSync(dataDir) && fs.readdirSync(dataDir).length > 0) return false;
  const source = templatePath();
  if (!fs.existsSync(path.join(source, 'PG_VERSION'))) return false;
  const staging = `${dataDir}.from-template-${process.pid}`;
  try {
    fs.rmSync(staging, { recursive: true, force: true });
    fs.cpSync(source, staging, { recursive: true });
    fs.rmSync(dataDir, { recursive: true, force: true });
    fs.renameSync(staging, dataDir);
    return true;
  } catch {
    // Only a speed-up: on any failure the server creates the database itself, as without a template.
    fs.rmSync(staging, { recursive: true, force: true });
    return false;
  }
}
