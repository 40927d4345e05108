// Errors across a worker thread (engine-worker.ts → engine-pool.ts): a thrown HttpError or
// ImportError travels as plain data and is rebuilt on the API thread, so the client gets the same
// status, message and details as when the work ran on the API thread.
import { ImportError, type ImportIssue } from '../../shared/seadata';
import { HttpError, type ErrorCode } from '../http/errors';

export type WorkerError =
  | { kind: 'http'; message: string; code: ErrorCode; details?: unknown }
  | { kind: 'import'; message: string; issues: ImportIssue[]; issueCount: number }
  | { kind: 'error'; name: string; message: string };

/** A thrown value as plain data (structured-clone safe). */
export function errorToData(err: unknown): WorkerError {
  if (err instanceof HttpError) return { kind: 'http', message: err.message, code: err.code, details: err.details };
  if (err instanceof ImportError) return { kind: 'import', message: err.message, issues: err.issues, issueCount: err.issueCount };
  const e = err instanceof Error ? err : new Error(String(err));
  return { kind: 'error', name: e.name, message: e.message };
}

/** The error again, of its own class. */
export function errorFromData(data: WorkerError): Error {
  if (data.kind === 'http') return new HttpError(data.code, data.message, data.details);
  if (data.kind === 'import') return new ImportError(data.issues, data.issueCount, data.message);
  const err = new Error(data.message);
  err.name = data.name;
  return err;
}
