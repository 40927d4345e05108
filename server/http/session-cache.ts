// Who is signed in, read from the session cookie, kept for a few seconds per Cookie header.
// Looking a session up costs the auth library a cookie signature check and database reads; every
// API request needs it, and under load it was the largest single cost (about 6 ms of 9 per request
// on the embedded database). The trade-off, chosen and written down: a sign-out, deactivation or
// role change takes effect at once on the instance that handled it (its cache is emptied when such
// a request finishes) and within SESSION_CACHE_MS on other instances.
import type { Request, RequestHandler } from 'express';
import type { Auth } from '../auth';
import { LRUCache } from 'lru-cache';
import { readSessionUser, type SessionUser } from './context';

/** How long a looked-up session is reused on this instance. */
export const SESSION_CACHE_MS = 5_000;
/** Cookie headers remembered at most (one per signed-in browser; a few hundred bytes each). */
const MAX_ENTRIES = 10_000;
/** Bytes remembered at most (a Cookie header can be long): key length plus the user's fields. */
const MAX_BYTES = 8 * 1024 * 1024;

export interface SessionReader {
  read(req: Request): Promise<SessionUser | null>;
  /** Middleware: once a request that may change sessions or users finishes, forget every entry. */
  forgetAfterChange: RequestHandler;
}

export function createSessionReader(auth: Auth, ttlMs = SESSION_CACHE_MS): SessionReader {
  // fetch() shares a lookup under way by Cookie header: a page sends its requests together, and
  // they share one lookup instead of each making its own (under paced load that was most of a
  // visit's work). Emptying the cache rejects the lookups under way, so none is stored after a change.
  const cache = new LRUCache<string, { user: SessionUser | null }, Request>({
    max: MAX_ENTRIES,
    maxSize: MAX_BYTES,
    sizeCalculation: (v, key) => key.length + 64 + (v.user ? v.user.id.length + v.user.name.length + v.user.email.length : 0),
    ttl: Math.max(1, ttlMs),
    fetchMethod: async (_key, _stale, { context }) => ({ user: await readSessionUser(auth, context) }),
  });
  // Bumped on every forget: a lookup the forget rejected is made again, after the change.
  let generation = 0;
  const forget = () => {
    generation++;
    cache.clear();
  };
  return {
    read(req) {
      const key = req.headers.cookie;
      if (!key || ttlMs <= 0) return readSessionUser(auth, req);
      const started = generation;
      return cache.fetch(key, { context: req }).then(
        (entry) => (entry ? entry.user : readSessionUser(auth, req)),
        (err: unknown) => {
          if (generation !== started) return readSessionUser(auth, req);
          throw err;
        },
      );
    },
    forgetAfterChange(req, res, next) {
      if (req.method !== 'GET' && req.method !== 'HEAD' && req.method !== 'OPTIONS') {
        res.once('finish', forget);
        res.once('close', forget);
      }
      next();
    },
  };
}
