import crypto from 'node:crypto';
import { and, asc, eq } from 'drizzle-orm';
import type { AdminUser, MeResponse } from '../../shared/api-types';
import type { CreateUserInput, UpdateUserInput } from '../../shared/schemas/projects';
import type { ProjectRole } from '../../shared/auth/roles';
import type { Auth } from '../auth';
import type { Db } from '../db/client';
import { project, projectMember, session, user } from '../db/schema';
import { HttpError } from '../http/errors';
import { hasControlChars, hasLoneSurrogate } from '../../shared/schemas/common';
import type { SessionUser } from '../http/context';
import { passwordProblem } from '../../shared/auth/password-rules';
import { TEMPORARY_PASSWORD_DAYS } from '../auth';
import { account } from '../db/schema';
import { membershipsOf } from './projects';

const DAY_MS = 86_400_000;

export async function describeMe(db: Db, me: SessionUser): Promise<MeResponse> {
  const memberships = await membershipsOf(db, me.id);
  return {
    id: me.id,
    name: me.name,
    email: me.email,
    globalRole: me.role,
    mustChangePassword: me.mustChangePassword ?? false,
    projects: memberships,
  };
}

export async function listUsers(db: Db): Promise<AdminUser[]> {
  const users = await db.select().from(user).orderBy(asc(user.name));
  const memberships = await db
    .select({ userId: projectMember.userId, projectId: project.id, projectName: project.name, role: projectMember.role })
    .from(projectMember)
    .innerJoin(project, eq(project.id, projectMember.projectId))
    .orderBy(asc(project.name));
  return users.map((u) => ({
    id: u.id,
    name: u.name,
    email: u.email,
    globalRole: u.role === 'admin' ? 'admin' : 'user',
    active: !u.banned,
    createdAt: u.createdAt.toISOString(),
    mustChangePassword: u.mustChangePassword,
    temporaryPasswordExpiresAt: u.mustChangePassword ? (u.temporaryPasswordExpiresAt?.toISOString() ?? null) : null,
    projects: memberships.filter((m) => m.userId === u.id).map(({ projectId, projectName, role }) => ({ projectId, projectName, role })),
  }));
}

/** A readable temporary password, shown once to the administrator who creates the user. */
export function temporaryPassword(): string {
  const words = crypto.randomBytes(12).toString('base64url');
  return `lw-${words.slice(0, 6)}-${words.slice(6, 12)}-${words.slice(12)}`;
}

/** The password rules (shared/auth/password-rules.ts) as a 400 naming the field. */
function checkPassword(password: string, context: { email: string; name: string }): void {
  const problem = passwordProblem(password, context);
  if (problem) throw new HttpError('validation', `The password ${problem}`, [{ field: 'password', message: problem }]);
}

/**
 * Creates a user. Without `password` the user gets a generated temporary password, which must be
 * changed at the first sign-in and stops working after TEMPORARY_PASSWORD_DAYS days; a given
 * password (the demo seed's) is the account's own.
 */
export async function createUser(
  auth: Auth,
  input: { name: string; email: string; globalRole: 'admin' | 'user' },
  password?: string,
  now = new Date(),
): Promise<{ user: AdminUser; temporaryPassword: string }> {
  const temporary = password === undefined;
  const pw = password ?? temporaryPassword();
  checkPassword(pw, input);
  try {
    const result = await auth.api.createUser({
      body: { name: input.name, email: input.email, password: pw, role: input.globalRole },
    });
    const u = result.user as { id: string; name: string; email: string; createdAt: Date };
    const expiresAt = temporary ? new Date(now.getTime() + TEMPORARY_PASSWORD_DAYS * DAY_MS) : null;
    if (expiresAt) {
      const ctx = await auth.$context;
      await ctx.internalAdapter.updateUser(u.id, { mustChangePassword: true, temporaryPasswordExpiresAt: expiresAt });
    }
    return {
      user: {
        id: u.id,
        name: u.name,
        email: u.email,
        globalRole: input.globalRole,
        active: true,
        createdAt: new Date(u.createdAt).toISOString(),
        mustChangePassword: temporary,
        temporaryPasswordExpiresAt: expiresAt?.toISOString() ?? null,
        projects: [],
      },
      temporaryPassword: pw,
    };
  } catch (err) {
    const message = err instanceof Error ? err.message : String(err);
    if (/already exists/i.test(message)) {
      throw new HttpError('conflict', 'A user with this e-mail already exists', [{ field: 'email', message: 'already in use' }]);
    }
    throw err;
  }
}

export async function createUserFromInput(auth: Auth, input: CreateUserInput, now = new Date()) {
  return createUser(auth, { name: input.name, email: input.email, globalRole: input.globalRole ?? 'user' }, undefined, now);
}

/**
 * Issues a new temporary password (a forgotten or expired one): the old password stops working,
 * every session of the user ends, and the new one must be changed at the next sign-in.
 */
export async function issueTemporaryPassword(
  auth: Auth,
  db: Db,
  userId: string,
  now = new Date(),
): Promise<{ temporaryPassword: string; expiresAt: string }> {
  checkUserId(userId);
  const [target] = await db.select({ id: user.id, email: user.email, name: user.name }).from(user).where(eq(user.id, userId));
  if (!target) throw new HttpError('not_found', 'User not found');
  const pw = temporaryPassword();
  checkPassword(pw, target);
  const ctx = await auth.$context;
  const hash = await ctx.password.hash(pw);
  const expiresAt = new Date(now.getTime() + TEMPORARY_PASSWORD_DAYS * DAY_MS);
  await db.transaction(async (tx) => {
    const updated = await tx
      .update(account)
      .set({ password: hash, updatedAt: now })
      .where(and(eq(account.userId, userId), eq(account.providerId, 'credential')))
      .returning({ id: account.id });
    if (updated.length === 0) throw new HttpError('conflict', 'This user has no password sign-in');
    await tx
      .update(user)
      .set({ mustChangePassword: true, temporaryPasswordExpiresAt: expiresAt, updatedAt: now })
      .where(eq(user.id, userId));
    await tx.delete(session).where(eq(session.userId, userId));
  });
  return { temporaryPassword: pw, expiresAt: expiresAt.toISOString() };
}

/** Deactivates (signs out everywhere, refuses sign-in) or reactivates a user; changes the global role. */
export async function updateUser(db: Db, actor: SessionUser, userId: string, input: UpdateUserInput): Promise<void> {
  checkUserId(userId);
  const [target] = await db.select({ id: user.id }).from(user).where(eq(user.id, userId));
  if (!target) throw new HttpError('not_found', 'User not found');
  if (userId === actor.id && (input.active === false || input.globalRole === 'user')) {
    throw new HttpError('validation', 'You cannot deactivate yourself or remove your own administrator role', [
      { field: input.active === false ? 'active' : 'globalRole', message: 'not on your own account' },
    ]);
  }
  await db.transaction(async (tx) => {
    const changes: Partial<typeof user.$inferInsert> = { updatedAt: new Date() };
    if (input.active !== undefined) {
      changes.banned = !input.active;
      changes.banReason = input.active ? null : 'Deactivated by an administrator';
    }
    if (input.globalRole) changes.role = input.globalRole;
    await tx.update(user).set(changes).where(eq(user.id, userId));
    if (input.active === false) await tx.delete(session).where(eq(session.userId, userId));
  });
}

export async function setMembership(db: Db, userId: string, projectId: string, role: ProjectRole): Promise<void> {
  checkUserId(userId);
  const [target] = await db.select({ id: user.id }).from(user).where(eq(user.id, userId));
  if (!target) throw new HttpError('not_found', 'User not found');
  const [p] = await db.select({ id: project.id }).from(project).where(eq(project.id, projectId));
  if (!p) throw new HttpError('not_found', 'Project not found');
  await db
    .insert(projectMember)
    .values({ userId, projectId, role })
    .onConflictDoUpdate({ target: [projectMember.projectId, projectMember.userId], set: { role } });
}

export async function removeMembership(db: Db, userId: string, projectId: string): Promise<void> {
  checkUserId(userId);
  const deleted = await db.delete(projectMember).where(eqBoth(userId, projectId)).returning({ id: projectMember.id });
  if (deleted.length === 0) throw new HttpError('not_found', 'Membership not found');
}

/**
 * A user id from a URL that cannot be one (a NUL, which PostgreSQL text refuses with an error, or
 * another control character, a lone surrogate, an absurd length) is an unknown user: 404, not 500.
 */
function checkUserId(userId: string): void {
  if (userId.length > 200 || hasControlChars(userId) || hasLoneSurrogate(userId)) throw new HttpError('not_found', 'User not found');
}

const eqBoth = (userId: string, projectId: string) => and(eq(projectMember.userId, userId), eq(projectMember.projectId, projectId));
