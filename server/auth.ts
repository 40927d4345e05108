import { betterAuth } from 'better-auth';
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
    plugins: [admin({ defaultRole: 'user', adminRoles: ['admin'] })],
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
