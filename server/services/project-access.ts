import { and, eq } from 'drizzle-orm';
import type { Request } from 'express';
import type { ProjectRole } from '../../shared/auth/roles';
import { PROJECT_ROLE_LABELS } from '../../shared/auth/roles';
import type { ProjectAccessRole } from '../../shared/api-types';
import { idParam } from '../../shared/schemas/common';
import type { Db } from '../db/client';
import { project, projectMember } from '../db/schema';
import { HttpError } from '../http/errors';
import { requireUser, type SessionUser } from '../http/context';

export interface ProjectAccess {
  user: SessionUser;
  projectId: string;
  role: ProjectAccessRole;
}

/** The caller's role in a project: their membership, or 'admin' for administrators; null otherwise. */
export async function projectRoleOf(db: Db, user: SessionUser, projectId: string): Promise<ProjectAccessRole | null> {
  if (!idParam.safeParse(projectId).success) return null;
  const [row] = await db
    .select({ role: projectMember.role, exists: project.id })
    .from(project)
    .leftJoin(projectMember, and(eq(projectMember.projectId, project.id), eq(projectMember.userId, user.id)))
    .where(eq(project.id, projectId));
  if (!row) return null;
  if (row.role) return row.role;
  return user.role === 'admin' ? 'admin' : null;
}

/**
 * Guard for project routes: 401 when anonymous, 404 when the project is unknown or not the
 * caller's, 403 naming the role when the caller's role is not among `allowed`.
 * Administrators pass every check (they act with a coordinator's rights).
 */
export async function requireProjectRole(db: Db, req: Request, projectId: string, ...allowed: ProjectRole[]): Promise<ProjectAccess> {
  const user = requireUser(req);
  const role = await projectRoleOf(db, user, projectId);
  if (!role) throw new HttpError('not_found', 'Project not found');
  if (role !== 'admin' && allowed.length > 0 && !allowed.includes(role)) {
    const names = allowed.map((r) => PROJECT_ROLE_LABELS[r].toLowerCase()).join(' or ');
    throw new HttpError('forbidden', `This needs the ${names} role in this project`);
  }
  return { user, projectId, role };
}

/** Any member (or an administrator) may read. */
export const requireProjectMember = (db: Db, req: Request, projectId: string) => requireProjectRole(db, req, projectId);

/** Coordinators (and administrators) may change the project. */
export const requireCoordinator = (db: Db, req: Request, projectId: string) => requireProjectRole(db, req, projectId, 'coordinator');
