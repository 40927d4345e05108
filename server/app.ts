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
import { signInBackoff } from './http/sign-in-backoff';
import { Limiter, perUser } from './http/limiter';
import { API_ROUTERS } from './routes';

/**
 * The auth library's routes the app uses; every other one (update-user, the admin plugin's
 * impersonation and role routes, list-sessions, get-session...) answers 404. The app's own
 * administration goes through /api/admin, which calls the library on the server side.
 */
export const AUTH_ROUTES_IN_USE: readonly string[] = ['POST /sign-in/email', 'POST /sign-out', 'POST /change-password'];

/** Old page address -> new one (permanent redirects, see createApp). */
export const RENAMED_PAGES: readonly (readonly [string, string])[] = [['/wave-lab', '/wave-calculator']];

/** Largest body the auth routes read (an e-mail and two passwords fit many times over). */
export const AUTH_BODY_LIMIT = '64kb';

/**
 * Reads that transform or return long series or compute statistics: at most HEAVY_READS_PER_USER
 * of them run at once per user (more wait, up to HEAVY_READS_WAITING; beyond that 429).
 */
export const HEAVY_READ_PATH =
  /^\/projects\/[^/]+\/(plan|plan\/windows\.ics|conditions\/[^/]+|datasets\/[^/]+\/(records|csv|monthly)|workability|workability\.csv|campaigns\/[^/]+\/simulate|ledger\/monthly)$/;
export const HEAVY_READS_PER_USER = 2;
export const HEAVY_READS_WAITING = 16;

/** Paths a user on a temporary password may still reach (besides sign-out and change-password). */
const BEFORE_PASSWORD_CHANGE = new Set(['GET /me']);

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
  /** The per-user limit of heavy reads (tests look at its peak). */
  heavyReads?: Limiter;
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

  // A production tile server (MAP_STYLE_URL): its style, tiles, glyphs and sprites come from its origin.
  const mapOrigins = deps.config.mapStyleUrl ? [new URL(deps.config.mapStyleUrl).origin] : [];
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          // The client ships its own font files; charts draw inline SVG styles.
          'default-src': ["'self'"],
          'img-src': ["'self'", 'data:', 'blob:', ...mapOrigins],
          'style-src': ["'self'", "'unsafe-inline'"],
          'font-src': ["'self'", 'data:'],
          'connect-src': ["'self'", ...mapOrigins],
          // The map library draws in a worker it starts from a blob: address.
          'worker-src': ["'self'", 'blob:'],
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

  // Nothing the API answers may be kept by a browser or a proxy (answers carry users' data).
  app.use('/api', (_req, res, next) => {
    res.setHeader('Cache-Control', 'no-store');
    next();
  });

  // Sign-in, sign-out and password change: the auth library's own handler, behind an allowlist
  // of the routes the app uses and a body reader limited to AUTH_BODY_LIMIT (the library itself
  // reads any size). The body is kept as text, which the library reads as it would the stream.
  const sessions = createSessionReader(deps.auth, options.sessionCacheMs);
  const authInUse = new Set(AUTH_ROUTES_IN_USE.map((r) => `${r.split(' ')[0]} /api/auth${r.split(' ')[1]}`));
  app.all(
    '/api/auth/{*any}',
    (req, _res, next) => {
      if (!authInUse.has(`${req.method} ${req.path}`)) throw new HttpError('not_found', `No API route ${req.method} ${req.path}`);
      next();
    },
    express.text({ type: (req) => Boolean(req.headers['content-type']), limit: AUTH_BODY_LIMIT }),
    (req, res, next) => (req.path === '/api/auth/sign-in/email' ? signInBackoff(deps.db, deps.clock)(req, res, next) : next()),
    sessions.forgetAfterChange,
    toNodeHandler(deps.auth),
  );

  // Our own API refuses state-changing requests from other sites' pages (the auth library checks
  // Origin on its own routes above). Before the body parser and the session lookup.
  app.use('/api', sameOriginOnly(deps.config.trustedOrigins));
  app.use('/api', express.json({ limit: options.jsonLimit ?? '1mb' }));
  app.use('/api', async (req, _res, next) => {
    const user = await sessions.read(req);
    setRequestUser(req, user);
    // A temporary password must be changed before anything else.
    if (user?.mustChangePassword && !BEFORE_PASSWORD_CHANGE.has(`${req.method} ${req.path}`)) {
      throw new HttpError('password_change_required', 'Change your temporary password first');
    }
    next();
  });
  const heavyReads =
    options.heavyReads ??
    new Limiter({
      concurrency: HEAVY_READS_PER_USER,
      queue: HEAVY_READS_WAITING,
      busyMessage: 'Too many long reads at once from your account: wait for them to finish',
    });
  const heavy = perUser(heavyReads);
  app.use('/api', (req, res, next) =>
    (req.method === 'GET' || req.method === 'POST') && HEAVY_READ_PATH.test(req.path) ? heavy(req, res, next) : next(),
  );
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

  // Renamed pages keep their old address as a permanent redirect (/wave-lab became
  // /wave-calculator in issue 17); the query string goes along.
  for (const [from, to] of RENAMED_PAGES) {
    app.get(from, (req, res) => {
      const q = req.originalUrl.indexOf('?');
      res.redirect(301, q < 0 ? to : to + req.originalUrl.slice(q));
    });
  }

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
