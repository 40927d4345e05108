// Answers that have not changed, served again without asking the database: GET requests of a
// signed-in user, on the embedded database only.
//
// An answer (status 200, JSON) is kept per user, address and Accept header with the database's
// write generation at the time the request came in (see Database.writeGeneration): any statement
// that may change data, from any route, job or the auth library, moves the generation and so
// retires every kept answer. Answers that depend on the clock (the forecast plan's "may start now"
// and earliest start) are kept at most `ttlMs` (default 5 s, like the session reuse); every other
// answer at most 12 times that (a minute), a bound for anything else that could change unseen.
//
// Each answer carries a weak ETag (a hash of its bytes, computed once): a request whose
// If-None-Match names it gets 304 without the body. JSON over 1 kB goes gzipped to clients that
// accept it (compressed once per distinct body).
import crypto from 'node:crypto';
import zlib from 'node:zlib';
import type { NextFunction, Request, Response } from 'express';
import { currentUser } from './context';

interface Kept {
  generation: number;
  at: number;
  etag: string;
  type: string;
}

interface Body {
  raw: Buffer;
  gzip: Buffer | null;
}

/** GETs never kept: one with a side effect (unsubscribe), answers from memory (the local mailbox), token feeds, health. */
const NEVER = /^\/api\/(unsubscribe|dev\/|calendar\/|health)/;

/** GET answers that depend on the clock. */
const CLOCK_DEPENDENT = /^\/api\/projects\/[^/]+\/(plan|overview)(\?|\/|$)/;

/** Compress bodies above this size, bytes. */
const GZIP_FROM = 1024;

export interface AnswerCacheOptions {
  /** The database's write generation; without it (a database server) nothing is kept. */
  writeGeneration?: () => number;
  /** Longest time an answer that depends on the clock is reused, ms (others: 12 times as long); 0 keeps nothing. */
  ttlMs: number;
  /** Most answers kept (least recently used go first). */
  maxEntries?: number;
  now?: () => number;
}

/** Express middleware for /api: serve kept answers, keep new ones, ETags and gzip. */
export function answerCache(options: AnswerCacheOptions) {
  const { writeGeneration, ttlMs } = options;
  const maxEntries = options.maxEntries ?? 2000;
  const now = options.now ?? Date.now;
  const entries = new Map<string, Kept>();
  // Bodies by ETag: every user's copy of one answer shares one buffer and one compressed copy.
  const bodies = new Map<string, Body>();

  function deliver(req: Request, res: Response, kept: Kept, body: Body, send: (b: Buffer) => void): void {
    res.setHeader('ETag', kept.etag);
    res.setHeader('Vary', 'Accept-Encoding');
    res.type(kept.type);
    if (req.fresh) {
      res.status(304).end();
      return;
    }
    if (body.raw.length >= GZIP_FROM && /\bgzip\b/.test(String(req.headers['accept-encoding'] ?? ''))) {
      body.gzip ??= zlib.gzipSync(body.raw, { level: 6 });
      res.setHeader('Content-Encoding', 'gzip');
      send(body.gzip);
      return;
    }
    send(body.raw);
  }

  function forgetOld(): void {
    while (entries.size > maxEntries) entries.delete(entries.keys().next().value as string);
    if (bodies.size > maxEntries) {
      const live = new Set([...entries.values()].map((e) => e.etag));
      for (const k of bodies.keys()) if (!live.has(k)) bodies.delete(k);
    }
  }

  return (req: Request, res: Response, next: NextFunction): void => {
    const user = currentUser(req);
    if (!writeGeneration || ttlMs <= 0 || req.method !== 'GET' || !user || NEVER.test(req.originalUrl)) return next();
    const key = `${user.id}\n${user.role}\n${req.originalUrl}\n${req.headers.accept ?? ''}`;
    const generation = writeGeneration();
    const t = now();
    const hit = entries.get(key);
    const maxAge = CLOCK_DEPENDENT.test(req.originalUrl) ? ttlMs : 12 * ttlMs;
    if (hit && hit.generation === generation && t - hit.at < maxAge) {
      const body = bodies.get(hit.etag);
      if (body) {
        entries.delete(key);
        entries.set(key, hit);
        deliver(req, res, hit, body, (b) => res.end(b));
        return;
      }
    }
    // Keep what the route answers: only 200 JSON without cookies, computed wholly within one generation.
    const send = res.send.bind(res);
    res.send = ((payload: unknown) => {
      res.send = send;
      const type = String(res.getHeader('Content-Type') ?? '');
      const bytes = typeof payload === 'string' ? Buffer.from(payload) : Buffer.isBuffer(payload) ? payload : null;
      if (
        res.statusCode !== 200 ||
        !bytes ||
        !type.startsWith('application/json') ||
        res.getHeader('Set-Cookie') ||
        res.getHeader('Content-Encoding')
      ) {
        return send(payload);
      }
      const etag = `W/"${crypto.createHash('sha1').update(bytes).digest('base64url')}"`;
      let body = bodies.get(etag);
      if (!body) bodies.set(etag, (body = { raw: bytes, gzip: null }));
      const kept: Kept = { generation, at: t, etag, type };
      if (writeGeneration() === generation) {
        entries.delete(key);
        entries.set(key, kept);
        forgetOld();
      }
      deliver(req, res, kept, body, (b) => send(b));
      return res;
    }) as Response['send'];
    next();
  };
}
