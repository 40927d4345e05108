// `npm start`: builds the client and bundles the server when they are missing or older than their
// sources, then starts the bundled server on the embedded database (migrations and the demo seed
// run at start).
import path from 'node:path';
import { spawn } from 'node:child_process';
import { buildClientIfStale } from './lib/client-build';
import { buildServerBundleIfStale } from './lib/server-bundle';

const ROOT = path.resolve(import.meta.dirname, '..');
try {
  buildClientIfStale(ROOT, (m) => console.log(`[lullwatch] ${m}`));
} catch (err) {
  console.error(`[lullwatch] ${(err as Error).message}`);
  process.exit(1);
}

// The embedded database: the migrated empty one a first start copies (made by `npm run build`;
// made here when missing).
if (!process.env.DATABASE_URL) {
  const { ensureDatabaseTemplate } = await import('../server/db/template');
  // Only a speed-up: without it the server creates the database itself.
  await ensureDatabaseTemplate((m) => console.log(`[lullwatch] ${m}`)).catch((err: unknown) => {
    console.warn(
      `[lullwatch] No empty database template (${err instanceof Error ? err.message : String(err)}); the server creates the database itself`,
    );
  });
}

// The server runs bundled on plain Node, in a process of its own (no TypeScript loader: a faster
// start); this process waits for it and passes on the signals that stop it.
let bundle: string;
try {
  bundle = (await buildServerBundleIfStale(ROOT, (m) => console.log(`[lullwatch] ${m}`))).entry;
} catch (err) {
  console.error(`[lullwatch] The server bundle failed: ${(err as Error).message}`);
  process.exit(1);
}
const server = spawn(process.execPath, [bundle], {
  stdio: 'inherit',
  env: { ...process.env, NODE_ENV: process.env.NODE_ENV ?? 'production' },
});
for (const signal of ['SIGINT', 'SIGTERM'] as const) process.on(signal, () => server.kill(signal));
server.on('exit', (code, signal) => process.exit(code ?? (signal ? 1 : 0)));
