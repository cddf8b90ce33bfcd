import { Link, useSearchParams } from 'react-router-dom';
import { Alert } from '../../components/ui/alert';
import { buttonClasses } from '../../components/ui/button-styles';
import { Card } from '../../components/ui/card';
import { PageTitle } from '../../components/ui/page-title';
import { Spinner } from '../../components/ui/spinner';
import { useCardCheckout } from '../../features/ledger/api/get-ledger';
import { useMoney } from '../../lib/money';

/**
 * /ledger/card-return: where the card page sends the payer back. Coming back proves nothing: the payment
 * is posted only when the card service's signed webhook arrives, so this shows "processing…" until then
 * (a live event, or the next look every two seconds).
 */
export function CardReturnPage() {
  const [params] = useSearchParams();
  const id = params.get('checkout') ?? '';
  const cancelled = params.get('cancelled') === '1';
  const money = useMoney();
  const { data, error } = useCardCheckout(id);
  return (
    <div className="mx-auto max-w-xl space-y-6">
      <PageTitle>Card payment</PageTitle>
      <Card className="space-y-4" aria-live="polite">
        <h1 className="text-2xl font-bold">Card payment</h1>
        {error && <Alert tone="error">That card payment was not found.</Alert>}
        {data?.status === 'open' && (
          <p className="flex items-center gap-3 text-lg" data-testid="card-status">
            <Spinner /> {cancelled ? 'Not paid yet: you left the card page.' : `Processing… waiting for the card service to confirm ${money(data.amountCents)}.`}
          </p>
        )}
        {data?.status === 'paid' && <Alert tone="success" title="Paid">{money(data.amountCents)} is posted to your farm's account.</Alert>}
        {data?.status === 'declined' && <Alert tone="warning" title="Not paid">The card payment was declined or cancelled; nothing was charged.</Alert>}
        <Link className={buttonClasses('secondary')} to="/ledger">Back to the Ledger</Link>
      </Card>
    </div>
  );
}
