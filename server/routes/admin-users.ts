import { Router } from 'express';
import { CreateUserInput, SetMembershipInput, UpdateUserInput } from '../../shared/schemas/projects';
import type { AppDeps } from '../deps';
import { requireAdmin } from '../http/context';
import { parseInput } from '../http/errors';
import { createUserFromInput, issueTemporaryPassword, listUsers, removeMembership, setMembership, updateUser } from '../services/users';
import { idParam } from '../../shared/schemas/common';
import { HttpError } from '../http/errors';

function projectIdParam(value: string): string {
  if (!idParam.safeParse(value).success) throw new HttpError('not_found', 'Project not found');
  return value;
}

export function adminUserRoutes({ db, auth, clock }: AppDeps): Router {
  const router = Router();

  /** GET /api/admin/users: every user with their project roles (administrators only). */
  router.get('/admin/users', async (req, res) => {
    requireAdmin(req);
    res.json(await listUsers(db));
  });

  /** POST /api/admin/users `{ name, email, globalRole? }`: 201 `{ user, temporaryPassword }` (shown once). */
  router.post('/admin/users', async (req, res) => {
    requireAdmin(req);
    const input = parseInput(CreateUserInput, req.body);
    res.status(201).json(await createUserFromInput(auth, input, clock()));
  });

  /**
   * POST /api/admin/users/:userId/temporary-password: a new temporary password (shown once) for a
   * forgotten or expired one; the old password stops working and every session of the user ends.
   */
  router.post('/admin/users/:userId/temporary-password', async (req, res) => {
    requireAdmin(req);
    res.json(await issueTemporaryPassword(auth, db, req.params.userId, clock()));
  });

  /** PATCH /api/admin/users/:userId `{ active?, globalRole? }`: deactivate/reactivate, change global role. */
  router.patch('/admin/users/:userId', async (req, res) => {
    const actor = requireAdmin(req);
    const input = parseInput(UpdateUserInput, req.body);
    await updateUser(db, actor, req.params.userId, input);
    res.json({ ok: true });
  });

  /** PUT /api/admin/users/:userId/projects/:projectId `{ role }`: assign or change a project role. */
  router.put('/admin/users/:userId/projects/:projectId', async (req, res) => {
    requireAdmin(req);
    const input = parseInput(SetMembershipInput, req.body);
    await setMembership(db, req.params.userId, projectIdParam(req.params.projectId), input.role);
    res.json({ ok: true });
  });

  /** DELETE /api/admin/users/:userId/projects/:projectId: remove the user from the project. */
  router.delete('/admin/users/:userId/projects/:projectId', async (req, res) => {
    requireAdmin(req);
    await removeMembership(db, req.params.userId, projectIdParam(req.params.projectId));
    res.status(204).end();
  });

  return router;
}
