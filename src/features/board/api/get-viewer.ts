import { useQuery } from '@tanstack/react-query';
import { meQueryOptions } from '../../../api/me';
import { isEditorRole, projectQueryOptions } from '../../../api/projects';

/** Who is looking at the board: their user id, project role, and what they may do. */
export function useViewer(projectId: string) {
  const project = useQuery(projectQueryOptions(projectId));
  const me = useQuery(meQueryOptions());
  const role = project.data?.role;
  return {
    isPending: project.isPending || me.isPending,
    error: project.error ?? me.error,
    userId: me.data?.id ?? null,
    role,
    // Fetching a forecast is the board's only write.
    canFetchForecast: isEditorRole(role),
    isSkipper: role === 'skipper',
  };
}
