import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ImportAnswer } from '../../../../shared/api-types-datasets';
import { ApiError, type FieldProblem } from '../../../lib/api';
import { datasetsQueryOptions } from '../../../api/datasets';

/** Largest upload the server takes, bytes (100 MiB; the server answers 413 above it). */
export const MAX_UPLOAD_BYTES = 100 * 1024 * 1024;
/** Largest NetCDF upload (2 GiB): only the chosen point's series is read from it. */
export const MAX_NETCDF_UPLOAD_BYTES = 2 * 1024 * 1024 * 1024;

/** Where an upload is: sending the bytes, then the server reading and saving them. */
export type UploadProgress =
  | { phase: 'sending'; sentBytes: number; totalBytes: number }
  | { phase: 'parsing' | 'saving'; bytesRead: number; totalBytes: number; rows: number };

/** The form fields besides the file, already as multipart strings (see shared ImportFormSchema). */
export type ImportFields = Record<string, string>;

interface StreamLine {
  progress?: { phase: 'parsing' | 'saving'; bytesRead: number; totalBytes: number; rows: number };
  status?: number;
  result?: ImportAnswer;
  error?: { code?: string; message?: string; details?: unknown };
}

function toApiError(status: number, body: StreamLine['error'] | undefined, fallback: string): ApiError {
  return new ApiError(
    status,
    body?.code ?? String(status),
    body?.message ?? fallback,
    Array.isArray(body?.details) ? (body.details as FieldProblem[]) : null,
  );
}

/**
 * Uploads a sea-state file (`POST /api/projects/:projectId/datasets`, multipart) with
 * XMLHttpRequest, so the caller sees the bytes sent, then the server's streamed progress
 * (`Accept: application/x-ndjson`: progress lines, then one line with the status and the answer).
 * Resolves with the 201 answer; rejects with an ApiError (400 bad_file with line details, 403,
 * 413...) or with an AbortError when `signal` fires.
 */
export function uploadDataset(
  projectId: string,
  file: File,
  fields: ImportFields,
  onProgress: (p: UploadProgress) => void,
  signal?: AbortSignal,
): Promise<ImportAnswer> {
  return new Promise((resolve, reject) => {
    const body = new FormData();
    for (const [k, v] of Object.entries(fields)) body.append(k, v);
    body.append('file', file, file.name);

    const xhr = new XMLHttpRequest();
    xhr.open('POST', `/api/projects/${projectId}/datasets`);
    xhr.withCredentials = true;
    xhr.setRequestHeader('accept', 'application/x-ndjson, application/json');
    let consumed = 0;
    let last: StreamLine | null = null;

    // Reads the complete NDJSON lines received so far.
    const readLines = () => {
      const text = xhr.responseText;
      let nl = text.indexOf('\n', consumed);
      while (nl !== -1) {
        const line = text.slice(consumed, nl).trim();
        consumed = nl + 1;
        nl = text.indexOf('\n', consumed);
        if (line === '') continue;
        let parsed: StreamLine;
        try {
          parsed = JSON.parse(line) as StreamLine;
        } catch {
          continue;
        }
        if (parsed.progress) onProgress({ ...parsed.progress });
        else last = parsed;
      }
    };

    xhr.upload.onprogress = (e) => {
      onProgress({ phase: 'sending', sentBytes: e.loaded, totalBytes: e.lengthComputable ? e.total : file.size });
    };
    xhr.onprogress = () => {
      if ((xhr.getResponseHeader('content-type') ?? '').includes('ndjson')) readLines();
    };
    xhr.onload = () => {
      const streamed = (xhr.getResponseHeader('content-type') ?? '').includes('ndjson');
      if (streamed) {
        readLines();
        // A last line without its newline is still a line.
        const tail = xhr.responseText.slice(consumed).trim();
        if (tail !== '') {
          try {
            last = JSON.parse(tail) as StreamLine;
          } catch {
            /* an incomplete line: handled below */
          }
        }
        const end = last as StreamLine | null;
        if (end?.status === 201 && end.result) return resolve(end.result);
        if (end?.status) return reject(toApiError(end.status, end.error, 'The import failed'));
        return reject(
          new ApiError(xhr.status, 'bad_response', 'The server stopped answering before the import finished. Nothing was saved.', null),
        );
      }
      // Refused before the import started (403, 413, 400 form fields...): a plain JSON answer.
      let json: StreamLine | null;
      try {
        json = xhr.responseText ? (JSON.parse(xhr.responseText) as StreamLine) : null;
      } catch {
        json = null;
      }
      if (xhr.status === 201 && json) return resolve(json as unknown as ImportAnswer);
      const fallback =
        xhr.status === 413
          ? `The file is larger than the upload limit of ${MAX_UPLOAD_BYTES / 1024 / 1024} MB`
          : xhr.statusText || 'The upload failed';
      reject(toApiError(xhr.status, json?.error, fallback));
    };
    xhr.onerror = () => reject(new ApiError(0, 'network', 'The connection was lost during the upload. Nothing was saved.', null));
    xhr.onabort = () => reject(new DOMException('The upload was cancelled', 'AbortError'));
    if (signal) {
      if (signal.aborted) return xhr.abort();
      signal.addEventListener('abort', () => xhr.abort(), { once: true });
    }
    xhr.send(body);
  });
}

/** Import mutation: uploads, then refreshes the project's dataset list. */
export function useImportDataset(projectId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (args: { file: File; fields: ImportFields; onProgress: (p: UploadProgress) => void; signal?: AbortSignal }) =>
      uploadDataset(projectId, args.file, args.fields, args.onProgress, args.signal),
    onSuccess: () => qc.invalidateQueries({ queryKey: datasetsQueryOptions(projectId).queryKey, exact: true }),
  });
}
