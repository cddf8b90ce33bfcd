import { ArrowLeft, Pencil } from 'lucide-react';
import { useState, type ReactNode } from 'react';
import { useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { queryClient } from '../../app/query-client';
import { Alert } from '../../components/ui/alert';
import { Button } from '../../components/ui/button';
import { Card } from '../../components/ui/card';
import { LinkButton } from '../../components/ui/link-button';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { PageSpinner } from '../../components/ui/spinner';
import { TextLink } from '../../components/ui/text-link';
import { useFarmToday } from '../../features/farms';
import { BreedMakeupBar, breedMakeupText, PurityBadge, useWeightUnit } from '../../features/herd';
import { buckCardQueryOptions, useBuckCard } from '../../features/stud-share/api/get-buck-cards';
import { useSetOfferPublished } from '../../features/stud-share/api/save-offer';
import { AvailabilityCalendar } from '../../features/stud-share/components/availability-calendar';
import { BiosecurityCaution } from '../../features/stud-share/components/biosecurity-caution';
import { Facts, feeText, GetRecordFacts, HealthFacts, OfferKinds, WeightFacts, Whereabouts } from '../../features/stud-share/components/buck-facts';
import { RequestForm } from '../../features/stud-share/components/request-form';
import { errorText } from '../../lib/form-errors';
import { useMoney } from '../../lib/money';
import { useSession } from '../../lib/session';
import { idFrom, useIdParam } from './stud-share-params';

export async function loader({ params }: LoaderFunctionArgs) {
  await queryClient.ensureQueryData(buckCardQueryOptions(idFrom(params, 'offerId')));
  return null;
}

function Section({ title, children, className }: { title: string; children: ReactNode; className?: string }) {
  return (
    <Card className={className}>
      <section aria-label={title} className="space-y-3">
        <h2 className="text-xl font-bold">{title}</h2>
        {children}
      </section>
    </Card>
  );
}

/** /stud-share/bucks/:offerId — his card, his calendar, and the request form for a member of another farm. */
export function BuckPage() {
  const offerId = useIdParam('offerId');
  const me = useSession();
  const money = useMoney();
  const unit = useWeightUnit();
  const today = useFarmToday();
  const [params] = useSearchParams();
  const damId = params.get('damId') ?? undefined;
  const card = useBuckCard(offerId);
  const publish = useSetOfferPublished(offerId);
  const [asked, setAsked] = useState<{ startOn: string; endOn: string } | null>(null);
  if (!card.data) return card.isError ? <Alert tone="error">{errorText(card.error)}</Alert> : <PageSpinner />;
  const c = card.data;
  const name = c.buck.name || c.buck.tattoo || 'Buck';
  const fee = feeText(c, money);
  const terms: [string, string][] = [
    ...(fee ? [['Fee', fee] as [string, string]] : []),
    ...(c.loan ? ([['Longest loan', `${c.longestLoanDays} days`], ['Rest between loans', `${c.restDays} days`], ['May travel', c.travelArea || 'Not said']] as [string, string][]) : []),
  ];
  return (
    <div className="space-y-6">
      <PageTitle>{name}</PageTitle>
      <LinkButton to={damId ? `/stud-share/find/${damId}` : '/stud-share'} variant="quiet" className="-ml-4">
        <ArrowLeft className="size-4" aria-hidden="true" />
        {damId ? 'Back to the ranking' : 'Back to the buck cards'}
      </LinkButton>
      <PageHeader
        title={name}
        lead={`${c.buck.tattoo ?? ''} · ${breedMakeupText(c.buck.breedMakeup)} · ${c.owningFarm.name}`}
        actions={
          c.canEdit ? (
            <>
              <LinkButton to={`/stud-share/bucks/${c.offerId}/edit`} variant="secondary">
                <Pencil className="size-4" aria-hidden="true" />
                Edit the offer
              </LinkButton>
              <Button variant={c.status === 'offered' ? 'quiet' : 'primary'} isBusy={publish.isPending} onClick={() => publish.mutate({ publish: c.status !== 'offered', version: c.version })}>
                {c.status === 'offered' ? 'Withdraw the offer' : 'Offer him again'}
              </Button>
            </>
          ) : undefined
        }
      />
      <div className="flex flex-wrap items-center gap-2">
        <OfferKinds card={c} />
        <Whereabouts card={c} />
        <PurityBadge makeup={c.buck.breedMakeup} />
        <TextLink to={`/herd/${c.buck.id}`}>His pedigree</TextLink>
      </div>
      {publish.error && <Alert tone="error">{errorText(publish.error)}</Alert>}
      {c.status === 'withdrawn' && <Alert tone="info">Withdrawn: the co-op no longer sees his card. Loans already accepted go ahead.</Alert>}
      <div className="grid gap-6 lg:grid-cols-2">
        <div className="space-y-6">
          {c.photos.length > 0 && (
            <ul className="grid grid-cols-2 gap-3 sm:grid-cols-3" aria-label={`Photos of ${name}`}>
              {c.photos.map((p, i) => (
                <li key={p.id}>
                  <img src={p.url} alt={`${name}, photo ${i + 1}`} className="aspect-square w-full rounded-xl border border-grey-200 object-cover" loading="lazy" />
                </li>
              ))}
            </ul>
          )}
          <Section title="The offer">
            {terms.length > 0 && <Facts rows={terms} label="The offer" />}
            {c.terms && <p className="whitespace-pre-line break-words">{c.terms}</p>}
            <BreedMakeupBar makeup={c.buck.breedMakeup} />
          </Section>
          <Section title="Health">
            <HealthFacts health={c.health} />
          </Section>
          <Section title="His get's record">
            <GetRecordFacts record={c.getRecord} unit={unit} />
            <p className="text-sm text-grey-600">From the litters he sired on farms that share their records with the co-op.</p>
          </Section>
          <Section title="Weight">
            <WeightFacts card={c} unit={unit} />
          </Section>
        </div>
        <div className="space-y-6">
          <Section title="When he is free">
            <AvailabilityCalendar offerId={c.offerId} today={today} highlight={asked} />
          </Section>
          {c.canRequest && me.user.farmId && c.status === 'offered' && (
            <Section title={`Ask for ${name}`}>
              {c.loan && <BiosecurityCaution quarantineDays={null} />}
              <RequestForm card={c} farmId={me.user.farmId} today={today} initialDoeId={damId} onDates={setAsked} />
            </Section>
          )}
        </div>
      </div>
    </div>
  );
}
