import type { SettleUpDto } from '@burrowline/shared';
import { useMoney } from '../../../lib/money';

/** The suggested payments that square the farms, and how they were found. */
export function SettleUpList({ data, ownFarmId }: { data: SettleUpDto; ownFarmId: string | null }) {
  const money = useMoney();
  return (
    <div className="space-y-3">
      {data.payments.length === 0 ? (
        <p className="text-grey-700">Every farm is square: nothing to settle.</p>
      ) : (
        <ul className="space-y-2">
          {data.payments.map((p) => (
            <li key={`${p.fromFarmId}-${p.toFarmId}`} className="flex flex-wrap items-baseline justify-between gap-2 rounded-xl border border-grey-200 bg-white px-4 py-3">
              <span>
                <strong>{p.fromFarmId === ownFarmId ? 'You' : p.fromFarmName}</strong> pay{p.fromFarmId === ownFarmId ? '' : 's'}{' '}
                <strong>{p.toFarmId === ownFarmId ? 'you' : p.toFarmName}</strong>
              </span>
              <span className="text-lg font-bold">{money(p.amountCents)}</span>
            </li>
          ))}
        </ul>
      )}
      <p className="text-sm text-grey-600">{data.note}</p>
    </div>
  );
}
