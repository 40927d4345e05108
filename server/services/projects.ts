import { and, asc, eq, inArray } from 'drizzle-orm';
import type { ProjectDetail, ProjectSummary } from '../../shared/api-types';
import type { CreateProjectInput, ProjectSettingsInput } from '../../shared/schemas/projects';
import type { Db } from '../db/client';
import { project, projectMember, user } from '../db/schema';
import { HttpError } from '../http/errors';
import type { SessionUser } from '../http/context';
import type { ProjectAccessRole } from '../../shared/api-types';

/** The projects a user is a member of, by name, with the user's role in each. */
export const membershipsOf = (db: Db, userId: string) =>
  db
    .select({ id: project.id, name: project.name, role: projectMember.role })
    .from(projectMember)
    .innerJoin(project, eq(project.id, projectMember.projectId))
    .where(eq(projectMember.userId, userId))
    .orderBy(asc(project.name));

/** The caller's projects; administrators see all. */
export async function listProjects(db: Db, user: SessionUser): Promise<ProjectSummary[]> {
  const memberships = await membershipsOf(db, user.id);
  if (user.role !== 'admin') return memberships;
  const mine = new Map(memberships.map((m) => [m.id, m] as const));
  const all = await db.select({ id: project.id, name: project.name }).from(project).orderBy(asc(project.name));
  return all.map((p) => mine.get(p.id) ?? { ...p, role: 'admin' as const });
}

/** Admins, and users who coordinate at least one project, may open a new project; 403 for anyone else. */
export async function requireProjectCreator(db: Db, user: SessionUser): Promise<SessionUser> {
  if (user.role === 'admin') return user;
  const coordinates = await db
    .select({ id: projectMember.id })
    .from(projectMember)
    .where(and(eq(projectMember.userId, user.id), eq(projectMember.role, 'coordinator')))
    .limit(1);
  if (coordinates.length === 0) {
    throw new HttpError('forbidden', 'Only administrators and coordinators can create projects');
  }
  return user;
}

/** Opens a new project for a caller `requireProjectCreator` lets through; the creator coordinates it. */
export async function createProject(db: Db, user: SessionUser, input: CreateProjectInput): Promise<ProjectSummary> {
  await requireProjectCreator(db, user);
  return db.transaction(async (tx) => {
    const [created] = await tx
      .insert(project)
      .values({ name: input.name, description: input.description ?? '' })
      .returning({ id: project.id, name: project.name });
    await tx.insert(projectMember).values({ projectId: created.id, userId: user.id, role: 'coordinator' });
    return { ...created, role: 'coordinator' as const };
  });
}

export async function getProject(db: Db, projectId: string, role: ProjectAccessRole): Promise<ProjectDetail> {
  const [row] = await db.select().from(project).where(eq(project.id, projectId));
  if (!row) throw new HttpError('not_found', 'Project not found');
  return {
    id: row.id,
    name: row.name,
    role,
    description: row.description,
    dataPointName: row.dataPointName,
    dataPointLatitude: row.dataPointLatitude,
    dataPointLongitude: row.dataPointLongitude,
    dataPointDepthM: row.dataPointDepthM,
    forecastSource: row.forecastSource,
    alphaCalibrationP: row.alphaCalibrationP,
    createdAt: row.createdAt.toISOString(),
  };
}

export async function updateProjectSettings(db: Db, projectId: string, input: ProjectSettingsInput): Promise<void> {
  await db
    .update(project)
    .set({ ...input, updatedAt: new Date() })
    .where(eq(project.id, projectId));
}

export async function projectNames(db: Db, ids: string[]): Promise<Map<string, string>> {
  if (ids.length === 0) return new Map();
  const rows = await db.select({ id: project.id, name: project.name }).from(project).where(inArray(project.id, ids));
  return new Map(rows.map((r) => [r.id, r.name]));
}

/** Active members of a project with their roles. */
export async function listMembers(db: Db, projectId: string) {
  const rows = await db
    .select({ userId: user.id, name: user.name, email: user.email, role: projectMember.role, banned: user.banned })
    .from(projectMember)
    .innerJoin(user, eq(user.id, projectMember.userId))
    .where(eq(projectMember.projectId, projectId))
    .orderBy(asc(user.name));
  return rows.filter((r) => !r.banned).map(({ banned: _b, ...r }) => r);
}
