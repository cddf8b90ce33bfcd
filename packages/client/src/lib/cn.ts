/** Joins class names, skipping the false ones, e.g. `cn('p-4', isActive && 'bg-straw')`. */
export function cn(...classes: (string | false | null | undefined)[]): string {
  return classes.filter(Boolean).join(' ');
}
