// Concurrency limits: at most `concurrency` tasks run per key at once, a few more wait their
// turn, and beyond that the caller gets a 429. Used per user on heavy reads (long series,
// statistics), so one user looping on them cannot stall everyone else, and for the whole process
// on imports.
import type { Request, RequestHandler } from 'express';
import { HttpError } from './errors';
import { requireUser } from './context';

export interface LimiterOptions {
  /** Tasks running at once per key. */
  concurrency: number;
  /** Tasks waiting per key beyond those; more are refused with 429. */
  queue: number;
  /** What a refused caller is told. */
  busyMessage: string;
}

export class Limiter {
  private readonly running = new Map<string, number>();
  private readonly waiting = new Map<string, (() => void)[]>();
  /** The most tasks seen running at once for any key (tests, diagnostics). */
  peak = 0;

  constructor(readonly options: LimiterOptions) {}

  /** Waits for a slot (or throws 429), runs `fn`, frees the slot. */
  async run<T>(key: string, fn: () => Promise<T>): Promise<T> {
    const release = await this.acquire(key);
    try {
      return await fn();
    } finally {
      release();
    }
  }

  /** A slot for `key`; call the returned function once to free it. */
  async acquire(key: string): Promise<() => void> {
    const running = this.running.get(key) ?? 0;
    if (running >= this.options.concurrency) {
      const queue = this.waiting.get(key) ?? [];
      if (queue.length >= this.options.queue) throw new HttpError('rate_limited', this.options.busyMessage);
      this.waiting.set(key, queue);
      // The slot is handed over by release(): `running` stays counted for the waiter.
      await new Promise<void>((resolve) => queue.push(resolve));
    } else {
      this.running.set(key, running + 1);
    }
    this.peak = Math.max(this.peak, this.running.get(key) ?? 0);
    let released = false;
    return () => {
      if (released) return;
      released = true;
      const queue = this.waiting.get(key);
      const nextWaiter = queue?.shift();
      if (queue && queue.length === 0) this.waiting.delete(key);
      if (nextWaiter) return nextWaiter();
      const n = (this.running.get(key) ?? 1) - 1;
      if (n <= 0) this.running.delete(key);
      else this.running.set(key, n);
    };
  }
}

/**
 * Middleware: holds one of the signed-in caller's heavy-read slots until the answer is sent (or
 * the connection closes). Anonymous callers pass through to the route's own 401.
 */
export function perUser(limiter: Limiter, keyOf: (req: Request) => string | null = (req) => safeUserId(req)): RequestHandler {
  return async (req, res, next) => {
    const key = keyOf(req);
    if (!key) return next();
    let closed = false;
    res.once('close', () => (closed = true));
    const release = await limiter.acquire(key);
    // A caller who left while waiting frees the slot at once.
    if (closed) return release();
    res.once('finish', release);
    res.once('close', release);
    next();
  };
}

function safeUserId(req: Request): string | null {
  try {
    return requireUser(req).id;
  } catch {
    return null;
  }
}
