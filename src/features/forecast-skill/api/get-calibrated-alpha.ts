import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CalibratedAlphaAnswer } from '../../../../shared/api-types-skill';
import { api } from '../../../lib/api';

/** `GET /api/projects/:projectId/alpha/calibrated?observation=`: the calibrated table at the project's p. */
export const getCalibratedAlpha = (projectId: string, observationId: string) =>
  api<CalibratedAlphaAnswer>(`/api/projects/${projectId}/alpha/calibrated?observation=${encodeURIComponent(observationId)}`);

export const calibratedAlphaQueryOptions = (projectId: string, observationId: string) =>
  queryOptions({
    queryKey: ['projects', projectId, 'alpha', 'calibrated', observationId],
    queryFn: () => getCalibratedAlpha(projectId, observationId),
    enabled: observationId !== '',
  });

export const useCalibratedAlpha = (projectId: string, observationId: string) =>
  useQuery(calibratedAlphaQueryOptions(projectId, observationId));
