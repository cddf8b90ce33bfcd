/**
 * A count with its noun as a breeder reads it: "1 day", "3 days", "1 head". The plural is the noun
 * plus "s" unless given (e.g. "head" stays "head").
 */
export function countOf(count: number, noun: string, plural = `${noun}s`): string {
  return `${count.toLocaleString('en-US')} ${count === 1 ? noun : plural}`;
}
