/**
 * Vessels of a project and their RAO tables (docs/domain.md#vessel-response). An RAO import
 * replaces the vessel's table as a whole, or changes nothing (all or nothing), and is audited.
 */
import { and, eq } from 'drizzle-orm';
import { responseLabel, responseUnit, type RaoTable } from '../../shared/response/rao';
import type { AuditAction } from '../../shared/schemas/sites';
import { readRaoCsv, type ResponseQuery, type VesselInput } from '../../shared/schemas/vessel';
import { DEFAULT_RESPONSE_SEA, summariseResponse, type SeaPartition, type VesselResponseSummary } from '../../shared/response';
import type { VesselRaosResponse, VesselResponse } from '../../shared/api-types-vessels';
import type { Db } from '../db/client';
import { vessel } from '../db/schema';
import type { SessionUser } from '../http/context';
import { HttpError, notFound } from '../http/errors';
import { recordAudit } from './audit';
import { assertNameFree, listProjectRows, projectRow } from './project-rows';

type VesselRow = typeof vessel.$inferSelect;

const toVessel = (r: VesselRow): VesselResponse => ({
  id: r.id,
  name: r.name,
  responses: r.raos ? Object.keys(r.raos.responses) : [],
  raoFileName: r.raoFileName,
  raoImportedAt: r.raoImportedAt?.toISOString() ?? null,
});

export async function listVessels(db: Db, projectId: string): Promise<VesselResponse[]> {
  return (await listProjectRows(db, vessel, projectId)).map(toVessel);
}

/** The vessel row, or 404 for a malformed id, an unknown id or another project's vessel. */
export const vesselRow = (db: Db, projectId: string, vesselId: string): Promise<VesselRow> =>
  projectRow(db, vessel, projectId, vesselId, 'Vessel');

/** The audit entry of one change to the vessel `row` (its id, and its name after the change). */
const vesselAudit = (tx: Db, projectId: string, user: SessionUser, row: VesselRow, action: AuditAction, before: unknown, after: unknown) =>
  recordAudit(tx, { projectId, user, entity: 'vessel', entityId: row.id, entityName: row.name, action, before, after });

export async function createVessel(db: Db, projectId: string, user: SessionUser, input: VesselInput): Promise<VesselResponse> {
  return db.transaction(async (tx) => {
    await assertNameFree(tx, vessel, projectId, input.name, 'A vessel');
    const [row] = await tx.insert(vessel).values({ projectId, name: input.name }).returning();
    await vesselAudit(tx, projectId, user, row, 'create', null, { name: row.name });
    return toVessel(row);
  });
}

export function toRaosResponse(row: VesselRow): VesselRaosResponse {
  const t = row.raos;
  return {
    vesselId: row.id,
    fileName: row.raoFileName,
    importedAt: row.raoImportedAt?.toISOString() ?? null,
    periods: t ? t.periodsS : [],
    headings: t ? t.headingsDeg : [],
    responses: t
      ? Object.entries(t.responses).map(([name, values]) => ({
          response: name,
          label: responseLabel(name),
          unit: responseUnit(name),
          values,
        }))
      : [],
  };
}

export async function getVesselRaos(db: Db, projectId: string, vesselId: string): Promise<VesselRaosResponse> {
  return toRaosResponse(await vesselRow(db, projectId, vesselId));
}

/**
 * Imports an RAO CSV for a vessel: 400 naming every problem (line, column, what) and nothing
 * stored, or the new table replaces the old one.
 */
export async function importVesselRaos(
  db: Db,
  projectId: string,
  user: SessionUser,
  vesselId: string,
  fileName: string,
  text: string,
): Promise<VesselRaosResponse> {
  const result = readRaoCsv(text);
  if (!result.ok) {
    const first = result.problems[0];
    const where = first.line === null ? fileName : `${fileName}, line ${first.line}${first.column ? `, column ${first.column}` : ''}`;
    throw new HttpError(
      'validation',
      `The RAO table was not imported (${result.problems.length} problem${result.problems.length === 1 ? '' : 's'}): ${where}: ${first.message}`,
      result.problems.map((p) => ({
        field: p.column ?? 'file',
        line: p.line,
        column: p.column,
        message: p.line === null ? p.message : `line ${p.line}${p.column ? `, column ${p.column}` : ''}: ${p.message}`,
      })),
    );
  }
  return db.transaction(async (tx) => {
    const before = await vesselRow(tx, projectId, vesselId);
    const table: RaoTable = result.table;
    const [row] = await tx
      .update(vessel)
      .set({ raos: table, raoFileName: fileName, raoImportedAt: new Date(), updatedAt: new Date() })
      .where(and(eq(vessel.projectId, projectId), eq(vessel.id, vesselId)))
      .returning();
    const was = { raoFileName: before.raoFileName, responses: before.raos ? Object.keys(before.raos.responses) : [] };
    const is = {
      raoFileName: fileName,
      responses: Object.keys(table.responses),
      periods: table.periodsS.length,
      headings: table.headingsDeg.length,
    };
    await vesselAudit(tx, projectId, user, row, 'update', was, is);
    return toRaosResponse(row);
  });
}

/**
 * Every response of a vessel to one sea state at a heading (the wave calculator's response
 * panel): R_s, R_mpm over 3 h, Tz and the spectra, with the default spectrum shapes of
 * docs/domain.md#vessel-response. 404 for a vessel the caller cannot see (checked by the route).
 */
export function vesselResponseAnswer(row: VesselRow, q: ResponseQuery): VesselResponseSummary & { vesselId: string; heading: number } {
  if (!row.raos)
    throw new HttpError('conflict', 'This vessel has no RAO table yet: import one first', [{ field: 'vesselId', message: 'no RAO table' }]);
  const partitions: SeaPartition[] = q.partitions
    ? q.partitions.map((p) => ({ kind: p.kind, hsM: p.hs, tpS: p.tp, dirDeg: p.dir }))
    : [{ kind: 'windSea', hsM: q.hs!, tpS: q.tp!, dirDeg: q.dir! }];
  return { vesselId: row.id, heading: q.heading, ...summariseResponse(row.raos, q.heading, partitions, DEFAULT_RESPONSE_SEA) };
}

/** The vessel row by id alone (the route then checks the caller is a member of its project). */
export async function vesselById(db: Db, vesselId: string): Promise<VesselRow> {
  const [row] = await db.select().from(vessel).where(eq(vessel.id, vesselId));
  if (!row) throw notFound('Vessel');
  return row;
}
