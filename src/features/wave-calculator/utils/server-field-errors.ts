import { ApiError } from '../../../lib/api';
import { readable } from './validate-fields';

/**
 * The field messages of a 400 answer (`details: [{ field, message }]`), first per field, worded
 * as the page words its own. Normally the shared schema catches these before any request.
 */
export function serverFieldErrors(error: unknown): Record<string, string> {
  const out: Record<string, string> = {};
  if (error instanceof ApiError && error.details) {
    for (const d of error.details) if (d.field && d.message && !out[d.field]) out[d.field] = readable(d.message);
  }
  return out;
}
