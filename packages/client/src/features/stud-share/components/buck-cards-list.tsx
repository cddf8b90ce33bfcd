import { createColumnHelper, getCoreRowModel, useReactTable } from '@tanstack/react-table';
import { useMemo } from 'react';
import type { BuckCardDto } from '@burrowline/shared';
import { DataTable, RowLink } from '../../../components/ui/data-table';
import { useMoney } from '../../../lib/money';
import { breedMakeupText } from '../../herd';
import { feeText, OfferKinds, Whereabouts } from './buck-facts';

const column = createColumnHelper<BuckCardDto>();
const buckName = (c: BuckCardDto) => c.buck.name || c.buck.tattoo || 'Unnamed buck';
const getText = (c: BuckCardDto) =>
  c.getRecord.littersSired === 0 ? 'No litters on record' : `${c.getRecord.littersSired} litters${c.getRecord.meanWeaned === null ? '' : `, ${Math.round(c.getRecord.meanWeaned * 10) / 10} weaned`}`;

/** Buck cards: a table on wide screens, a card each on a phone; each links to his page. */
export function BuckCardsList({ cards, caption, empty, isRefreshing }: { cards: BuckCardDto[]; caption: string; empty: string; isRefreshing?: boolean }) {
  const money = useMoney();
  const columns = useMemo(
    () => [
      column.display({
        id: 'buck', header: 'Buck',
        cell: (c) => (
          <div>
            <RowLink to={`/stud-share/bucks/${c.row.original.offerId}`}>{buckName(c.row.original)}</RowLink>
            <p className="text-sm text-grey-600">{c.row.original.buck.tattoo} · {breedMakeupText(c.row.original.buck.breedMakeup)}</p>
          </div>
        ),
      }),
      column.display({ id: 'farm', header: 'Farm', cell: (c) => c.row.original.owningFarm.name }),
      column.display({ id: 'kinds', header: 'Offered for', cell: (c) => <OfferKinds card={c.row.original} /> }),
      ...(cards.some((c) => c.feesVisible) ? [column.display({ id: 'fee', header: 'Fee', cell: (c) => feeText(c.row.original, money) })] : []),
      column.display({ id: 'get', header: "Get's record", cell: (c) => getText(c.row.original) }),
      column.display({ id: 'where', header: 'Now', cell: (c) => <Whereabouts card={c.row.original} /> }),
    ],
    [money, cards],
  );
  const table = useReactTable({ data: cards, columns, getCoreRowModel: getCoreRowModel(), getRowId: (c) => c.offerId });
  return (
    <DataTable
      table={table}
      caption={caption}
      empty={empty}
      isRefreshing={isRefreshing}
      renderCard={(row) => {
        const c = row.original;
        const fee = feeText(c, money);
        return (
          <div className="space-y-2" data-testid="buck-card">
            <div className="flex flex-wrap items-baseline justify-between gap-x-3 gap-y-1">
              <RowLink to={`/stud-share/bucks/${c.offerId}`} cover>
                {buckName(c)}
              </RowLink>
              <Whereabouts card={c} />
            </div>
            <p className="text-sm text-grey-700">
              {c.buck.tattoo} · {breedMakeupText(c.buck.breedMakeup)} · {c.owningFarm.name}
            </p>
            <OfferKinds card={c} />
            <p className="text-sm text-grey-700">
              {getText(c)}
              {c.health.rhdv2VaccinatedOn ? ' · RHDV2 vaccinated' : ''}
            </p>
            {fee && <p className="text-sm font-semibold">{fee}</p>}
          </div>
        );
      }}
    />
  );
}
