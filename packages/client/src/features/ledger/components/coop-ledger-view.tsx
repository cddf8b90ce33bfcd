import type { CoopLedgerDto } from '@burrowline/shared';
import { Badge } from '../../../components/ui/badge';
import { Card } from '../../../components/ui/card';
import { useMoney } from '../../../lib/money';

/** The admin's view of the co-op's books: its own accounts, every farm's balance and dues, and the check that they balance. */
export function CoopLedgerView({ data }: { data: CoopLedgerDto }) {
  const money = useMoney();
  return (
    <div className="space-y-6">
      <section aria-label="Co-op accounts" className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        {data.accounts.map((a) => (
          <div key={a.id} className="rounded-2xl border border-grey-200 bg-white p-4 shadow-sm">
            <p className="text-sm font-semibold text-grey-600 uppercase">{a.name}</p>
            <p className="mt-1 text-2xl font-bold">{money(a.balanceCents)}</p>
            {(a.expectedInCents > 0 || a.expectedOutCents > 0) && <p className="text-sm text-grey-600">Expected: {money(a.expectedInCents)} in · {money(a.expectedOutCents)} out</p>}
          </div>
        ))}
      </section>
      <p className={data.booksTotalCents === 0 ? 'text-moss-deep' : 'font-bold text-clay'} data-testid="books-total">
        {data.booksTotalCents === 0 ? 'The books balance: every account together sums to zero.' : `The books are off by ${money(data.booksTotalCents)}. Tell the developers.`}
      </p>
      <Card className="space-y-3">
        <h2 className="text-lg font-bold">Farms</h2>
        <ul className="divide-y divide-grey-200" aria-label="Every farm's balance and dues">
          {data.farms.map((f) => (
            <li key={f.farmId} className="flex flex-wrap items-center justify-between gap-2 py-3" data-testid={`coop-farm-${f.farmId}`}>
              <span className="font-semibold">{f.farmName}</span>
              <span className="flex flex-wrap items-center gap-3">
                <span className={f.balanceCents < 0 ? 'font-bold text-clay' : 'font-bold text-moss-deep'} data-testid="farm-balance">{money(f.balanceCents)}</span>
                {f.dues ? (
                  f.dues.owedCents > 0 ? <Badge tone="straw">{f.dues.year} dues: {money(f.dues.owedCents)} owed</Badge> : <Badge tone="moss">{f.dues.year} dues paid</Badge>
                ) : (
                  <Badge>No dues</Badge>
                )}
              </span>
            </li>
          ))}
        </ul>
      </Card>
    </div>
  );
}
