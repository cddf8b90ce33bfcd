import { cn } from '../../lib/cn';

export type ButtonVariant = 'primary' | 'secondary' | 'danger' | 'quiet' | 'on-moss';

const variants: Record<ButtonVariant, string> = {
  primary: 'bg-moss text-white hover:bg-moss-deep',
  secondary: 'border-2 border-moss bg-white text-moss-deep hover:bg-moss-wash',
  danger: 'bg-clay text-white hover:bg-clay-deep',
  quiet: 'text-moss-deep underline-offset-4 hover:bg-moss-wash hover:underline',
  // For the moss top bar: a straw focus ring shows against moss, the default moss one would not.
  'on-moss': 'border-2 border-oat/70 text-oat hover:bg-moss-deep focus-visible:outline-straw',
};

/** Shared by buttons and links that look like buttons; 44 px tall at least, for gloved fingers. */
export function buttonClasses(variant: ButtonVariant = 'primary', extra?: string): string {
  return cn(
    'inline-flex min-h-11 items-center justify-center gap-2 rounded-lg px-4 py-2 text-base font-semibold',
    'transition-colors disabled:cursor-not-allowed disabled:opacity-60',
    variants[variant],
    extra,
  );
}
