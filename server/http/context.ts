import type { Request } from 'express';
import { fromNodeHeaders } from 'better-auth/node';
import type { Auth } from '../auth';
import { HttpError } from './errors';

export interface SessionUser {
  id: string;
  name: string;
  email: string;
  role: 'admin' | 'user';
  /** Signed in with a temporary password that must be changed first. */
  mustChangePassword?: boolean;
}

/** Reads the signed-in user from the session cookie; null when anonymous. */
export async function readSessionUser(auth: Auth, req: Request): Promise<SessionUser | null> {
  const result = await auth.api.getSession({ headers: fromNodeHeaders(req.headers) });
  if (!result) return null;
  const u = result.user as {
    id: string;
    name: string;
    email: string;
    role?: string | null;
    banned?: boolean | null;
    mustChangePassword?: boolean | null;
  };
  if (u.banned) return null;
  return {
    id: u.id,
    name: u.name,
    email: u.email,
    role: u.role === 'admin' ? 'admin' : 'user',
    mustChangePassword: u.mustChangePassword === true,
  };
}

const USER_KEY = Symbol('lullwatch.user');
type WithUser = Request & { [USER_KEY]?: SessionUser | null };

export function setRequestUser(req: Request, user: SessionUser | null): void {
  (req as WithUser)[USER_KEY] = user;
}

/** The signed-in user, or null when anonymous. */
export function currentUser(req: Request): SessionUser | null {
  return (req as WithUser)[USER_KEY] ?? null;
}

/** The signed-in user, or a 401. */
export function requireUser(req: Request): SessionUser {
  const user = (req as WithUser)[USER_KEY];
  if (!user) throw new HttpError('unauthenticated', 'Sign in first');
  return user;
}

/** The signed-in administrator, or a 401/403. */
export function requireAdmin(req: Request): SessionUser {
  const user = requireUser(req);
  if (user.role !== 'admin') throw new HttpError('forbidden', 'Administrators only');
  return user;
}
