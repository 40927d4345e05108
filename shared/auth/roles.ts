/** Roles a user can hold in one project (one marine campaign or contract). */
export const PROJECT_ROLES = ['coordinator', 'skipper', 'client'] as const;
export type ProjectRole = (typeof PROJECT_ROLES)[number];

/** Global roles: 'admin' manages users and sees every project; 'user' sees only their projects. */
export const GLOBAL_ROLES = ['admin', 'user'] as const;
export type GlobalRole = (typeof GLOBAL_ROLES)[number];

export const PROJECT_ROLE_LABELS: Record<ProjectRole, string> = {
  coordinator: 'Marine coordinator',
  skipper: 'Skipper',
  client: 'Client',
};
