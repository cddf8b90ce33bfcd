import { useState } from 'react';
import type { StudLoanDto } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Badge } from '../../../components/ui/badge';
import { Pagination, RowLink } from '../../../components/ui/data-table';
import { SegmentedFilter } from '../../../components/ui/segmented-filter';
import { Spinner } from '../../../components/ui/spinner';
import { errorText } from '../../../lib/form-errors';
import { useMoney } from '../../../lib/money';
import { useLoans } from '../api/get-loans';
import { kindLabels, periodText, stateText, stateTones } from '../stud-share-labels';

const PAGE_SIZE = 20;

function LoanItem({ loan, side }: { loan: StudLoanDto; side: 'owner' | 'requester' }) {
  const money = useMoney();
  const buck = loan.buck.name || loan.buck.tattoo || 'Buck';
  const other = side === 'owner' ? loan.requestingFarm.name : loan.owningFarm.name;
  const waiting = loan.actions.length > 0;
  return (
    <li className="relative rounded-2xl border border-grey-200 bg-white p-4 shadow-sm" data-testid="loan-item">
      <div className="flex flex-wrap items-start justify-between gap-2">
        <RowLink to={`/stud-share/loans/${loan.id}`} cover>
          {buck} {side === 'owner' ? 'for' : 'from'} {other}
        </RowLink>
        <span className="flex flex-wrap gap-1.5">
          {loan.overdue && <Badge tone="clay">Overdue</Badge>}
          <Badge tone={stateTones[loan.state]}>{stateText(loan.state, side, loan.kind)}</Badge>
        </span>
      </div>
      <p className="mt-1 text-grey-700">
        {kindLabels[loan.kind]} · {periodText(loan.startOn, loan.endOn)}
      </p>
      <p className="text-sm text-grey-600">
        For {loan.does.map((d) => d.name || d.tattoo).join(', ')}
        {loan.feesVisible && loan.feeCents ? ` · fee ${money(loan.feeCents)}` : ''}
      </p>
      {waiting && <p className="mt-2 text-sm font-semibold text-moss-deep">Your turn: {side === 'owner' && loan.state === 'requested' ? 'answer the request' : 'see what to do'}</p>}
    </li>
  );
}

/** "My requests" (what my farm asked for) or the requests for my bucks, open ones first by default. */
export function LoanList({ side, empty }: { side: 'requests' | 'offers'; empty: string }) {
  const [show, setShow] = useState<'open' | 'all'>('open');
  const [page, setPage] = useState(1);
  const loans = useLoans({ side, open: show === 'open' ? true : undefined, page, pageSize: PAGE_SIZE });
  const as = side === 'offers' ? 'owner' : 'requester';
  return (
    <div className="space-y-3">
      <SegmentedFilter
        label="Which"
        value={show}
        onChange={(v) => {
          setShow(v);
          setPage(1);
        }}
        options={[{ value: 'open', label: 'Open' }, { value: 'all', label: 'All, with past ones' }]}
      />
      {loans.isError && <Alert tone="error">{errorText(loans.error)}</Alert>}
      {loans.isPending ? (
        <Spinner />
      ) : loans.data && loans.data.items.length === 0 ? (
        <p className="rounded-2xl border border-dashed border-grey-300 bg-white p-6 text-center text-grey-600">{empty}</p>
      ) : (
        <ul className="grid gap-3 lg:grid-cols-2" aria-label={side === 'offers' ? 'Requests for your bucks' : 'Your requests'}>
          {loans.data?.items.map((loan) => <LoanItem key={loan.id} loan={loan} side={as} />)}
        </ul>
      )}
      {loans.data && loans.data.total > PAGE_SIZE && <Pagination page={page} pageSize={PAGE_SIZE} total={loans.data.total} onPage={setPage} noun="requests" />}
    </div>
  );
}
