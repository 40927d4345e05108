import { EXTRA_COLUMNS, type ExtraSeries } from '../../shared/seadata/extra-columns';
import { eq } from 'drizzle-orm';
import type { Db } from '../db/client';
import { project } from '../db/schema';
import type { ForecastProvider } from '../forecast';
import { ForecastServiceError } from '../forecast';
import { HttpError } from '../http/errors';
import { createDataset, latestDataset } from './datasets';
import { toSeaSeries } from './sea-series';

/** Ensemble members the client asks for beside the control (docs/domain.md#forecast-uncertainty). */
export const ENSEMBLE_MEMBERS_ASKED = 20;

export interface FetchedForecast {
  datasetId: string;
  issuedAt: string;
  records: number;
  /** Ensemble members stored beside the control (0: the service sent none). */
  members: number;
  /** false when this issue was already stored (nothing new). */
  isNew: boolean;
}

/**
 * Fetches the latest forecast for the project's data point and stores it as a new forecast
 * issue. The answer is validated (zod) by the provider before anything is stored; a failure
 * throws and leaves every earlier forecast in place. An issue already stored is not stored twice.
 */
export async function fetchLatestForecast(
  db: Db,
  provider: ForecastProvider,
  projectId: string,
  userId: string | null,
): Promise<FetchedForecast> {
  const [p] = await db.select().from(project).where(eq(project.id, projectId));
  if (!p) throw new HttpError('not_found', 'Project not found');
  if (p.dataPointLatitude === null || p.dataPointLongitude === null) {
    throw new HttpError('validation', 'Set the data point latitude and longitude in the project settings first', [
      { field: 'dataPointLatitude', message: 'is required to fetch forecasts' },
    ]);
  }
  let issue;
  try {
    issue = await provider.fetchLatest({
      latitude: p.dataPointLatitude,
      longitude: p.dataPointLongitude,
      members: ENSEMBLE_MEMBERS_ASKED,
    });
  } catch (err) {
    if (err instanceof ForecastServiceError) {
      throw new HttpError('unavailable', `The forecast service failed: ${err.message} The previous forecast is kept.`, { code: err.code });
    }
    throw err;
  }
  const previous = await latestDataset(db, projectId, 'forecast');
  if (previous?.issuedAt && previous.issuedAt.getTime() === issue.issuedAtMs && previous.sourceKind === 'service') {
    return {
      datasetId: previous.id,
      issuedAt: previous.issuedAt.toISOString(),
      records: previous.recordCount,
      members: previous.ensembleMembers,
      isNew: false,
    };
  }
  const r = issue.records;
  // Partitions the service gave (docs/domain.md#partitions) go to the optional columns.
  const extra: ExtraSeries = {};
  for (const c of EXTRA_COLUMNS) {
    const values = (r as Partial<Record<string, Float64Array>>)[c];
    if (values) extra[c] = values;
  }
  const series = toSeaSeries({ timeMs: r.timeMs, hs: r.hs, tp: r.tp, dir: r.dir, wind: r.wind, windDir: r.windDir, extra });
  const issuedAt = new Date(issue.issuedAtMs);
  const row = await createDataset(
    db,
    {
      projectId,
      createdBy: userId,
      name: `Forecast issued ${issuedAt.toISOString().slice(0, 16).replace('T', ' ')} UTC`,
      kind: 'forecast',
      dataPointName: p.dataPointName,
      dataPointLatitude: issue.latitude,
      dataPointLongitude: issue.longitude,
      // The service answers for deep water offshore of the data point (common practice for
      // global wave models); the project's data-point depth applies to it.
      dataPointDepthM: p.dataPointDepthM,
      sourceKind: 'service',
      format: provider.name,
      issuedAt,
    },
    series,
    { source: provider.name },
    (issue.members ?? []).map((m) => ({
      member: m.member,
      hs: m.records.hs,
      tp: m.records.tp,
      dir: m.records.dir,
      wind: m.records.wind,
      windDir: m.records.windDir,
    })),
  );
  return { datasetId: row.id, issuedAt: issuedAt.toISOString(), records: row.recordCount, members: row.ensembleMembers, isNew: true };
}
