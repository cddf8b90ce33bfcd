import type { RequestHandler } from 'express';
import { rateLimit } from 'express-rate-limit';
import { ErrorCode } from '@burrowline/shared';
import type { Config } from '../config/env';
import { AppError } from '../lib/app-error';

function limiter(opts: { windowSeconds: number; limit: number; key?: (req: Parameters<RequestHandler>[0]) => string; failuresOnly?: boolean; message: string }): RequestHandler {
  return rateLimit({
    windowMs: opts.windowSeconds * 1000,
    limit: opts.limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    skipSuccessfulRequests: opts.failuresOnly ?? false,
    keyGenerator: opts.key,
    handler: (_req, _res, next) => next(new AppError(ErrorCode.rateLimited, 429, opts.message)),
  });
}

/**
 * Sign-in is limited per address (all attempts) and per account (failures only, so the owner who
 * types the right password is never locked out by someone else's guesses beyond the window).
 */
export function signInLimiters(config: Config): RequestHandler[] {
  const { windowSeconds, maxPerIp, maxFailuresPerAccount } = config.signIn;
  const minutes = Math.ceil(windowSeconds / 60);
  return [
    limiter({ windowSeconds, limit: maxPerIp, message: `Too many sign-in attempts from this address; wait ${minutes} minutes` }),
    limiter({
      windowSeconds,
      limit: maxFailuresPerAccount,
      failuresOnly: true,
      key: (req) => `account:${String((req.body as { email?: unknown })?.email ?? '').trim().toLowerCase()}`,
      message: `Too many failed sign-ins for this account; wait ${minutes} minutes or reset your password`,
    }),
  ];
}

export function passwordResetLimiter(config: Config): RequestHandler {
  return limiter({
    windowSeconds: config.signIn.windowSeconds,
    limit: config.signIn.maxResetsPerIp,
    message: 'Too many reset requests from this address; wait a while and try again',
  });
}

/**
 * The public application form: limited per address (a flood from one machine) and per e-mail (one
 * person re-sending under many addresses). Counted on every try, accepted or refused.
 */
export function applicationLimiters(config: Config): RequestHandler[] {
  const { applyWindowSeconds: windowSeconds, applyMaxPerIp, applyMaxPerEmail } = config.membership;
  const wait = windowSeconds >= 120 ? `${Math.ceil(windowSeconds / 60)} minutes` : `${windowSeconds} seconds`;
  return [
    limiter({
      windowSeconds,
      limit: applyMaxPerIp,
      message: `Too many applications from this address; wait ${wait} and try again, or write to the co-op's coordinator`,
    }),
    limiter({
      windowSeconds,
      limit: applyMaxPerEmail,
      key: (req) => `apply-email:${String((req.body as { email?: unknown })?.email ?? '').trim().toLowerCase()}`,
      message: `Too many applications for this e-mail address; wait ${wait} and try again`,
    }),
  ];
}
