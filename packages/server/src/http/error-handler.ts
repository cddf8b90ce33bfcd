import type { ErrorRequestHandler, Request, RequestHandler } from 'express';
import { ForbiddenError } from '@casl/ability';
import { OptimisticLockError, UniqueConstraintError } from 'sequelize';
import { ZodError } from 'zod';
import { ErrorCode, type ErrorBody } from '@burrowline/shared';
import { exclusionViolationOf, isLostConnection, isPrimaryKeyClash } from '../db/database-errors';
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

/** Seconds a client should wait before retrying a lost connection (a database restart takes a few). */
export const RETRY_AFTER_SECONDS = 5;

/** A 4xx that a parser or the router set on its error (body-parser, express, path decoding); never a 5xx it claims. */
function clientStatusOf(error: unknown): number | null {
  const { status, statusCode } = (error ?? {}) as { status?: unknown; statusCode?: unknown };
  const value = typeof status === 'number' ? status : statusCode;
  return typeof value === 'number' && value >= 400 && value < 500 ? value : null;
}

function toAppError(error: unknown): AppError {
  if (error instanceof AppError) return error;
  if (error instanceof ZodError) return AppError.validation(fieldMessages(error));
  if (error instanceof ForbiddenError) return new AppError(ErrorCode.forbidden, 403, 'You may not do that');
  if (error instanceof OptimisticLockError) return AppError.staleVersion();
  // Primary keys are global: a client-chosen id of another co-op's row clashes here, where row-level security
  // hid it from the service's own look-up. It answers exactly as an id taken in the actor's co-op does.
  if (isPrimaryKeyClash(error)) return AppError.idTaken();
  if (error instanceof UniqueConstraintError) return new AppError(ErrorCode.conflict, 409, 'That already exists');
  // A buck's days are held by the database (see 0064): a service planned with him while he is lent out lands here.
  if (exclusionViolationOf(error)?.startsWith('stud_bookings_')) {
    return new AppError(ErrorCode.conflict, 409, 'That buck is lent out or booked on that day; choose another day or another buck');
  }
  const bodyError = error as { type?: string; status?: number };
  if (bodyError.type === 'entity.too.large') return new AppError(ErrorCode.payloadTooLarge, 413, 'The request is too large');
  if (bodyError.type === 'entity.parse.failed') return new AppError(ErrorCode.validation, 400, 'The request body is not valid JSON');
  if (bodyError.type === 'charset.unsupported' || bodyError.type === 'encoding.unsupported') {
    return new AppError(ErrorCode.validation, 400, 'Send the request as UTF-8 JSON');
  }
  if (error instanceof URIError) return new AppError(ErrorCode.validation, 400, 'The address holds a broken %-escape');
  const clientStatus = clientStatusOf(error);
  if (clientStatus === 404) return new AppError(ErrorCode.notFound, 404, 'Nothing is at that address');
  if (clientStatus === 413) return new AppError(ErrorCode.payloadTooLarge, 413, 'The request is too large');
  if (clientStatus !== null) return new AppError(ErrorCode.validation, clientStatus, 'The request could not be read; check its address, headers and body');
  if (isLostConnection(error)) {
    return new AppError(ErrorCode.unavailable, 503, 'Burrowline cannot reach a service it needs just now; try again in a few seconds');
  }
  return new AppError(ErrorCode.internal, 500, 'Something went wrong on our side; try again in a moment');
}

/** The status and body the error handler would send for `error` (logged the same way). */
export function errorBodyOf(
  error: unknown,
  req: Pick<Request, 'method' | 'path' | 'user'>,
): { status: number; body: ErrorBody; headers: Record<string, string> } {
  const appError = toAppError(error);
  if (appError.status >= 500) {
    logger.error('request failed', { method: req.method, path: req.path, error: error instanceof Error ? error.stack : String(error) });
  } else if (appError.status === 403) {
    logger.warn('refused', { path: req.path, userId: req.user?.id, coopId: req.user?.coopId });
  }
  const headers: Record<string, string> = appError.status === 503 ? { 'Retry-After': String(RETRY_AFTER_SECONDS) } : {};
  return { status: appError.status, body: { error: { code: appError.code, message: appError.message, details: appError.details } }, headers };
}

/** The one error handler: shared body shape, no stack traces or SQL to the client (ASVS 16.5.1). */
export const errorHandler: ErrorRequestHandler = (error, req, res, _next) => {
  const { status, body, headers } = errorBodyOf(error, req);
  if (res.headersSent) return;
  for (const [name, value] of Object.entries(headers)) res.set(name, value);
  res.status(status).json(body);
};

export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new AppError(ErrorCode.notFound, 404, `No API route ${req.method} ${req.path}`));
};
