import { useRef } from 'react';
import type { LedgerSummaryDto } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { errorText } from '../../../lib/form-errors';
import { newIdempotencyKey } from '../../../lib/idempotency';
import { useMoney } from '../../../lib/money';
import { useOpenCardCheckout } from '../api/ledger-mutations';

/** Paying the co-op by card: each button opens a checkout (one per click, whatever the retries) and goes to the card page. */
export function PayByCard({ summary }: { summary: LedgerSummaryDto }) {
  const money = useMoney();
  const open = useOpenCardCheckout();
  // One key per thing paid, kept across a retry of the same click.
  const keys = useRef(new Map<string, string>());
  const pay = (what: string, body: { purpose: 'dues' | 'balance'; duesYear?: number }) => {
    const key = keys.current.get(what) ?? newIdempotencyKey();
    keys.current.set(what, key);
    open.mutate({ idempotencyKey: key, ...body }, { onSuccess: (checkout) => { if (checkout.url) window.location.assign(checkout.url); } });
  };
  const owedDues = summary.dues.filter((d) => d.owedCents > 0);
  if (!summary.cardPaymentsEnabled) return <p className="text-grey-700">Card payments are not set up for this co-op; record a payment made another way instead.</p>;
  return (
    <div className="space-y-3">
      {owedDues.length === 0 && summary.owedToCoopCents === 0 && <p className="text-grey-700">Nothing is owed to the co-op right now.</p>}
      <div className="flex flex-wrap gap-3">
        {owedDues.map((d) => (
          <Button key={d.year} isBusy={open.isPending} onClick={() => pay(`dues-${d.year}`, { purpose: 'dues', duesYear: d.year })}>
            Pay {d.year} dues by card ({money(d.owedCents)})
          </Button>
        ))}
        {summary.owedToCoopCents > 0 && (
          <Button variant="secondary" isBusy={open.isPending} onClick={() => pay('balance', { purpose: 'balance' })}>
            Pay the co-op balance by card ({money(summary.owedToCoopCents)})
          </Button>
        )}
      </div>
      {open.error && <Alert tone="error">{errorText(open.error)}</Alert>}
      <p className="text-sm text-grey-600">You pay on the card service's page; the payment shows here as soon as the card service confirms it.</p>
    </div>
  );
}
