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
