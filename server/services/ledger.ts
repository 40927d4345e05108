/**
 * The downtime ledger: what actually happened, per calendar day (worksite time zone) and
 * operation at each of its worksites, proposed by the system from the data and confirmed or
 * corrected by the coordinator, then locked; and the monthly totals against the hindcast
 * expectation.
 *
 * Choices (docs/domain.md leaves them open; written down here):
 * - Hours planned: every hour of the calendar day in the worksite's time zone, i.e. the day's real
 *   length (24 h; 23 or 25 h on daylight-saving change days). The ledger books weather downtime of
 *   a campaign in progress around the clock, as offshore spreads usually work; a day the spread
 *   did not work is corrected to 0 lost hours by the coordinator with a note.
 * - Hours lost to weather: planned hours that were not workable at OPLIM (alpha = false: this is
 *   what happened, not a forecast to be cautious about, docs/domain.md#convention-14). A record stands for
 *   [t, t + dt) and belongs to the day of its start; records with a missing value the limits need
 *   ("no data") and hours with no record at all count as lost too: nobody can show they were
 *   workable. Lost = planned - workable records x dt, within [0, planned].
 * - Limiting factor: among the lost hours, the engine's limiting factor that was deciding for the
 *   most hours (ties to the first in the engine's limit order), or "noData" when missing values
 *   and absent records account for the most; null when nothing was lost.
 * - Only days that are over in the worksite's time zone are proposed or confirmed: the ledger
 *   records what happened, and a client reads a confirmed day as lost hours that happened.
 * - Source, per worksite and day: the newest observation dataset whose records span the whole day
 *   (first record at or before the day's start, last record + dt at or after its end), else the
 *   forecast issues that together cover the day, each minute taken from the newest issue that
 *   covers it (the shortest lead time: the best estimate of what happened when nothing was
 *   measured), shown as "from forecast"; a day neither covers is not proposed and is reported
 *   as uncovered.
 * - Expectation: for calendar month m, the month's lost hours in each hindcast year (hours of the
 *   month - workable records at OPLIM x dt, the same rule as a ledger day, over the year-months the
 *   hindcast spans wholly), then P50 and P90 over the years by Hyndman & Fan type 7.
 */
import { and, asc, eq, gte, lte, or, sql } from 'drizzle-orm';
import { TZDate, tz } from '@date-fns/tz';
import { eachDayOfInterval, format } from 'date-fns';
import { LIMIT_NAMES, STATUS, evaluateHours, evaluateStatus, quantileR7, recordSteps, zonedMonthStartMs } from '../../shared/engine';
import type { LedgerEntry, LedgerMonthRow, LedgerMonthlyAnswer, LedgerProposeAnswer } from '../../shared/api-types-downtime';
import type { ProjectAccessRole } from '../../shared/api-types';
import { LEDGER_LIMITING_VALUES, type LedgerConfirmInput, type LedgerLimiting } from '../../shared/schemas/downtime';
import { idParam } from '../../shared/schemas/common';
import type { Db } from '../db/client';
import { bisectLeft } from 'd3-array'; // first index whose time is >= t (times ascending)
import { dataset, ledgerDay, operation, user, worksite } from '../db/schema';
import type { SessionUser } from '../http/context';
import { HttpError, notFound } from '../http/errors';
import { recordAudit } from './audit';
import { readSeries, type SeaSeries } from './series-store';
import { loadProjectSetup, operationSpec, sitesOf, transformForSite, type ProjectSetup, type WorksiteRow } from './site-context';
import { cachedStats, datasetSeries, forEachOperationSite, limitsVersion, statisticsDataset, type DatasetRow } from './workability';
import { runEngineTask } from './engine-pool';

const MS_PER_HOUR = 3_600_000;
const round2 = (x: number) => Math.round(x * 100) / 100;
/** `excluded.<column>` in an upsert: the value the insert tried to write. */
const sqlExcluded = (column: string) => sql.raw(`excluded.${column}`);

// ---------------------------------------------------------------------------------------------
// Days
// ---------------------------------------------------------------------------------------------

/** Every date from `from` to `to` (YYYY-MM-DD, inclusive). */
export function daysOf(from: string, to: string): string[] {
  if (to < from) return [];
  // Calendar dates carry no zone: counted in UTC, where every day is 24 h.
  const utc = tz('UTC');
  return eachDayOfInterval({ start: `${from}T00:00:00Z`, end: `${to}T00:00:00Z` }, { in: utc }).map((day) => format(day, 'yyyy-MM-dd', { in: utc }));
}

/**
 * The instants a calendar day starts and ends in a time zone, UTC ms: local midnight to the next
 * local midnight (@date-fns/tz; 23 or 25 h apart on daylight-saving change days).
 */
export function zonedDayMs(day: string, timeZone: string): { startMs: number; endMs: number } {
  const [y, m, d] = day.split('-').map(Number);
  return { startMs: new TZDate(y, m - 1, d, timeZone).getTime(), endMs: new TZDate(y, m - 1, d + 1, timeZone).getTime() };
}

// ---------------------------------------------------------------------------------------------
// Proposal
// ---------------------------------------------------------------------------------------------

/** Tally of one day: workable hours and lost hours by limiting factor. */
export interface DayTally {
  plannedHours: number;
  lostHours: number;
  limiting: LedgerLimiting | null;
}

/**
 * Planned and lost hours of one day from hourly statuses at OPLIM (see the module comment).
 * @param timeMs record times, ascending; @param status STATUS codes; @param limiting LIMIT codes
 * @param stepMs fallback dt, ms (each record counts its local step, record-steps.ts); @param startMs, endMs the day, UTC ms
 */
export function tallyDay(timeMs: Float64Array, status: Uint8Array, limiting: Uint8Array, stepMs: number, startMs: number, endMs: number): DayTally {
  const plannedHours = (endMs - startMs) / MS_PER_HOUR;
  const dur = recordSteps(timeMs, stepMs).durationMs;
  const byLimit = new Float64Array(LIMIT_NAMES.length);
  let noData = 0;
  let present = 0;
  let workable = 0;
  let i = bisectLeft(timeMs, startMs);
  for (; i < timeMs.length && timeMs[i] < endMs; i++) {
    const dtH = Math.min(dur[i], endMs - timeMs[i]) / MS_PER_HOUR;
    present += dtH;
    const s = status[i];
    if (s === STATUS.WORKABLE) workable += dtH;
    else if (s === STATUS.NO_DATA) noData += dtH;
    else byLimit[limiting[i]] += dtH;
  }
  noData += Math.max(0, plannedHours - present);
  const lostHours = Math.min(plannedHours, Math.max(0, plannedHours - workable));
  let best: LedgerLimiting | null = null;
  let bestHours = 0;
  for (let c = 1; c < byLimit.length; c++) {
    if (byLimit[c] > bestHours) {
      bestHours = byLimit[c];
      best = LIMIT_NAMES[c] as LedgerLimiting;
    }
  }
  if (noData > bestHours) best = 'noData';
  return { plannedHours, lostHours: round2(lostHours), limiting: lostHours > 0 ? best : null };
}

type DatasetRowFull = typeof dataset.$inferSelect;

/** Does the dataset's record span cover [startMs, endMs)? */
const spans = (d: DatasetRowFull, startMs: number, endMs: number) =>
  d.startAt.getTime() <= startMs && d.endAt.getTime() + d.stepMinutes * 60_000 >= endMs;

/** Does the dataset's records' span overlap [startMs, endMs)? */
const overlaps = (d: DatasetRowFull, startMs: number, endMs: number) =>
  d.startAt.getTime() < endMs && d.endAt.getTime() + d.stepMinutes * 60_000 > startMs;

/** Do the datasets' spans together cover [startMs, endMs) without a gap? */
function unionCovers(list: DatasetRowFull[], startMs: number, endMs: number): boolean {
  const spansSorted = list.map((d) => [d.startAt.getTime(), d.endAt.getTime() + d.stepMinutes * 60_000] as const).sort((a, b) => a[0] - b[0]);
  let reached = startMs;
  for (const [a, b] of spansSorted) {
    if (a > reached) break;
    reached = Math.max(reached, b);
    if (reached >= endMs) return true;
  }
  return reached >= endMs;
}

/** One source of statuses for {@link tallyStitched}: record times, statuses, limiting factors, fallback dt (each record counts its local step, record-steps.ts). */
export interface StatusPart {
  timeMs: Float64Array;
  status: Uint8Array;
  limiting: Uint8Array;
  stepMs: number;
}

const MS_PER_MINUTE = 60_000;

/**
 * Planned and lost hours of one day from several sources in order of preference (for forecast
 * issues: the newest first). Each minute of the day takes the status of the first source with a
 * record starting in the day that covers it ([t, t + dt_i), dt_i the record's local step: a forecast
 * turns 3-hourly after a few days); minutes no source covers count as no
 * data, as in {@link tallyDay}. With one source on whole-hour records this equals tallyDay.
 * @returns the tally, and per source the minutes it decided
 */
export function tallyStitched(parts: StatusPart[], startMs: number, endMs: number): DayTally & { minutesBySource: number[] } {
  const plannedHours = (endMs - startMs) / MS_PER_HOUR;
  const minutes = Math.round((endMs - startMs) / MS_PER_MINUTE);
  const claimed = new Uint8Array(minutes);
  const byLimit = new Float64Array(LIMIT_NAMES.length);
  const minutesBySource = parts.map(() => 0);
  let workable = 0;
  let noData = 0;
  let covered = 0;
  parts.forEach((p, k) => {
    const dur = recordSteps(p.timeMs, p.stepMs).durationMs;
    for (let i = bisectLeft(p.timeMs, startMs); i < p.timeMs.length && p.timeMs[i] < endMs; i++) {
      const a = Math.floor((p.timeMs[i] - startMs) / MS_PER_MINUTE);
      const b = Math.min(minutes, Math.ceil((p.timeMs[i] + dur[i] - startMs) / MS_PER_MINUTE));
      let n = 0;
      for (let m = a; m < b; m++) {
        if (claimed[m] === 0) {
          claimed[m] = 1;
          n++;
        }
      }
      if (n === 0) continue;
      minutesBySource[k] += n;
      covered += n;
      const s = p.status[i];
      if (s === STATUS.WORKABLE) workable += n;
      else if (s === STATUS.NO_DATA) noData += n;
      else byLimit[p.limiting[i]] += n;
    }
  });
  noData += minutes - covered;
  const lostHours = Math.min(plannedHours, Math.max(0, plannedHours - workable / 60));
  let best: LedgerLimiting | null = null;
  let bestMinutes = 0;
  for (let c = 1; c < byLimit.length; c++) {
    if (byLimit[c] > bestMinutes) {
      bestMinutes = byLimit[c];
      best = LIMIT_NAMES[c] as LedgerLimiting;
    }
  }
  if (noData > bestMinutes) best = 'noData';
  return { plannedHours, lostHours: round2(lostHours), limiting: lostHours > 0 ? best : null, minutesBySource };
}

/**
 * Proposes ledger days for every operation at each of its worksites from `from` to `to`
 * (YYYY-MM-DD, inclusive, each in the worksite's time zone): writes new rows and updates proposed
 * ones; confirmed rows are never touched. Only days that are over in the worksite's time zone at
 * `now` are proposed (the others are listed in `notOver`): the ledger records what happened.
 * Source per worksite and day: the newest observation dataset that spans the whole day, else the
 * forecast issues that together cover it, each minute from the newest issue that covers it.
 */
export async function proposeLedger(db: Db, projectId: string, range: { from: string; to: string }, now: Date): Promise<LedgerProposeAnswer> {
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
    .where(and(eq(dataset.projectId, projectId), or(eq(dataset.kind, 'observation'), eq(dataset.kind, 'forecast')), lte(dataset.startAt, new Date(maxMs)), gte(dataset.endAt, new Date(minMs - 24 * MS_PER_HOUR))));
  const newest = (a: DatasetRowFull, b: DatasetRowFull) =>
    (b.issuedAt?.getTime() ?? b.createdAt.getTime()) - (a.issuedAt?.getTime() ?? a.createdAt.getTime()) || b.createdAt.getTime() - a.createdAt.getTime();
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
    .where(and(eq(ledgerDay.projectId, projectId), eq(ledgerDay.status, 'confirmed'), gte(ledgerDay.day, range.from), lte(ledgerDay.day, range.to)));
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
      const ev = evaluateHours(t.engine, operationSpec(op), { alpha: false, alphaTable: setup.alphaTable });
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
  const sources: LedgerProposeAnswer['sources'] = [...used.values()].map((src) => ({ id: src.id, name: src.name, kind: src.kind as 'observation' | 'forecast' }));

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
        // Never touch a confirmed row (also when one was confirmed while this ran).
        setWhere: eq(ledgerDay.status, 'proposed'),
      })
      .returning({ id: ledgerDay.id });
    written += done.length;
  }
  keptConfirmed += rows.length - written;
  return { written, keptConfirmed, uncovered, notOver, sources };
}


// ---------------------------------------------------------------------------------------------
// Listing and confirming
// ---------------------------------------------------------------------------------------------

const LIMITING = new Set<string>(LEDGER_LIMITING_VALUES);
const asLimiting = (v: string | null): LedgerLimiting | null => (v !== null && LIMITING.has(v) ? (v as LedgerLimiting) : null);

function ledgerSelect(db: Db) {
  return db
    .select({
      row: ledgerDay,
      operationName: operation.name,
      siteName: worksite.name,
      siteTimeZone: worksite.timeZone,
      datasetName: dataset.name,
      confirmedByName: user.name,
    })
    .from(ledgerDay)
    .innerJoin(operation, eq(operation.id, ledgerDay.operationId))
    .innerJoin(worksite, eq(worksite.id, ledgerDay.siteId))
    .leftJoin(dataset, eq(dataset.id, ledgerDay.datasetId))
    .leftJoin(user, eq(user.id, ledgerDay.confirmedBy));
}

type LedgerJoined = Awaited<ReturnType<ReturnType<typeof ledgerSelect>['execute']>>[number];

function toEntry(r: LedgerJoined): LedgerEntry {
  const d = r.row;
  return {
    id: d.id,
    operationId: d.operationId,
    operationName: r.operationName,
    siteId: d.siteId,
    siteName: r.siteName,
    day: d.day,
    plannedHours: d.plannedHours,
    proposedLostHours: d.proposedLostHours,
    proposedLimiting: asLimiting(d.proposedLimiting),
    lostHours: d.lostHours,
    limiting: asLimiting(d.limiting),
    note: d.note,
    source: d.source,
    datasetId: d.datasetId,
    datasetName: r.datasetName ?? null,
    status: d.status,
    confirmedBy: r.confirmedByName ?? null,
    confirmedAt: d.confirmedAt?.toISOString() ?? null,
  };
}

/** Clients see the confirmed ledger only; proposals are the coordinator's working draft. */
const confirmedOnly = (role: ProjectAccessRole) => role === 'client';

/** Ledger rows from `from` to `to` (inclusive), by day, operation and worksite. */
export async function listLedger(db: Db, projectId: string, range: { from: string; to: string }, role: ProjectAccessRole): Promise<LedgerEntry[]> {
  const conditions = [eq(ledgerDay.projectId, projectId), gte(ledgerDay.day, range.from), lte(ledgerDay.day, range.to)];
  if (confirmedOnly(role)) conditions.push(eq(ledgerDay.status, 'confirmed'));
  const rows = await ledgerSelect(db)
    .where(and(...conditions))
    .orderBy(asc(ledgerDay.day), asc(operation.name), asc(worksite.name));
  // Clients see the confirmed figures only, not what the data proposed before a correction.
  if (confirmedOnly(role)) return rows.map((r) => ({ ...toEntry(r), proposedLostHours: null, proposedLimiting: null }));
  return rows.map(toEntry);
}

/**
 * Confirms a proposed day as it stands, or corrected (`lostHours`, `limiting`); a correction needs
 * a note. Locks the row: a second confirmation is refused (409). Only a day that is over in the
 * worksite's time zone at `now` can be confirmed. Written to the audit trail.
 * @throws HttpError 404 unknown entry, 409 already confirmed or day not over, 400 no note for a
 *   correction or lost hours above the planned hours.
 */
export async function confirmLedger(
  db: Db,
  projectId: string,
  actor: SessionUser,
  entryId: string,
  input: LedgerConfirmInput,
  now: Date,
): Promise<LedgerEntry> {
  if (!idParam.safeParse(entryId).success) throw notFound('Ledger entry');
  return db.transaction(async (tx) => {
    const [current] = await ledgerSelect(tx).where(and(eq(ledgerDay.projectId, projectId), eq(ledgerDay.id, entryId)));
    if (!current) throw notFound('Ledger entry');
    const d = current.row;
    if (d.status === 'confirmed') throw new HttpError('conflict', `${d.day} is already confirmed and locked`);
    const { endMs } = zonedDayMs(d.day, current.siteTimeZone);
    if (endMs > now.getTime()) {
      throw new HttpError(
        'conflict',
        `${d.day} is not over yet at ${current.siteName} (${current.siteTimeZone}): a day can be confirmed once it has ended there, from ${new Date(endMs).toISOString().slice(0, 16).replace('T', ' ')} UTC`,
      );
    }
    const lostHours = input.lostHours ?? d.proposedLostHours;
    const limiting = input.limiting !== undefined ? input.limiting : asLimiting(d.proposedLimiting);
    if (lostHours > d.plannedHours) {
      throw new HttpError('validation', `Invalid body: lostHours: must be at most the ${d.plannedHours} h planned`, [
        { field: 'lostHours', message: `must be at most the ${d.plannedHours} h planned` },
      ]);
    }
    const corrected = lostHours !== d.proposedLostHours || limiting !== asLimiting(d.proposedLimiting);
    const note = input.note.trim();
    if (corrected && note === '') {
      throw new HttpError('validation', 'Invalid body: note: a corrected value needs a note saying why', [{ field: 'note', message: 'a corrected value needs a note saying why' }]);
    }
    const [updated] = await tx
      .update(ledgerDay)
      .set({ status: 'confirmed', lostHours, limiting, note, confirmedBy: actor.id, confirmedAt: new Date(), updatedAt: new Date() })
      .where(and(eq(ledgerDay.id, entryId), eq(ledgerDay.status, 'proposed')))
      .returning({ id: ledgerDay.id });
    if (!updated) throw new HttpError('conflict', `${d.day} is already confirmed and locked`);
    await recordAudit(tx, {
      projectId,
      user: actor,
      entity: 'project',
      entityId: d.id,
      entityName: `Downtime ledger ${d.day}: ${current.operationName} at ${current.siteName}`,
      action: 'update',
      before: { status: 'proposed', lostHours: d.proposedLostHours, limiting: d.proposedLimiting, plannedHours: d.plannedHours, source: d.source },
      after: { status: 'confirmed', lostHours, limiting, plannedHours: d.plannedHours, note, corrected },
    });
    const [after] = await ledgerSelect(tx).where(eq(ledgerDay.id, entryId));
    return toEntry(after);
  });
}

// ---------------------------------------------------------------------------------------------
// Monthly totals against the hindcast expectation
// ---------------------------------------------------------------------------------------------

/** Expected lost hours of one operation at one worksite per calendar month (what is cached). */
export interface LedgerExpectation {
  operationId: string;
  siteId: string;
  /** Index 0-11: January to December. */
  months: { years: number; p50Hours: number | null; p90Hours: number | null }[];
}

/**
 * Lost hours per year-month in the hindcast (hours of the month - the durations of the workable
 * records at OPLIM, each record its local step, record-steps.ts),
 * for the year-months the data spans wholly, as `[yearMonth (year*12 + month0), lostHours][]`.
 */
export function yearMonthLostHours(timeMs: Float64Array, status: Uint8Array, yearMonth: Int32Array, stepMs: number, timeZone: string): [number, number][] {
  const n = timeMs.length;
  if (n === 0) return [];
  const firstMs = timeMs[0];
  const dur = recordSteps(timeMs, stepMs).durationMs;
  const endMs = timeMs[n - 1] + dur[n - 1];
  const workable = new Map<number, number>();
  for (let i = 0; i < n; i++) {
    const ym = yearMonth[i];
    workable.set(ym, (workable.get(ym) ?? 0) + (status[i] === STATUS.WORKABLE ? dur[i] / MS_PER_HOUR : 0));
  }
  const out: [number, number][] = [];
  for (const [ym, count] of [...workable].sort((a, b) => a[0] - b[0])) {
    const y = Math.floor(ym / 12);
    const m = ym - y * 12 + 1;
    const a = zonedMonthStartMs(y, m, timeZone);
    const b = zonedMonthStartMs(y, m + 1, timeZone);
    if (a < firstMs || b > endMs) continue;
    out.push([ym, Math.max(0, (b - a) / MS_PER_HOUR - count)]);
  }
  return out;
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
 * Per month and operation at a worksite: confirmed planned and lost hours, lost hours still
 * proposed (not for clients), and the hindcast expectation of the month's lost hours (P50/P90).
 * Months are those with ledger rows, optionally limited to days `from`-`to`.
 */
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
  const alpha = options.alpha ?? false;
  const version = limitsVersion(setup, hindcast.dataPointDepthM);
  const expectations = await cachedStats(db, projectId, hindcast.id, version, alpha ? 'ledger-alpha' : 'ledger', async () =>
    // On an engine worker thread (engine-pool.ts).
    runEngineTask('ledgerExpectations', computeExpectations, await datasetSeries(db, hindcast.id), hindcast, setup, alpha),
  );
  return { hindcast, expectations };
}

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
    db.select().from(ledgerDay).where(and(...conditions)),
    loadProjectSetup(db, projectId),
    statisticsDataset(db, projectId, options.datasetId),
  ]);
  let expectations: LedgerExpectation[] = [];
  if (hindcast) {
    const version = limitsVersion(setup, hindcast.dataPointDepthM);
    expectations = await cachedStats(db, projectId, hindcast.id, version, alpha ? 'ledger-alpha' : 'ledger', async () =>
      // On an engine worker thread (engine-pool.ts).
      runEngineTask('ledgerExpectations', computeExpectations, await datasetSeries(db, hindcast.id), hindcast, setup, alpha),
    );
  }
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
