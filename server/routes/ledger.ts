import { Router } from 'express';
import { z } from 'zod';
import { LedgerConfirmDayInput, LedgerConfirmInput, LedgerRangeQuery, isoDay } from '../../shared/schemas/downtime';
import type { AppDeps } from '../deps';
import { parseInput } from '../http/errors';
import { confirmLedger, confirmLedgerDay, listLedger } from '../services/ledger-entries';
import { ledgerMonthly } from '../services/ledger-monthly';
import { proposeLedger } from '../services/ledger-propose';
import { requireCoordinator, requireProjectMember } from '../services/project-access';

const MonthlyQuery = z.object({
  dataset: z.string().uuid('must be a dataset id').optional(),
  from: isoDay.optional(),
  to: isoDay.optional(),
  alpha: z
    .enum(['true', 'false'], { error: 'alpha must be true or false' })
    .default('false')
    .transform((v) => v === 'true'),
});

/** The downtime ledger: every member reads (clients the confirmed days only), coordinators propose and confirm. */
export function ledgerRoutes({ db, clock }: AppDeps): Router {
  const router = Router();

  /**
   * POST /api/projects/:projectId/ledger/propose?from=YYYY-MM-DD&to=YYYY-MM-DD: proposes each day
   * that is over (worksite time zone) for every operation at each of its worksites from the newest
   * observation that covers the day, else the forecast issues that covered it; planned hours, hours
   * lost at OPLIM, limiting factor. Updates proposed rows, never confirmed ones.
   * → `{ written, keptConfirmed, uncovered, notOver, sources }`.
   */
  router.post('/projects/:projectId/ledger/propose', async (req, res) => {
    const access = await requireCoordinator(db, req, req.params.projectId);
    const q = parseInput(LedgerRangeQuery, req.query, 'query');
    res.json(await proposeLedger(db, access.projectId, q, clock()));
  });

  /** GET /api/projects/:projectId/ledger?from=&to=: ledger days by day, operation and worksite (clients: confirmed only). */
  router.get('/projects/:projectId/ledger', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    const q = parseInput(LedgerRangeQuery, req.query, 'query');
    res.json(await listLedger(db, access.projectId, q, access.role));
  });

  /**
   * GET /api/projects/:projectId/ledger/monthly?dataset=&from=&to=&alpha=false|true: per month and
   * operation at a worksite, confirmed lost hours against the hindcast expectation (P50/P90 of the
   * month's lost hours over the hindcast years, at OPLIM or with alpha=true at the forecast limits,
   * the basis of the rest of the downtime page; default the project's default hindcast).
   */
  router.get('/projects/:projectId/ledger/monthly', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    const q = parseInput(MonthlyQuery, req.query, 'query');
    res.json(
      await ledgerMonthly(db, access.projectId, { datasetId: q.dataset, from: q.from, to: q.to, role: access.role, alpha: q.alpha }),
    );
  });

  /**
   * POST /api/projects/:projectId/ledger/:entryId/confirm `{ lostHours?, limiting?, note }`:
   * confirms the day (a corrected value needs a note) and locks it; 409 when already confirmed or
   * when the day is not over yet in the worksite's time zone.
   * Written to the audit trail.
   */
  router.post('/projects/:projectId/ledger/:entryId/confirm', async (req, res) => {
    const access = await requireCoordinator(db, req, req.params.projectId);
    const input = parseInput(LedgerConfirmInput, req.body ?? {});
    res.json(await confirmLedger(db, access.projectId, access.user, req.params.entryId, input, clock()));
  });

  /**
   * POST /api/projects/:projectId/ledger/confirm-day `{ day, siteId?, note? }`: confirms every
   * proposed entry of the day (of one worksite when given) as proposed, all or none; 409 when none
   * is proposed or the day is not over yet at one of its worksites. Each entry is audited.
   * → the confirmed entries.
   */
  router.post('/projects/:projectId/ledger/confirm-day', async (req, res) => {
    const access = await requireCoordinator(db, req, req.params.projectId);
    const input = parseInput(LedgerConfirmDayInput, req.body ?? {});
    res.json(await confirmLedgerDay(db, access.projectId, access.user, input, clock()));
  });

  return router;
}
