import type { ErrorRequestHandler } from 'express';
import { z } from 'zod';
import { issuesInWords, problemSentence, type ProblemInWords } from '../../shared/schemas/words';

export type ErrorCode =
  | 'validation'
  | 'unauthenticated'
  | 'forbidden'
  | 'not_found'
  | 'conflict'
  | 'too_large'
  | 'unsupported_media_type'
  | 'password_change_required'
  | 'bad_file'
  | 'rate_limited'
  | 'unavailable'
  | 'internal';

const STATUS: Record<ErrorCode, number> = {
  validation: 400,
  bad_file: 400,
  unauthenticated: 401,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  too_large: 413,
  unsupported_media_type: 415,
  password_change_required: 403,
  rate_limited: 429,
  unavailable: 503,
  internal: 500,
};

/** An error with a status and a message meant for the user. Thrown by guards and services. */
export class HttpError extends Error {
  readonly status: number;
  constructor(
    readonly code: ErrorCode,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
    this.status = STATUS[code];
  }
}

export const notFound = (what: string) => new HttpError('not_found', `${what} not found`);

/**
 * zod issues as `{ field, label, message }`: `field` the dotted path (forms put the message on
 * that field), `label` the path in words, naming list entries by number and name
 * (`shared/schemas/words.ts`, the one place for validation words).
 */
export function zodDetails(error: z.ZodError, value?: unknown, whole = 'The request'): ProblemInWords[] {
  return issuesInWords(error, value, whole);
}

/** Parses with a schema, throwing a 400 that names every failing field in words. */
export function parseInput<S extends z.ZodType>(schema: S, value: unknown, where = 'body'): z.infer<S> {
  const result = schema.safeParse(value);
  if (!result.success) {
    const details = zodDetails(result.error, value, where === 'form' ? 'The form' : 'The request');
    const first = problemSentence(details[0]);
    const more = details.length > 1 ? ` (and ${details.length - 1} more ${details.length === 2 ? 'problem' : 'problems'})` : '';
    throw new HttpError('validation', `${first}${more}`, details);
  }
  return result.data;
}

/**
 * Errors that Express, its router and body parsers raise for a malformed request, as the client
 * errors they are (never a 500 with a stack trace in the log): a path with a bad percent-escape
 * (the router's 400), a charset or content encoding the parser does not know (415), a body too
 * deeply nested to parse (400), and any other 4xx they mark.
 */
function clientError(err: unknown): HttpError | null {
  if (!err || typeof err !== 'object') return null;
  const e = err as { type?: unknown; status?: unknown; statusCode?: unknown; message?: unknown };
  if (e.type === 'charset.unsupported' || e.type === 'encoding.unsupported') {
    return new HttpError('unsupported_media_type', `Unsupported request body encoding: ${String(e.message ?? '')}`);
  }
  if (err instanceof RangeError && /call stack/i.test(err.message)) return new HttpError('validation', 'Request body is nested too deeply');
  if (err instanceof URIError) return new HttpError('validation', 'Malformed percent-escape in the request address');
  const status = typeof e.status === 'number' ? e.status : typeof e.statusCode === 'number' ? e.statusCode : 0;
  if (status === 413) return new HttpError('too_large', 'Request body too large');
  if (status === 415) return new HttpError('unsupported_media_type', 'Unsupported request body type');
  if (status >= 400 && status < 500) return new HttpError('validation', 'Malformed request');
  return null;
}

/** The one error handler: JSON `{ error: { code, message, details } }`, no stack traces outside development. */
export function errorHandler(options: { exposeStack: boolean; log: (err: unknown) => void }): ErrorRequestHandler {
  return (err, _req, res, _next) => {
    let httpError: HttpError;
    if (err instanceof HttpError) {
      httpError = err;
    } else if (err && typeof err === 'object' && 'type' in err && err.type === 'entity.too.large') {
      httpError = new HttpError('too_large', 'Request body too large');
    } else if (err && typeof err === 'object' && 'type' in err && err.type === 'entity.parse.failed') {
      httpError = new HttpError('validation', 'Request body is not valid JSON');
    } else if (err && typeof err === 'object' && 'code' in err && err.code === 'LIMIT_FILE_SIZE') {
      httpError = new HttpError('too_large', (err as Error).message);
    } else if (clientError(err)) {
      httpError = clientError(err)!;
    } else {
      options.log(err);
      httpError = new HttpError('internal', 'Internal server error');
    }
    if (res.headersSent) return;
    const body: { error: { code: string; message: string; details?: unknown; stack?: string } } = {
      error: { code: httpError.code, message: httpError.message, details: httpError.details ?? null },
    };
    if (options.exposeStack && httpError.code === 'internal' && err instanceof Error) body.error.stack = err.stack;
    res.status(httpError.status).json(body);
  };
}
