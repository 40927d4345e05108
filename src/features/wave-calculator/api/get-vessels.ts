import { queryOptions, useQueries } from '@tanstack/react-query';
import type { ProjectSummary } from '../../../../shared/api-types';
import { api } from '../../../lib/api';

/** A vessel of a project as GET /api/projects/:projectId/vessels answers it. */
export interface VesselSummary {
  id: string;
  name: string;
  /** Response columns of its RAO table (empty until one is imported). */
  responses: string[];
  raoFileName: string | null;
  raoImportedAt: string | null;
}

export const getVessels = (projectId: string, signal?: AbortSignal) =>
  api<VesselSummary[]>(`/api/projects/${projectId}/vessels`, { signal });

/** `GET /api/projects/:projectId/vessels`, under the project's key (its owner invalidates it). */
export const vesselsQueryOptions = (projectId: string) =>
  queryOptions({ queryKey: ['projects', projectId, 'vessels'], queryFn: ({ signal }) => getVessels(projectId, signal) });

/** The vessels of each of the user's projects, in the projects' order. */
export function useVesselsOfProjects(projects: readonly ProjectSummary[]) {
  return useQueries({
    queries: projects.map((p) => vesselsQueryOptions(p.id)),
    combine: (results) => ({
      pending: results.some((r) => r.isPending),
      error: results.find((r) => r.error)?.error ?? null,
      byProject: projects.map((p, i) => ({ project: p, vessels: results[i]?.data ?? [] })),
    }),
  });
}
