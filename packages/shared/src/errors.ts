/** Error codes shared by server and client; the body of every API error is `ErrorBody`. */
export const ErrorCode = {
  validation: 'validation_failed',
  unauthenticated: 'unauthenticated',
  forbidden: 'forbidden',
  notFound: 'not_found',
  conflict: 'conflict',
  /** A warning the person may override: resubmit with `confirm: true` (e.g. a parent younger than its breed's first-breeding age). */
  confirmationRequired: 'confirmation_required',
  staleVersion: 'stale_version',
  rateLimited: 'rate_limited',
  csrf: 'csrf_rejected',
  invalidCredentials: 'invalid_credentials',
  invalidToken: 'invalid_token',
  weakPassword: 'weak_password',
  payloadTooLarge: 'payload_too_large',
  /** An upload whose content (checked by its signature, not its name) is not a kind we accept. */
  unsupportedFile: 'unsupported_file',
  internal: 'internal_error',
  /** The database is out of reach for a moment (a restart, a lost connection): try again after `Retry-After`. */
  unavailable: 'unavailable',
} as const;

export type ErrorCode = (typeof ErrorCode)[keyof typeof ErrorCode];

export interface ErrorBody {
  error: {
    code: ErrorCode;
    message: string;
    /** Field-level messages keyed by dotted path, e.g. `{ "location": ["Required"] }`. */
    details?: Record<string, string[]>;
  };
}

/** The header every state-changing request must carry (with a same-origin check on the server). */
export const CSRF_HEADER = 'x-burrowline-csrf';
