/**
 * Forecast skill from the project's own archive and the calibrated alpha table
 * (docs/domain.md#forecast-uncertainty, docs/domain.md#calibrated-alpha): the stored forecast
 * issues are paired with an observation dataset (or a hindcast covering them), and the figures per
 * lead and Hs bin give a calibrated alpha table that a coordinator may adopt (audited). Never
 * adopted by itself.
 */
import { and, desc, eq, isNotNull } from 'drizzle-orm';
import type { CalibratedAlphaAnswer, ForecastSkillAnswer, SkillObservationRef } from '../../shared/api-types-skill';
import { defaultAlphaTable } from '../../shared/engine/default-alpha-table';
import { calibrateAlphaTable } from '../../shared/skill/calibrated-alpha';
import { DEFAULT_CALIBRATION_P } from '../../shared/skill/calibration-p';
import {
  FEW_ISSUES,
  pairForecasts,
  samplePairs,
  SKILL_LEAD_BINS_H,
  SKILL_POINTS_CAP,
  skillBins,
  skillByLead,
  type SkillIssue,
  type SkillPair,
} from '../../shared/skill/forecast-skill';
import type { Db } from '../db/client';
import { dataset, operation, project } from '../db/schema';
import type { SessionUser } from '../http/context';
import { HttpError } from '../http/errors';
import { getAlpha, writeAlpha } from './alpha';
import { getDatasetRow } from './datasets';
import { readSeries } from './series-store';

const HOUR_MS = 3_600_000;
const MAX_LEAD_MS = SKILL_LEAD_BINS_H[SKILL_LEAD_BINS_H.length - 1][1] * HOUR_MS;

/** The observation (or hindcast) dataset to compare with; 400 for a forecast, 404 when unknown. */
async function observationRow(db: Db, projectId: string, datasetId: string) {
  const row = await getDatasetRow(db, projectId, datasetId);
  if (row.kind === 'forecast') {
    throw new HttpError('validation', 'Invalid query: observation: pick an observation or hindcast dataset, not a forecast', [
      { field: 'observation', message: 'Pick an observation or hindcast dataset, not a forecast' },
    ]);
  }
  return row;
}

/** All pairs of the project's stored forecast issues with one observation dataset. */
async function pairsWith(db: Db, projectId: string, obsRow: Awaited<ReturnType<typeof observationRow>>) {
  const obs = await readSeries(db, obsRow.id);
  const fromMs = obsRow.startAt.getTime();
  const toMs = obsRow.endAt.getTime();
  const rows = await db
    .select({ id: dataset.id, issuedAt: dataset.issuedAt, startAt: dataset.startAt, endAt: dataset.endAt })
    .from(dataset)
    .where(and(eq(dataset.projectId, projectId), eq(dataset.kind, 'forecast'), isNotNull(dataset.issuedAt)))
    .orderBy(dataset.issuedAt);
  const issues: SkillIssue[] = [];
  for (const r of rows) {
    const issuedAtMs = r.issuedAt!.getTime();
    // Only the part within 96 h of the issue and within the observation's span can pair.
    const lo = Math.max(issuedAtMs, fromMs);
    const hi = Math.min(issuedAtMs + MAX_LEAD_MS, toMs);
    if (lo > hi || r.endAt.getTime() < lo || r.startAt.getTime() > hi) continue;
    const s = await readSeries(db, r.id, { fromMs: lo, toMs: hi });
    issues.push({ issuedAtMs, timeMs: s.timeMs, hs: s.hs });
  }
  const pairs = pairForecasts(issues, { timeMs: obs.timeMs, hs: obs.hs });
  const ref: SkillObservationRef = { id: obsRow.id, name: obsRow.name, kind: obsRow.kind as SkillObservationRef['kind'] };
  return { ref, issuesCompared: issues.length, pairs };
}

const issuesPaired = (pairs: SkillPair[]) => new Set(pairs.map((p) => p.issue)).size;
const round = (x: number, d: number) => Math.round(x * 10 ** d) / 10 ** d;

/** GET forecast-skill: the figures per bin, per lead, and a sample of the pairs for the plot. */
export async function forecastSkill(db: Db, projectId: string, observationId: string): Promise<ForecastSkillAnswer> {
  const obsRow = await observationRow(db, projectId, observationId);
  const { ref, issuesCompared, pairs } = await pairsWith(db, projectId, obsRow);
  return {
    observation: ref,
    issuesCompared,
    issuesPaired: issuesPaired(pairs),
    pairs: pairs.length,
    bins: skillBins(pairs),
    byLead: skillByLead(pairs),
    points: samplePairs(pairs).map((p) => ({ leadH: round(p.leadH, 2), fc: round(p.fc, 3), obs: round(p.obs, 3) })),
    pointsCap: SKILL_POINTS_CAP,
    fewIssues: FEW_ISSUES,
  };
}

/** The project's p (docs/domain.md#calibrated-alpha). */
async function projectP(db: Db, projectId: string): Promise<number> {
  const [row] = await db.select({ p: project.alphaCalibrationP }).from(project).where(eq(project.id, projectId));
  if (!row) throw new HttpError('not_found', 'Project not found');
  return row.p ?? DEFAULT_CALIBRATION_P;
}

/** The newest observation dataset of the project, or null. */
async function newestObservation(db: Db, projectId: string) {
  const [row] = await db
    .select({ id: dataset.id })
    .from(dataset)
    .where(and(eq(dataset.projectId, projectId), eq(dataset.kind, 'observation')))
    .orderBy(desc(dataset.createdAt))
    .limit(1);
  return row?.id ?? null;
}

/**
 * GET alpha/calibrated: the calibrated table at p (the query's, else the project's) against one
 * observation dataset (the query's, else the newest observation dataset; none = every cell the default's).
 */
export async function calibratedAlpha(
  db: Db,
  projectId: string,
  query: { p?: number; observation?: string },
): Promise<CalibratedAlphaAnswer> {
  const pProject = await projectP(db, projectId);
  const p = query.p ?? pProject;
  const observationId = query.observation ?? (await newestObservation(db, projectId));
  let ref: SkillObservationRef | null = null;
  let pairs: SkillPair[] = [];
  if (observationId) {
    const found = await pairsWith(db, projectId, await observationRow(db, projectId, observationId));
    ref = found.ref;
    pairs = found.pairs;
  }
  const ops = await db
    .select({ tpopH: operation.tpopH, tcH: operation.tcH, weatherRestricted: operation.weatherRestricted })
    .from(operation)
    .where(eq(operation.projectId, projectId));
  const base = defaultAlphaTable();
  const calibrated = calibrateAlphaTable(base, skillBins(pairs), p, ops);
  const current = await getAlpha(db, projectId);
  return {
    p,
    projectP: pProject,
    z: calibrated.z,
    observation: ref,
    issuesPaired: issuesPaired(pairs),
    pairs: pairs.length,
    table: calibrated.table,
    cells: calibrated.cells,
    defaultTable: base,
    current: { isDefault: current.isDefault, updatedAt: current.updatedAt },
    fewIssues: FEW_ISSUES,
  };
}

/**
 * POST alpha/adopt-calibrated: recomputes the calibrated table from the stored data (never a table
 * sent by the client) and makes it the project's alpha table, audited with the data behind it:
 * p, z, the observation dataset, the counts, and every cell's bin, mean, sd and counts.
 * 409 when no cell has data (the table would be the default's).
 */
export async function adoptCalibratedAlpha(
  db: Db,
  projectId: string,
  user: SessionUser,
  input: { p?: number; observation?: string },
): Promise<CalibratedAlphaAnswer> {
  return db.transaction(async (tx) => {
    const answer = await calibratedAlpha(tx, projectId, input);
    if (!answer.observation || answer.cells.every((row) => row.every((c) => c.fallback))) {
      throw new HttpError('conflict', 'Nothing to adopt: no bin of the calibrated table has data (every cell is the default value)');
    }
    await writeAlpha(tx, projectId, user, answer.table, 'update', {
      calibration: {
        p: answer.p,
        z: answer.z,
        observation: answer.observation,
        issuesPaired: answer.issuesPaired,
        pairs: answer.pairs,
        cells: answer.cells,
      },
    });
    const current = await getAlpha(tx, projectId);
    return { ...answer, current: { isDefault: current.isDefault, updatedAt: current.updatedAt } };
  });
}
