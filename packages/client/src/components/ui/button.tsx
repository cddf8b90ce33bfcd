import type { ComponentProps } from 'react';
import { buttonClasses, type ButtonVariant } from './button-styles';
import { Spinner } from './spinner';

interface ButtonProps extends ComponentProps<'button'> {
  variant?: ButtonVariant;
  /** Shows a spinner and blocks a second submit while the request runs. */
  isBusy?: boolean;
}

export function Button({ variant, isBusy = false, className, children, disabled, type = 'button', ...props }: ButtonProps) {
  return (
    <button
      type={type}
      className={buttonClasses(variant, className)}
      disabled={disabled || isBusy}
      aria-busy={isBusy || undefined}
      {...props}
    >
      {isBusy && <Spinner size="sm" decorative />}
      {children}
    </button>
  );
}
