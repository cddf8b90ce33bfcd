import type { ReactNode } from 'react';
import { formatWeight, type ChoreEntryDto } from '@burrowline/shared';
import { Badge } from '../../../components/ui/badge';
import { useWeightUnit } from '../../herd';

const stateBadge = {
  pending: <Badge tone="straw">Waiting for review</Badge>,
  accepted: <Badge tone="moss">Accepted</Badge>,
  returned: <Badge tone="clay">Returned</Badge>,
} as const;

export const palpationLabels = { positive: 'kits felt (positive)', negative: 'empty (negative)', unsure: 'not sure' } as const;

export const hoursText = (minutes: number) => `${(minutes / 60).toFixed(1)} h`;

/** One chore entry as a card: what, when, how long, about what, the figure it carries, its photos and review. */
export function ChoreCard({ entry, showApprentice = false, children }: { entry: ChoreEntryDto; showApprentice?: boolean; children?: ReactNode }) {
  const about = entry.animal?.label ?? entry.group?.label ?? entry.litter?.label ?? null;
  const unit = useWeightUnit();
  return (
    <article className="space-y-2 rounded-xl border border-grey-200 bg-white p-4" aria-label={`${entry.kindLabel} on ${entry.doneOn}`}>
      <div className="flex flex-wrap items-start justify-between gap-2">
        <div className="min-w-0">
          <h3 className="font-bold text-bark">{entry.kindLabel}</h3>
          <p className="text-sm text-grey-600">
            {showApprentice && `${entry.apprentice.name} · `}
            {entry.doneOn} · {entry.minutes} min{about && ` · ${about}`}
          </p>
        </div>
        {stateBadge[entry.reviewState]}
      </div>
      {entry.weighing && (
        <p className="font-semibold text-bark">
          Weight: {formatWeight(entry.weighing.totalGrams, unit)}{entry.weighing.headCount > 1 && ` for ${entry.weighing.headCount} head`}
          {entry.reviewState !== 'accepted' && <span className="font-normal text-grey-600"> (unverified until accepted)</span>}
        </p>
      )}
      {entry.litterCount && (
        <p className="font-semibold text-bark">
          {entry.litterCount.count} kit{entry.litterCount.count === 1 ? '' : 's'} {entry.litterCount.kind}
          {entry.reviewState !== 'accepted' && <span className="font-normal text-grey-600"> (unverified until accepted)</span>}
        </p>
      )}
      {entry.palpation && (
        <p className="font-semibold text-bark">
          Palpation: {palpationLabels[entry.palpation.result]}
          {entry.reviewState !== 'accepted' && <span className="font-normal text-grey-600"> (unverified until accepted)</span>}
        </p>
      )}
      {entry.notes && <p className="break-words whitespace-pre-line text-grey-700">{entry.notes}</p>}
      {entry.photos.length > 0 && (
        <ul className="flex flex-wrap gap-2" aria-label="Photos">
          {entry.photos.map((p) => (
            <li key={p.id}>
              <a href={p.url} target="_blank" rel="noreferrer" className="block">
                <img src={p.thumbnailUrl} alt={`Photo of ${entry.kindLabel.toLowerCase()}`} className="size-20 rounded-lg object-cover" />
              </a>
            </li>
          ))}
        </ul>
      )}
      {entry.reviewState === 'returned' && entry.reviewComment && (
        <p className="rounded-lg bg-clay-wash p-3 text-bark">
          <span className="font-semibold">{entry.reviewedBy?.name ?? 'Your mentor'}:</span> {entry.reviewComment}
        </p>
      )}
      {children}
    </article>
  );
}
