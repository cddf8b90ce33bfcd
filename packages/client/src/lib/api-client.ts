import { CSRF_HEADER, ErrorCode, type ErrorBody } from '@burrowline/shared';

/** Codes the browser can produce on its own, besides the server's. */
export type ClientErrorCode = ErrorCode | 'network_error';

export class ApiError extends Error {
  override readonly name = 'ApiError';

  constructor(
    readonly status: number,
    readonly code: ClientErrorCode,
    message: string,
    readonly details: Record<string, string[]> = {},
  ) {
    super(message);
  }
}

export function isApiError(error: unknown, code?: ClientErrorCode): error is ApiError {
  return error instanceof ApiError && (code === undefined || error.code === code);
}

type Method = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';

interface ApiFetchOptions {
  method?: Method;
  body?: unknown;
  signal?: AbortSignal;
}

function isErrorBody(value: unknown): value is ErrorBody {
  const error = (value as Partial<ErrorBody> | null)?.error;
  return typeof error === 'object' && error !== null && typeof error.code === 'string' && typeof error.message === 'string';
}

async function toApiError(response: Response): Promise<ApiError> {
  const body: unknown = await response.json().catch(() => null);
  if (isErrorBody(body)) {
    return new ApiError(response.status, body.error.code, body.error.message, body.error.details ?? {});
  }
  // A proxy or a crashed server can answer without our error shape.
  return new ApiError(response.status, ErrorCode.internal, 'Something went wrong on our side; try again in a moment');
}

/** The one way the client talks to the API: JSON in and out, same-origin cookie, CSRF header on writes. */
export async function apiFetch<T>(path: string, { method = 'GET', body, signal }: ApiFetchOptions = {}): Promise<T> {
  const headers: Record<string, string> = { accept: 'application/json' };
  if (method !== 'GET') headers[CSRF_HEADER] = '1';
  if (body !== undefined) headers['content-type'] = 'application/json';

  let response: Response;
  try {
    response = await fetch(path, {
      method,
      headers,
      body: body === undefined ? undefined : JSON.stringify(body),
      credentials: 'same-origin',
      signal,
    });
  } catch (error) {
    if (signal?.aborted) throw error;
    throw new ApiError(0, 'network_error', "Can't reach Burrowline. Check your connection and try again.");
  }

  if (!response.ok) throw await toApiError(response);
  if (response.status === 204) return undefined as T;
  return (await response.json()) as T;
}
