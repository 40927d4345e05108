import cron, { type TaskContext } from 'node-cron';
import type { AppDeps } from '../server/deps';
import { deliverDueMail } from '../server/services/outbox';
import { planNewForecasts, runPlanningJob } from '../server/services/planning';
import { queueDigests } from '../server/services/digests';
import { workStatisticsAhead } from '../server/services/statistics-ahead';
import { proposeLedgerAhead } from '../server/services/ledger-ahead';

export interface Schedule {
  stop(): void;
  /** Resolves when no scheduled work is running. */
  idle(): Promise<void>;
}

/**
 * The scheduled work of one app instance (node-cron, UTC): the planning job on `planCron`
 * (default every 6 hours at minute 15), every minute the planning of a new latest forecast stored
 * outside the job (fetched by a coordinator, imported), e-mail delivery every minute, daily digests every 15
 * minutes, and every 2 minutes what each project's Downtime page opens on (workability statistics,
 * the first campaign's simulation, the ledger's hindcast expectation), worked out ahead where not
 * stored for the present data and limits, and every hour at minute 25 the ledger days of the last
 * week that are over, proposed from the data where they changed (never a confirmed one). `noOverlap` keeps one run of each at a time in this
 * process; the planning job also takes a database advisory lock per project against other
 * instances, and plans a project once per tick across them; the statistics take a lock of their
 * own per project and skip what another instance stored.
 */
export function startPlanningSchedule(deps: AppDeps, options: { planCron: string; enabled: boolean }): Schedule {
  if (!options.enabled) return { stop: () => {}, idle: async () => {} };
  const running = new Set<Promise<unknown>>();
  const track = (p: Promise<unknown>) => {
    running.add(p);
    void p.finally(() => running.delete(p));
    return p;
  };
  const guard = (name: string, fn: (ctx: TaskContext) => Promise<unknown>) => (ctx: TaskContext) =>
    track(fn(ctx).catch((err: unknown) => deps.log.error(`${name} failed`, { error: err instanceof Error ? err.message : String(err) })));
  const tasks = [
    // ctx.date is the tick's scheduled time, the same on every instance: a project another instance
    // already planned on this tick is not planned again. A tick reached late (a busy process) still
    // runs, up to the next tick (node-cron would otherwise drop a tick more than 1 s late).
    cron.createTask(
      options.planCron,
      guard('Planning job', (ctx) => runPlanningJob(deps, { trigger: 'schedule', tickAt: ctx.date })),
      {
        name: 'plan',
        noOverlap: true,
        timezone: 'UTC',
        missedExecutionTolerance: 6 * 3_600_000,
      },
    ),
    // A new latest forecast stored outside the job (fetched by a coordinator, imported, the demo's
    // first) is planned, and its alerts queued, within the minute.
    cron.createTask(
      '* * * * *',
      guard('Planning new forecasts', () => planNewForecasts(deps)),
      { name: 'new-forecasts', noOverlap: true, timezone: 'UTC' },
    ),
    cron.createTask(
      '* * * * *',
      guard('Mail delivery', () =>
        deliverDueMail(deps.db, deps.mailer, deps.clock(), { maxAttempts: deps.config.mailMaxAttempts, log: deps.log, links: deps.config }),
      ),
      {
        name: 'mail',
        noOverlap: true,
        timezone: 'UTC',
      },
    ),
    cron.createTask(
      '*/15 * * * *',
      guard('Daily digests', () => queueDigests(deps)),
      { name: 'digest', noOverlap: true, timezone: 'UTC' },
    ),
    cron.createTask(
      '*/2 * * * *',
      guard('Statistics ahead', () => workStatisticsAhead(deps)),
      { name: 'statistics', noOverlap: true, timezone: 'UTC' },
    ),
    // Each hour: the last week's finished days proposed to the ledger where they changed.
    cron.createTask(
      '25 * * * *',
      guard('Ledger proposals', () => proposeLedgerAhead(deps)),
      { name: 'ledger', noOverlap: true, timezone: 'UTC' },
    ),
  ];
  for (const t of tasks) void t.start();
  return {
    stop: () => {
      for (const t of tasks) void t.destroy();
    },
    idle: async () => {
      await Promise.allSettled([...running]);
    },
  };
}
