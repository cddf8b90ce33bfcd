import type { ReactNode } from 'react';
import { NavLink } from 'react-router-dom';
import { cn } from '../../lib/cn';
import { useMoreToTheRight } from './use-more-to-the-right';

/** One tab of an area's own navigation (the admin area, the grow-out area). */
export function SectionTab({ to, icon, children, badge, end }: { to: string; icon: ReactNode; children: string; badge?: ReactNode; end?: boolean }) {
  return (
    <li>
      <NavLink
        to={to}
        end={end}
        className={({ isActive }) =>
          cn(
            'inline-flex min-h-11 items-center gap-2 rounded-lg border-2 px-3 font-semibold whitespace-nowrap',
            isActive ? 'border-moss bg-moss-wash text-moss-deep' : 'border-transparent text-bark hover:border-grey-300',
          )
        }
      >
        {icon}
        {children}
        {badge}
      </NavLink>
    </li>
  );
}

/**
 * The row of an area's tabs; scrolls sideways on a phone rather than wrapping into a wall of buttons, and fades
 * at the right edge while more tabs sit beyond it.
 */
export function SectionTabs({ label, children }: { label: string; children: ReactNode }) {
  const scroller = useMoreToTheRight<HTMLElement>();
  return (
    <nav
      ref={scroller.ref}
      aria-label={label}
      className={cn('-mx-4 overflow-x-auto px-4 sm:mx-0 sm:px-0', scroller.more && '[mask-image:linear-gradient(to_right,black_calc(100%-3rem),transparent)]')}
    >
      <ul className="flex gap-2 sm:flex-wrap">{children}</ul>
    </nav>
  );
}
