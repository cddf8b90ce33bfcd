import { Suspense } from 'react';
import { ArrowLeft, Scale } from 'lucide-react';
import { useQuery } from '@tanstack/react-query';
import { useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { queryClient } from '../../app/query-client';
import { Card } from '../../components/ui/card';
import { LinkButton } from '../../components/ui/link-button';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { PageSpinner } from '../../components/ui/spinner';
import { groupsQueryOptions } from '../../features/grow-out';
import { useWeightUnit } from '../../features/herd/hooks/use-weight-unit';
import { candidatesQueryOptions, useRoundCandidates, type RoundSet } from '../../features/weighing-rounds/api/weighing-round-api';
import { WeighingRound } from '../../features/weighing-rounds/components/weighing-round';
import { weighingRoundLink } from '../../features/weighing-rounds';
import { useSession } from '../../lib/session';

const SET_KEYS = ['set', 'groupId', 'litterId', 'animalIds'] as const;

function setFrom(params: URLSearchParams): RoundSet | null {
  if (!params.get('set')) return null;
  return Object.fromEntries(SET_KEYS.flatMap((k) => (params.get(k) ? [[k, params.get(k)!]] : [])));
}

export async function loader({ request }: LoaderFunctionArgs) {
  const set = setFrom(new URL(request.url).searchParams);
  if (set) await queryClient.ensureQueryData(candidatesQueryOptions(set));
  return null;
}

/** Where a round came from, to go back to once it is saved. */
function backOf(set: RoundSet | null): { href: string; label: string } {
  if (set?.set === 'group' && set.groupId) return { href: `/grow-out/groups/${set.groupId}`, label: 'Back to the group' };
  if (set?.set === 'litter' && set.litterId) return { href: `/litters/${set.litterId}`, label: 'Back to the litter' };
  if (set?.set === 'animals') return { href: '/herd', label: 'Back to the herd' };
  return { href: '/grow-out', label: 'Back to grow-out' };
}

function Round({ set, doneHref }: { set: RoundSet; doneHref: string }) {
  const { data } = useRoundCandidates(set);
  const unit = useWeightUnit();
  const { user } = useSession();
  // A new set starts a new round (and a new idempotency key).
  return <WeighingRound key={JSON.stringify(set)} round={data} unit={unit} isApprentice={user.role === 'apprentice'} doneHref={doneHref} />;
}

/** With nothing chosen yet: every growing animal, or one of the growing groups. */
function ChooseSet() {
  const groups = useQuery(groupsQueryOptions({ status: 'growing' }));
  return (
    <Card className="space-y-4">
      <h2 className="text-xl font-semibold">What are you weighing?</h2>
      <LinkButton to={weighingRoundLink({ growing: true })} variant="primary" className="w-full sm:w-auto">
        <Scale className="size-5" aria-hidden="true" />
        Every growing animal
      </LinkButton>
      {(groups.data?.groups.length ?? 0) > 0 && (
        <div className="space-y-2">
          <h3 className="font-semibold">A grow-out group, kit by kit</h3>
          <ul className="grid gap-2 sm:grid-cols-2">
            {groups.data!.groups.map((g) => (
              <li key={g.id}>
                <LinkButton to={weighingRoundLink({ groupId: g.id })} variant="secondary" className="w-full justify-between">
                  <span className="truncate">{g.name}</span>
                  <span className="shrink-0 text-sm font-normal">{g.currentHeads} heads</span>
                </LinkButton>
              </li>
            ))}
          </ul>
        </div>
      )}
      <p className="text-sm text-grey-600">A litter is weighed from its page, kit by kit; chosen animals from the Herd list ("Weigh these").</p>
    </Card>
  );
}

/** /weighing-round: weigh a group, a litter, the growing stock or chosen animals one after another on a phone. */
export function WeighingRoundPage() {
  const [params] = useSearchParams();
  const set = setFrom(params);
  const back = backOf(set);
  return (
    <div className="mx-auto max-w-4xl space-y-4">
      <PageTitle>Weighing round</PageTitle>
      <LinkButton to={back.href} variant="quiet" className="-ml-4">
        <ArrowLeft className="size-4" aria-hidden="true" />
        {back.label}
      </LinkButton>
      <PageHeader title="Weighing round" lead="One after another, saved together at the end." />
      {set ? (
        <Suspense fallback={<PageSpinner />}>
          <Round set={set} doneHref={back.href} />
        </Suspense>
      ) : (
        <ChooseSet />
      )}
    </div>
  );
}
