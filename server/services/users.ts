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

export async function describeMe(db: Db, me: SessionUser): Promise<MeResponse> {
  const memberships = await db
    .select({ id: project.id, name: project.name, role: projectMember.role })
    .from(projectMember)
    .innerJoin(project, eq(project.id, projectMember.projectId))
    .where(eq(projectMember.userId, me.id))
    .orderBy(asc(project.name));
  return { id: me.id, name: me.name, email: me.email, globalRole: me.role, projects: memberships };
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
    projects: memberships
      .filter((m) => m.userId === u.id)
      .map(({ projectId, projectName, role }) => ({ projectId, projectName, role })),
  }));
}

/** A readable temporary password, shown once to the administrator who creates the user. */
export function temporaryPassword(): string {
  const words = crypto.randomBytes(12).toString('base64url');
  return `lw-${words.slice(0, 6)}-${words.slice(6, 12)}-${words.slice(12)}`;
}

export async function createUser(
  auth: Auth,
  input: { name: string; email: string; globalRole: 'admin' | 'user' },
  password = temporaryPassword(),
): Promise<{ user: AdminUser; temporaryPassword: string }> {
  try {
    const result = await auth.api.createUser({
      body: { name: input.name, email: input.email, password, role: input.globalRole },
    });
    const u = result.user as { id: string; name: string; email: string; createdAt: Date };
    return {
      user: {
        id: u.id,
        name: u.name,
        email: u.email,
        globalRole: input.globalRole,
        active: true,
        createdAt: new Date(u.createdAt).toISOString(),
        projects: [],
      },
      temporaryPassword: password,
    };
  } catch (err) {
    const message = err instanceof Error ? err.message : String(err);
    if (/already exists/i.test(message)) {
      throw new HttpError('conflict', 'A user with this e-mail already exists', [{ field: 'email', message: 'already in use' }]);
    }
    throw err;
  }
}

export async function createUserFromInput(auth: Auth, input: CreateUserInput) {
  return createUser(auth, { name: input.name, email: input.email, globalRole: input.globalRole ?? 'user' });
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
  const deleted = await db
    .delete(projectMember)
    .where(eqBoth(userId, projectId))
    .returning({ id: projectMember.id });
  if (deleted.length === 0) throw new HttpError('not_found', 'Membership not found');
}

/**
 * A user id from a URL that cannot be one (a NUL, which PostgreSQL text refuses with an error, or
 * another control character, a lone surrogate, an absurd length) is an unknown user: 404, not 500.
 */
function checkUserId(userId: string): void {
  if (userId.length > 200 || hasControlChars(userId) || hasLoneSurrogate(userId)) throw new HttpError('not_found', 'User not found');
}

const eqBoth = (userId: string, projectId: string) =>
  and(eq(projectMember.userId, userId), eq(projectMember.projectId, projectId));
