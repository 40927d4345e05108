import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ProjectDetail, ProjectSummary } from '../../../../shared/api-types';
import type { CreateProjectInput, ProjectSettingsInput } from '../../../../shared/schemas/projects';
import { api } from '../../../lib/api';
import { projectQueryOptions, projectsQueryOptions } from '../../../api/projects';
import { meQueryOptions } from '../../../api/me';

export function useCreateProject() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateProjectInput) => api<ProjectSummary>('/api/projects', { method: 'POST', json: input }),
    onSuccess: () => {
      void qc.invalidateQueries({ queryKey: projectsQueryOptions().queryKey });
      void qc.invalidateQueries({ queryKey: meQueryOptions().queryKey });
    },
  });
}

export function useUpdateProjectSettings(projectId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: ProjectSettingsInput) => api<ProjectDetail>(`/api/projects/${projectId}/settings`, { method: 'PUT', json: input }),
    onSuccess: (data) => {
      qc.setQueryData(projectQueryOptions(projectId).queryKey, data);
      void qc.invalidateQueries({ queryKey: projectsQueryOptions().queryKey, exact: true });
    },
  });
}
