import type { ErrorRequestHandler, Request, RequestHandler } from 'express';
import { ForbiddenError } from '@casl/ability';
import { OptimisticLockError, UniqueConstraintError } from 'sequelize';
import { ZodError } from 'zod';
import { ErrorCode, type ErrorBody } from '@burrowline/shared';
import { AppError } from '../lib/app-error';
import { logger } from '../lib/logger';

function fieldMessages(error: ZodError): Record<string, string[]> {
  const details: Record<string, string[]> = {};
  for (const issue of error.issues) {
    const key = issue.path.join('.') || '_';
    (details[key] ??= []).push(issue.message);
  }
  return details;
}

function toAppError(error: unknown): AppError {
  if (error instanceof AppError) return error;
  if (error instanceof ZodError) return AppError.validation(fieldMessages(error));
  if (error instanceof ForbiddenError) return new AppError(ErrorCode.forbidden, 403, 'You may not do that');
  if (error instanceof OptimisticLockError) return AppError.staleVersion();
  if (error instanceof UniqueConstraintError) return new AppError(ErrorCode.conflict, 409, 'That already exists');
  const bodyError = error as { type?: string; status?: number };
  if (bodyError.type === 'entity.too.large') return new AppError(ErrorCode.payloadTooLarge, 413, 'The request is too large');
  if (bodyError.type === 'entity.parse.failed') return new AppError(ErrorCode.validation, 400, 'The request body is not valid JSON');
  if (bodyError.type === 'charset.unsupported' || bodyError.type === 'encoding.unsupported') {
    return new AppError(ErrorCode.validation, 400, 'Send the request as UTF-8 JSON');
  }
  return new AppError(ErrorCode.internal, 500, 'Something went wrong on our side; try again in a moment');
}

/** The status and body the error handler would send for `error` (logged the same way). */
export function errorBodyOf(error: unknown, req: Pick<Request, 'method' | 'path' | 'user'>): { status: number; body: ErrorBody } {
  const appError = toAppError(error);
  if (appError.status >= 500) {
    logger.error('request failed', { method: req.method, path: req.path, error: error instanceof Error ? error.stack : String(error) });
  } else if (appError.status === 403) {
    logger.warn('refused', { path: req.path, userId: req.user?.id, coopId: req.user?.coopId });
  }
  return { status: appError.status, body: { error: { code: appError.code, message: appError.message, details: appError.details } } };
}

/** The one error handler: shared body shape, no stack traces or SQL to the client (ASVS 16.5.1). */
export const errorHandler: ErrorRequestHandler = (error, req, res, _next) => {
  const { status, body } = errorBodyOf(error, req);
  if (res.headersSent) return;
  res.status(status).json(body);
};

export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new AppError(ErrorCode.notFound, 404, `No API route ${req.method} ${req.path}`));
};
