import { useQueries } from '@tanstack/react-query';
import type { ProjectSummary } from '../../../../shared/api-types';
import type { VesselResponse } from '../../../../shared/api-types-vessels';
import { vesselsQueryOptions } from '../../../api/vessels';

/** A vessel of a project as GET /api/projects/:projectId/vessels answers it. */
export type VesselSummary = VesselResponse;

/** The vessels of each of the user's projects, in the projects' order (the list's owner is src/api/vessels.ts). */
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
