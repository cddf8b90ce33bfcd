import { Link } from 'react-router-dom';
import { formatWeight, KIT_DEATH_CAUSE_LABELS, type LitterDto, type LitterEventDto, type WeightUnit } from '@burrowline/shared';
import { Badge } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { animalName } from '../../../lib/names';
import { formatDate } from '../../../lib/days';
import { errorText } from '../../../lib/form-errors';
import { useMyApprentices } from '../../mentorship';
import { useReviewLitterEvent } from '../api/review-litter-event';

/** A loss names its cause from the list, then the breeder's words when they say more. */
function lossWords(e: Pick<LitterEventDto, 'cause' | 'deathCause'>): string {
  const listed = e.deathCause ? KIT_DEATH_CAUSE_LABELS[e.deathCause] : null;
  const parts = [listed, e.cause && e.cause !== listed ? e.cause : null].filter(Boolean);
  return parts.length > 0 ? ` — ${parts.join(': ')}` : '';
}

const words: Record<LitterEventDto['kind'], string> = {
  fostered_in: 'Fostered in',
  fostered_out: 'Fostered out',
  lost: 'Lost',
  culled: 'Culled',
  weaned: 'Weaned',
};

function other(e: LitterEventDto): string | null {
  if (!e.otherLitter) return null;
  const dam = e.otherLitter.dam ? `${animalName(e.otherLitter.dam)}'s litter` : 'another litter';
  return `${e.kind === 'fostered_in' ? 'from' : 'to'} ${dam}${e.otherLitter.isOwnFarm ? '' : ` at ${e.otherLitter.farm.name}`}`;
}

/** Every dated change of the kit count, with who entered it and (an apprentice's, for her mentor) its review. */
export function LitterEventsList({ litter, canReview, unit }: { litter: LitterDto; canReview: boolean; unit: WeightUnit }) {
  const review = useReviewLitterEvent();
  const myApprentices = useMyApprentices();
  if (litter.events.length === 0) return <p className="text-grey-600">No changes since the kindling.</p>;
  return (
    <>
      <ul className="divide-y divide-grey-200">
        {litter.events.map((e) => {
          const target = other(e);
          return (
            <li key={e.id} className="flex flex-wrap items-center justify-between gap-2 py-2">
              <span className={e.reviewState === 'returned' ? 'text-grey-500 line-through' : ''}>
                <strong>{formatDate(e.on)}</strong> · {words[e.kind]} {e.count === 1 ? '1 kit' : `${e.count} kits`}
                {target && e.otherLitter?.isOwnFarm ? (
                  <>
                    {' '}
                    <Link to={`/litters/${e.otherLitter.id}`} className="font-medium text-moss-deep underline underline-offset-4">
                      {target}
                    </Link>
                  </>
                ) : target ? ` ${target}` : ''}
                {lossWords(e)}
                {e.weaningWeightGrams ? ` · ${formatWeight(e.weaningWeightGrams, unit)} together (${formatWeight(e.weaningWeightGrams / e.count, unit)} a kit)` : ''}
                {e.enteredBy ? <span className="text-sm text-grey-600"> · {e.fromOtherFarm ? `recorded at the other farm by ${e.enteredBy.name}` : e.enteredBy.name}</span> : null}
              </span>
              <span className="flex flex-wrap items-center gap-2">
                {e.reviewState === 'pending' && <Badge tone="straw">Unverified · waiting for review</Badge>}
                {e.reviewState === 'returned' && <Badge tone="clay">Returned{e.reviewComment ? `: ${e.reviewComment}` : ''}</Badge>}
                {e.reviewState === 'pending' && canReview && myApprentices.includes(e.enteredBy?.id) && (
                  <>
                    <Button variant="secondary" className="px-3" onClick={() => review.mutate({ eventId: e.id, input: { decision: 'accepted', version: e.version } })}>
                      Accept
                    </Button>
                    <Button variant="quiet" className="px-3" onClick={() => review.mutate({ eventId: e.id, input: { decision: 'returned', comment: 'Please check the count', version: e.version } })}>
                      Return
                    </Button>
                  </>
                )}
              </span>
            </li>
          );
        })}
      </ul>
      {review.isError && <p role="alert" className="text-sm font-medium text-clay-deep">{errorText(review.error)}</p>}
    </>
  );
}
