import type { QueryClient } from '@tanstack/react-query';
import { projectQueryOptions } from '../../../api/projects';

/**
 * After any change to worksites, operations, limits or the alpha table: everything cached under
 * the project may depend on it (the lists here, the audit trail, and other pages' plans and
 * statistics), so the whole project subtree is marked stale. Only queries on screen refetch now;
 * the others refetch when next shown.
 */
export function invalidateProjectSetup(qc: QueryClient, projectId: string): Promise<void> {
  return qc.invalidateQueries({ queryKey: projectQueryOptions(projectId).queryKey });
}
