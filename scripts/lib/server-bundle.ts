// The server as one bundled ES module (esbuild), so that `npm start` runs it on plain Node: loading
// the server through tsx (a TypeScript compile and a loader hook for every module) cost about
// 7 s of CPU time at each start. Packages stay outside the bundle (Node loads them from
// node_modules as usual); only our own TypeScript is bundled. The engine worker is a second entry,
// so the worker threads run without tsx too.
//
// The bundle lives in node_modules/.cache/lullwatch-server/ (a build product of this machine, like
// the database template): `import.meta.dirname` and `import.meta.url` of each bundled file are
// replaced by that file's own location, so paths to the migrations, the client build and the
// database template stay what they are in the sources.
import fs from 'node:fs';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { build, type Plugin } from 'esbuild';
import { newestMtime } from './client-build';

/** The folders and files whose change makes the bundle stale. */
const SOURCES = ['server', 'shared', 'seed', 'jobs', 'scripts/lib', 'package.json', 'package-lock.json'];

export interface ServerBundle {
  /** The server's entry (server/index.ts), bundled. */
  entry: string;
  /** The engine worker (server/services/engine-worker.ts), bundled. */
  engineWorker: string;
}

/** Where the bundle of the repository at `root` lives. */
export function serverBundlePaths(root: string): ServerBundle {
  const dir = path.join(root, 'node_modules', '.cache', 'lullwatch-server');
  return { entry: path.join(dir, 'index.mjs'), engineWorker: path.join(dir, 'engine-worker.mjs') };
}

/** Each bundled .ts file keeps its own import.meta.dirname and import.meta.url. */
const keepFileLocation: Plugin = {
  name: 'keep-file-location',
  setup(b) {
    b.onLoad({ filter: /\.ts$/ }, async (args) => {
      const source = await fs.promises.readFile(args.path, 'utf8');
      const contents = source.includes('import.meta')
        ? source
            .replaceAll('import.meta.dirname', JSON.stringify(path.dirname(args.path)))
            .replaceAll('import.meta.url', JSON.stringify(pathToFileURL(args.path).href))
        : source;
      return { contents, loader: 'ts' };
    });
  },
};

/** Bundles the server when the bundle is missing or older than its sources; returns its paths. */
export async function buildServerBundleIfStale(root: string, log: (message: string) => void = console.log): Promise<ServerBundle> {
  const out = serverBundlePaths(root);
  const builtAt = Math.min(...[out.entry, out.engineWorker].map((f) => fs.statSync(f, { throwIfNoEntry: false })?.mtimeMs ?? 0));
  if (builtAt >= Math.max(...SOURCES.map((p) => newestMtime(path.join(root, p))))) return out;
  log('Bundling the server (its bundle is missing or older than its sources)...');
  fs.rmSync(path.dirname(out.entry), { recursive: true, force: true });
  await build({
    absWorkingDir: root,
    entryPoints: { index: 'server/index.ts', 'engine-worker': 'server/services/engine-worker.ts' },
    outdir: path.dirname(out.entry),
    outExtension: { '.js': '.mjs' },
    bundle: true,
    splitting: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    packages: 'external',
    // engine-pool.ts starts this file instead of the TypeScript worker.
    define: { __LULLWATCH_ENGINE_WORKER__: JSON.stringify(pathToFileURL(out.engineWorker).href) },
    plugins: [keepFileLocation],
    logLevel: 'warning',
  });
  return out;
}
