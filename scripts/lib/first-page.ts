// The first page's script weight: the JavaScript a browser must fetch to show the sign-in page and
// the projects list, gzipped. Read from the build's manifest (dist/.vite/manifest.json): the entry
// chunk and every chunk it imports statically, plus the chunks of those two pages when they are
// split off. `npm run build` prints it; tests/unit/first-page-budget.test.ts fails above the budget.
import fs from 'node:fs';
import path from 'node:path';
import zlib from 'node:zlib';

/** At most 150 kB (150,000 bytes, as Vite counts kB) of gzipped JavaScript for the first page. */
export const FIRST_PAGE_BUDGET_BYTES = 150_000;

/** Source modules of the first page's routes besides the entry (sign-in page, projects list). */
export const FIRST_PAGE_MODULES = ['src/features/auth/components/sign-in-page.tsx', 'src/features/projects/components/projects-page.tsx'];

interface ManifestChunk {
  file: string;
  isEntry?: boolean;
  imports?: string[];
}
export type ViteManifest = Record<string, ManifestChunk>;

/** Manifest keys of the chunks the first page loads (entry, the two pages, and their static imports). */
export function firstPageChunks(manifest: ViteManifest): string[] {
  const entries = Object.keys(manifest).filter((k) => manifest[k].isEntry);
  if (entries.length === 0) throw new Error('the build manifest has no entry chunk');
  const seen = new Set<string>();
  const visit = (key: string) => {
    if (seen.has(key) || !manifest[key]) return;
    seen.add(key);
    for (const k of manifest[key].imports ?? []) visit(k);
  };
  for (const k of [...entries, ...FIRST_PAGE_MODULES]) visit(k);
  return [...seen];
}

export interface FirstPageSize {
  files: { file: string; bytes: number; gzipBytes: number }[];
  bytes: number;
  gzipBytes: number;
}

/** Sizes (raw and gzip level 9, as a server would send them) of the first page's JavaScript in a built dist folder. */
export function firstPageSize(distDir: string): FirstPageSize {
  const manifestPath = path.join(distDir, '.vite', 'manifest.json');
  if (!fs.existsSync(manifestPath)) throw new Error(`no build manifest at ${manifestPath}: run npm run build`);
  const manifest = JSON.parse(fs.readFileSync(manifestPath, 'utf8')) as ViteManifest;
  const files = firstPageChunks(manifest)
    .map((k) => manifest[k].file)
    .filter((f) => f.endsWith('.js'))
    .map((file) => {
      const body = fs.readFileSync(path.join(distDir, file));
      return { file, bytes: body.length, gzipBytes: zlib.gzipSync(body, { level: 9 }).length };
    });
  return { files, bytes: files.reduce((a, f) => a + f.bytes, 0), gzipBytes: files.reduce((a, f) => a + f.gzipBytes, 0) };
}

/** One line for the build's output. */
export function describeFirstPage(size: FirstPageSize): string {
  const kb = (b: number) => (b / 1000).toFixed(1);
  const verdict = size.gzipBytes <= FIRST_PAGE_BUDGET_BYTES ? 'met' : 'NOT met';
  return `first page (sign-in and projects list): ${size.files.length} script files, ${kb(size.bytes)} kB, ${kb(size.gzipBytes)} kB gzipped; budget ${kb(FIRST_PAGE_BUDGET_BYTES)} kB gzipped: ${verdict}`;
}
