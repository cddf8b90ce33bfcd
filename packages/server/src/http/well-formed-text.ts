import type { RequestHandler } from 'express';
import { ErrorCode } from '@burrowline/shared';
import { AppError } from '../lib/app-error';

// Half of a UTF-16 surrogate pair: JSON may escape one ("\ud800") and JavaScript keeps it, but it is no
// character, and PostgreSQL refuses it in jsonb (an edit's record of changes), so it failed deep in a write as a 500.
const LONE_SURROGATE = /\p{Cs}/u;

/**
 * Refuses a JSON body whose keys or texts are not valid Unicode, before any route reads it. Walks the body with
 * a list rather than recursion, as a body may nest thousands of levels deep within the size limit.
 */
export const refuseMalformedText: RequestHandler = (req, _res, next) => {
  const pending: unknown[] = [req.body];
  while (pending.length > 0) {
    const value = pending.pop();
    if (typeof value === 'string') {
      if (LONE_SURROGATE.test(value)) return next(malformed());
    } else if (value !== null && typeof value === 'object') {
      for (const [key, inner] of Object.entries(value)) {
        if (LONE_SURROGATE.test(key)) return next(malformed());
        pending.push(inner);
      }
    }
  }
  next();
};

function malformed() {
  return new AppError(ErrorCode.validation, 400, 'The request holds text that is not valid Unicode (half of a surrogate pair); send it again as UTF-8');
}
