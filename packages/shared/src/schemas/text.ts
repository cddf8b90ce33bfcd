import { z } from 'zod';

// Control characters (CR, LF, tabs, NUL…) have no place in a name; they would also reach e-mail headers.
// eslint-disable-next-line no-control-regex
const controlCharacters = /[\u0000-\u001f\u007f]/;
// A note keeps its line breaks and tabs, but no NUL or other invisible control character.
// eslint-disable-next-line no-control-regex
const hiddenCharacters = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f]/;

/** A trimmed one-line text such as a name or a place, with messages that name the field. */
export function singleLine(what: string, min: number, max: number) {
  return z
    .string({ message: `${what} is required` })
    .trim()
    .min(min, min <= 1 ? `${what} is required` : `${what} needs at least ${min} characters`)
    .max(max, `Keep ${what.toLowerCase()} under ${max} characters`)
    .refine((value) => !controlCharacters.test(value), `Keep ${what.toLowerCase()} on one line`);
}

/** A trimmed free text of several lines (a note, a description): line breaks stay, other control characters are refused. */
export function multiLine(max: number, tooLong = `Keep it under ${max.toLocaleString('en-US')} characters`) {
  return z
    .string()
    .trim()
    .max(max, tooLong)
    .refine((value) => !hiddenCharacters.test(value), 'Remove the invisible control characters from this text');
}

/**
 * The id of a record the person picks from a list (a doe, a group, a feed). It only fails when nothing or
 * something unknown was picked, so the message asks for the choice rather than talking about ids.
 */
export function recordId(what: string) {
  return z.uuid({ message: `Choose ${what.replace(/^The /, 'the ')}` });
}
