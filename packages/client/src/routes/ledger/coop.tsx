import { Link } from 'react-router-dom';
import { queryClient } from '../../app/query-client';
import { buttonClasses } from '../../components/ui/button-styles';
import { Card } from '../../components/ui/card';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { useFarmToday } from '../../features/farms';
import { coopLedgerQueryOptions, feesQueryOptions, settleUpQueryOptions, useCoopLedger, useFeesByMonth, useSettleUp } from '../../features/ledger/api/get-ledger';
import { CoopLedgerView } from '../../features/ledger/components/coop-ledger-view';
import { DuesForm } from '../../features/ledger/components/dues-form';
import { FeesChart } from '../../features/ledger/components/fees-chart';
import { SettleUpList } from '../../features/ledger/components/settle-up-card';
import { StatementDownloads } from '../../features/ledger/components/statement-downloads';
import { TransfersTable } from '../../features/ledger/components/transfers-table';

export async function loader() {
  await Promise.all([
    queryClient.ensureQueryData(coopLedgerQueryOptions()),
    queryClient.prefetchQuery(settleUpQueryOptions()),
    queryClient.prefetchQuery(feesQueryOptions(true)),
  ]);
  return null;
}

/** /ledger/coop: the admin's view of the co-op's books, every farm's balance and dues, and setting the dues. */
export function CoopLedgerPage() {
  const today = useFarmToday();
  const { data } = useCoopLedger();
  const { data: settle } = useSettleUp();
  const { data: fees } = useFeesByMonth(true);
  if (!data) return null;
  return (
    <div className="space-y-6">
      <PageTitle>Co-op books</PageTitle>
      <PageHeader title="Co-op books" lead="The co-op's own accounts, every farm's balance and dues." actions={<Link className={buttonClasses('secondary')} to="/ledger">My farm's account</Link>} />
      <CoopLedgerView data={data} />
      <div className="grid gap-6 lg:grid-cols-2">
        <Card className="space-y-4">
          <h2 className="text-lg font-bold">Settle up between farms</h2>
          {settle && <SettleUpList data={settle} ownFarmId={null} />}
        </Card>
        <Card className="space-y-4">
          <h2 className="text-lg font-bold">Fees by month, whole co-op</h2>
          {fees && <FeesChart data={fees} />}
        </Card>
      </div>
      <Card className="space-y-4">
        <h2 className="text-lg font-bold">Dues</h2>
        <DuesForm defaultYear={Number(today.slice(0, 4)) + 1} />
      </Card>
      <Card className="space-y-4">
        <h2 className="text-lg font-bold">Every transfer</h2>
        <TransfersTable ownFarmId={null} counterparties={[{ value: 'coop', label: 'The co-op' }, ...data.farms.map((f) => ({ value: f.farmId, label: f.farmName }))]} />
      </Card>
      <Card className="space-y-4">
        <h2 className="text-lg font-bold">Co-op statement</h2>
        <StatementDownloads coop defaultFrom={`${today.slice(0, 4)}-01-01`} defaultTo={today} />
      </Card>
    </div>
  );
}
