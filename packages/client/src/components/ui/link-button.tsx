import { Link, type LinkProps } from 'react-router-dom';
import { buttonClasses, type ButtonVariant } from './button-styles';

interface LinkButtonProps extends LinkProps {
  variant?: ButtonVariant;
}

/** A navigation that looks like a button (it is still a link to assistive tech). */
export function LinkButton({ variant = 'secondary', className, ...props }: LinkButtonProps) {
  return <Link className={buttonClasses(variant, typeof className === 'string' ? className : undefined)} {...props} />;
}
