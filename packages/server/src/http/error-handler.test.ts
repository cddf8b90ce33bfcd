import type { Request, Response } from 'express';
import { ConnectionAcquireTimeoutError, ConnectionRefusedError, DatabaseError, UniqueConstraintError } from 'sequelize';
import { describe, expect, it } from 'vitest';
import { ErrorCode } from '@burrowline/shared';
import { AppError } from '../lib/app-error';
import { setLogLevel } from '../lib/logger';
import { errorBodyOf, errorHandler } from './error-handler';

// The handler logs every 5xx with its stack; these errors are made on purpose.
setLogLevel('silent');

const req = { method: 'GET', path: '/api/test', user: undefined } as unknown as Request;

function pgError(message: string, code?: string) {
  return Object.assign(new Error(message), { code, sql: 'SELECT 1' });
}

/** What `errorHandler` sends for `error`: status, headers and body. */
function answerTo(error: unknown) {
  const sent: { status?: number; headers: Record<string, string>; body?: unknown } = { headers: {} };
  const res = {
    headersSent: false,
    set(name: string, value: string) {
      sent.headers[name.toLowerCase()] = value;
      return res;
    },
    status(code: number) {
      sent.status = code;
      return res;
    },
    json(body: unknown) {
      sent.body = body;
      return res;
    },
  };
  errorHandler(error, req, res as unknown as Response, () => undefined);
  return sent;
}

describe('error handler: a lost database', () => {
  it('when sequelize cannot connect or the pool waits too long, then the answer is 503 with Retry-After', () => {
    for (const error of [
      new ConnectionRefusedError(pgError('connect ECONNREFUSED 127.0.0.1:5432', 'ECONNREFUSED')),
      new ConnectionAcquireTimeoutError(pgError('Operation timeout')),
    ]) {
      const sent = answerTo(error);
      expect(sent.status, error.name).toBe(503);
      expect(Number(sent.headers['retry-after'])).toBeGreaterThan(0);
      expect(sent.body).toMatchObject({ error: { code: ErrorCode.unavailable } });
    }
  });

  it('when PostgreSQL shuts a connection mid-query or the socket drops, then the answer is 503', () => {
    const errors = [
      new DatabaseError(pgError('terminating connection due to administrator command', '57P01')),
      new DatabaseError(pgError('the database system is starting up', '57P03')),
      new DatabaseError(pgError('Connection terminated unexpectedly')),
      pgError('connect ECONNREFUSED 127.0.0.1:5432', 'ECONNREFUSED'),
      pgError('terminating connection due to administrator command', '57P01'),
    ];
    for (const error of errors) expect(errorBodyOf(error, req).status, error.message).toBe(503);
  });

  it('when a query fails for another reason, then it stays a 500 (or its own mapping)', () => {
    expect(errorBodyOf(new DatabaseError(pgError('column "x" does not exist', '42703')), req).status).toBe(500);
    expect(errorBodyOf(new UniqueConstraintError({}), req).status).toBe(409);
    expect(answerTo(new Error('boom')).headers['retry-after']).toBeUndefined();
  });
});

describe('error handler: client errors', () => {
  it('when a parser or the router set a 4xx status, then that status is answered', () => {
    const badGzip = Object.assign(new Error('incorrect header check'), { status: 400, statusCode: 400, expose: true });
    expect(errorBodyOf(badGzip, req)).toMatchObject({ status: 400, body: { error: { code: ErrorCode.validation } } });
    const gone = Object.assign(new Error('Not Found'), { statusCode: 404, expose: true });
    expect(errorBodyOf(gone, req)).toMatchObject({ status: 404, body: { error: { code: ErrorCode.notFound } } });
  });

  it('when decodeURIComponent throws, then the answer is 400', () => {
    let uriError: unknown;
    try {
      decodeURIComponent('%E0%A4%A');
    } catch (error) {
      uriError = error;
    }
    expect(uriError).toBeInstanceOf(URIError);
    expect(errorBodyOf(uriError, req).status).toBe(400);
  });

  it('when an error claims a 5xx status of its own, then it is still a plain 500 with no detail', () => {
    const claimed = Object.assign(new Error('secret internals'), { status: 502 });
    expect(errorBodyOf(claimed, req)).toMatchObject({ status: 500, body: { error: { code: ErrorCode.internal } } });
  });
});

describe('error handler: unique clashes', () => {
  it("when a client-chosen id clashes with a primary key (another co-op's row, hidden by row-level security), then it answers as an id taken in the co-op", () => {
    const clash = new UniqueConstraintError({ parent: Object.assign(pgError('duplicate key value violates unique constraint "animals_pkey"', '23505'), { constraint: 'animals_pkey' }) });
    expect(errorBodyOf(clash, req)).toMatchObject({ status: 409, body: { error: { code: ErrorCode.conflict, message: AppError.idTaken().message } } });
  });

  it('when another unique key clashes, then the answer is a 409 that names no record', () => {
    const clash = new UniqueConstraintError({ parent: Object.assign(pgError('duplicate key value violates unique constraint "breeds_coop_name_unique"', '23505'), { constraint: 'breeds_coop_name_unique' }) });
    expect(errorBodyOf(clash, req)).toMatchObject({ status: 409, body: { error: { code: ErrorCode.conflict, message: 'That already exists' } } });
  });
});
