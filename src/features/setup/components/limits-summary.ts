import type { OperationLimits } from '../../../../shared/engine/types';
import { describeLimits } from '../../../../shared/limits-in-words';

/** The limits as one line: "Hs ≤ 1.5 m, Tp not in 13–15 s, wind ≤ 16 m/s" (shared/limits-in-words.ts, short form). */
export function summarizeLimits(limits: OperationLimits): string {
  const parts = describeLimits(limits);
  return parts.length > 0 ? parts.join(', ') : 'No limit set';
}
