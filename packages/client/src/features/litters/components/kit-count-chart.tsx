import { daysBetween } from '@burrowline/shared';
import { formatDate } from '../../../lib/days';

/** Kits with the doe over the days since the kindling: a step line, with the count at each change. */
export function KitCountChart({ history, today }: { history: { on: string; count: number }[]; today: string }) {
  if (history.length === 0) return null;
  const start = history[0]!.on;
  const end = today > history.at(-1)!.on ? today : history.at(-1)!.on;
  const span = Math.max(1, daysBetween(start, end));
  const max = Math.max(1, ...history.map((h) => h.count));
  const w = 600;
  const h = 160;
  const pad = { l: 32, r: 12, t: 12, b: 28 };
  const x = (day: string) => pad.l + (daysBetween(start, day) / span) * (w - pad.l - pad.r);
  const y = (count: number) => pad.t + (1 - count / max) * (h - pad.t - pad.b);
  let d = `M ${x(start)} ${y(history[0]!.count)}`;
  for (let i = 1; i < history.length; i++) d += ` H ${x(history[i]!.on)} V ${y(history[i]!.count)}`;
  d += ` H ${x(end)}`;
  const summary = history.map((p) => `${formatDate(p.on)}: ${p.count}`).join('; ');
  return (
    <figure className="space-y-1">
      <svg viewBox={`0 0 ${w} ${h}`} className="w-full" role="img" aria-label={`Kits with the doe: ${summary}`}>
        {[0, Math.round(max / 2), max].map((tick) => (
          <g key={tick}>
            <line x1={pad.l} x2={w - pad.r} y1={y(tick)} y2={y(tick)} className="stroke-grey-200" />
            <text x={pad.l - 6} y={y(tick) + 4} textAnchor="end" className="fill-grey-600 text-[11px]">
              {tick}
            </text>
          </g>
        ))}
        <path d={d} fill="none" className="stroke-moss" strokeWidth={3} />
        {history.map((p) => (
          <circle key={p.on} cx={x(p.on)} cy={y(p.count)} r={4} className="fill-straw stroke-bark" />
        ))}
        <text x={pad.l} y={h - 8} className="fill-grey-600 text-[11px]">
          {formatDate(start)}
        </text>
        <text x={w - pad.r} y={h - 8} textAnchor="end" className="fill-grey-600 text-[11px]">
          {formatDate(end)}
        </text>
      </svg>
      <figcaption className="text-sm text-grey-600">Kits with the doe, from the kindling to today.</figcaption>
    </figure>
  );
}
