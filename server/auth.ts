import { betterAuth, type BetterAuthPlugin } from 'better-auth';
import { APIError, createAuthMiddleware, getSessionFromCtx } from 'better-auth/api';
import { drizzleAdapter } from 'better-auth/adapters/drizzle';
import { admin } from 'better-auth/plugins';
import { eq } from 'drizzle-orm';
import type { Db } from './db/client';
import { user, session, account, verification, rateLimit } from './db/schema/auth';
import { PASSWORD_MAX_LENGTH, PASSWORD_MIN_LENGTH, passwordProblem } from '../shared/auth/password-rules';
import { nameText } from '../shared/schemas/common';

/** Header the app sets from the socket (or the trusted proxy chain) before the auth handler runs. */
export const CLIENT_IP_HEADER = 'x-lullwatch-client-ip';

/** How long a temporary password from an administrator may be used to sign in. */
export const TEMPORARY_PASSWORD_DAYS = 7;

export interface AuthConfig {
  secret: string;
  baseURL: string;
  trustedOrigins: string[];
  /** Sign-in attempts allowed per client address per minute. */
  signInPerMinute?: number;
  /** Cookies carry Secure (set when the app is reached over https). */
  secureCookies: boolean;
  /** Tests that must prove cross-site refusal turn the Origin check back on under NODE_ENV=test. */
  enforceOriginCheckInTests?: boolean;
}

/**
 * The one answer to every failed sign-in (unknown e-mail, wrong password, deactivated account),
 * built exactly as the auth library builds its own (`APIError.from`, so the same key order).
 */
const invalidSignIn = () => APIError.from('UNAUTHORIZED', { code: 'INVALID_EMAIL_OR_PASSWORD', message: 'Invalid email or password' });

/**
 * A deactivated user who types the right password gets the same answer as a wrong password or an
 * unknown e-mail (401 "Invalid email or password"), not the admin plugin's 403 "banned", so a
 * sign-in attempt tells nobody that an account exists or is deactivated. It refuses the session
 * before the admin plugin's own check, which runs after it (plugins' hooks run in list order).
 * (An `after` hook cannot do this: the answer would keep the 403 status of the replaced error.)
 *
 * A temporary password older than {@link TEMPORARY_PASSWORD_DAYS} days signs nobody in: the
 * answer says so (only someone who typed that password learns it) and an administrator issues a
 * new one.
 */
const sessionRules = {
  id: 'lullwatch-session-rules',
  init: () => ({
    options: {
      databaseHooks: {
        session: {
          create: {
            async before(newSession, ctx) {
              if (!ctx) return;
              const found = (await ctx.context.internalAdapter.findUserById(newSession.userId)) as {
                banned?: boolean | null;
                banExpires?: Date | string | null;
                mustChangePassword?: boolean | null;
                temporaryPasswordExpiresAt?: Date | string | null;
              } | null;
              if (found?.banned && !(found.banExpires && new Date(found.banExpires).getTime() < Date.now())) {
                // An expired ban: the admin plugin lifts it and lets the sign-in through.
                throw invalidSignIn();
              }
              if (
                ctx.path === '/sign-in/email' &&
                found?.mustChangePassword &&
                found.temporaryPasswordExpiresAt &&
                new Date(found.temporaryPasswordExpiresAt).getTime() < Date.now()
              ) {
                throw APIError.from('UNAUTHORIZED', {
                  code: 'TEMPORARY_PASSWORD_EXPIRED',
                  message: `This temporary password is more than ${TEMPORARY_PASSWORD_DAYS} days old and no longer works: ask an administrator for a new one`,
                });
              }
            },
          },
        },
        // The app's name rule (one line, no control characters, at most 120 characters) on every
        // path that writes a user's name, the auth library's own included.
        user: {
          create: {
            async before(data) {
              checkName(data.name);
            },
          },
          update: {
            async before(data) {
              if ('name' in data) checkName(data.name);
            },
          },
        },
      },
    },
  }),
} satisfies BetterAuthPlugin;

const NameRule = nameText();
function checkName(name: unknown): void {
  const parsed = NameRule.safeParse(name);
  if (!parsed.success) throw APIError.from('BAD_REQUEST', { code: 'INVALID_NAME', message: `Name ${parsed.error.issues[0].message}` });
}

/** Keeps raw session tokens out of JSON answers: the HttpOnly cookie is the only carrier. */
function withoutToken(returned: unknown): Record<string, unknown> | null {
  if (!returned || typeof returned !== 'object' || returned instanceof Error || !('token' in returned)) return null;
  const { token: _token, ...rest } = returned as Record<string, unknown>;
  return rest;
}

export function createAuth(db: Db, config: AuthConfig) {
  return betterAuth({
    appName: 'Lullwatch',
    database: drizzleAdapter(db, {
      provider: 'pg',
      schema: { user, session, account, verification, rateLimit },
    }),
    secret: config.secret,
    baseURL: config.baseURL,
    basePath: '/api/auth',
    trustedOrigins: config.trustedOrigins,
    // Sign-up is closed: administrators create users (with a temporary password) on the admin page.
    emailAndPassword: {
      enabled: true,
      disableSignUp: true,
      minPasswordLength: PASSWORD_MIN_LENGTH,
      maxPasswordLength: PASSWORD_MAX_LENGTH,
    },
    session: { expiresIn: 60 * 60 * 24 * 7, updateAge: 60 * 60 * 24 },
    user: {
      additionalFields: {
        // Set when an administrator issues a temporary password; cleared by a change of password.
        mustChangePassword: { type: 'boolean', required: false, defaultValue: false, input: false },
        temporaryPasswordExpiresAt: { type: 'date', required: false, input: false },
      },
    },
    hooks: {
      before: createAuthMiddleware(async (ctx) => {
        if (ctx.path !== '/change-password') return;
        const body = (ctx.body ?? {}) as { newPassword?: unknown };
        const current = await getSessionFromCtx(ctx);
        const problem = passwordProblem(String(body.newPassword ?? ''), { email: current?.user.email, name: current?.user.name });
        if (problem) throw APIError.from('BAD_REQUEST', { code: 'WEAK_PASSWORD', message: `The new password ${problem}` });
        // A password change ends every other session of the account (someone who knew the old
        // password is signed out everywhere); this browser gets a fresh session.
        return { context: { body: { ...ctx.body, revokeOtherSessions: true } } };
      }),
      after: createAuthMiddleware(async (ctx) => {
        if (ctx.path !== '/sign-in/email' && ctx.path !== '/change-password') return;
        const returned = ctx.context.returned;
        if (
          ctx.path === '/change-password' &&
          returned &&
          typeof returned === 'object' &&
          !(returned instanceof Error) &&
          'user' in returned
        ) {
          const id = (returned as { user: { id: string } }).user.id;
          await db.update(user).set({ mustChangePassword: false, temporaryPasswordExpiresAt: null }).where(eq(user.id, id));
        }
        const stripped = withoutToken(returned);
        if (stripped) return ctx.json(stripped);
      }),
    },
    plugins: [sessionRules, admin({ defaultRole: 'user', adminRoles: ['admin'] })],
    rateLimit: {
      enabled: true,
      storage: 'database',
      window: 60,
      max: 300,
      customRules: {
        '/sign-in/email': { window: 60, max: config.signInPerMinute ?? 30 },
        // The library's default for this path is 3 per 10 s per address; the old password is
        // checked anyway, and one office changing several temporary passwords is not an attack.
        '/change-password': { window: 60, max: 20 },
      },
    },
    advanced: {
      cookiePrefix: 'lullwatch',
      useSecureCookies: config.secureCookies,
      defaultCookieAttributes: { httpOnly: true, sameSite: 'lax' },
      ipAddress: { ipAddressHeaders: [CLIENT_IP_HEADER] },
      ...(config.enforceOriginCheckInTests ? { disableOriginCheck: false } : {}),
    },
  });
}

export type Auth = ReturnType<typeof createAuth>;
