/**
 * Ledger proposals: each finished day of every operation at each of its worksites, tallied from
 * the data (the day arithmetic and its choices: shared/ledger/days.ts).
 *
 * - Only days that are over in the worksite's time zone are proposed or confirmed: the ledger
 *   records what happened, and a client reads a confirmed day as lost hours that happened.
 * - Source, per worksite and day: the newest observation dataset whose records span the whole day
 *   (first record at or before the day's start, last record + dt at or after its end), else the
 *   forecast issues that together cover the day, each minute taken from the newest issue that
 *   covers it (the shortest lead time: the best estimate of what happened when nothing was
 *   measured), shown as "from forecast"; a day neither covers is not proposed and is reported
 *   as uncovered.
 */
import { and, eq, gte, lte, or, sql } from 'drizzle-orm';
import { evaluateHours } from '../../shared/engine';
import type { LedgerProposeAnswer } from '../../shared/api-types-downtime';
import { daysOf, tallyDay, tallyStitched, zonedDayMs, type DayTally, type StatusPart } from '../../shared/ledger/days';
import type { Db } from '../db/client';
import { dataset, ledgerDay } from '../db/schema';
import { readSeries, type SeaSeries } from './series-store';
import { ledgerDaysWhere } from './ledger-entries';
import { loadProjectSetup, operationSpec, sitesOf, transformForSite, type ProjectSetup, type WorksiteRow } from './site-context';

const MS_PER_HOUR = 3_600_000;
/** `excluded.<column>` in an upsert: the value the insert tried to write. */
const sqlExcluded = (column: string) => sql.raw(`excluded.${column}`);

type DatasetRowFull = typeof dataset.$inferSelect;

export interface ProposeOptions {
  /**
   * Write only new days and proposed days whose figures or source change (the scheduled proposals:
   * an unchanged day keeps its update time). `written` then counts those, and `keptConfirmed` only
   * the days found confirmed before writing.
   */
  onlyChanged?: boolean;
}

/** The upsert's row differs from the stored one in what a proposal says (NULLs compared as values). */
const PROPOSAL_CHANGED = sql`(${ledgerDay.plannedHours}, ${ledgerDay.proposedLostHours}, ${ledgerDay.proposedLimiting}, ${ledgerDay.source}, ${ledgerDay.datasetId}) is distinct from (${sqlExcluded('planned_hours')}, ${sqlExcluded('proposed_lost_hours')}, ${sqlExcluded('proposed_limiting')}, ${sqlExcluded('source')}, ${sqlExcluded('dataset_id')})`;

/** Does the dataset's record span cover [startMs, endMs)? */
const spans = (d: DatasetRowFull, startMs: number, endMs: number) =>
  d.startAt.getTime() <= startMs && d.endAt.getTime() + d.stepMinutes * 60_000 >= endMs;

/** Does the dataset's records' span overlap [startMs, endMs)? */
const overlaps = (d: DatasetRowFull, startMs: number, endMs: number) =>
  d.startAt.getTime() < endMs && d.endAt.getTime() + d.stepMinutes * 60_000 > startMs;

/** Do the datasets' spans together cover [startMs, endMs) without a gap? */
function unionCovers(list: DatasetRowFull[], startMs: number, endMs: number): boolean {
  const spansSorted = list
    .map((d) => [d.startAt.getTime(), d.endAt.getTime() + d.stepMinutes * 60_000] as const)
    .sort((a, b) => a[0] - b[0]);
  let reached = startMs;
  for (const [a, b] of spansSorted) {
    if (a > reached) break;
    reached = Math.max(reached, b);
    if (reached >= endMs) return true;
  }
  return reached >= endMs;
}

/**
 * Proposes ledger days for every operation at each of its worksites from `from` to `to`
 * (YYYY-MM-DD, inclusive, each in the worksite's time zone): writes new rows and updates proposed
 * ones; confirmed rows are never touched. Only days that are over in the worksite's time zone at
 * `now` are proposed (the others are listed in `notOver`): the ledger records what happened.
 * Source per worksite and day: the newest observation dataset that spans the whole day, else the
 * forecast issues that together cover it, each minute from the newest issue that covers it.
 */
export async function proposeLedger(
  db: Db,
  projectId: string,
  range: { from: string; to: string },
  now: Date,
  options: ProposeOptions = {},
): Promise<LedgerProposeAnswer> {
  const setup = await loadProjectSetup(db, projectId);
  const days = daysOf(range.from, range.to);
  const nowMs = now.getTime();
  const usedSites = new Map<string, WorksiteRow>();
  for (const op of setup.operations) for (const s of sitesOf(op, setup.sites)) usedSites.set(s.id, s);
  const empty: LedgerProposeAnswer = { written: 0, keptConfirmed: 0, uncovered: [], notOver: [], sources: [] };
  if (usedSites.size === 0) return empty;
  const notOver: LedgerProposeAnswer['notOver'] = [];
  const siteDays = new Map<string, { day: string; startMs: number; endMs: number }[]>();
  let minMs = Infinity;
  let maxMs = -Infinity;
  for (const site of usedSites.values()) {
    const all = days.map((day) => ({ day, ...zonedDayMs(day, site.timeZone) }));
    const over = all.filter((d) => d.endMs <= nowMs);
    if (over.length < all.length) notOver.push({ siteId: site.id, days: all.filter((d) => d.endMs > nowMs).map((d) => d.day) });
    siteDays.set(site.id, over);
    if (over.length === 0) continue;
    minMs = Math.min(minMs, over[0].startMs);
    maxMs = Math.max(maxMs, over[over.length - 1].endMs);
  }
  if (!Number.isFinite(minMs)) return { ...empty, notOver };

  // Candidate sources: observations newest first, then forecasts by issue time, newest first.
  const candidates = await db
    .select()
    .from(dataset)
    .where(
      and(
        eq(dataset.projectId, projectId),
        or(eq(dataset.kind, 'observation'), eq(dataset.kind, 'forecast')),
        lte(dataset.startAt, new Date(maxMs)),
        gte(dataset.endAt, new Date(minMs - 24 * MS_PER_HOUR)),
      ),
    );
  const newest = (a: DatasetRowFull, b: DatasetRowFull) =>
    (b.issuedAt?.getTime() ?? b.createdAt.getTime()) - (a.issuedAt?.getTime() ?? a.createdAt.getTime()) ||
    b.createdAt.getTime() - a.createdAt.getTime();
  const observations = candidates.filter((d) => d.kind === 'observation').sort((a, b) => b.createdAt.getTime() - a.createdAt.getTime());
  const forecasts = candidates.filter((d) => d.kind === 'forecast').sort(newest);

  // Sources per worksite and day.
  interface SiteDay {
    site: WorksiteRow;
    day: string;
    startMs: number;
    endMs: number;
    kind: 'observation' | 'forecast';
    sources: DatasetRowFull[];
  }
  const work: SiteDay[] = [];
  const uncovered: LedgerProposeAnswer['uncovered'] = [];
  const needed = new Map<string, { from: number; to: number }>();
  for (const site of usedSites.values()) {
    const missing: string[] = [];
    for (const d of siteDays.get(site.id)!) {
      const obs = observations.find((o) => spans(o, d.startMs, d.endMs));
      let entry: SiteDay | null = null;
      if (obs) entry = { site, ...d, kind: 'observation', sources: [obs] };
      else {
        const issues = forecasts.filter((f) => overlaps(f, d.startMs, d.endMs));
        if (issues.length > 0 && unionCovers(issues, d.startMs, d.endMs)) entry = { site, ...d, kind: 'forecast', sources: issues };
      }
      if (!entry) {
        missing.push(d.day);
        continue;
      }
      work.push(entry);
      for (const src of entry.sources) {
        const r = needed.get(src.id) ?? { from: Infinity, to: -Infinity };
        needed.set(src.id, { from: Math.min(r.from, d.startMs - src.stepMinutes * 60_000), to: Math.max(r.to, d.endMs) });
      }
    }
    if (missing.length > 0) uncovered.push({ siteId: site.id, days: missing });
  }

  // Existing confirmed rows are left alone.
  const confirmed = await db
    .select({ operationId: ledgerDay.operationId, siteId: ledgerDay.siteId, day: ledgerDay.day })
    .from(ledgerDay)
    .where(ledgerDaysWhere(projectId, 'confirmed', gte(ledgerDay.day, range.from), lte(ledgerDay.day, range.to)));
  const locked = new Set(confirmed.map((r) => `${r.operationId}|${r.siteId}|${r.day}`));
  let keptConfirmed = 0;

  const seriesById = new Map<string, SeaSeries>();
  for (const [id, r] of needed) seriesById.set(id, await readSeries(db, id, { fromMs: r.from, toMs: r.to }));
  // Statuses at OPLIM per source, worksite and operation, worked out once.
  const transformed = new Map<string, ReturnType<typeof transformForSite>>();
  const statuses = new Map<string, StatusPart>();
  const statusOf = (src: DatasetRowFull, site: WorksiteRow, op: ProjectSetup['operations'][number]): StatusPart => {
    const key = `${src.id}|${site.id}|${op.id}`;
    let part = statuses.get(key);
    if (!part) {
      const series = seriesById.get(src.id)!;
      let t = transformed.get(`${src.id}|${site.id}`);
      if (!t) {
        t = transformForSite(series, src.dataPointDepthM, site);
        transformed.set(`${src.id}|${site.id}`, t);
      }
      const ev = evaluateHours(t.engine, operationSpec(op, setup.vessels), { alpha: false, alphaTable: setup.alphaTable });
      part = { timeMs: series.timeMs, status: ev.status, limiting: ev.limiting, stepMs: src.stepMinutes * 60_000 };
      statuses.set(key, part);
    }
    return part;
  };

  const rows: (typeof ledgerDay.$inferInsert)[] = [];
  const used = new Map<string, DatasetRowFull>();
  for (const w of work) {
    for (const op of setup.operations) {
      if (!sitesOf(op, setup.sites).some((s) => s.id === w.site.id)) continue;
      if (locked.has(`${op.id}|${w.site.id}|${w.day}`)) {
        keptConfirmed++;
        continue;
      }
      let tally: DayTally;
      let main = w.sources[0];
      if (w.kind === 'observation') {
        const p = statusOf(main, w.site, op);
        tally = tallyDay(p.timeMs, p.status, p.limiting, p.stepMs, w.startMs, w.endMs);
        used.set(main.id, main);
      } else {
        const stitched = tallyStitched(
          w.sources.map((src) => statusOf(src, w.site, op)),
          w.startMs,
          w.endMs,
        );
        tally = stitched;
        let most = -1;
        stitched.minutesBySource.forEach((n, k) => {
          if (n > 0) used.set(w.sources[k].id, w.sources[k]);
          if (n > most) {
            most = n;
            main = w.sources[k];
          }
        });
      }
      rows.push({
        projectId,
        operationId: op.id,
        siteId: w.site.id,
        day: w.day,
        plannedHours: tally.plannedHours,
        proposedLostHours: tally.lostHours,
        proposedLimiting: tally.limiting,
        source: w.kind,
        datasetId: main.id,
        status: 'proposed',
      });
    }
  }
  const sources: LedgerProposeAnswer['sources'] = [...used.values()].map((src) => ({
    id: src.id,
    name: src.name,
    kind: src.kind as 'observation' | 'forecast',
  }));

  let written = 0;
  for (let k = 0; k < rows.length; k += 200) {
    const batch = rows.slice(k, k + 200);
    const done = await db
      .insert(ledgerDay)
      .values(batch)
      .onConflictDoUpdate({
        target: [ledgerDay.projectId, ledgerDay.operationId, ledgerDay.siteId, ledgerDay.day],
        set: {
          plannedHours: sqlExcluded('planned_hours'),
          proposedLostHours: sqlExcluded('proposed_lost_hours'),
          proposedLimiting: sqlExcluded('proposed_limiting'),
          source: sqlExcluded('source'),
          datasetId: sqlExcluded('dataset_id'),
          updatedAt: new Date(),
        },
        // Never touch a confirmed row (also when one was confirmed while this ran); with
        // onlyChanged, nor a proposed row whose figures and source stay the same.
        setWhere: options.onlyChanged ? and(eq(ledgerDay.status, 'proposed'), PROPOSAL_CHANGED) : eq(ledgerDay.status, 'proposed'),
      })
      .returning({ id: ledgerDay.id });
    written += done.length;
  }
  // Rows the upsert left alone were confirmed meanwhile (or, with onlyChanged, may be unchanged).
  if (!options.onlyChanged) keptConfirmed += rows.length - written;
  return { written, keptConfirmed, uncovered, notOver, sources };
}
