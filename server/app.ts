import { answerCache } from './http/answer-cache';
import fs from 'node:fs';
import path from 'node:path';
import express, { type Express } from 'express';
import helmet from 'helmet';
import { toNodeHandler } from 'better-auth/node';
import { CLIENT_IP_HEADER } from './auth';
import type { AppDeps } from './deps';
import { setRequestUser } from './http/context';
import { createSessionReader } from './http/session-cache';
import { errorHandler, HttpError } from './http/errors';
import { sameOriginOnly } from './http/same-origin';
import { API_ROUTERS } from './routes';

export interface AppOptions {
  /** Built client (vite build output) to serve; omitted in API-only tests. */
  clientDir?: string;
  /** Express "trust proxy" value when behind a reverse proxy. */
  trustProxy?: string | number | boolean;
  /** Stack traces in 500 answers (development only). */
  exposeStack?: boolean;
  /** JSON body limit. */
  jsonLimit?: string;
  /** How long a looked-up session is reused (default SESSION_CACHE_MS; 0 turns the reuse off). */
  sessionCacheMs?: number;
  /**
   * How long an unchanged GET answer is served again without the database, ms (embedded database
   * only, see http/answer-cache.ts); default 0 (off), `npm start` sets ANSWER_CACHE_MS (5 s).
   */
  answerCacheMs?: number;
}

/** Builds the Express app from its dependencies. `server/index.ts` starts it; tests call it directly. */
export function createApp(deps: AppDeps, options: AppOptions = {}): Express {
  const app = express();
  app.disable('x-powered-by');
  if (options.trustProxy !== undefined) app.set('trust proxy', options.trustProxy);

  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          // The client ships its own font files; charts draw inline SVG styles.
          'default-src': ["'self'"],
          'img-src': ["'self'", 'data:', 'blob:'],
          'style-src': ["'self'", "'unsafe-inline'"],
          'font-src': ["'self'", 'data:'],
          'connect-src': ["'self'"],
          'upgrade-insecure-requests': null,
        },
      },
    }),
  );

  // The auth library keys its sign-in rate limit on this header: set it from the socket (or the
  // trusted proxy chain), overwriting anything a client sent.
  app.use((req, _res, next) => {
    req.headers[CLIENT_IP_HEADER] = req.ip ?? req.socket.remoteAddress ?? 'unknown';
    next();
  });

  // Sign-in, sign-out and sessions: the auth library's own handler, before the JSON parser.
  const sessions = createSessionReader(deps.auth, options.sessionCacheMs);
  app.all('/api/auth/{*any}', sessions.forgetAfterChange, toNodeHandler(deps.auth));

  // Our own API refuses state-changing requests from other sites' pages (the auth library checks
  // Origin on its own routes above). Before the body parser and the session lookup.
  app.use('/api', sameOriginOnly(deps.config.trustedOrigins));
  app.use('/api', express.json({ limit: options.jsonLimit ?? '1mb' }));
  app.use('/api', async (req, _res, next) => {
    setRequestUser(req, await sessions.read(req));
    next();
  });
  // Deactivation and role changes go through the administration routes.
  app.use('/api/admin', sessions.forgetAfterChange);
  // Unchanged answers again without the database (embedded database only), with ETags and gzip.
  app.use('/api', answerCache({ writeGeneration: deps.database.writeGeneration, ttlMs: options.answerCacheMs ?? 0 }));

  const api = express.Router();
  for (const routes of API_ROUTERS) api.use(routes(deps));
  app.use('/api', api);
  app.use('/api', (req) => {
    throw new HttpError('not_found', `No API route ${req.method} ${req.originalUrl.split('?')[0]}`);
  });

  if (options.clientDir && fs.existsSync(path.join(options.clientDir, 'index.html'))) {
    const clientDir = options.clientDir;
    app.use(express.static(clientDir, { index: false, maxAge: '1h' }));
    app.get('/{*splat}', (_req, res) => {
      res.setHeader('Cache-Control', 'no-store');
      res.sendFile(path.join(clientDir, 'index.html'));
    });
  }

  app.use(
    errorHandler({
      exposeStack: options.exposeStack ?? false,
      log: (err) => deps.log.error('Unhandled error', { err: err instanceof Error ? err.stack : String(err) }),
    }),
  );
  return app;
}
