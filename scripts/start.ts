// `npm start`: builds the client when it is missing or older than its sources, then starts the
// server on the embedded database (migrations and the demo seed run at start).
import path from 'node:path';
import { buildClientIfStale } from './lib/client-build';

try {
  buildClientIfStale(path.resolve(import.meta.dirname, '..'), (m) => console.log(`[lullwatch] ${m}`));
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

process.env.NODE_ENV ??= 'production';
await import('../server/index');
