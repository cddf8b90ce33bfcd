import type { ReactNode } from 'react';
import { NavLink } from 'react-router-dom';
import { cn } from '../../lib/cn';

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

/** The row of an area's tabs; scrolls sideways on a phone rather than wrapping into a wall of buttons. */
export function SectionTabs({ label, children }: { label: string; children: ReactNode }) {
  return (
    <nav aria-label={label} className="-mx-4 overflow-x-auto px-4 sm:mx-0 sm:px-0">
      <ul className="flex gap-2 sm:flex-wrap">{children}</ul>
    </nav>
  );
}
