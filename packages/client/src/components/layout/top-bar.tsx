import { CalendarDays, LogOut, Rabbit, ShieldCheck, Tent, Warehouse } from 'lucide-react';
import type { ReactNode } from 'react';
import { Link, NavLink } from 'react-router-dom';
import { CountBadge } from '../ui/badge';
import { BrandMark } from '../ui/brand-mark';
import { Button } from '../ui/button';

function NavItem({ to, end, icon, children, badge }: { to: string; end?: boolean; icon: ReactNode; children: string; badge?: ReactNode }) {
  return (
    <li>
      <NavLink
        to={to}
        end={end}
        className={({ isActive }) =>
          [
            'inline-flex min-h-11 items-center gap-2 rounded-lg px-2.5 font-medium whitespace-nowrap focus-visible:outline-straw sm:px-3',
            isActive ? 'bg-straw text-bark' : 'text-oat hover:bg-moss-deep',
          ].join(' ')
        }
      >
        {icon}
        {children}
        {badge}
      </NavLink>
    </li>
  );
}

interface TopBarProps {
  coopName: string;
  personName: string;
  roleLabel: string;
  /** Absent for someone not attached to a farm: then there is no "My farm" to link to. */
  farmId: string | null;
  onSignOut: () => void;
  isSigningOut: boolean;
  /** Only for the co-op's admins: their area, with the count of applications they have not opened. */
  admin?: { unreadApplications: number };
}

/** Wraps to two rows on a phone (co-op and account, then the areas) so nothing scrolls sideways. */
export function TopBar({ coopName, personName, roleLabel, farmId, onSignOut, isSigningOut, admin }: TopBarProps) {
  return (
    <header className="bg-moss text-oat">
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:absolute focus:top-2 focus:left-2 focus:z-10 focus:rounded-lg focus:bg-straw focus:px-4 focus:py-3 focus:text-bark"
      >
        Skip to content
      </a>
      {/* Phone: co-op and sign-out on one row, areas and person on the next. Wide: all on one row. */}
      <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-x-3 gap-y-1 px-4 py-2 sm:gap-x-6">
        <Link to="/" className="order-1 flex min-h-11 min-w-0 flex-1 items-center gap-2.5 rounded-lg focus-visible:outline-straw sm:flex-none">
          <BrandMark withName={false} onMoss />
          <span className="min-w-0 text-lg leading-tight font-bold">{coopName}</span>
        </Link>
        {/* Icon-only on a phone, but always named "Sign out" for assistive tech. */}
        <Button variant="on-moss" className="order-2 min-w-11 px-3 sm:order-4 sm:px-4" onClick={onSignOut} isBusy={isSigningOut}>
          {!isSigningOut && <LogOut className="size-5" aria-hidden="true" />}
          <span className="sr-only sm:not-sr-only">Sign out</span>
        </Button>
        <div className="order-3 flex w-full items-center justify-between gap-3 sm:contents">
          {/* The areas wrap onto a second line on a narrow phone rather than push the page sideways. */}
          <nav aria-label="Main" className="min-w-0 sm:order-2">
            <ul className="flex flex-wrap gap-1">
              <NavItem to="/" end icon={<Tent className="hidden size-5 sm:block" aria-hidden="true" />}>
                Commons
              </NavItem>
              {farmId && (
                <NavItem to={`/farms/${farmId}`} icon={<Warehouse className="hidden size-5 sm:block" aria-hidden="true" />}>
                  My farm
                </NavItem>
              )}
              {farmId && (
                <NavItem to="/herd" icon={<Rabbit className="hidden size-5 sm:block" aria-hidden="true" />}>
                  Herd
                </NavItem>
              )}
              {farmId && (
                <NavItem to="/almanac" icon={<CalendarDays className="hidden size-5 sm:block" aria-hidden="true" />}>
                  Almanac
                </NavItem>
              )}
              {admin && (
                <NavItem
                  to="/admin"
                  icon={<ShieldCheck className="hidden size-5 sm:block" aria-hidden="true" />}
                  badge={<CountBadge count={admin.unreadApplications} label="new applications" />}
                >
                  Admin
                </NavItem>
              )}
            </ul>
          </nav>
          <p className="min-w-0 text-right leading-tight sm:order-3 sm:ml-auto">
            <span className="block max-w-32 truncate font-medium sm:max-w-56">{personName}</span>
            <span className="block text-sm text-oat/85">{roleLabel}</span>
          </p>
        </div>
      </div>
    </header>
  );
}
