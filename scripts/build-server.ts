// Part of `npm run build`: bundles the server for `npm start` (scripts/lib/server-bundle.ts), when stale.
import path from 'node:path';
import { buildServerBundleIfStale } from './lib/server-bundle';

await buildServerBundleIfStale(path.resolve(import.meta.dirname, '..'));
