import { ArrowLeft, HeartHandshake, Pencil, Search } from 'lucide-react';
import { formatDate } from '../../lib/days';
import type { ReactNode } from 'react';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { seniorRangeFor, subjectOf, type AnimalDetailDto, type PedigreeCardDto } from '@burrowline/shared';
import { queryClient } from '../../app/query-client';
import { Alert } from '../../components/ui/alert';
import { Badge } from '../../components/ui/badge';
import { Card } from '../../components/ui/card';
import { LinkButton } from '../../components/ui/link-button';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { PageSpinner } from '../../components/ui/spinner';
import { HutchCardsLink, PedigreePdfLink } from '../../features/herd-files/components/download-links';
import { animalViewQueryOptions, useAnimalView } from '../../features/herd/api/get-animal';
import { AnimalPhotos } from '../../features/photos/components/photo-gallery';
import { pedigreeQueryOptions, usePedigree } from '../../features/herd/api/get-pedigree';
import { useWeighIns } from '../../features/herd/api/get-weigh-ins';
import { AnimalFacts, AnimalHistory, CardList, CoiSummary, PedigreeCardFacts } from '../../features/herd/components/animal-sections';
import { BreedMakeupBar, breedMakeupText, PurityBadge } from '../../features/herd/components/breed-makeup';
import { NoteForm, StatusForm, WeighInForm } from '../../features/herd/components/entry-forms';
import { CompletenessBars, PedigreeTree } from '../../features/herd/components/pedigree-tree';
import { WeightChart } from '../../features/herd/components/weight-chart';
import { useWeightUnit } from '../../features/herd/hooks/use-weight-unit';
import { sexLabels } from '../../features/herd/herd-labels';
import { useAbility } from '../../lib/ability';
import { useSession } from '../../lib/session';
import { animalIdFrom, useAnimalIdParam } from './animal-id-param';
import { ProcessingActions } from '../../features/processing/components/processing-actions';
import { BreedingRecord } from '../../features/doe-board/components/breeding-record';

export async function loader({ params }: LoaderFunctionArgs) {
  const animalId = animalIdFrom(params);
  await Promise.all([queryClient.ensureQueryData(animalViewQueryOptions(animalId)), queryClient.ensureQueryData(pedigreeQueryOptions(animalId))]);
  return null;
}

function Section({ title, children, actions }: { title: string; children: ReactNode; actions?: ReactNode }) {
  const id = `section-${title.toLowerCase().replace(/[^a-z]+/g, '-')}`;
  return (
    <section aria-labelledby={id}>
      <Card className="space-y-4">
        <div className="flex flex-wrap items-center justify-between gap-3">
          <h2 id={id} className="text-xl font-bold tracking-tight">
            {title}
          </h2>
          {actions}
        </div>
        {children}
      </Card>
    </section>
  );
}

function PedigreeSection({ animalId }: { animalId: string }) {
  const tree = usePedigree(animalId);
  return (
    <Section title="Pedigree">
      {tree.data ? <PedigreeTree tree={tree.data} /> : tree.isError ? <Alert tone="error">{tree.error.message}</Alert> : <PageSpinner />}
    </Section>
  );
}

function TopSummary({ coi, makeup, completeness }: { coi: number; makeup: PedigreeCardDto['breedMakeup']; completeness: number[] | null }) {
  return (
    <div className="grid gap-4 md:grid-cols-3">
      <Card>
        <CoiSummary coi={coi} />
      </Card>
      <Card className="space-y-3">
        <p className="text-sm font-semibold tracking-wide text-grey-600 uppercase">Breed make-up</p>
        <PurityBadge makeup={makeup} />
        <BreedMakeupBar makeup={makeup} />
      </Card>
      {completeness && (
        <Card className="space-y-2">
          <p className="text-sm font-semibold tracking-wide text-grey-600 uppercase">Pedigree known</p>
          <CompletenessBars completeness={completeness} />
        </Card>
      )}
    </div>
  );
}

function FullRecord({ animal }: { animal: AnimalDetailDto }) {
  const me = useSession();
  const ability = useAbility();
  const unit = useWeightUnit();
  const weighIns = useWeighIns(animal.id);
  const subject = subjectOf('Animal', { coopId: me.coop.id, owningFarmId: animal.owningFarm?.id, keepingFarmId: animal.keepingFarm?.id });
  const canEdit = ability.can('update', subject);
  const keptHere = animal.keepingFarm?.id === me.user.farmId && animal.onFarm;
  const canWeigh = keptHere && ability.can('create', subjectOf('WeighIn', { coopId: me.coop.id, farmId: animal.keepingFarm?.id, enteredBy: me.user.id }));
  const isApprentice = me.user.role === 'apprentice';
  const title = animal.name || animal.tattoo || 'Animal';

  return (
    <div className="space-y-6">
      <PageTitle>{title}</PageTitle>
      <LinkButton to="/herd" variant="quiet" className="-ml-4">
        <ArrowLeft className="size-4" aria-hidden="true" />
        Back to Herd
      </LinkButton>
      <PageHeader
        title={title}
        lead={`${animal.tattoo} · ${sexLabels[animal.sex]} · ${breedMakeupText(animal.breedMakeup)}`}
        actions={
          <>
            {animal.sex === 'doe' && animal.onFarm && (
              <LinkButton to={`/herd/${animal.id}/trial-mating`} variant="secondary">
                <HeartHandshake className="size-5" aria-hidden="true" />
                Litter preview
              </LinkButton>
            )}
            {animal.sex === 'buck' && keptHere && animal.owningFarm?.id === me.user.farmId && canEdit && animal.lifecycle === 'breeding' && (
              <LinkButton to={`/stud-share/offer?buckId=${animal.id}`} variant="secondary">
                <HeartHandshake className="size-5" aria-hidden="true" />
                Offer in Stud Share
              </LinkButton>
            )}
            {animal.sex === 'doe' && keptHere && (
              <LinkButton to={`/stud-share/find/${animal.id}`} variant="secondary">
                <Search className="size-5" aria-hidden="true" />
                Find a stud buck
              </LinkButton>
            )}
            <PedigreePdfLink animalId={animal.id} />
            {keptHere && <HutchCardsLink animalIds={[animal.id]}>Hutch card</HutchCardsLink>}
            {canEdit && (
              <LinkButton to={`/herd/${animal.id}/edit`} variant="primary">
                <Pencil className="size-4" aria-hidden="true" />
                Edit
              </LinkButton>
            )}
          </>
        }
      />
      {!animal.onFarm && <Alert tone="info">{`No longer on the farm: ${animal.disposition.replace('_', ' ')}${animal.dispositionCause ? ` (${animal.dispositionCause})` : ''}.`}</Alert>}
      <TopSummary coi={animal.coi} makeup={animal.breedMakeup} completeness={animal.completeness} />
      <Section title="Details">
        <AnimalFacts animal={animal} unit={unit} />
      </Section>
      {animal.sex === 'doe' && (
        <Section title="Breeding record">
          <BreedingRecord doeId={animal.id} unit={unit} />
        </Section>
      )}
      <Section title="Photos">
        <AnimalPhotos animalId={animal.id} name={title} />
      </Section>
      <Section title="Weight">
        {weighIns.data ? (
          <WeightChart weighIns={weighIns.data} birthDate={animal.birthDate} standard={seniorRangeFor(animal.sex, animal.breed)} unit={unit} />
        ) : (
          <PageSpinner />
        )}
        {canWeigh && <WeighInForm animalId={animal.id} unit={unit} isApprentice={isApprentice} />}
      </Section>
      {keptHere && animal.owningFarm?.id === me.user.farmId && (
        <Section title="Withdrawal and processing">
          <ProcessingActions animalId={animal.id} canMark={canEdit} />
        </Section>
      )}
      <PedigreeSection animalId={animal.id} />
      <Section title={`Offspring (${animal.offspring.length})`}>
        <CardList cards={animal.offspring} empty="No offspring recorded." />
      </Section>
      <Section title="Status and custody history">
        <AnimalHistory animal={animal} />
        {canEdit && (
          <details className="rounded-xl border border-grey-200 p-3">
            <summary className="min-h-11 cursor-pointer content-center font-semibold text-moss-deep">Record a status change</summary>
            <div className="pt-3">
              <StatusForm animalId={animal.id} />
            </div>
          </details>
        )}
      </Section>
      <Section title="Notes">
        {animal.noteLog.length === 0 ? (
          <p className="text-grey-600">No notes yet.</p>
        ) : (
          <ul className="space-y-3">
            {animal.noteLog.map((n) => (
              <li key={n.id} className="rounded-xl bg-grey-50 p-3">
                <p className="text-sm text-grey-600">
                  {formatDate(n.notedOn)} · {n.enteredBy.name}{' '}
                  {n.reviewState !== 'accepted' && <Badge tone={n.reviewState === 'pending' ? 'straw' : 'clay'}>{n.reviewState === 'pending' ? 'Unverified' : 'Returned'}</Badge>}
                </p>
                <p className="whitespace-pre-line">{n.body}</p>
              </li>
            ))}
          </ul>
        )}
        {keptHere && <NoteForm animalId={animal.id} isApprentice={isApprentice} />}
      </Section>
    </div>
  );
}

function CardOnly({ card }: { card: PedigreeCardDto }) {
  const title = card.name || card.tattoo || 'Animal';
  return (
    <div className="space-y-6">
      <PageTitle>{title}</PageTitle>
      <LinkButton to="/herd" variant="quiet" className="-ml-4">
        <ArrowLeft className="size-4" aria-hidden="true" />
        Back to Herd
      </LinkButton>
      <PageHeader
        title={title}
        lead={`${card.tattoo ?? card.registrationNumber ?? 'No tattoo'} · ${sexLabels[card.sex]} · ${breedMakeupText(card.breedMakeup)}`}
        actions={
          card.sex === 'doe' && card.onFarm && (
            <LinkButton to={`/herd/${card.id}/trial-mating`} variant="secondary">
              <HeartHandshake className="size-5" aria-hidden="true" />
              Litter preview
            </LinkButton>
          )
        }
      />
      <Alert tone="info">
        {card.isOutside
          ? 'An outside animal, known from its papers. Every co-op member sees the same record.'
          : `This is ${card.currentFarm?.name ?? 'another farm'}'s animal: you see its pedigree card. Weights, notes and health stay with its farm.`}
      </Alert>
      <TopSummary coi={card.coi} makeup={card.breedMakeup} completeness={null} />
      <Section title="Pedigree card">
        <PedigreeCardFacts card={card} />
      </Section>
      <PedigreeSection animalId={card.id} />
    </div>
  );
}

export function AnimalPage() {
  const animalId = useAnimalIdParam();
  const view = useAnimalView(animalId);
  if (!view.data) return view.isError ? <Alert tone="error">{view.error.message}</Alert> : <PageSpinner />;
  return view.data.kind === 'record' ? <FullRecord key={animalId} animal={view.data.animal} /> : <CardOnly key={animalId} card={view.data.card} />;
}
