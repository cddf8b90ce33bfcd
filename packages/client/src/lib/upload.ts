import { CSRF_HEADER, ErrorCode, type ErrorBody } from '@burrowline/shared';
import { ApiError } from './api-client';

export interface UploadOptions {
  method?: 'POST' | 'PUT';
  /** Bytes sent so far (for an upload progress bar). */
  onUpload?: (sent: number, total: number) => void;
  /**
   * Ask for a streamed answer (one JSON object a line) and hear each line as it arrives; the last
   * line is `{ type: 'result', status, body }` or `{ type: 'error', status, body }`.
   */
  onLine?: (line: unknown) => void;
  signal?: AbortSignal;
}

type StreamEnd = { type: 'result' | 'error'; status: number; body: unknown };

function isErrorBody(value: unknown): value is ErrorBody {
  const error = (value as Partial<ErrorBody> | null)?.error;
  return typeof error === 'object' && error !== null && typeof error.code === 'string' && typeof error.message === 'string';
}

function toError(status: number, body: unknown): ApiError {
  if (isErrorBody(body)) return new ApiError(status, body.error.code, body.error.message, body.error.details ?? {});
  return new ApiError(status, ErrorCode.internal, 'Something went wrong on our side; try again in a moment');
}

/**
 * Sends a form with files the way `apiFetch` sends JSON (same-origin cookie, CSRF header), but over
 * XMLHttpRequest: fetch cannot report upload progress, and a large spreadsheet's check reports its
 * own progress as a stream of lines.
 */
export function uploadForm<T>(path: string, form: FormData, { method = 'POST', onUpload, onLine, signal }: UploadOptions = {}): Promise<T> {
  return new Promise<T>((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open(method, path);
    xhr.withCredentials = true;
    xhr.setRequestHeader(CSRF_HEADER, '1');
    xhr.setRequestHeader('accept', onLine ? 'application/x-ndjson' : 'application/json');
    let read = 0;
    let end: StreamEnd | null = null;
    const takeLines = (final: boolean) => {
      const text = xhr.responseText;
      let newline = text.indexOf('\n', read);
      while (newline !== -1 || (final && read < text.length)) {
        const stop = newline === -1 ? text.length : newline;
        const raw = text.slice(read, stop).trim();
        read = stop + 1;
        if (raw) {
          const line = JSON.parse(raw) as { type?: string };
          if (line.type === 'result' || line.type === 'error') end = line as StreamEnd;
          else onLine?.(line);
        }
        newline = text.indexOf('\n', read);
      }
    };
    if (onUpload) xhr.upload.onprogress = (event) => onUpload(event.loaded, event.lengthComputable ? event.total : event.loaded);
    const streamed = () => (xhr.getResponseHeader('content-type') ?? '').includes('application/x-ndjson');
    xhr.onprogress = () => {
      if (onLine && streamed()) takeLines(false);
    };
    xhr.onload = () => {
      try {
        if (streamed()) {
          takeLines(true);
          const last = end as StreamEnd | null;
          if (!last) return reject(toError(xhr.status, null));
          return last.type === 'result' ? resolve(last.body as T) : reject(toError(last.status, last.body));
        }
        const body: unknown = xhr.responseText ? JSON.parse(xhr.responseText) : undefined;
        if (xhr.status >= 200 && xhr.status < 300) resolve(body as T);
        else reject(toError(xhr.status, body));
      } catch {
        reject(toError(xhr.status, null));
      }
    };
    xhr.onerror = () => reject(new ApiError(0, 'network_error', "Can't reach Burrowline. Check your connection and try again."));
    xhr.onabort = () => reject(new DOMException('The upload was cancelled', 'AbortError'));
    signal?.addEventListener('abort', () => xhr.abort(), { once: true });
    xhr.send(form);
  });
}
