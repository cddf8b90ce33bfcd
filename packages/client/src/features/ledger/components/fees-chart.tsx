import type { FeesByMonthDto } from '@burrowline/shared';
import { useMoney } from '../../../lib/money';
import { kindColours, kindLabels, monthLabel } from '../ledger-format';

/** Fees by kind for each of the last twelve months: stacked bars in plain SVG, with the figures in a table for screen readers. */
export function FeesChart({ data }: { data: FeesByMonthDto }) {
  const money = useMoney();
  const totals = data.months.map((_, i) => data.kinds.reduce((s, k) => s + (data.cents[k]?.[i] ?? 0), 0));
  const max = Math.max(1, ...totals);
  const width = 360;
  const height = 160;
  const bar = width / data.months.length;
  const used = data.kinds.filter((k) => (data.cents[k] ?? []).some((v) => v > 0));
  return (
    <figure className="space-y-3">
      <svg viewBox={`0 0 ${width} ${height + 18}`} className="h-auto w-full" role="img" aria-label="Fees by kind per month, last twelve months">
        {data.months.map((month, i) => {
          let y = height;
          return (
            <g key={month}>
              {data.kinds.map((kind) => {
                const value = data.cents[kind]?.[i] ?? 0;
                if (value === 0) return null;
                const h = (value / max) * (height - 8);
                y -= h;
                return <rect key={kind} x={i * bar + 3} y={y} width={bar - 6} height={h} fill={kindColours[kind] ?? '#999'} rx={2} />;
              })}
              <text x={i * bar + bar / 2} y={height + 14} textAnchor="middle" fontSize="9" fill="#6B6460">
                {monthLabel(month)}
              </text>
            </g>
          );
        })}
        <line x1={0} x2={width} y1={height} y2={height} stroke="#C9C2BA" />
      </svg>
      <figcaption className="flex flex-wrap gap-x-4 gap-y-1 text-sm text-grey-700">
        {used.length === 0 && <span>No fees posted in the last twelve months.</span>}
        {used.map((k) => (
          <span key={k} className="inline-flex items-center gap-1.5">
            <span className="inline-block size-3 rounded-sm" style={{ background: kindColours[k] }} aria-hidden="true" />
            {kindLabels[k]}: {money((data.cents[k] ?? []).reduce((s, v) => s + v, 0))}
          </span>
        ))}
      </figcaption>
      <table className="sr-only">
        <caption>Fees by month</caption>
        <tbody>
          {data.months.map((m, i) => (
            <tr key={m}>
              <th scope="row">{m}</th>
              <td>{money(totals[i]!)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </figure>
  );
}
