// `npm start`: builds the client when it is missing or older than its sources, then starts the
// server on the embedded database (migrations and the demo seed run at start).
import fs from 'node:fs';
import path from 'node:path';
import { spawnSync } from 'node:child_process';

const root = path.resolve(import.meta.dirname, '..');
const builtIndex = path.join(root, 'dist', 'index.html');

function newestMtime(entry: string): number {
  const stat = fs.statSync(entry, { throwIfNoEntry: false });
  if (!stat) return 0;
  if (!stat.isDirectory()) return stat.mtimeMs;
  let newest = stat.mtimeMs;
  for (const name of fs.readdirSync(entry)) newest = Math.max(newest, newestMtime(path.join(entry, name)));
  return newest;
}

const sources = ['src', 'shared', 'index.html', 'vite.config.ts', 'package.json'].map((p) => path.join(root, p));
const builtAt = fs.statSync(builtIndex, { throwIfNoEntry: false })?.mtimeMs ?? 0;
if (builtAt < Math.max(...sources.map(newestMtime))) {
  console.log('[lullwatch] building the client...');
  const result = spawnSync(process.execPath, [path.join(root, 'node_modules/vite/bin/vite.js'), 'build'], {
    cwd: root,
    stdio: 'inherit',
  });
  if (result.status !== 0) process.exit(result.status ?? 1);
}

process.env.NODE_ENV ??= 'production';
await import('../server/index');
