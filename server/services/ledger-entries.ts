/**
 * The ledger's rows as read and confirmed: the coordinator confirms a proposed day as it stands
 * or corrected with a note, which locks it; clients read the confirmed days only.
 */
import { and, asc, eq, gte, lte, type SQL } from 'drizzle-orm';
import type { LedgerEntry } from '../../shared/api-types-downtime';
import type { ProjectAccessRole } from '../../shared/api-types';
import { zonedDayMs } from '../../shared/ledger/days';
import {
  LEDGER_LIMITING_VALUES,
  type LedgerConfirmDayInput,
  type LedgerConfirmInput,
  type LedgerLimiting,
} from '../../shared/schemas/downtime';
import { idParam } from '../../shared/schemas/common';
import type { Db } from '../db/client';
import { dataset, ledgerDay, operation, user, worksite } from '../db/schema';
import type { SessionUser } from '../http/context';
import { HttpError, notFound } from '../http/errors';
import { recordAudit } from './audit';

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
export const confirmedOnly = (role: ProjectAccessRole) => role === 'client';

/** The project's ledger days of `status` that meet every one of `more`. */
export const ledgerDaysWhere = (projectId: string, status: 'proposed' | 'confirmed', ...more: (SQL | undefined)[]) =>
  and(eq(ledgerDay.projectId, projectId), eq(ledgerDay.status, status), ...more);

/** Ledger rows from `from` to `to` (inclusive), by day, operation and worksite. */
export async function listLedger(
  db: Db,
  projectId: string,
  range: { from: string; to: string },
  role: ProjectAccessRole,
): Promise<LedgerEntry[]> {
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
  return db.transaction((tx) => confirmRow(tx, projectId, actor, entryId, input, now));
}

/** {@link confirmLedger} inside a transaction the caller holds (one entry). */
async function confirmRow(
  tx: Db,
  projectId: string,
  actor: SessionUser,
  entryId: string,
  input: LedgerConfirmInput,
  now: Date,
): Promise<LedgerEntry> {
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
    throw new HttpError('validation', 'Invalid body: note: a corrected value needs a note saying why', [
      { field: 'note', message: 'a corrected value needs a note saying why' },
    ]);
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
    before: {
      status: 'proposed',
      lostHours: d.proposedLostHours,
      limiting: d.proposedLimiting,
      plannedHours: d.plannedHours,
      source: d.source,
    },
    after: { status: 'confirmed', lostHours, limiting, plannedHours: d.plannedHours, note, corrected },
  });
  const [after] = await ledgerSelect(tx).where(eq(ledgerDay.id, entryId));
  return toEntry(after);
}

/**
 * Confirms every proposed entry of one day (in each worksite's zone; of one worksite when
 * `siteId` is given) as proposed, all or none, each written to the audit trail as
 * {@link confirmLedger} writes it; confirmed entries of the day stay as they are.
 * @throws HttpError 409 when the day has no proposed entry, or is not over yet at one of its
 *   worksites (nothing is confirmed then); 404 for an unknown worksite.
 */
export async function confirmLedgerDay(
  db: Db,
  projectId: string,
  actor: SessionUser,
  input: LedgerConfirmDayInput,
  now: Date,
): Promise<LedgerEntry[]> {
  return db.transaction(async (tx) => {
    if (input.siteId) {
      const [site] = await tx
        .select({ id: worksite.id })
        .from(worksite)
        .where(and(eq(worksite.projectId, projectId), eq(worksite.id, input.siteId)));
      if (!site) throw notFound('Worksite');
    }
    const ids = await tx
      .select({ id: ledgerDay.id })
      .from(ledgerDay)
      .where(
        and(
          ledgerDaysWhere(projectId, 'proposed', eq(ledgerDay.day, input.day)),
          input.siteId ? eq(ledgerDay.siteId, input.siteId) : undefined,
        ),
      )
      .orderBy(asc(ledgerDay.siteId), asc(ledgerDay.operationId));
    if (ids.length === 0) throw new HttpError('conflict', `${input.day} has no proposed entry to confirm`);
    const confirmed: LedgerEntry[] = [];
    for (const { id } of ids) confirmed.push(await confirmRow(tx, projectId, actor, id, { note: input.note }, now));
    return confirmed;
  });
}
