import { Router } from 'express';
import { SubscriptionInput } from '../../shared/schemas/alerts';
import type { AppDeps } from '../deps';
import { parseInput } from '../http/errors';
import { requireProjectMember } from '../services/project-access';
import { mySubscription, NOTHING_CHOSEN, saveSubscription } from '../services/subscriptions';

/** The caller's alert subscription in a project. */
export function subscriptionRoutes(deps: AppDeps): Router {
  const { db } = deps;
  const router = Router();

  /** GET /api/projects/:projectId/subscription: what the caller hears about in this project. */
  router.get('/projects/:projectId/subscription', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    const sub = await mySubscription(db, access.user.id, access.projectId);
    res.json(sub ?? { ...NOTHING_CHOSEN, stored: false });
  });

  /** PUT /api/projects/:projectId/subscription: choose operations, worksites, immediate alerts and/or a daily digest. */
  router.put('/projects/:projectId/subscription', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    const input = parseInput(SubscriptionInput, req.body);
    await saveSubscription(db, access.user.id, access.projectId, input);
    res.json(await mySubscription(db, access.user.id, access.projectId));
  });

  return router;
}
