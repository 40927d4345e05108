import path from 'node:path';
import { defineConfig, type Plugin } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { describeFirstPage, firstPageSize } from './scripts/lib/first-page';

/** Prints the first page's gzipped script total after every build (see scripts/lib/first-page.ts). */
function firstPageReport(): Plugin {
  let outDir = 'dist';
  return {
    name: 'lullwatch-first-page',
    apply: 'build',
    configResolved(config) {
      outDir = path.resolve(config.root, config.build.outDir);
    },
    closeBundle() {
      console.log(describeFirstPage(firstPageSize(outDir)));
    },
  };
}

export default defineConfig({
  plugins: [react(), tailwindcss(), firstPageReport()],
  server: {
    port: 5173,
    proxy: { '/api': 'http://127.0.0.1:3000' },
  },
  build: {
    outDir: 'dist',
    emptyOutDir: true,
    // dist/.vite/manifest.json: read by the first-page budget (not served: the server skips dot folders).
    manifest: true,
    chunkSizeWarningLimit: 900,
  },
});
