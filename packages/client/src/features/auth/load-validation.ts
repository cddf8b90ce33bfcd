/**
 * The shared schemas (and zod) for the sign-in screens, fetched when someone first focuses a form:
 * by the time they have typed an e-mail address, the validation code is there.
 */
export function loadAuthValidation() {
  return import('./validation');
}
