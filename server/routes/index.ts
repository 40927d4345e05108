import type { Router } from 'express';
import type { AppDeps } from '../deps';
import { healthRoutes } from './health';
import { meRoutes } from './me';
import { projectRoutes } from './projects';
import { adminUserRoutes } from './admin-users';
import { sitesRoutes } from './sites';
import { operationsRoutes } from './operations';
import { projectSetupRoutes } from './project-setup';
import { auditRoutes } from './audit';
import { datasetsRoutes } from './datasets';
import { forecastsRoutes } from './forecasts';
import { waveRoutes } from './wave';
import { planRoutes } from './plan';
import { workabilityRoutes } from './workability';
import { campaignsRoutes } from './campaigns';
import { ledgerRoutes } from './ledger';
import { planJobRoutes } from './plan-jobs';
import { alertRoutes } from './alerts';
import { outboxRoutes } from './outbox';
import { subscriptionRoutes } from './subscriptions';
import { unsubscribeRoutes } from './unsubscribe';
import { mailboxRoutes } from './mailbox';
import { calendarRoutes } from './calendar';
import { recurrenceRoutes } from './recurrence';
import { internalBackupRoutes } from './internal-backup';
import { overviewRoutes } from './overview';
import { forecastSkillRoutes } from './forecast-skill';

/** Every API router, in the order they are mounted under /api. */
export const API_ROUTERS: ((deps: AppDeps) => Router)[] = [
  healthRoutes,
  meRoutes,
  projectRoutes,
  adminUserRoutes,
  sitesRoutes,
  operationsRoutes,
  projectSetupRoutes,
  auditRoutes,
  datasetsRoutes,
  forecastsRoutes,
  waveRoutes,
  planRoutes,
  workabilityRoutes,
  campaignsRoutes,
  ledgerRoutes,
  planJobRoutes,
  alertRoutes,
  outboxRoutes,
  subscriptionRoutes,
  unsubscribeRoutes,
  mailboxRoutes,
  calendarRoutes,
  recurrenceRoutes,
  internalBackupRoutes,
  overviewRoutes,
  forecastSkillRoutes,
];
