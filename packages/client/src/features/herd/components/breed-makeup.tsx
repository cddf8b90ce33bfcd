import type { BreedMakeupDto } from '@burrowline/shared';
import { Badge } from '../../../components/ui/badge';
import { cn } from '../../../lib/cn';
import { formatShare, purityLabels, purityTones } from '../herd-labels';

/** "½ New Zealand · ½ Californian", "New Zealand", or "Unknown ancestry", with the unknown share named. */
export function breedMakeupText(makeup: BreedMakeupDto): string {
  if (makeup.purity === 'unknown') return 'Unknown ancestry';
  if (makeup.purity === 'purebred') return makeup.breeds[0]?.name ?? 'Purebred';
  const parts = makeup.breeds.map((b) => `${formatShare(b.fraction)} ${b.name}`);
  if (makeup.unknown > 0) parts.push(`${formatShare(makeup.unknown)} unknown`);
  return parts.join(' · ');
}

export function PurityBadge({ makeup }: { makeup: BreedMakeupDto }) {
  return <Badge tone={purityTones[makeup.purity]}>{purityLabels[makeup.purity]}</Badge>;
}

// Our own sequence of the palette's shades, so adjacent shares stay told apart; the legend carries the names.
const shades = ['bg-moss', 'bg-straw', 'bg-clay', 'bg-moss-deep', 'bg-straw-deep', 'bg-clay-deep'];

/** The make-up as one bar of shares with a legend; unknown ancestry is hatched grey. */
export function BreedMakeupBar({ makeup, className }: { makeup: BreedMakeupDto; className?: string }) {
  const segments = [
    ...makeup.breeds.map((b, i) => ({ key: b.breedId, label: b.name, fraction: b.fraction, shade: shades[i % shades.length]! })),
    ...(makeup.unknown > 0 ? [{ key: 'unknown', label: 'Unknown', fraction: makeup.unknown, shade: 'bg-grey-300 bg-[repeating-linear-gradient(45deg,transparent_0_4px,rgba(0,0,0,0.12)_4px_8px)]' }] : []),
  ];
  return (
    <div className={cn('space-y-2', className)}>
      <div className="flex h-3 overflow-hidden rounded-full bg-grey-100" aria-hidden="true">
        {segments.map((s) => (
          <div key={s.key} className={s.shade} style={{ width: `${s.fraction * 100}%` }} />
        ))}
      </div>
      <ul className="flex flex-wrap gap-x-4 gap-y-1 text-sm">
        {segments.map((s) => (
          <li key={s.key} className="flex items-center gap-1.5">
            <span className={cn('inline-block size-3 rounded-sm', s.shade)} aria-hidden="true" />
            <span className="font-semibold">{formatShare(s.fraction)}</span> {s.label}
          </li>
        ))}
      </ul>
    </div>
  );
}
