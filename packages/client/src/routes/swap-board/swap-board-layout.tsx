import { ArrowLeftRight, Inbox, Megaphone, Store } from 'lucide-react';
import { Outlet } from 'react-router-dom';
import { SectionTab as Tab, SectionTabs } from '../../components/ui/section-tabs';
import { useSession } from '../../lib/session';

/** Swap Board: the board, the wanted posts, the farm's own listings and its offers, under one set of tabs. */
export function SwapBoardLayout() {
  const me = useSession();
  return (
    <div className="space-y-6">
      <SectionTabs label="Swap Board">
        <Tab to="/swap-board" end icon={<ArrowLeftRight className="size-5" aria-hidden="true" />}>
          The board
        </Tab>
        <Tab to="/swap-board/wanted" icon={<Megaphone className="size-5" aria-hidden="true" />}>
          Wanted
        </Tab>
        {me.user.farmId && (
          <>
            <Tab to="/swap-board/mine" icon={<Store className="size-5" aria-hidden="true" />}>
              My listings
            </Tab>
            <Tab to="/swap-board/offers" icon={<Inbox className="size-5" aria-hidden="true" />}>
              My offers
            </Tab>
          </>
        )}
      </SectionTabs>
      <Outlet />
    </div>
  );
}
