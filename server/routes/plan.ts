import { Router } from 'express';
import { z } from 'zod';
import type { AppDeps } from '../deps';
import { HttpError, parseInput } from '../http/errors';
import { requireProjectMember } from '../services/project-access';
import { hourChain, projectPlan, projectPlanJson, siteConditions } from '../services/plans';
import { icsDocument, windowFinishSentence } from '../services/calendar';
import { CAUTION_LINE } from '../../shared/caution';

const alphaFlag = z
  .enum(['true', 'false'])
  .default('true')
  .transform((v) => v === 'true');
const PlanQuery = z.object({
  dataset: z.string().uuid('must be a dataset id').optional(),
  alpha: alphaFlag,
  /** A stretch of a non-forecast dataset, at most 31 days (ISO 8601). */
  from: z.iso.datetime({ offset: true, error: 'must be an ISO 8601 time' }).optional(),
  to: z.iso.datetime({ offset: true, error: 'must be an ISO 8601 time' }).optional(),
});
const ChainQuery = PlanQuery.extend({
  operationId: z.string().uuid('must be an operation id'),
  siteId: z.string().uuid('must be a worksite id'),
  time: z.iso.datetime({ offset: true, error: 'must be an ISO 8601 time' }),
});
const IcsQuery = PlanQuery.extend({
  operationId: z.string().uuid('must be an operation id'),
  siteId: z.string().uuid('must be a worksite id').optional(),
});

export function planRoutes({ db, clock }: AppDeps): Router {
  const router = Router();

  /**
   * GET /api/projects/:projectId/plan?dataset=&alpha=: per operation and worksite, usable windows,
   * earliest go-start, "may start now" and the hourly statuses (latest forecast when no dataset).
   */
  router.get('/projects/:projectId/plan', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    const q = parseInput(PlanQuery, req.query, 'query');
    res
      .type('application/json')
      .send(await projectPlanJson(db, access.projectId, { datasetId: q.dataset, alpha: q.alpha, now: clock(), from: q.from, to: q.to }));
  });

  /** GET .../plan/chain?operationId=&siteId=&time=: the chain behind one hour. */
  router.get('/projects/:projectId/plan/chain', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    const q = parseInput(ChainQuery, req.query, 'query');
    res.json(
      await hourChain(db, access.projectId, {
        datasetId: q.dataset,
        operationId: q.operationId,
        siteId: q.siteId,
        time: q.time,
        alpha: q.alpha,
      }),
    );
  });

  /** GET .../plan/windows.ics?operationId=&siteId=: the operation's usable windows as iCalendar. */
  router.get('/projects/:projectId/plan/windows.ics', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    const q = parseInput(IcsQuery, req.query, 'query');
    const plan = await projectPlan(db, access.projectId, { datasetId: q.dataset, alpha: q.alpha, now: clock(), from: q.from, to: q.to });
    const rows = plan.plans.filter((p) => p.operationId === q.operationId && (!q.siteId || p.siteId === q.siteId));
    if (rows.length === 0) throw new HttpError('not_found', 'Operation not found in the plan');
    const events = rows.flatMap((p) =>
      p.windows.map((w) => ({
        uid: `${p.operationId}-${p.siteId}-${w.start}@lullwatch`,
        start: new Date(w.start),
        end: new Date(w.end),
        summary: `Window: ${p.operationName} at ${p.siteName}`,
        description: `Usable weather window of ${w.hours} h (TR ${p.tr} h) from ${plan.dataset?.name ?? 'the forecast'}. ${windowFinishSentence(w.start, p.tpop, p.tr, p.timeZone)} ${CAUTION_LINE}`,
      })),
    );
    const name = rows[0].operationName.replace(/[^A-Za-z0-9._-]+/g, '-').slice(0, 60);
    res.setHeader('content-type', 'text/calendar; charset=utf-8');
    res.setHeader('content-disposition', `attachment; filename="${name}-windows.ics"`);
    res.send(icsDocument(`${rows[0].operationName}: weather windows`, events));
  });

  /** GET /api/projects/:projectId/conditions/:siteId?dataset=: worksite Hs, Tp, bed velocity, wind over time, with limits. */
  router.get('/projects/:projectId/conditions/:siteId', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    const q = parseInput(PlanQuery, req.query, 'query');
    if (!z.string().uuid().safeParse(req.params.siteId).success) throw new HttpError('not_found', 'Worksite not found');
    res.json(
      await siteConditions(db, access.projectId, { datasetId: q.dataset, siteId: req.params.siteId, from: q.from, to: q.to, now: clock() }),
    );
  });

  return router;
}
