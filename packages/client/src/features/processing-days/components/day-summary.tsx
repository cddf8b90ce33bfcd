import type { ProcessingDaySummaryDto } from '@burrowline/shared';
import { Badge } from '../../../components/ui/badge';
import { Card } from '../../../components/ui/card';
import { useMoney } from '../../../lib/money';
import { dressOutText } from '../processing-days-format';
import { DressOutChart } from './dress-out-chart';

const outcomeLabels = { passed: 'Passed', trimmed: 'Trimmed', condemned: 'Condemned' } as const;

/**
 * After the day: head processed per farm, dress-out per farm and per breed or cross, the carcasses trimmed
 * or condemned with the reasons, the fees and each farm's share of the costs (split by head processed,
 * to the cent). Money only for who may see it: the DTO leaves it out otherwise.
 */
export function DaySummary({ summary }: { summary: ProcessingDaySummaryDto }) {
  const money = useMoney();
  const seesMoney = summary.totalSharedCostCents !== undefined;
  const pct = (x: number | null) => (x === null ? null : x * 100);
  return (
    <div className="space-y-6" data-testid="day-summary">
      <Card className="space-y-4">
        <div className="flex flex-wrap items-baseline justify-between gap-2">
          <h2 className="text-xl font-bold">{summary.headProcessed} head processed</h2>
          {summary.status === 'closed' ? (
            <Badge tone="moss">{seesMoney ? (summary.feesPosted ? 'Closed · fees and costs posted' : 'Closed') : 'Closed'}</Badge>
          ) : (
            <Badge tone="straw">Not closed yet: figures so far</Badge>
          )}
        </div>
        <ul className="space-y-3 md:hidden" aria-label="Per farm">
          {summary.farms.map((f) => (
            <li key={f.farmId} className="rounded-xl border border-grey-200 p-3" data-testid={`summary-farm-${f.farmId}`}>
              <p className="font-semibold">{f.farmName}</p>
              <dl className="mt-1 grid grid-cols-2 gap-x-3 gap-y-1 text-sm">
                <dt className="text-grey-600">Booked</dt><dd>{f.headBooked}</dd>
                <dt className="text-grey-600">Brought</dt><dd>{f.headBrought}</dd>
                <dt className="text-grey-600">Processed</dt><dd className="font-semibold">{f.headProcessed}</dd>
                <dt className="text-grey-600">Dress-out</dt><dd>{dressOutText(f.dressOut)}</dd>
                <dt className="text-grey-600">Trimmed</dt><dd>{f.trimmedHead}</dd>
                <dt className="text-grey-600">Condemned</dt><dd>{f.condemnedHead}</dd>
                {seesMoney && <><dt className="text-grey-600">Fee</dt><dd>{money(f.feeCents ?? 0)}</dd></>}
                {seesMoney && <><dt className="text-grey-600">Share of costs</dt><dd>{money(f.sharedCostCents ?? 0)}</dd></>}
              </dl>
            </li>
          ))}
        </ul>
        <div className="hidden overflow-x-auto md:block">
          <table className="w-full text-left">
            <caption className="sr-only">Per farm</caption>
            <thead className="border-b border-grey-200 text-sm text-grey-700">
              <tr>
                <th scope="col" className="py-2 pr-4">Farm</th>
                <th scope="col" className="py-2 pr-4 text-right">Booked</th>
                <th scope="col" className="py-2 pr-4 text-right">Brought</th>
                <th scope="col" className="py-2 pr-4 text-right">Processed</th>
                <th scope="col" className="py-2 pr-4 text-right">Dress-out</th>
                <th scope="col" className="py-2 pr-4 text-right">Trimmed</th>
                <th scope="col" className="py-2 pr-4 text-right">Condemned</th>
                {seesMoney && <th scope="col" className="py-2 pr-4 text-right">Fee</th>}
                {seesMoney && <th scope="col" className="py-2 text-right">Share of costs</th>}
              </tr>
            </thead>
            <tbody className="divide-y divide-grey-200 tabular-nums">
              {summary.farms.map((f) => (
                <tr key={f.farmId}>
                  <th scope="row" className="py-2 pr-4 font-semibold">{f.farmName}</th>
                  <td className="py-2 pr-4 text-right">{f.headBooked}</td>
                  <td className="py-2 pr-4 text-right">{f.headBrought}</td>
                  <td className="py-2 pr-4 text-right font-semibold">{f.headProcessed}</td>
                  <td className="py-2 pr-4 text-right">{dressOutText(f.dressOut)}</td>
                  <td className="py-2 pr-4 text-right">{f.trimmedHead}</td>
                  <td className="py-2 pr-4 text-right">{f.condemnedHead}</td>
                  {seesMoney && <td className="py-2 pr-4 text-right">{money(f.feeCents ?? 0)}</td>}
                  {seesMoney && <td className="py-2 text-right">{money(f.sharedCostCents ?? 0)}</td>}
                </tr>
              ))}
            </tbody>
            {seesMoney && (
              <tfoot className="border-t-2 border-grey-300 tabular-nums">
                <tr>
                  <th scope="row" className="py-2 pr-4">Shared costs</th>
                  <td colSpan={8} className="py-2 text-right font-semibold" data-testid="shared-cost-total">{money(summary.totalSharedCostCents ?? 0)}</td>
                </tr>
              </tfoot>
            )}
          </table>
        </div>
        {seesMoney && (
          <p className="text-sm text-grey-700 md:hidden">Shared costs {money(summary.totalSharedCostCents ?? 0)}, split by head processed; the shares add up to the cent.</p>
        )}
        {seesMoney && <p className="hidden text-sm text-grey-700 md:block">Costs are split by head processed; the shares add up to the total to the cent (largest remainder).</p>}
      </Card>
      <Card className="grid gap-8 lg:grid-cols-2">
        <DressOutChart title="Dress-out per farm" rows={summary.farms.map((f) => ({ key: f.farmId, label: f.farmName, percent: pct(f.dressOut), head: f.headProcessed }))} />
        <DressOutChart title="Dress-out per breed or cross" rows={summary.byBreed.map((b) => ({ key: b.label, label: b.label, percent: pct(b.dressOut), head: b.headProcessed }))} />
      </Card>
      <Card className="space-y-3">
        <h2 className="text-xl font-bold">Trimmed and condemned</h2>
        {summary.outcomes.filter((o) => o.outcome !== 'passed').length === 0 ? (
          <p className="text-grey-700">None.</p>
        ) : (
          <ul className="space-y-2">
            {summary.outcomes.filter((o) => o.outcome !== 'passed').map((o, i) => (
              <li key={`${o.farmId}-${o.outcome}-${i}`} className="flex flex-wrap items-baseline gap-x-3 gap-y-1">
                <Badge tone={o.outcome === 'condemned' ? 'clay' : 'straw'}>{outcomeLabels[o.outcome]} · {o.head}</Badge>
                <span className="font-medium">{o.farmName}</span>
                <span className="text-grey-700">{o.reason}</span>
              </li>
            ))}
          </ul>
        )}
      </Card>
    </div>
  );
}
