import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DatasetDetail } from '../../../../shared/api-types-datasets';
import { api } from '../../../lib/api';

/** `GET /api/projects/:projectId/datasets/:datasetId`: facts, coverage and the import report. */
export const getDataset = (projectId: string, datasetId: string) => api<DatasetDetail>(`/api/projects/${projectId}/datasets/${datasetId}`);

export const datasetQueryOptions = (projectId: string, datasetId: string) =>
  queryOptions({
    queryKey: ['projects', projectId, 'datasets', { id: datasetId }],
    queryFn: () => getDataset(projectId, datasetId),
  });

export const useDataset = (projectId: string, datasetId: string) => useQuery(datasetQueryOptions(projectId, datasetId));

/** Address of the CSV download (`GET .../datasets/:datasetId/csv`, UTC times, SI units). */
export const datasetCsvUrl = (projectId: string, datasetId: string) => `/api/projects/${projectId}/datasets/${datasetId}/csv`;
