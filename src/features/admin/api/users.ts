import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { AdminUser } from '../../../../shared/api-types';
import type { ProjectRole } from '../../../../shared/auth/roles';
import type { CreateUserInput, UpdateUserInput } from '../../../../shared/schemas/projects';
import { api } from '../../../lib/api';

export const adminUsersQueryOptions = () =>
  queryOptions({ queryKey: ['admin', 'users'], queryFn: () => api<AdminUser[]>('/api/admin/users') });

export const useAdminUsers = () => useQuery(adminUsersQueryOptions());

function useInvalidateUsers() {
  const qc = useQueryClient();
  return () => qc.invalidateQueries({ queryKey: adminUsersQueryOptions().queryKey });
}

export function useCreateUser() {
  const invalidate = useInvalidateUsers();
  return useMutation({
    mutationFn: (input: CreateUserInput) =>
      api<{ user: AdminUser; temporaryPassword: string }>('/api/admin/users', { method: 'POST', json: input }),
    onSuccess: invalidate,
  });
}

/** `POST /api/admin/users/:userId/temporary-password`: a new temporary password, shown once. */
export function useIssueTemporaryPassword() {
  const invalidate = useInvalidateUsers();
  return useMutation({
    mutationFn: (userId: string) =>
      api<{ temporaryPassword: string; expiresAt: string }>(`/api/admin/users/${userId}/temporary-password`, { method: 'POST', json: {} }),
    onSuccess: invalidate,
  });
}

export function useUpdateUser() {
  const invalidate = useInvalidateUsers();
  return useMutation({
    mutationFn: ({ userId, ...input }: UpdateUserInput & { userId: string }) =>
      api(`/api/admin/users/${userId}`, { method: 'PATCH', json: input }),
    onSuccess: invalidate,
  });
}

export function useSetMembership() {
  const invalidate = useInvalidateUsers();
  return useMutation({
    mutationFn: ({ userId, projectId, role }: { userId: string; projectId: string; role: ProjectRole | null }) =>
      role
        ? api(`/api/admin/users/${userId}/projects/${projectId}`, { method: 'PUT', json: { role } })
        : api(`/api/admin/users/${userId}/projects/${projectId}`, { method: 'DELETE' }),
    onSuccess: invalidate,
  });
}
