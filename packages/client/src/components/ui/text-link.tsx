import { Link, type LinkProps } from 'react-router-dom';

/** An inline link with a tap area of 44 px even though the text is small. */
export function TextLink(props: LinkProps) {
  return (
    <Link
      className="inline-flex min-h-11 items-center rounded font-medium text-moss-deep underline decoration-2 underline-offset-4 hover:text-moss"
      {...props}
    />
  );
}
