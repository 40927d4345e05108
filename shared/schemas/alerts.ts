import { z } from 'zod';
import { knownTimeZone } from './common';

export const SubscriptionInput = z.object({
  /** Operations to hear about; empty = all of the project's. */
  operationIds: z.array(z.string().uuid()).max(200),
  /** Worksites to hear about; empty = all. */
  siteIds: z.array(z.string().uuid()).max(200),
  immediate: z.boolean(),
  digest: z.boolean(),
  digestTime: z.string().regex(/^([01]\d|2[0-3]):[0-5]\d$/, 'must be a local time HH:MM'),
  digestTimeZone: knownTimeZone(),
  active: z.boolean(),
  /** E-mail when a campaign's P50 finish moves by more than this many days between planning runs (clients and coordinators); null = off. */
  outlookMoveDays: z
    .number({ error: 'must be a number of days' })
    .int('must be whole days')
    .min(1, 'must be at least 1 day')
    .max(365, 'must be at most 365 days')
    .nullable()
    .optional()
    .default(null),
  /** E-mail when a window's ensemble chance to hold TR falls below this percentage (1-99); null = off. */
  windowChanceBelow: z
    .number({ error: 'must be a percentage' })
    .int('must be a whole percentage')
    .min(1, 'must be at least 1 %')
    .max(99, 'must be at most 99 %')
    .nullable()
    .optional()
    .default(null),
});
export type SubscriptionInput = z.infer<typeof SubscriptionInput>;

export const PlanJobInput = z.object({ projectId: z.string().uuid().optional() }).default({});
