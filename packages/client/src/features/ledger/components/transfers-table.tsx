import { createColumnHelper, getCoreRowModel, useReactTable } from '@tanstack/react-table';
import { useMemo } from 'react';
import { ledgerViewSchema, transferKinds, type LedgerView, type TransferDto } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Badge } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { DataTable, Pagination } from '../../../components/ui/data-table';
import { SelectField } from '../../../components/ui/select-field';
import { TextField } from '../../../components/ui/text-field';
import { formatDate } from '../../../lib/days';
import { errorText } from '../../../lib/form-errors';
import { useMoney } from '../../../lib/money';
import { useUrlState } from '../../../lib/url-state';
import { useTransfers } from '../api/get-ledger';
import { useConfirmTransfer, useVoidTransfer } from '../api/ledger-mutations';
import { kindLabels } from '../ledger-format';

const PAGE_SIZE = 20;
const column = createColumnHelper<TransferDto>();

/**
 * How a transfer reads from the farm's side: who the other party is and whether it credits (+) or charges (−).
 * In the whole co-op's list (no farm) it reads as who owes whom, unsigned.
 */
function sideOf(t: TransferDto, ownFarmId: string | null) {
  if (!ownFarmId) return { other: `${t.debit.name} → ${t.credit.name}`, sign: 0 };
  const credited = t.credit.farmId === ownFarmId;
  return { other: credited ? t.debit.name : t.credit.name, sign: credited ? 1 : -1 };
}

const amountClass = (sign: number) => (sign > 0 ? 'text-moss-deep' : sign < 0 ? 'text-clay' : 'text-bark');
const signText = (sign: number) => (sign > 0 ? '+' : sign < 0 ? '−' : '');

const statusTone = { pending: 'straw', posted: 'moss', voided: 'neutral' } as const;

function Actions({ t }: { t: TransferDto }) {
  const confirm = useConfirmTransfer();
  const cancel = useVoidTransfer();
  if (!t.canConfirm && !t.canVoid) return null;
  return (
    <div className="relative z-10 flex flex-wrap gap-2">
      {t.canConfirm && (
        <Button variant="primary" isBusy={confirm.isPending} onClick={() => confirm.mutate(t.id)}>
          Confirm
        </Button>
      )}
      {t.canVoid && (
        <Button variant="quiet" isBusy={cancel.isPending} onClick={() => cancel.mutate(t.id)}>
          {t.canConfirm ? 'Decline' : 'Withdraw'}
        </Button>
      )}
      {(confirm.error || cancel.error) && <p className="w-full text-sm text-clay">{errorText(confirm.error ?? cancel.error)}</p>}
    </div>
  );
}

/**
 * The account's transfers, newest first, a page at a time from the server: filters by kind, period and
 * counterparty live in the address. A table on wide screens, cards on a phone.
 */
export function TransfersTable({ ownFarmId, farmId, counterparties }: { ownFarmId: string | null; farmId?: string; counterparties: { value: string; label: string }[] }) {
  const money = useMoney();
  const [view, setView] = useUrlState<LedgerView>(ledgerViewSchema);
  const filters = {
    page: view.page, pageSize: PAGE_SIZE, farmId,
    kind: view.kind === 'all' ? undefined : view.kind,
    counterparty: view.counterparty === 'all' ? undefined : view.counterparty,
    from: view.from || undefined, to: view.to || undefined,
  };
  const { data, isFetching, error } = useTransfers(filters);
  const columns = useMemo(
    () => [
      column.accessor('bookedOn', { header: 'Date', enableSorting: false, cell: (c) => <span className="whitespace-nowrap">{formatDate(c.getValue())}</span> }),
      column.accessor('kind', { header: 'Kind', enableSorting: false, cell: (c) => kindLabels[c.getValue()] }),
      column.display({ id: 'other', header: ownFarmId ? 'With' : 'Owes → owed', cell: (c) => sideOf(c.row.original, ownFarmId).other }),
      column.accessor('memo', { header: 'Memo', enableSorting: false, cell: (c) => c.getValue() || c.row.original.correctionReason || '' }),
      column.display({
        id: 'amount', header: 'Amount',
        cell: (c) => {
          const { sign } = sideOf(c.row.original, ownFarmId);
          return <span className={`font-semibold whitespace-nowrap ${amountClass(sign)}`}>{signText(sign)}{money(c.row.original.amountCents)}</span>;
        },
      }),
      column.accessor('status', { header: 'Status', enableSorting: false, cell: (c) => <Badge tone={statusTone[c.getValue()]}>{c.getValue()}</Badge> }),
      column.display({ id: 'actions', header: '', cell: (c) => <Actions t={c.row.original} /> }),
    ],
    [money, ownFarmId],
  );
  const table = useReactTable({ data: data?.items ?? [], columns, getCoreRowModel: getCoreRowModel(), manualPagination: true });
  return (
    <div className="space-y-4">
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        <SelectField
          label="Kind"
          value={view.kind}
          onChange={(e) => setView({ kind: e.target.value as LedgerView['kind'], page: 1 })}
          options={[{ value: 'all', label: 'All kinds' }, ...transferKinds.map((k) => ({ value: k, label: kindLabels[k] }))]}
        />
        <SelectField label="With" value={view.counterparty} onChange={(e) => setView({ counterparty: e.target.value, page: 1 })} options={[{ value: 'all', label: 'Everyone' }, ...counterparties]} />
        <TextField label="From" type="date" value={view.from} onChange={(e) => setView({ from: e.target.value, page: 1 })} />
        <TextField label="To" type="date" value={view.to} onChange={(e) => setView({ to: e.target.value, page: 1 })} />
      </div>
      {ownFarmId && <p className="text-sm text-grey-600">+ adds to what the farm is owed (a fee it earns, a payment it made); − adds to what it owes (a fee it is charged, a payment it received).</p>}
      {error && <Alert tone="error">{errorText(error)}</Alert>}
      <DataTable
        table={table}
        caption="Transfers"
        isRefreshing={isFetching}
        empty="No transfers match these filters."
        renderCard={(row) => {
          const t = row.original;
          const { other, sign } = sideOf(t, ownFarmId);
          return (
            <div className="space-y-2">
              <div className="flex items-baseline justify-between gap-3">
                <span className="font-semibold">{kindLabels[t.kind]} · {other}</span>
                <span className={`text-lg font-bold whitespace-nowrap ${amountClass(sign)}`}>{signText(sign)}{money(t.amountCents)}</span>
              </div>
              <div className="flex flex-wrap items-center gap-2 text-sm text-grey-600">
                <span>{formatDate(t.bookedOn)}</span>
                <Badge tone={statusTone[t.status]}>{t.status}</Badge>
                {(t.memo || t.correctionReason) && <span className="break-words">{t.memo || t.correctionReason}</span>}
              </div>
              <Actions t={t} />
            </div>
          );
        }}
      />
      <Pagination page={view.page} pageSize={PAGE_SIZE} total={data?.total ?? 0} onPage={(page) => setView({ page })} noun="transfers" />
    </div>
  );
}
