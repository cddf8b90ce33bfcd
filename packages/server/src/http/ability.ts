import type { NextFunction, Request, RequestHandler, Response } from 'express';
import { defineAbilityFor, ErrorCode, type AppAbility } from '@burrowline/shared';
import { AppError } from '../lib/app-error';
import type { SessionUser } from '../lib/session-user';

declare module 'express-serve-static-core' {
  interface Request {
    ability: AppAbility;
  }
}

/** Every request gets the CASL ability of its person (an empty one when signed out). */
export const attachAbility: RequestHandler = (req, _res, next) => {
  req.ability = defineAbilityFor(req.user ?? null);
  next();
};

/** Deny by default: routes behind this need a signed-in person. */
export function requireUser(req: Request, _res: Response, next: NextFunction) {
  if (!req.user) return next(new AppError(ErrorCode.unauthenticated, 401, 'Sign in to continue'));
  next();
}

export function actorOf(req: Request): SessionUser {
  if (!req.user) throw new AppError(ErrorCode.unauthenticated, 401, 'Sign in to continue');
  return req.user;
}
