import { useEffect, useState } from 'react';
import { Bell, CalendarDays, Coins, Ellipsis, Handshake, LogOut, Rabbit, ShieldCheck, Sprout, Tent, Warehouse, X, type LucideIcon } from 'lucide-react';
import { Link, NavLink, useLocation } from 'react-router-dom';
import { CountBadge } from '../ui/badge';
import { BrandMark } from '../ui/brand-mark';
import { Button } from '../ui/button';

interface Area {
  to: string;
  label: string;
  icon: LucideIcon;
  end?: boolean;
  badge?: { count: number; label: string };
}

interface TopBarProps {
  coopName: string;
  personName: string;
  roleLabel: string;
  /** Absent for someone not attached to a farm: then there is no farm, herd or Almanac to link to. */
  farmId: string | null;
  onSignOut: () => void;
  isSigningOut: boolean;
  /** Only for the co-op's admins: their area, with the count of applications they have not opened. */
  admin?: { unreadApplications: number };
  /** Whether the person sees money (never an apprentice): the Ledger's entry. */
  ledger?: boolean;
  /** The bell: how many notifications the person has not read. */
  unreadNotifications: number;
}

// Whole class names, so Tailwind sees them when it scans this file.
const columns: Record<number, string> = { 1: 'grid-cols-1', 2: 'grid-cols-2', 3: 'grid-cols-3', 4: 'grid-cols-4', 5: 'grid-cols-5' };
/** A phone's bar holds five places, wide enough for a gloved thumb and a whole word; the rest sit under "More". */
const PHONE_PLACES = 5;

function areasFor({ farmId, admin, ledger }: Pick<TopBarProps, 'farmId' | 'admin' | 'ledger'>): Area[] {
  const areas: Area[] = [{ to: '/', label: 'Commons', icon: Tent, end: true }];
  if (farmId) {
    areas.push({ to: '/herd', label: 'Herd', icon: Rabbit });
    areas.push({ to: '/almanac', label: 'Almanac', icon: CalendarDays });
    areas.push({ to: '/grow-out', label: 'Grow-out', icon: Sprout });
  }
  // What the farms do together: Stud Share, processing days, chat, mentorship, the co-op's rules.
  areas.push({ to: '/co-op', label: 'Co-op', icon: Handshake });
  if (farmId) {
    if (ledger) areas.push({ to: '/ledger', label: 'Ledger', icon: Coins });
    areas.push({ to: `/farms/${farmId}`, label: 'My farm', icon: Warehouse });
  }
  if (admin) areas.push({ to: '/admin', label: 'Admin', icon: ShieldCheck, badge: { count: admin.unreadApplications, label: 'new applications' } });
  return areas;
}

/**
 * Wide screens: the co-op and sign-out on top, the areas in a row beneath. Phones and tablets: the co-op and sign-out on top and
 * the areas in a tab bar at the bottom, where a thumb reaches them with gloves on.
 */
export function TopBar({ coopName, personName, roleLabel, farmId, onSignOut, isSigningOut, admin, ledger, unreadNotifications }: TopBarProps) {
  const areas = areasFor({ farmId, admin, ledger });
  return (
    <>
      <header className="bg-moss text-oat">
        <a
          href="#main"
          className="sr-only focus:not-sr-only focus:absolute focus:top-2 focus:left-2 focus:z-10 focus:rounded-lg focus:bg-straw focus:px-4 focus:py-3 focus:text-bark"
        >
          Skip to content
        </a>
        <div className="mx-auto flex max-w-6xl items-center gap-3 px-4 py-2">
          <Link to="/" className="flex min-h-11 min-w-0 flex-1 items-center gap-2.5 rounded-lg focus-visible:outline-straw">
            <BrandMark withName={false} onMoss />
            <span className="min-w-0 truncate text-lg leading-tight font-bold">{coopName}</span>
          </Link>
          <p className="hidden min-w-0 text-right leading-tight sm:block">
            <span className="block max-w-48 truncate font-medium">{personName}</span>
            <span className="block text-sm text-oat/85">{roleLabel}</span>
          </p>
          <NavLink
            to="/notifications"
            className={({ isActive }) =>
              ['relative inline-flex min-h-11 min-w-11 shrink-0 items-center justify-center rounded-lg focus-visible:outline-straw', isActive ? 'bg-straw text-bark' : 'hover:bg-moss-deep'].join(' ')
            }
          >
            <Bell className="size-6" aria-hidden="true" />
            <span className="sr-only">Notifications</span>
            <span className="absolute -top-0.5 -right-1.5">
              <CountBadge count={unreadNotifications} label="unread" />
            </span>
          </NavLink>
          {/* Icon-only on a phone, but always named "Sign out" for assistive tech. */}
          <Button variant="on-moss" className="min-w-11 shrink-0 px-3 sm:px-4" onClick={onSignOut} isBusy={isSigningOut} title={`Signed in as ${personName} (${roleLabel})`}>
            {!isSigningOut && <LogOut className="size-5" aria-hidden="true" />}
            <span className="sr-only sm:not-sr-only">Sign out</span>
          </Button>
        </div>
        {/* The areas get a row of their own on wide screens, so six of them never run under the co-op's name or sign-out. */}
        <nav aria-label="Main" className="hidden border-t border-moss-deep lg:block">
          <ul className="mx-auto flex max-w-6xl flex-wrap gap-1 px-4 py-1.5">
            {areas.map((area) => (
              <li key={area.to}>
                <NavLink
                  to={area.to}
                  end={area.end}
                  className={({ isActive }) =>
                    [
                      'inline-flex min-h-11 items-center gap-2 rounded-lg px-3 font-medium whitespace-nowrap focus-visible:outline-straw',
                      isActive ? 'bg-straw text-bark' : 'text-oat hover:bg-moss-deep',
                    ].join(' ')
                  }
                >
                  <area.icon className="size-5" aria-hidden="true" />
                  {area.label}
                  {area.badge && <CountBadge count={area.badge.count} label={area.badge.label} />}
                </NavLink>
              </li>
            ))}
          </ul>
        </nav>
      </header>
      <PhoneBar areas={areas} />
    </>
  );
}

function PhoneTab({ area, onClick }: { area: Area; onClick?: () => void }) {
  return (
    <NavLink
      to={area.to}
      end={area.end}
      onClick={onClick}
      className={({ isActive }) =>
        [
          'relative flex min-h-14 flex-col items-center justify-center gap-0.5 px-0.5 text-xs font-medium tracking-tight focus-visible:outline-straw',
          isActive ? 'bg-straw text-bark' : 'text-oat hover:bg-moss-deep',
        ].join(' ')
      }
    >
      <area.icon className="size-6" aria-hidden="true" />
      <span className="max-w-full truncate">{area.label}</span>
      {area.badge && (
        <span className="absolute top-1 right-1/2 translate-x-6">
          <CountBadge count={area.badge.count} label={area.badge.label} />
        </span>
      )}
    </NavLink>
  );
}

/** Phones and tablets: the first areas in a bottom bar, the others in a sheet that "More" opens above it. */
function PhoneBar({ areas }: { areas: Area[] }) {
  const [moreOpen, setMoreOpen] = useState(false);
  const { pathname } = useLocation();
  const overflow = areas.length > PHONE_PLACES;
  const shown = overflow ? areas.slice(0, PHONE_PLACES - 1) : areas;
  const more = overflow ? areas.slice(PHONE_PLACES - 1) : [];
  const moreActive = more.some((area) => pathname === area.to || pathname.startsWith(`${area.to}/`));
  const moreBadge = more.reduce((sum, area) => sum + (area.badge?.count ?? 0), 0);
  useEffect(() => setMoreOpen(false), [pathname]);
  useEffect(() => {
    if (!moreOpen) return;
    const close = (event: KeyboardEvent) => event.key === 'Escape' && setMoreOpen(false);
    window.addEventListener('keydown', close);
    return () => window.removeEventListener('keydown', close);
  }, [moreOpen]);
  return (
    <nav aria-label="Main" className="fixed inset-x-0 bottom-0 z-20 border-t border-moss-deep bg-moss pb-[env(safe-area-inset-bottom)] text-oat lg:hidden">
      {moreOpen && (
        <ul id="more-areas" className="mx-auto grid max-w-xl grid-cols-2 gap-1 border-b border-moss-deep p-2">
          {more.map((area) => (
            <li key={area.to}>
              <NavLink
                to={area.to}
                end={area.end}
                className={({ isActive }) =>
                  ['flex min-h-12 items-center gap-2 rounded-lg px-3 font-medium focus-visible:outline-straw', isActive ? 'bg-straw text-bark' : 'hover:bg-moss-deep'].join(' ')
                }
              >
                <area.icon className="size-5" aria-hidden="true" />
                {area.label}
                {area.badge && <CountBadge count={area.badge.count} label={area.badge.label} />}
              </NavLink>
            </li>
          ))}
        </ul>
      )}
      <ul className={`mx-auto grid max-w-xl ${columns[shown.length + (overflow ? 1 : 0)] ?? 'grid-cols-5'}`}>
        {shown.map((area) => (
          <li key={area.to}>
            <PhoneTab area={area} />
          </li>
        ))}
        {overflow && (
          <li>
            <button
              type="button"
              aria-expanded={moreOpen}
              aria-controls="more-areas"
              onClick={() => setMoreOpen((open) => !open)}
              className={[
                'relative flex min-h-14 w-full flex-col items-center justify-center gap-0.5 px-0.5 text-xs font-medium tracking-tight focus-visible:outline-straw',
                moreActive && !moreOpen ? 'bg-straw text-bark' : 'text-oat hover:bg-moss-deep',
              ].join(' ')}
            >
              {moreOpen ? <X className="size-6" aria-hidden="true" /> : <Ellipsis className="size-6" aria-hidden="true" />}
              <span>More</span>
              {!moreOpen && moreBadge > 0 && (
                <span className="absolute top-1 right-1/2 translate-x-6">
                  <CountBadge count={moreBadge} label="new in More" />
                </span>
              )}
            </button>
          </li>
        )}
      </ul>
    </nav>
  );
}
