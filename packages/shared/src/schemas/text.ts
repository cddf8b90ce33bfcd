import { z } from 'zod';

// Control characters (CR, LF, tabs, NUL…) have no place in a name; they would also reach e-mail headers.
// eslint-disable-next-line no-control-regex
const controlCharacters = /[\u0000-\u001f\u007f]/;

/** A trimmed one-line text such as a name or a place, with messages that name the field. */
export function singleLine(what: string, min: number, max: number) {
  return z
    .string({ message: `${what} is required` })
    .trim()
    .min(min, min <= 1 ? `${what} is required` : `${what} needs at least ${min} characters`)
    .max(max, `Keep ${what.toLowerCase()} under ${max} characters`)
    .refine((value) => !controlCharacters.test(value), `Keep ${what.toLowerCase()} on one line`);
}
