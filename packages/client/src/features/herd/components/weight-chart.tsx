import { daysBetween, formatWeight, gramsToPounds, type WeightRange, type WeighInDto, type WeightUnit } from '@burrowline/shared';
import { formatDate } from '../../../lib/days';

interface WeightChartProps {
  weighIns: WeighInDto[];
  birthDate: string | null;
  /** The breed's senior range for this animal's sex, drawn as a band. */
  standard: WeightRange | null;
  unit: WeightUnit;
}

const W = 640;
const H = 260;
const pad = { left: 56, right: 16, top: 16, bottom: 40 };

function niceStep(max: number, targetTicks: number): number {
  const raw = max / targetTicks;
  const magnitude = 10 ** Math.floor(Math.log10(raw));
  return [1, 2, 2.5, 5, 10].map((m) => m * magnitude).find((s) => s >= raw) ?? raw;
}

/**
 * Live weight over age, in the farm's units, against the breed's senior standard (a band from the
 * breed catalogue). Returned weigh-ins are left out; unverified ones show as open circles.
 */
export function WeightChart({ weighIns, birthDate, standard, unit }: WeightChartProps) {
  const points = weighIns
    .filter((w) => w.reviewState !== 'returned' && w.animalId)
    .map((w) => ({ day: birthDate ? daysBetween(birthDate, w.weighedOn) : 0, grams: w.gramsPerHead, pending: w.reviewState === 'pending', on: w.weighedOn }));
  if (points.length === 0) return <p className="text-grey-600">No weigh-ins yet.</p>;

  const toUnit = (g: number) => (unit === 'lb_oz' ? gramsToPounds(g) : g / 1000);
  const unitLabel = unit === 'lb_oz' ? 'lb' : 'kg';
  const maxDay = Math.max(60, ...points.map((p) => p.day)) * 1.05;
  const maxGrams = Math.max(...points.map((p) => p.grams), standard?.maxGrams ?? standard?.minGrams ?? 0) * 1.1;
  const maxValue = toUnit(maxGrams);
  const step = niceStep(maxValue, 5);
  const x = (day: number) => pad.left + (day / maxDay) * (W - pad.left - pad.right);
  const y = (grams: number) => H - pad.bottom - (toUnit(grams) / maxValue) * (H - pad.top - pad.bottom);
  const yTicks = Array.from({ length: Math.floor(maxValue / step) + 1 }, (_, i) => i * step);
  const monthStep = maxDay > 720 ? 6 : maxDay > 240 ? 2 : 1;
  const xTicks = Array.from({ length: Math.floor(maxDay / 30.44 / monthStep) + 1 }, (_, i) => i * monthStep);
  const path = points.map((p, i) => `${i === 0 ? 'M' : 'L'}${x(p.day).toFixed(1)},${y(p.grams).toFixed(1)}`).join(' ');
  const bandTop = standard?.maxGrams ?? null;
  const bandBottom = standard?.minGrams ?? null;

  return (
    <figure className="space-y-2">
      <svg viewBox={`0 0 ${W} ${H}`} className="h-auto w-full" role="img" aria-label={`Weight over age in ${unitLabel}, ${points.length} weigh-ins`}>
        {bandBottom !== null && (
          <g>
            <rect
              x={pad.left}
              width={W - pad.left - pad.right}
              y={y(bandTop ?? maxGrams / 1.1)}
              height={Math.max(2, y(bandBottom) - y(bandTop ?? maxGrams / 1.1))}
              className="fill-straw/35"
            />
            <text x={W - pad.right - 4} y={y(bandTop ?? maxGrams / 1.1) + 14} textAnchor="end" className="fill-straw-deep text-[12px] font-semibold">
              Senior standard
            </text>
          </g>
        )}
        {yTicks.map((t) => {
          const ty = H - pad.bottom - (t / maxValue) * (H - pad.top - pad.bottom);
          return (
            <g key={t}>
              <line x1={pad.left} x2={W - pad.right} y1={ty} y2={ty} className="stroke-grey-200" />
              <text x={pad.left - 8} y={ty + 4} textAnchor="end" className="fill-grey-600 text-[12px]">
                {Number(t.toFixed(2))}
              </text>
            </g>
          );
        })}
        {xTicks.map((m) => (
          <text key={m} x={x(m * 30.44)} y={H - pad.bottom + 18} textAnchor="middle" className="fill-grey-600 text-[12px]">
            {m === 0 ? 'birth' : `${m} mo`}
          </text>
        ))}
        <text x={14} y={pad.top + 4} className="fill-grey-700 text-[12px] font-semibold">
          {unitLabel}
        </text>
        <path d={path} fill="none" className="stroke-moss" strokeWidth={2.5} />
        {points.map((p) => (
          <circle key={`${p.on}-${p.grams}`} cx={x(p.day)} cy={y(p.grams)} r={4.5} strokeWidth={2} className={p.pending ? 'fill-white stroke-clay' : 'fill-moss stroke-moss'}>
            <title>{`${p.on}: ${formatWeight(p.grams, unit)}${p.pending ? ' (unverified)' : ''}`}</title>
          </circle>
        ))}
      </svg>
      <figcaption className="flex flex-wrap gap-x-5 gap-y-1 text-sm text-grey-700">
        <span className="flex items-center gap-1.5">
          <span className="inline-block size-3 rounded-full bg-moss" aria-hidden="true" /> Weigh-in
        </span>
        <span className="flex items-center gap-1.5">
          <span className="inline-block size-3 rounded-full border-2 border-clay bg-white" aria-hidden="true" /> Unverified (waits for review)
        </span>
        {bandBottom !== null && (
          <span className="flex items-center gap-1.5">
            <span className="inline-block h-3 w-5 bg-straw/50" aria-hidden="true" /> Breed standard, seniors of this sex:{' '}
            {formatWeight(bandBottom, unit)}
            {bandTop !== null ? ` – ${formatWeight(bandTop, unit)}` : ' and up'}
          </span>
        )}
      </figcaption>
      <details>
        <summary className="inline-flex min-h-11 cursor-pointer items-center font-medium text-moss-deep">Show the weigh-ins as a list</summary>
        <ul className="mt-1 space-y-1">
          {weighIns.map((w) => (
            <li key={w.id}>
              {formatDate(w.weighedOn)}: {formatWeight(w.gramsPerHead, unit)} · entered by {w.enteredBy.name}
              {w.reviewState !== 'accepted' && ` · ${w.reviewState === 'pending' ? 'waits for review' : 'returned'}`}
            </li>
          ))}
        </ul>
      </details>
    </figure>
  );
}
