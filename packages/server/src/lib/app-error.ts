import { ErrorCode } from '@burrowline/shared';

/** The one error type services throw; the error handler turns it into the shared body shape. */
export class AppError extends Error {
  constructor(
    readonly code: ErrorCode,
    readonly status: number,
    message: string,
    readonly details?: Record<string, string[]>,
  ) {
    super(message);
    this.name = 'AppError';
  }

  static notFound(what = 'That record') {
    return new AppError(ErrorCode.notFound, 404, `${what} was not found`);
  }

  /** The request clashes with the record's current state (already decided, already taken); the message says how. */
  static conflict(message: string, details?: Record<string, string[]>) {
    return new AppError(ErrorCode.conflict, 409, message, details);
  }

  /**
   * A client-chosen id that another record already has. The same answer whichever co-op's record it is, so
   * it tells an outsider no more than that a random UUID clashed (see the error handler's primary-key case).
   */
  static idTaken() {
    return new AppError(ErrorCode.conflict, 409, 'That id is already taken; reload and try again');
  }

  static staleVersion() {
    return new AppError(
      ErrorCode.staleVersion,
      409,
      'Someone else saved a change to this record first. Reload to see it, then make your change again.',
    );
  }

  static validation(details: Record<string, string[]>, message = 'Some fields need attention') {
    return new AppError(ErrorCode.validation, 400, message, details);
  }
}
