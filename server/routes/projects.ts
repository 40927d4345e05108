import { Router } from 'express';
import { CreateProjectInput, ProjectSettingsInput } from '../../shared/schemas/projects';
import type { AppDeps } from '../deps';
import { requireUser } from '../http/context';
import { parseInput } from '../http/errors';
import { requireCoordinator, requireProjectMember } from '../services/project-access';
import { createProject, getProject, requireProjectCreator, listMembers, listProjects, updateProjectSettings } from '../services/projects';

export function projectRoutes({ db }: AppDeps): Router {
  const router = Router();

  /** GET /api/projects: the caller's projects `[{ id, name, role }]` (admins: all). */
  router.get('/projects', async (req, res) => {
    res.json(await listProjects(db, requireUser(req)));
  });

  /** POST /api/projects `{ name, description? }`: admins and coordinators; the creator coordinates it. */
  router.post('/projects', async (req, res) => {
    // The role check comes before the body check: a caller who may not create projects gets 403 whatever they send.
    const user = await requireProjectCreator(db, requireUser(req));
    const input = parseInput(CreateProjectInput, req.body);
    res.status(201).json(await createProject(db, user, input));
  });

  /** GET /api/projects/:projectId: project details and the caller's role. */
  router.get('/projects/:projectId', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    res.json(await getProject(db, access.projectId, access.role));
  });

  /** PUT /api/projects/:projectId/settings: name, description, data point, forecast source (coordinators). */
  router.put('/projects/:projectId/settings', async (req, res) => {
    const access = await requireCoordinator(db, req, req.params.projectId);
    const input = parseInput(ProjectSettingsInput, req.body);
    await updateProjectSettings(db, access.projectId, input);
    res.json(await getProject(db, access.projectId, access.role));
  });

  /** GET /api/projects/:projectId/members (coordinators): members with their roles, e.g. to assign skippers. */
  router.get('/projects/:projectId/members', async (req, res) => {
    const access = await requireCoordinator(db, req, req.params.projectId);
    res.json(await listMembers(db, access.projectId));
  });

  return router;
}
