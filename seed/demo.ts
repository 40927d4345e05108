import { eq } from 'drizzle-orm';
import type { AppDeps } from '../server/deps';
import { project, projectMember } from '../server/db/schema';
import { createUser } from '../server/services/users';
import { DEMO_PASSWORD, DEMO_PROJECT, DEMO_SECOND_PROJECT, DEMO_USERS } from './scenario';

export interface DemoIds {
  users: Record<(typeof DEMO_USERS)[number]['key'], string>;
  projectId: string;
  secondProjectId: string;
}

/** Seeds the invented demo scenario into an empty database. */
export async function seedDemo(deps: Pick<AppDeps, 'db' | 'auth' | 'log'>): Promise<DemoIds> {
  const { db, auth } = deps;
  const users = {} as DemoIds['users'];
  for (const u of DEMO_USERS) {
    const created = await createUser(auth, { name: u.name, email: u.email, globalRole: u.globalRole }, DEMO_PASSWORD);
    users[u.key] = created.user.id;
  }
  const [main] = await db.insert(project).values(DEMO_PROJECT).returning({ id: project.id });
  const [second] = await db.insert(project).values(DEMO_SECOND_PROJECT).returning({ id: project.id });
  await db.insert(projectMember).values([
    { projectId: main.id, userId: users.coordinator, role: 'coordinator' },
    { projectId: main.id, userId: users.skipper, role: 'skipper' },
    { projectId: main.id, userId: users.client, role: 'client' },
    { projectId: second.id, userId: users.coordinator, role: 'coordinator' },
    { projectId: second.id, userId: users.skipper, role: 'client' },
  ]);
  const [check] = await db.select({ id: project.id }).from(project).where(eq(project.id, main.id));
  deps.log.info('Demo scenario seeded', { project: check.id });
  return { users, projectId: main.id, secondProjectId: second.id };
}
