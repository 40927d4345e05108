/**
 * The ledger's monthly totals against the hindcast expectation: for calendar month m, the month's
 * lost hours in each hindcast year (hours of the month - workable records at OPLIM x dt, the same
 * rule as a ledger day, over the year-months the hindcast spans wholly: shared/ledger/days.ts),
 * then P50 and P90 over the years by Hyndman & Fan type 7.
 */
import { and, eq, gte, lte } from 'drizzle-orm';
import { evaluateStatus, quantileR7, zonedMonthStartMs } from '../../shared/engine';
import type { LedgerMonthRow, LedgerMonthlyAnswer } from '../../shared/api-types-downtime';
import type { ProjectAccessRole } from '../../shared/api-types';
import { yearMonthLostHours } from '../../shared/ledger/days';
import type { Db } from '../db/client';
import { ledgerDay } from '../db/schema';
import type { SeaSeries } from './series-store';
import type { ProjectSetup } from './site-context';
import { loadProjectSetup } from './site-context';
import {
  cachedStats,
  datasetSeries,
  forEachOperationSite,
  limitsVersion,
  settleStatsCache,
  statisticsDataset,
  statsStored,
  type DatasetRow,
} from './workability';
import { runEngineTask } from './engine-pool';
import { confirmedOnly } from './ledger-entries';

const MS_PER_HOUR = 3_600_000;
const round2 = (x: number) => Math.round(x * 100) / 100;

/** Expected lost hours of one operation at one worksite per calendar month (what is cached). */
export interface LedgerExpectation {
  operationId: string;
  siteId: string;
  /** Index 0-11: January to December. */
  months: { years: number; p50Hours: number | null; p90Hours: number | null }[];
}

/**
 * Expected lost hours (P50/P90 over the hindcast years) of every operation at each worksite, at
 * OPLIM (`alpha` false, the default) or at the forecast limits, to match the rest of the page.
 */
export function computeExpectations(series: SeaSeries, row: DatasetRow, setup: ProjectSetup, alpha = false): LedgerExpectation[] {
  const out: LedgerExpectation[] = [];
  forEachOperationSite(series, row, setup, ({ op, spec, site, engine, calendar, stepMs, workspace }) => {
    const status = evaluateStatus(engine, spec, { alpha, alphaTable: setup.alphaTable, out: workspace.status });
    const perYm = yearMonthLostHours(engine.timeMs, status, calendar.yearMonth, stepMs, site.timeZone);
    const months = Array.from({ length: 12 }, (_, m) => {
      const values = Float64Array.from(perYm.filter(([ym]) => ym - Math.floor(ym / 12) * 12 === m).map(([, h]) => h));
      return values.length === 0
        ? { years: 0, p50Hours: null, p90Hours: null }
        : { years: values.length, p50Hours: round2(quantileR7(values, 0.5)), p90Hours: round2(quantileR7(values, 0.9)) };
    });
    out.push({ operationId: op.id, siteId: site.id, months });
  });
  return out;
}

/**
 * The hindcast expectation of lost hours per calendar month for every operation at each of its
 * worksites (the basis of {@link ledgerMonthly}), with the dataset it is taken from; none without a hindcast.
 */
export async function ledgerExpectations(
  db: Db,
  projectId: string,
  options: { datasetId?: string; alpha?: boolean } = {},
): Promise<{ hindcast: DatasetRow | null; expectations: LedgerExpectation[] }> {
  const [setup, hindcast] = await Promise.all([loadProjectSetup(db, projectId), statisticsDataset(db, projectId, options.datasetId)]);
  if (!hindcast) return { hindcast: null, expectations: [] };
  return { hindcast, expectations: await expectationsFor(db, projectId, setup, hindcast, options.alpha ?? false) };
}

/**
 * Works out and stores the hindcast expectation the Downtime page's ledger opens on (the default
 * hindcast, forecast limits on) when the `stats_cache` table does not hold it for the present
 * limits yet; true when it worked it out. `hindcast` is the project's default. For the scheduled
 * work (server/services/statistics-ahead.ts).
 */
export async function storeDefaultLedgerExpectations(db: Db, hindcast: DatasetRow, setup: ProjectSetup): Promise<boolean> {
  const version = limitsVersion(setup, hindcast.dataPointDepthM, hindcast.waterLevelReference);
  if (await statsStored(db, hindcast.id, version, expectationVariant(true))) return false;
  await expectationsFor(db, hindcast.projectId, setup, hindcast, true);
  await settleStatsCache();
  return true;
}

const expectationVariant = (alpha: boolean) => (alpha ? 'ledger-alpha' : 'ledger');

async function expectationsFor(
  db: Db,
  projectId: string,
  setup: ProjectSetup,
  hindcast: DatasetRow,
  alpha: boolean,
): Promise<LedgerExpectation[]> {
  const version = limitsVersion(setup, hindcast.dataPointDepthM, hindcast.waterLevelReference);
  return cachedStats(db, projectId, hindcast.id, version, expectationVariant(alpha), async () =>
    // On an engine worker thread (engine-pool.ts).
    runEngineTask('ledgerExpectations', computeExpectations, await datasetSeries(db, hindcast.id), hindcast, setup, alpha),
  );
}

/**
 * Per month and operation at a worksite: confirmed planned and lost hours, lost hours still
 * proposed (not for clients), and the hindcast expectation of the month's lost hours (P50/P90).
 * Months are those with ledger rows, optionally limited to days `from`-`to`.
 */
export async function ledgerMonthly(
  db: Db,
  projectId: string,
  options: { datasetId?: string; from?: string; to?: string; role: ProjectAccessRole; alpha?: boolean },
): Promise<LedgerMonthlyAnswer> {
  const alpha = options.alpha ?? false;
  const conditions = [eq(ledgerDay.projectId, projectId)];
  if (options.from) conditions.push(gte(ledgerDay.day, options.from));
  if (options.to) conditions.push(lte(ledgerDay.day, options.to));
  if (confirmedOnly(options.role)) conditions.push(eq(ledgerDay.status, 'confirmed'));
  const [rows, setup, hindcast] = await Promise.all([
    db
      .select()
      .from(ledgerDay)
      .where(and(...conditions)),
    loadProjectSetup(db, projectId),
    statisticsDataset(db, projectId, options.datasetId),
  ]);
  const expectations: LedgerExpectation[] = hindcast ? await expectationsFor(db, projectId, setup, hindcast, alpha) : [];
  const expected = new Map(expectations.map((e) => [`${e.operationId}|${e.siteId}`, e]));
  const ops = new Map(setup.operations.map((o) => [o.id, o]));
  const sites = new Map(setup.sites.map((s) => [s.id, s]));

  const groups = new Map<string, LedgerMonthRow>();
  for (const r of rows) {
    const op = ops.get(r.operationId);
    const site = sites.get(r.siteId);
    if (!op || !site) continue;
    const month = r.day.slice(0, 7);
    const key = `${month}|${r.operationId}|${r.siteId}`;
    let g = groups.get(key);
    if (!g) {
      const y = Number(month.slice(0, 4));
      const m = Number(month.slice(5, 7));
      const e = expected.get(`${r.operationId}|${r.siteId}`)?.months[m - 1];
      g = {
        month,
        operationId: op.id,
        operationName: op.name,
        siteId: site.id,
        siteName: site.name,
        days: 0,
        confirmedDays: 0,
        confirmedPlannedHours: 0,
        confirmedLostHours: 0,
        proposedLostHours: confirmedOnly(options.role) ? null : 0,
        monthHours: (zonedMonthStartMs(y, m + 1, site.timeZone) - zonedMonthStartMs(y, m, site.timeZone)) / MS_PER_HOUR,
        expectedP50Hours: e?.p50Hours ?? null,
        expectedP90Hours: e?.p90Hours ?? null,
        hindcastYears: e?.years ?? 0,
      };
      groups.set(key, g);
    }
    g.days++;
    if (r.status === 'confirmed') {
      g.confirmedDays++;
      g.confirmedPlannedHours += r.plannedHours;
      g.confirmedLostHours = round2(g.confirmedLostHours + (r.lostHours ?? 0));
    } else if (g.proposedLostHours !== null) {
      g.proposedLostHours = round2(g.proposedLostHours + r.proposedLostHours);
    }
  }
  const out = [...groups.values()].sort(
    (a, b) => a.month.localeCompare(b.month) || a.operationName.localeCompare(b.operationName) || a.siteName.localeCompare(b.siteName),
  );
  return { hindcast: hindcast ? { id: hindcast.id, name: hindcast.name } : null, alpha, rows: out };
}
