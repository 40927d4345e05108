// A per-account back-off on sign-in, beside the auth library's per-address limit. The address
// limit alone lets one shared address (an office, a vessel's satellite link) lock everyone behind
// it out, and does nothing against slow guessing of one account from many addresses; this one
// follows the account (the e-mail typed, known or not, so it tells nothing about which exist).
//
// After FREE_ATTEMPTS attempts without a success, each further attempt waits a delay that doubles,
// from 15 s to at most 15 minutes. Every attempt counts when it starts (so parallel attempts cannot
// slip through together); a successful sign-in clears the count. Kept in the auth library's
// `rate_limit` table, so every instance shares it. OWASP Authentication Cheat Sheet, "Account
// lockout" (prefer a growing delay to a hard lock-out), cited from memory.
import crypto from 'node:crypto';
import type { RequestHandler } from 'express';
import { and, eq, sql } from 'drizzle-orm';
import type { Db } from '../db/client';
import { rateLimit } from '../db/schema';

/** Attempts allowed without any delay. */
export const FREE_ATTEMPTS = 5;
/** First delay after the free attempts, ms; it doubles with each further attempt. */
export const FIRST_DELAY_MS = 15_000;
/** Longest delay, ms. */
export const MAX_DELAY_MS = 15 * 60_000;

export const delayAfter = (attempts: number) =>
  attempts < FREE_ATTEMPTS ? 0 : Math.min(MAX_DELAY_MS, FIRST_DELAY_MS * 2 ** (attempts - FREE_ATTEMPTS));

const keyOf = (email: string) => `account-backoff:${crypto.createHash('sha256').update(email.trim().toLowerCase()).digest('hex')}`;

/**
 * Counts one attempt for the account, unless it must still wait: then the milliseconds left.
 */
export async function startAttempt(db: Db, email: string, nowMs: number): Promise<{ waitMs: number }> {
  const key = keyOf(email);
  for (let tries = 0; tries < 3; tries++) {
    const [row] = await db.select().from(rateLimit).where(eq(rateLimit.key, key));
    if (!row) {
      const inserted = await db
        .insert(rateLimit)
        .values({ id: crypto.randomUUID(), key, count: 1, lastRequest: nowMs })
        .onConflictDoNothing()
        .returning({ id: rateLimit.id });
      if (inserted.length > 0) return { waitMs: 0 };
      continue; // another attempt inserted it meanwhile
    }
    const waitMs = row.lastRequest + delayAfter(row.count) - nowMs;
    if (waitMs > 0) return { waitMs };
    // Only if nobody else counted an attempt since the read (compare-and-set on the count).
    const updated = await db
      .update(rateLimit)
      .set({ count: sql`${rateLimit.count} + 1`, lastRequest: nowMs })
      .where(and(eq(rateLimit.key, key), eq(rateLimit.count, row.count)))
      .returning({ id: rateLimit.id });
    if (updated.length > 0) return { waitMs: 0 };
  }
  return { waitMs: FIRST_DELAY_MS };
}

export async function clearAttempts(db: Db, email: string): Promise<void> {
  await db.delete(rateLimit).where(eq(rateLimit.key, keyOf(email)));
}

/** The e-mail of a sign-in body (the raw text the body reader kept), or null. */
function emailOf(body: unknown): string | null {
  try {
    const parsed: unknown = typeof body === 'string' ? JSON.parse(body) : body;
    const email = parsed && typeof parsed === 'object' ? (parsed as { email?: unknown }).email : undefined;
    return typeof email === 'string' && email.length > 0 && email.length <= 320 ? email : null;
  } catch {
    return null;
  }
}

/** Middleware for POST /api/auth/sign-in/email, after the body reader and before the auth handler. */
export function signInBackoff(db: Db, clock: () => Date): RequestHandler {
  return async (req, res, next) => {
    const email = emailOf(req.body);
    if (!email) return next();
    const { waitMs } = await startAttempt(db, email, clock().getTime());
    if (waitMs > 0) {
      const seconds = Math.ceil(waitMs / 1000);
      res.setHeader('retry-after', String(seconds));
      res.setHeader('x-retry-after', String(seconds));
      res.status(429).json({ code: 'TOO_MANY_ATTEMPTS', message: `Too many sign-in attempts for this account: try again in ${seconds} s` });
      return;
    }
    res.once('finish', () => {
      if (res.statusCode === 200) void clearAttempts(db, email).catch(() => undefined);
    });
    next();
  };
}
