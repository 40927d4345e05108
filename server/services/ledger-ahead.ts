// Ledger days proposed ahead (scheduled work, jobs/schedule.ts): every hour each project's days of
// the last week that are over in their worksite's zone and not yet confirmed are proposed from the
// data as the Propose button does (ledger-propose.ts), so that a coordinator finds yesterday waiting
// for confirmation in the morning, and a day first proposed from the forecast is proposed again from
// an observation record imported later. Proposals are drafts: nothing reaches a client until a
// coordinator confirms the day.
import { advisoryLockKey } from '../db/client';
import type { AppDeps } from '../deps';
import { project } from '../db/schema';
import { proposeLedger } from './ledger-propose';

/** Days back from today (UTC) the scheduled proposals cover: a week (our choice). */
export const LEDGER_AHEAD_DAYS = 7;

/** The advisory lock of one project's scheduled proposals (apart from its planning lock). */
export function ledgerLockKey(projectId: string): number {
  return advisoryLockKey('ledger', projectId);
}

export interface LedgerAheadResult {
  /** Projects where days were written, with how many. */
  written: { projectId: string; days: number }[];
  busy: number;
  failed: number;
}

const isoDay = (ms: number) => new Date(ms).toISOString().slice(0, 10);

/**
 * One run over every project: proposes the days from LEDGER_AHEAD_DAYS days before today (UTC) to
 * today, each read in its worksite's zone (days not over yet are left for a later run), writing
 * only what changed. A project another instance is proposing is left to it; a failure is logged
 * and the run goes on.
 */
export async function proposeLedgerAhead(deps: AppDeps): Promise<LedgerAheadResult> {
  const now = deps.clock();
  const range = { from: isoDay(now.getTime() - LEDGER_AHEAD_DAYS * 86_400_000), to: isoDay(now.getTime()) };
  const result: LedgerAheadResult = { written: [], busy: 0, failed: 0 };
  const ids = (await deps.db.select({ id: project.id }).from(project)).map((r) => r.id);
  for (const projectId of ids) {
    try {
      const locked = await deps.database.withAdvisoryLock(ledgerLockKey(projectId), () =>
        proposeLedger(deps.db, projectId, range, now, { onlyChanged: true }),
      );
      if (!locked.acquired) result.busy++;
      else if (locked.value.written > 0) result.written.push({ projectId, days: locked.value.written });
    } catch (err) {
      result.failed++;
      deps.log.warn('Ledger proposals: a project failed', { projectId, error: err instanceof Error ? err.message : String(err) });
    }
  }
  if (result.written.length > 0)
    deps.log.info('Ledger days proposed', { projects: result.written.length, days: result.written.reduce((a, w) => a + w.days, 0) });
  return result;
}
