import { ClipboardList, History, ScrollText, Users } from 'lucide-react';
import { Outlet } from 'react-router-dom';
import { CountBadge } from '../../components/ui/badge';
import { SectionTab as Tab, SectionTabs } from '../../components/ui/section-tabs';
import { useUnreadApplications } from '../../features/applications/api/get-unread-applications';

export { requireCoopAdmin as loader } from './admin-guard';

/** The co-op admin's area: the application queue, the roster, the audit log and the co-op's rules. */
export function AdminLayout() {
  const unread = useUnreadApplications(true).data ?? 0;
  return (
    <div className="space-y-6">
      <SectionTabs label="Co-op admin">
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
      </SectionTabs>
      <Outlet />
    </div>
  );
}
