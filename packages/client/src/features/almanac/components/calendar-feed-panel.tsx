import { useState } from 'react';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { useCalendarFeed } from '../api/get-calendar-feed';
import { useRenewCalendarFeed, useRevokeCalendarFeed } from '../api/renew-calendar-feed';
import { formatInstantDate } from '../../../lib/dates';
import { errorText } from '../../../lib/form-errors';

/** The farm's secret calendar address for a phone calendar; shown once when made, renewable. */
export function CalendarFeedPanel({ canManage }: { canManage: boolean }) {
  const feed = useCalendarFeed(canManage);
  const renew = useRenewCalendarFeed();
  const revoke = useRevokeCalendarFeed();
  const [copied, setCopied] = useState(false);
  if (!canManage) {
    return (
      <Card className="space-y-2">
        <h2 className="text-lg font-bold">Phone calendar</h2>
        <p className="text-grey-700">A member of the farm can put the Almanac in a phone calendar.</p>
      </Card>
    );
  }
  const url = renew.data?.url ?? null;
  return (
    <Card className="space-y-3">
      <h2 className="text-lg font-bold">Phone calendar</h2>
      <p className="text-grey-700">
        Subscribe to the farm's Almanac from any calendar app. The address is secret: whoever has it sees the farm's tasks. Renew it to stop an old one working.
      </p>
      {url && (
        <div className="space-y-2 rounded-xl bg-moss-wash p-3">
          <p className="text-sm font-semibold">Your calendar address (shown only now):</p>
          <p className="font-mono text-sm break-all" data-testid="calendar-feed-url">
            {url}
          </p>
          <Button
            variant="secondary"
            onClick={() => {
              void navigator.clipboard?.writeText(url).then(() => setCopied(true));
            }}
          >
            {copied ? 'Copied' : 'Copy the address'}
          </Button>
        </div>
      )}
      <p className="text-sm text-grey-600">
        {feed.data?.active ? `A feed address is in use (made ${formatInstantDate(feed.data.createdAt!)}).` : 'No feed address yet.'}
      </p>
      <div className="flex flex-wrap gap-3">
        <Button onClick={() => renew.mutate()} isBusy={renew.isPending}>
          {feed.data?.active ? 'Renew the address' : 'Make a calendar address'}
        </Button>
        {feed.data?.active && (
          <Button variant="quiet" onClick={() => revoke.mutate()} isBusy={revoke.isPending}>
            Turn the feed off
          </Button>
        )}
      </div>
      {(renew.error || revoke.error) && <p role="alert" className="text-sm font-medium text-clay-deep">{errorText(renew.error ?? revoke.error)}</p>}
    </Card>
  );
}
