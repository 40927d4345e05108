// The first page's script weight (a size check on a real build, not a timing): at most 150 kB of
// gzipped JavaScript to show the sign-in page and the projects list, and every other section in
// chunks of its own. The budget is the product's own aim (issue 18), no outside source.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { build } from 'vite';
import { FIRST_PAGE_BUDGET_BYTES, firstPageChunks, firstPageSize, type ViteManifest } from '../../scripts/lib/first-page';

const ROOT = path.resolve(import.meta.dirname, '../..');
let outDir = '';
let manifest: ViteManifest;

beforeAll(async () => {
  // A fresh build into a temporary folder, so a stale dist/ cannot pass or fail the check.
  outDir = fs.mkdtempSync(path.join(os.tmpdir(), 'lullwatch-first-page-'));
  // Vitest sets NODE_ENV=test, which would make Vite bundle React's development build.
  const nodeEnv = process.env.NODE_ENV;
  process.env.NODE_ENV = 'production';
  try {
    await build({
      root: ROOT,
      configFile: path.join(ROOT, 'vite.config.ts'),
      mode: 'production',
      logLevel: 'error',
      build: { outDir, emptyOutDir: true },
    });
  } finally {
    process.env.NODE_ENV = nodeEnv;
  }
  manifest = JSON.parse(fs.readFileSync(path.join(outDir, '.vite', 'manifest.json'), 'utf8')) as ViteManifest;
}, 180_000);

afterAll(() => {
  if (outDir) fs.rmSync(outDir, { recursive: true, force: true });
});

describe('first page weight', () => {
  it('the sign-in page and the projects list need at most 150 kB of gzipped JavaScript', () => {
    const size = firstPageSize(outDir);
    expect(size.files.length).toBeGreaterThan(0);
    expect(size.gzipBytes).toBeLessThanOrEqual(FIRST_PAGE_BUDGET_BYTES);
  });

  it('every project section and the charts are chunks of their own, not in the first page', () => {
    const first = new Set(firstPageChunks(manifest));
    const lazyModules = [
      'src/app/layouts/project-layout.tsx',
      'src/features/board/components/board-page.tsx',
      'src/features/board/components/conditions-page.tsx',
      'src/features/board/components/conditions-charts.tsx',
      'src/features/setup/components/setup-page.tsx',
      'src/features/downtime/components/downtime-page.tsx',
      'src/features/downtime/components/downtime-heatmap.tsx',
      'src/features/alerts/components/alerts-page.tsx',
      'src/features/alerts/components/mailbox-page.tsx',
      'src/features/datasets/components/datasets-page.tsx',
      'src/features/datasets/components/dataset-detail-page.tsx',
      'src/features/datasets/components/dataset-import-page.tsx',
      'src/features/datasets/components/series-chart.tsx',
      'src/features/wave-calculator/components/wave-calculator-page.tsx',
      'src/features/admin/components/people-page.tsx',
      'src/features/projects/components/project-settings-page.tsx',
    ];
    for (const m of lazyModules) {
      expect(manifest[m], `${m} is not a chunk of its own`).toBeDefined();
      expect(first.has(m), `${m} is in the first page`).toBe(false);
    }
  });

  it('counts the static imports of the entry, and not its dynamic ones (a made-up manifest)', () => {
    const made: ViteManifest = {
      'index.html': { file: 'a.js', isEntry: true, imports: ['_b.js'] },
      '_b.js': { file: 'b.js', imports: ['_c.js'] },
      '_c.js': { file: 'c.js' },
      'src/features/board/components/board-page.tsx': { file: 'd.js', imports: ['_c.js'] },
    };
    expect(firstPageChunks(made).sort()).toEqual(['_b.js', '_c.js', 'index.html']);
  });
});
