import { APIError, betterAuth, type BetterAuthPlugin } from 'better-auth';
import { drizzleAdapter } from 'better-auth/adapters/drizzle';
import { admin } from 'better-auth/plugins';
import type { Db } from './db/client';
import { user, session, account, verification, rateLimit } from './db/schema/auth';

/** Header the app sets from the socket (or the trusted proxy chain) before the auth handler runs. */
export const CLIENT_IP_HEADER = 'x-lullwatch-client-ip';

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
 * A deactivated user who types the right password gets the same answer as a wrong password or an
 * unknown e-mail (401 "Invalid email or password"), not the admin plugin's 403 "banned", so a
 * sign-in attempt tells nobody that an account exists or is deactivated. It refuses the session
 * before the admin plugin's own check, which runs after it (plugins' hooks run in list order).
 * (An `after` hook cannot do this: the answer would keep the 403 status of the replaced error.)
 */
const deactivatedSignInLooksLikeWrongPassword = {
  id: 'lullwatch-deactivated-sign-in',
  init: () => ({
    options: {
      databaseHooks: {
        session: {
          create: {
            async before(newSession, ctx) {
              if (!ctx) return;
              const found = (await ctx.context.internalAdapter.findUserById(newSession.userId)) as { banned?: boolean | null; banExpires?: Date | string | null } | null;
              if (!found?.banned) return;
              // An expired ban: the admin plugin lifts it and lets the sign-in through.
              if (found.banExpires && new Date(found.banExpires).getTime() < Date.now()) return;
              throw new APIError('UNAUTHORIZED', { code: 'INVALID_EMAIL_OR_PASSWORD', message: 'Invalid email or password' });
            },
          },
        },
      },
    },
  }),
} satisfies BetterAuthPlugin;

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
    emailAndPassword: { enabled: true, disableSignUp: true, minPasswordLength: 10 },
    session: { expiresIn: 60 * 60 * 24 * 7, updateAge: 60 * 60 * 24 },
    plugins: [deactivatedSignInLooksLikeWrongPassword, admin({ defaultRole: 'user', adminRoles: ['admin'] })],
    rateLimit: {
      enabled: true,
      storage: 'database',
      window: 60,
      max: 300,
      customRules: {
        '/sign-in/email': { window: 60, max: config.signInPerMinute ?? 10 },
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
