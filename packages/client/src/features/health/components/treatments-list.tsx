import { useMemo } from 'react';
import { createColumnHelper, getCoreRowModel, useReactTable } from '@tanstack/react-table';
import { treatmentRouteLabels, type TreatmentDto } from '@burrowline/shared';
import { Badge } from '../../../components/ui/badge';
import { DataTable } from '../../../components/ui/data-table';
import { formatDate } from '../../../lib/days';
import { subjectName } from '../../../lib/names';

const column = createColumnHelper<TreatmentDto>();

function withdrawalText(t: TreatmentDto): string {
  if (t.withdrawalDays === 0) return 'No withdrawal (0 days)';
  return `through ${formatDate(t.withdrawalEndsOn)}${t.withdrawalDays !== null ? ` (${t.withdrawalDays} d)` : ''}`;
}

/** Every treatment of the farm, latest first: a table on wide screens, cards on a phone. */
export function TreatmentsList({ treatments }: { treatments: TreatmentDto[] }) {
  const columns = useMemo(
    () => [
      column.accessor((t) => subjectName(t), { id: 'subject', header: 'Treated' }),
      column.accessor('treatment', { header: 'Treatment' }),
      column.accessor('dose', { header: 'Dose', cell: (c) => c.getValue() || '—' }),
      column.accessor('route', { header: 'Route', cell: (c) => (c.getValue() ? treatmentRouteLabels[c.getValue()!] : '—') }),
      column.accessor('veterinarian', { header: 'Prescribed by', cell: (c) => c.getValue() || '—' }),
      column.accessor('startedOn', { header: 'Given', cell: (c) => `${formatDate(c.getValue())}${c.row.original.lastDoseOn ? ` – ${formatDate(c.row.original.lastDoseOn)}` : ''}` }),
      column.accessor('withdrawalEndsOn', {
        header: 'Withdrawal',
        cell: (c) => (
          <span className="whitespace-nowrap">
            {withdrawalText(c.row.original)} {c.row.original.underWithdrawal && <Badge tone="clay">Now</Badge>}
          </span>
        ),
      }),
    ],
    [],
  );
  const table = useReactTable({ data: treatments, columns, enableSorting: false, getCoreRowModel: getCoreRowModel() });
  return (
    <DataTable
      table={table}
      caption="Treatments"
      empty="No treatments recorded."
      renderCard={(row) => {
        const t = row.original;
        return (
          <div className="space-y-1">
            <p className="flex flex-wrap items-center justify-between gap-2">
              <strong>{subjectName(t)}</strong>
              {t.underWithdrawal && <Badge tone="clay">Under withdrawal</Badge>}
            </p>
            <p>
              {t.treatment}
              {t.dose ? `, ${t.dose}` : ''}
              {t.route ? ` · ${treatmentRouteLabels[t.route]}` : ''}
            </p>
            <p className="text-sm text-grey-600">
              {formatDate(t.startedOn)}
              {t.lastDoseOn ? ` – ${formatDate(t.lastDoseOn)}` : ''} · {t.veterinarian || 'no veterinarian recorded'}
            </p>
            <p className="text-sm">Withdrawal {withdrawalText(t)}</p>
          </div>
        );
      }}
    />
  );
}
