// The built client (dist/) is rebuilt when it is missing or older than its sources: `npm start`
// and `npm run bench:load` both serve it.
import fs from 'node:fs';
import path from 'node:path';
import { spawnSync } from 'node:child_process';

/** Newest modification time of a file or of anything under a folder, ms; 0 when it is missing. */
export function newestMtime(entry: string): number {
  const stat = fs.statSync(entry, { throwIfNoEntry: false });
  if (!stat) return 0;
  if (!stat.isDirectory()) return stat.mtimeMs;
  let newest = stat.mtimeMs;
  for (const name of fs.readdirSync(entry)) newest = Math.max(newest, newestMtime(path.join(entry, name)));
  return newest;
}

/** Runs `vite build` in `root` when dist/index.html is missing or older than the client's sources; throws when the build fails. */
export function buildClientIfStale(root: string, log: (message: string) => void = console.log): void {
  const sources = ['src', 'shared', 'index.html', 'vite.config.ts', 'package.json'].map((p) => path.join(root, p));
  const builtAt = fs.statSync(path.join(root, 'dist', 'index.html'), { throwIfNoEntry: false })?.mtimeMs ?? 0;
  if (builtAt >= Math.max(...sources.map(newestMtime))) return;
  log('Building the client (dist/ is missing or older than its sources)...');
  const result = spawnSync(process.execPath, [path.join(root, 'node_modules/vite/bin/vite.js'), 'build'], { cwd: root, stdio: 'inherit' });
  if (result.status !== 0) throw new Error('the client build failed');
}
