import type { ProjectAccessRole } from '../../shared/api-types';

/** Top-level sections; the list grows as features land. */
export const APP_SECTIONS: { path: string; label: string; adminOnly?: boolean }[] = [
  { path: '/', label: 'Projects' },
  { path: '/wave-calculator', label: 'Wave calculator' },
  { path: '/admin/people', label: 'People & access', adminOnly: true },
  { path: '/admin/mailbox', label: 'Mailbox', adminOnly: true },
];

/** Sections inside a project, with the roles that see them. */
export const PROJECT_SECTIONS: { path: string; label: string; roles: ProjectAccessRole[] }[] = [
  { path: '', label: 'Overview', roles: ['admin', 'coordinator', 'skipper', 'client'] },
  { path: 'board', label: 'Watch board', roles: ['admin', 'coordinator', 'skipper', 'client'] },
  { path: 'setup', label: 'Sites & limits', roles: ['admin', 'coordinator', 'skipper', 'client'] },
  { path: 'vessels', label: 'Vessels', roles: ['admin', 'coordinator', 'skipper', 'client'] },
  { path: 'downtime', label: 'Downtime', roles: ['admin', 'coordinator', 'skipper', 'client'] },
  { path: 'alerts', label: 'Alerts', roles: ['admin', 'coordinator', 'skipper', 'client'] },
  { path: 'sea-data', label: 'Sea data', roles: ['admin', 'coordinator', 'skipper', 'client'] },
  { path: 'forecast-skill', label: 'Forecast skill', roles: ['admin', 'coordinator', 'skipper', 'client'] },
  { path: 'settings', label: 'Settings', roles: ['admin', 'coordinator'] },
];
