// `npm run dev`: the API with reload (tsx watch) and the Vite dev server, which proxies /api.
import { spawn } from 'node:child_process';
import path from 'node:path';

const root = path.resolve(import.meta.dirname, '..');
const bin = (name: string) => path.join(root, 'node_modules', '.bin', name);
const children = [
  spawn(bin('tsx'), ['watch', 'server/index.ts'], { cwd: root, stdio: 'inherit', env: { ...process.env, NODE_ENV: 'development' } }),
  spawn(bin('vite'), [], { cwd: root, stdio: 'inherit' }),
];
const stop = () => {
  for (const child of children) child.kill('SIGTERM');
  process.exit(0);
};
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
for (const child of children) child.on('exit', (code) => code && stop());
