import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { RecordsAnswer } from '../../../../shared/api-types-datasets';
import { api } from '../../../lib/api';

/** Records of a time range in typed arrays: UTC ms, SI units, NaN = missing. */
export interface SeriesColumns {
  timeMs: Float64Array;
  /** Significant wave height Hs, m. */
  hs: Float64Array;
  /** Peak period Tp, s. */
  tp: Float64Array;
  /** Wind speed at 10 m, m/s. */
  wind: Float64Array;
  /** The range these records were asked for. */
  range: RecordsRange;
}

/** Range of a records request; both ends ISO 8601 UTC, inclusive; omitted = open. */
export interface RecordsRange {
  from?: string;
  to?: string;
}

const toColumn = (a: readonly (number | null)[]) => Float64Array.from(a, (x) => (x === null ? NaN : x));

/** `GET .../datasets/:datasetId/records?from=&to=`, kept as the columns the chart draws. */
export async function getDatasetRecords(projectId: string, datasetId: string, range: RecordsRange): Promise<SeriesColumns> {
  const q = new URLSearchParams();
  if (range.from) q.set('from', range.from);
  if (range.to) q.set('to', range.to);
  const qs = q.size > 0 ? `?${q.toString()}` : '';
  const r = await api<RecordsAnswer>(`/api/projects/${projectId}/datasets/${datasetId}/records${qs}`);
  return {
    timeMs: Float64Array.from(r.time, (t) => Date.parse(t)),
    hs: toColumn(r.hs),
    tp: toColumn(r.tp),
    wind: toColumn(r.wind),
    range: { ...range },
  };
}

export const datasetRecordsQueryOptions = (projectId: string, datasetId: string, range: RecordsRange) =>
  queryOptions({
    queryKey: ['projects', projectId, 'datasets', { id: datasetId }, 'records', { from: range.from ?? null, to: range.to ?? null }],
    queryFn: () => getDatasetRecords(projectId, datasetId, { from: range.from, to: range.to }),
    // Records of a stored dataset never change; keep showing the previous range while the next loads.
    staleTime: Infinity,
    placeholderData: keepPreviousData,
  });

export const useDatasetRecords = (projectId: string, datasetId: string, range: RecordsRange) =>
  useQuery(datasetRecordsQueryOptions(projectId, datasetId, range));
