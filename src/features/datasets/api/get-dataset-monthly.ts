import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MonthlySummaryRow } from '../../../../shared/api-types-datasets';
import { api } from '../../../lib/api';

/** `GET .../datasets/:datasetId/monthly`: records, coverage, mean and 90th percentile Hs per UTC month. */
export const getDatasetMonthly = (projectId: string, datasetId: string) =>
  api<MonthlySummaryRow[]>(`/api/projects/${projectId}/datasets/${datasetId}/monthly`);

export const datasetMonthlyQueryOptions = (projectId: string, datasetId: string) =>
  queryOptions({
    queryKey: ['projects', projectId, 'datasets', { id: datasetId }, 'monthly'],
    queryFn: () => getDatasetMonthly(projectId, datasetId),
  });

export const useDatasetMonthly = (projectId: string, datasetId: string) => useQuery(datasetMonthlyQueryOptions(projectId, datasetId));
