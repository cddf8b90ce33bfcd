import { HeartHandshake, Inbox, Send } from 'lucide-react';
import { Outlet } from 'react-router-dom';
import { SectionTab as Tab, SectionTabs } from '../../components/ui/section-tabs';
import { useSession } from '../../lib/session';

/**
 * Stud Share: the bucks offered across the co-op, what the farm asked for, and what was asked of its
 * bucks. A loan's page and the finder sit under the same tabs.
 */
export function StudShareLayout() {
  const me = useSession();
  return (
    <div className="space-y-6">
      <SectionTabs label="Stud Share">
        <Tab to="/stud-share" end icon={<HeartHandshake className="size-5" aria-hidden="true" />}>
          Buck cards
        </Tab>
        {me.user.farmId && (
          <>
            <Tab to="/stud-share/requests" icon={<Send className="size-5" aria-hidden="true" />}>
              My requests
            </Tab>
            <Tab to="/stud-share/offers" icon={<Inbox className="size-5" aria-hidden="true" />}>
              My offers
            </Tab>
          </>
        )}
      </SectionTabs>
      <Outlet />
    </div>
  );
}
