/**
 * The one error a forecast provider throws when the service fails. Its `message` is written for
 * the coordinator who pressed "Fetch latest forecast" (what went wrong, what happens next); `code`
 * lets the caller decide (the scheduled job simply tries again at its next tick).
 */

/**
 * - `timeout`: no complete answer within the time limit;
 * - `http`: the service answered with a status other than 2xx (see `status`);
 * - `malformed`: the answer was not JSON, or not a forecast that passes the schema (see `details`);
 * - `network`: the service could not be reached (refused, reset, name not found...).
 */
export type ForecastServiceErrorCode = 'timeout' | 'http' | 'malformed' | 'network';

export class ForecastServiceError extends Error {
  override readonly name = 'ForecastServiceError';
  readonly code: ForecastServiceErrorCode;
  /** HTTP status for code `http`. */
  readonly status?: number;
  /** For code `malformed`: the first validation problems, as "path: message" lines. */
  readonly details: readonly string[];

  constructor(
    code: ForecastServiceErrorCode,
    message: string,
    options: { status?: number; details?: readonly string[]; cause?: unknown } = {},
  ) {
    super(message, options.cause === undefined ? undefined : { cause: options.cause });
    this.code = code;
    this.status = options.status;
    this.details = options.details ?? [];
  }
}
