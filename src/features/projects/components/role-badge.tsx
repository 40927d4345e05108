import type { ProjectAccessRole } from '../../../../shared/api-types';

const LABELS: Record<ProjectAccessRole, string> = {
  admin: 'Administrator',
  coordinator: 'Marine coordinator',
  skipper: 'Skipper',
  client: 'Client (read-only)',
};

export function RoleBadge({ role }: { role: ProjectAccessRole }) {
  return (
    <span
      className="w-fit rounded-full border border-line bg-surface-2 px-3 py-1 text-xs font-semibold text-ink-soft"
      data-testid="role-badge"
    >
      {LABELS[role]}
    </span>
  );
}
