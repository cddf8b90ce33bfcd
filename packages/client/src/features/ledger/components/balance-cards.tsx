import type { LedgerSummaryDto } from '@burrowline/shared';
import { useMoney } from '../../../lib/money';

/** The three figures a member looks for first: what others owe the farm, what it owes, and what is still pending. */
export function BalanceCards({ summary }: { summary: LedgerSummaryDto }) {
  const money = useMoney();
  const cards = [
    { label: 'Owed to you', value: money(summary.owedToYouCents), note: 'Posted, from farms and the co-op', tone: 'border-moss bg-moss-wash' },
    { label: 'You owe', value: money(summary.youOweCents), note: summary.owedToCoopCents > 0 ? `${money(summary.owedToCoopCents)} of it to the co-op` : 'Posted, to farms and the co-op', tone: 'border-clay/60 bg-white' },
    {
      label: 'Expected',
      value: `${money(summary.expectedInCents)} in · ${money(summary.expectedOutCents)} out`,
      note: 'Pending fees and payments: not in the balance until posted',
      tone: 'border-straw bg-white',
    },
  ];
  return (
    <section aria-label="Balances" className="grid gap-3 sm:grid-cols-3">
      {cards.map((c) => (
        <div key={c.label} className={`rounded-2xl border-2 p-4 shadow-sm ${c.tone}`} data-testid={`balance-${c.label.toLowerCase().replace(/ /g, '-')}`}>
          <p className="text-sm font-semibold tracking-wide text-grey-600 uppercase">{c.label}</p>
          <p className="mt-1 text-2xl font-bold break-words text-bark">{c.value}</p>
          <p className="mt-1 text-sm text-grey-600">{c.note}</p>
        </div>
      ))}
    </section>
  );
}
