import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { subjectOf } from '@burrowline/shared';
import { queryClient } from '../../app/query-client';
import { buttonClasses } from '../../components/ui/button-styles';
import { Card } from '../../components/ui/card';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { farmsListQueryOptions } from '../../features/farms/api/get-farms';
import { useFarmToday } from '../../features/farms';
import { feesQueryOptions, settleUpQueryOptions, summaryQueryOptions, useFeesByMonth, useLedgerSummary, useSettleUp } from '../../features/ledger/api/get-ledger';
import { BalanceCards } from '../../features/ledger/components/balance-cards';
import { FeesChart } from '../../features/ledger/components/fees-chart';
import { PayByCard } from '../../features/ledger/components/pay-by-card';
import { RecordPaymentForm } from '../../features/ledger/components/record-payment-form';
import { SettleUpList } from '../../features/ledger/components/settle-up-card';
import { StatementDownloads } from '../../features/ledger/components/statement-downloads';
import { TransfersTable } from '../../features/ledger/components/transfers-table';
import { useAbility } from '../../lib/ability';
import { formatDate } from '../../lib/days';
import { useMoney } from '../../lib/money';
import { useSession } from '../../lib/session';

export async function loader() {
  await Promise.all([
    queryClient.ensureQueryData(summaryQueryOptions()),
    queryClient.ensureQueryData(settleUpQueryOptions()),
    queryClient.ensureQueryData(farmsListQueryOptions()),
    queryClient.prefetchQuery(feesQueryOptions(false)),
  ]);
  return null;
}

/** /ledger: the farm's account — balances, dues, paying, settling up, the transfers and statements. */
export function LedgerPage() {
  const me = useSession();
  const ability = useAbility();
  const isAdmin = ability.can('manage', subjectOf('Ledger', { coopId: me.coop.id }));
  const money = useMoney();
  const today = useFarmToday();
  const { data: summary } = useLedgerSummary();
  const { data: settle } = useSettleUp();
  const { data: fees } = useFeesByMonth(false);
  const { data: farms = [] } = useQuery(farmsListQueryOptions());
  const otherFarms = farms.filter((f) => f.id !== me.user.farmId).map((f) => ({ id: f.id, name: f.name }));
  if (!summary) return null;
  return (
    <div className="space-y-6">
      <PageTitle>Ledger</PageTitle>
      <PageHeader
        title="Ledger"
        lead={`${summary.farmName}: fees and balances with the other farms and the co-op.`}
        actions={isAdmin ? <Link className={buttonClasses('secondary')} to="/ledger/coop">Co-op books</Link> : undefined}
      />
      <BalanceCards summary={summary} />
      {summary.awaitingYourConfirmation > 0 && (
        <p className="rounded-xl border-2 border-straw bg-straw/20 px-4 py-3 font-semibold">
          {summary.awaitingYourConfirmation === 1
            ? 'A payment or correction waits for your confirmation in the transfers below.'
            : `${summary.awaitingYourConfirmation} payments or corrections wait for your confirmation in the transfers below.`}
        </p>
      )}
      <div className="grid gap-6 lg:grid-cols-2">
        <Card className="space-y-4">
          <h2 className="text-lg font-bold">Dues and paying the co-op</h2>
          {summary.dues.length > 0 && (
            <ul className="space-y-1" aria-label="Dues">
              {summary.dues.map((d) => (
                <li key={d.year} className="flex flex-wrap justify-between gap-2" data-testid={`dues-${d.year}`}>
                  <span>{d.year} dues, due {formatDate(d.dueOn)}</span>
                  <span className="font-semibold">{d.owedCents > 0 ? `${money(d.owedCents)} owed` : 'Paid'}</span>
                </li>
              ))}
            </ul>
          )}
          <PayByCard summary={summary} />
        </Card>
        <Card className="space-y-4">
          <h2 className="text-lg font-bold">Settle up</h2>
          {settle && <SettleUpList data={settle} ownFarmId={me.user.farmId} />}
        </Card>
      </div>
      <Card className="space-y-4">
        <h2 className="text-lg font-bold">Transfers</h2>
        <TransfersTable ownFarmId={me.user.farmId} counterparties={[{ value: 'coop', label: 'The co-op' }, ...otherFarms.map((f) => ({ value: f.id, label: f.name }))]} />
      </Card>
      <div className="grid gap-6 lg:grid-cols-2">
        <Card className="space-y-4">
          <h2 className="text-lg font-bold">Record a payment</h2>
          <RecordPaymentForm farms={otherFarms} duesYears={summary.dues.filter((d) => d.owedCents > 0).map((d) => d.year)} today={today} />
        </Card>
        <Card className="space-y-4">
          <h2 className="text-lg font-bold">Fees by month</h2>
          {fees && <FeesChart data={fees} />}
          <h2 className="pt-2 text-lg font-bold">Statements</h2>
          <StatementDownloads defaultFrom={`${today.slice(0, 4)}-01-01`} defaultTo={today} />
        </Card>
      </div>
    </div>
  );
}
