import { ArrowLeftRight } from 'lucide-react';
import { Card } from '../../../components/ui/card';
import { LinkButton } from '../../../components/ui/link-button';
import { useSwapSummary } from '../api/get-swap-board';

/** Swap Board on the Co-op hub: what is on the board, and the offers waiting for the person's farm. */
export function SwapBoardSummary() {
  const summary = useSwapSummary();
  const s = summary.data;
  return (
    <Card className="space-y-3" data-testid="swap-board-summary">
      <div className="flex items-center gap-2">
        <ArrowLeftRight className="size-6 text-moss" aria-hidden="true" />
        <h2 className="text-xl font-bold">Swap Board</h2>
      </div>
      {!s ? (
        <p className="text-grey-600">{summary.isError ? 'The board could not be read.' : 'Reading the board…'}</p>
      ) : (
        <div className="space-y-1">
          <p className="font-semibold">
            {s.offersAwaitingMe > 0
              ? `${s.offersAwaitingMe} offer${s.offersAwaitingMe === 1 ? '' : 's'} wait for your answer`
              : `${s.openListings} listing${s.openListings === 1 ? '' : 's'} on the board`}
          </p>
          <p className="text-sm text-grey-600">
            {s.wantedPosts} wanted post{s.wantedPosts === 1 ? '' : 's'} · {s.myOpenListings} of your farm's listing{s.myOpenListings === 1 ? '' : 's'} open
          </p>
        </div>
      )}
      <div className="flex flex-wrap gap-2">
        <LinkButton to="/swap-board" variant="secondary">The board</LinkButton>
        {s && s.offersAwaitingMe > 0 && <LinkButton to="/swap-board/offers" variant="primary">Answer</LinkButton>}
      </div>
    </Card>
  );
}
