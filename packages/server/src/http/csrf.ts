import type { RequestHandler } from 'express';
import { CSRF_HEADER, ErrorCode } from '@burrowline/shared';
import { AppError } from '../lib/app-error';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Every state-changing request carries our custom header (a cross-site form or fetch cannot add it
 * without a CORS preflight we never grant) and, when the browser names its origin, comes from ours.
 */
export function csrfGuard(appUrl: string): RequestHandler {
  const allowedOrigin = new URL(appUrl).origin;
  return (req, _res, next) => {
    if (SAFE_METHODS.has(req.method)) return next();
    const origin = req.get('origin');
    const fetchSite = req.get('sec-fetch-site');
    const headerOk = req.get(CSRF_HEADER) === '1';
    const originOk = !origin || origin === allowedOrigin;
    const siteOk = !fetchSite || fetchSite === 'same-origin' || fetchSite === 'none';
    if (headerOk && originOk && siteOk) return next();
    next(new AppError(ErrorCode.csrf, 403, 'This request did not come from Burrowline; reload the page and try again'));
  };
}
