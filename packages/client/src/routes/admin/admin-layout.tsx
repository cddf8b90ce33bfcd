import { ClipboardList, History, ScrollText, Users } from 'lucide-react';
import type { ReactNode } from 'react';
import { NavLink, Outlet } from 'react-router-dom';
import { CountBadge } from '../../components/ui/badge';
import { useUnreadApplications } from '../../features/applications/api/get-unread-applications';
import { cn } from '../../lib/cn';

export { requireCoopAdmin as loader } from './admin-guard';

function Tab({ to, icon, children, badge }: { to: string; icon: ReactNode; children: string; badge?: ReactNode }) {
  return (
    <li>
      <NavLink
        to={to}
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

/** The co-op admin's area: the application queue, the roster, the audit log and the co-op's rules. */
export function AdminLayout() {
  const unread = useUnreadApplications(true).data ?? 0;
  return (
    <div className="space-y-6">
      <nav aria-label="Co-op admin">
        <ul className="flex flex-wrap gap-2">
          <Tab to="/admin/applications" icon={<ClipboardList className="size-5" aria-hidden="true" />} badge={<CountBadge count={unread} label="new" />}>
            Applications
          </Tab>
          <Tab to="/admin/members" icon={<Users className="size-5" aria-hidden="true" />}>
            Members
          </Tab>
          <Tab to="/admin/audit" icon={<History className="size-5" aria-hidden="true" />}>
            Audit log
          </Tab>
          <Tab to="/admin/rules" icon={<ScrollText className="size-5" aria-hidden="true" />}>
            Co-op rules
          </Tab>
        </ul>
      </nav>
      <Outlet />
    </div>
  );
}
