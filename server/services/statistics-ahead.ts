// Statistics worked out ahead (scheduled work, jobs/schedule.ts): after a hindcast import, a change
// of the default hindcast, of a campaign or of any limit, the next run works out what the Downtime
// page opens on (the workability statistics, the first campaign's simulation and the ledger's
// hindcast expectation, forecast limits on) and stores it, so the first person to open the page
// finds it ready instead of waiting for a cold 30-year computation (1.5-2 s for the workability
// alone on the bench's project). The work runs on the engine thread, below the API thread's
// priority (engine-pool.ts). The campaign's live outlook is not stored here: the planning job
// works it out on every new forecast.
import { advisoryLockKey } from '../db/client';
import type { AppDeps } from '../deps';
import { project } from '../db/schema';
import { storeDefaultSimulation } from './campaigns';
import { storeDefaultLedgerExpectations } from './ledger-monthly';
import { loadProjectSetup } from './site-context';
import { statisticsDataset, storeDefaultWorkability } from './workability';

/** The advisory lock of one project's statistics work (apart from its planning lock). */
export function statisticsLockKey(projectId: string): number {
  return advisoryLockKey('statistics', projectId);
}

/**
 * What one run did: the projects where it worked something out; how many had nothing to do (all
 * stored already, or no hindcast), were held by another instance, or failed.
 */
export interface StatisticsAheadResult {
  worked: string[];
  unchanged: number;
  busy: number;
  failed: number;
}

/**
 * One run over every project, one after the other. A project another instance is working on is
 * left to it; a failure is logged and the run goes on with the next project.
 */
export async function workStatisticsAhead(deps: AppDeps): Promise<StatisticsAheadResult> {
  const startedMs = performance.now();
  const result: StatisticsAheadResult = { worked: [], unchanged: 0, busy: 0, failed: 0 };
  const ids = (await deps.db.select({ id: project.id }).from(project)).map((r) => r.id);
  for (const projectId of ids) {
    try {
      const locked = await deps.database.withAdvisoryLock(statisticsLockKey(projectId), async () => {
        // The default hindcast and the setup read once, for the three.
        const row = await statisticsDataset(deps.db, projectId);
        if (!row) return false;
        const setup = await loadProjectSetup(deps.db, projectId);
        const workability = await storeDefaultWorkability(deps.db, row, setup);
        const simulation = await storeDefaultSimulation(deps.db, row, setup, deps.clock());
        const ledger = await storeDefaultLedgerExpectations(deps.db, row, setup);
        return workability || simulation || ledger;
      });
      if (!locked.acquired) result.busy++;
      else if (locked.value) result.worked.push(projectId);
      else result.unchanged++;
    } catch (err) {
      result.failed++;
      deps.log.warn('Statistics ahead: a project failed', { projectId, error: err instanceof Error ? err.message : String(err) });
    }
  }
  if (result.worked.length > 0)
    deps.log.info('Statistics worked out ahead', { projects: result.worked.length, ms: Math.round(performance.now() - startedMs) });
  return result;
}
