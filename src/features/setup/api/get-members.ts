import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';

export interface ProjectMember {
  userId: string;
  name: string;
  email: string;
  role: 'coordinator' | 'skipper' | 'client';
}

export const membersQueryOptions = (projectId: string) =>
  queryOptions({ queryKey: ['projects', projectId, 'members'], queryFn: () => api<ProjectMember[]>(`/api/projects/${projectId}/members`) });

/** Members of the project (coordinators and administrators only; others get no list). */
export const useMembers = (projectId: string) => useQuery({ ...membersQueryOptions(projectId), retry: false });
