// The one fetch wrapper: JSON in and out, cookies included, errors as ApiError with the server's
// code, message and field details.
export interface FieldProblem {
  /** the dotted schema path (forms put the message on this field) */
  field?: string;
  /** the field in words ("Operation 2 “Lift” › Limits › Hs max") */
  label?: string;
  message?: string;
  line?: number;
  column?: string;
  value?: string;
  reason?: string;
}

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details: FieldProblem[] | null,
  ) {
    super(message);
  }
}

export async function api<T>(path: string, init: RequestInit & { json?: unknown } = {}): Promise<T> {
  const { json, headers, ...rest } = init;
  const res = await fetch(path, {
    credentials: 'same-origin',
    ...rest,
    headers: {
      accept: 'application/json',
      ...(json !== undefined ? { 'content-type': 'application/json' } : {}),
      ...headers,
    },
    body: json !== undefined ? JSON.stringify(json) : init.body,
  });
  if (res.status === 204) return undefined as T;
  const text = await res.text();
  const body = text ? safeJson(text) : null;
  if (!res.ok) {
    const err =
      body && typeof body === 'object' && 'error' in body
        ? (body as { error: { code?: string; message?: string; details?: unknown } }).error
        : null;
    const message =
      err?.message ??
      (body && typeof body === 'object' && 'message' in body ? String((body as { message: unknown }).message) : res.statusText);
    throw new ApiError(
      res.status,
      err?.code ?? String(res.status),
      message,
      Array.isArray(err?.details) ? (err.details as FieldProblem[]) : null,
    );
  }
  return body as T;
}

function safeJson(text: string): unknown {
  try {
    return JSON.parse(text);
  } catch {
    return { error: { code: 'bad_response', message: 'The server answered something that is not JSON' } };
  }
}
