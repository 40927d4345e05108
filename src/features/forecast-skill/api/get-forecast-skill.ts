import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ForecastSkillAnswer } from '../../../../shared/api-types-skill';
import { api } from '../../../lib/api';

/** `GET /api/projects/:projectId/forecast-skill?observation=`: the forecast archive against one observation dataset. */
export const getForecastSkill = (projectId: string, observationId: string) =>
  api<ForecastSkillAnswer>(`/api/projects/${projectId}/forecast-skill?observation=${encodeURIComponent(observationId)}`);

export const forecastSkillQueryOptions = (projectId: string, observationId: string) =>
  queryOptions({
    queryKey: ['projects', projectId, 'forecast-skill', observationId],
    queryFn: () => getForecastSkill(projectId, observationId),
    enabled: observationId !== '',
  });

export const useForecastSkill = (projectId: string, observationId: string) => useQuery(forecastSkillQueryOptions(projectId, observationId));
