/** The audit trail's query. */
import { z } from 'zod';

export const AUDIT_ENTITIES = ['operation', 'worksite', 'alpha', 'project', 'campaign', 'vessel'] as const;
export type AuditEntity = (typeof AUDIT_ENTITIES)[number];
export const AUDIT_ACTIONS = ['create', 'update', 'delete', 'import'] as const;
export type AuditAction = (typeof AUDIT_ACTIONS)[number];

/** `GET .../audit?entity=&limit=`: newest first, at most `limit` (1-500, default 100). */
const blankToUndefined = (v: unknown) => (v === '' ? undefined : v);
export const AuditQuery = z.object({
  entity: z.preprocess(
    blankToUndefined,
    z.enum(AUDIT_ENTITIES, { error: `entity must be one of ${AUDIT_ENTITIES.join(', ')}` }).optional(),
  ),
  limit: z.preprocess(
    blankToUndefined,
    z.coerce
      .number()
      .int('limit must be a whole number')
      .min(1, 'limit must be at least 1')
      .max(500, 'limit must be at most 500')
      .default(100),
  ),
});
export type AuditQuery = z.infer<typeof AuditQuery>;
