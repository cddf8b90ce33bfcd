/**
 * A number as typed in a form ("12", " 3.5 "). Empty is NaN rather than 0, so the shared schema answers
 * with its own "enter a number" message instead of accepting a zero nobody typed.
 */
export function typedNumber(text: string): number {
  return text.trim() === '' ? NaN : Number(text);
}

/** The same for an optional number: empty is null (not given). */
export function typedOptionalNumber(text: string): number | null {
  return text.trim() === '' ? null : Number(text);
}
