import { Link } from 'react-router-dom';
import { formatDate } from '../../../lib/days';
import { formatWeight, type AnimalDetailDto, type PedigreeCardDto, type WeightUnit } from '@burrowline/shared';
import { Badge } from '../../../components/ui/badge';
import {
  ageClassLabels, coiLevel, custodyEventLabels, custodyLabels, dispositionLabels, formatCoi, lifecycleLabels, sexLabels,
} from '../herd-labels';
import { breedMakeupText, PurityBadge } from './breed-makeup';
import { CoiValue } from './coi-badge';

function Fact({ term, children }: { term: string; children: React.ReactNode }) {
  return (
    <div className="space-y-0.5">
      <dt className="text-sm font-medium text-grey-600">{term}</dt>
      <dd className="break-words">{children}</dd>
    </div>
  );
}

function ageText(days: number | null): string {
  if (days === null) return '—';
  if (days < 63) return `${Math.floor(days / 7)} weeks`;
  const months = Math.floor(days / 30.44);
  return months < 24 ? `${months} months` : `${Math.floor(months / 12)} years ${months % 12} months`;
}

/** The record's facts, for the farm that owns or keeps the animal. */
export function AnimalFacts({ animal, unit }: { animal: AnimalDetailDto; unit: WeightUnit }) {
  return (
    <dl className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
      <Fact term="Ear tattoo">{animal.tattoo}</Fact>
      <Fact term="Sex">{sexLabels[animal.sex]}</Fact>
      <Fact term="Born">
        {animal.birthDate ? formatDate(animal.birthDate) : 'Unknown'} ({ageText(animal.ageDays)})
      </Fact>
      <Fact term="Age class">{animal.ageClass ? ageClassLabels[animal.ageClass] : '—'}</Fact>
      <Fact term="Declared breed">{animal.breedName ?? 'None (from its parents, or unknown)'}</Fact>
      <Fact term="Colour or variety">{animal.colour || '—'}</Fact>
      <Fact term="Registration number">{animal.registrationNumber ?? '—'}</Fact>
      <Fact term="Hutch">{animal.hutch || '—'}</Fact>
      <Fact term="Status">
        {lifecycleLabels[animal.lifecycle]} · {dispositionLabels[animal.disposition]}
        {animal.dispositionCause && ` (${animal.dispositionCause})`}
      </Fact>
      <Fact term="Bred at">{animal.breedingFarm?.name ?? (animal.breederName || 'Outside the co-op')}</Fact>
      <Fact term="Owned by">{animal.owningFarm?.name ?? '—'}</Fact>
      <Fact term="Kept at">
        {animal.keepingFarm?.name ?? '—'} {animal.custody !== 'at_home' && <Badge tone="straw">{custodyLabels[animal.custody]}</Badge>}
      </Fact>
      <Fact term="Latest weight">
        {animal.latestWeight ? (
          <>
            {formatWeight(animal.latestWeight.grams, unit)} on {formatDate(animal.latestWeight.weighedOn)}
            {animal.latestWeight.reviewState === 'pending' && (
              <Badge tone="straw" className="ml-2">
                Unverified
              </Badge>
            )}
          </>
        ) : (
          '—'
        )}
      </Fact>
      {animal.notes && (
        <div className="sm:col-span-2 lg:col-span-3">
          <Fact term="Notes">
            <span className="whitespace-pre-line">{animal.notes}</span>
          </Fact>
        </div>
      )}
    </dl>
  );
}

/** COI in words and numbers, for the top of an animal's page. */
export function CoiSummary({ coi }: { coi: number }) {
  const level = coiLevel(coi);
  return (
    <div className="space-y-1">
      <p className="text-sm font-semibold tracking-wide text-grey-600 uppercase">Inbreeding (COI)</p>
      <p className="text-3xl font-bold" data-testid="animal-coi">
        {formatCoi(coi)}
      </p>
      <Badge tone={level.tone}>{level.label}</Badge>
    </div>
  );
}

/** A dated list of status changes and moves between farms, oldest first. */
export function AnimalHistory({ animal }: { animal: AnimalDetailDto }) {
  const entries = [
    ...animal.statusHistory.map((e) => ({
      id: e.id,
      on: e.effectiveOn,
      text:
        e.kind === 'lifecycle'
          ? `Status: ${lifecycleLabels[e.value as keyof typeof lifecycleLabels]}`
          : `${dispositionLabels[e.value as keyof typeof dispositionLabels]}${e.cause ? ` — ${e.cause}` : ''}`,
      where: e.farm?.name ?? '',
      kind: e.kind === 'lifecycle' ? 'Lifecycle' : 'Disposition',
    })),
    ...animal.custodyHistory.map((e) => ({
      id: e.id,
      on: e.movedOn,
      text:
        `${custodyEventLabels[e.kind]}${e.fromFarm && e.toFarm ? `: ${e.fromFarm.name} → ${e.toFarm.name}` : e.toFarm ? ` at ${e.toFarm.name}` : ''}` +
        (e.tattooAfter ? ` (tattoo ${e.tattooBefore} → ${e.tattooAfter})` : '') +
        (e.note ? ` — ${e.note}` : ''),
      where: '',
      kind: 'Custody',
    })),
  ].sort((a, b) => a.on.localeCompare(b.on));
  return (
    <ol className="relative space-y-3 border-l-2 border-grey-200 pl-5">
      {entries.map((e) => (
        <li key={e.id} className="relative">
          <span className="absolute top-1.5 -left-[27px] size-3 rounded-full border-2 border-white bg-moss" aria-hidden="true" />
          <p className="text-sm text-grey-600">
            <time dateTime={e.on}>{e.on}</time> · {e.kind}
            {e.where && ` · ${e.where}`}
          </p>
          <p>{e.text}</p>
        </li>
      ))}
    </ol>
  );
}

/** Cards of other animals (offspring), linking to each. */
export function CardList({ cards, empty }: { cards: PedigreeCardDto[]; empty: string }) {
  if (cards.length === 0) return <p className="text-grey-600">{empty}</p>;
  return (
    <ul className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
      {cards.map((c) => (
        <li key={c.id} className="relative rounded-xl border border-grey-200 bg-white p-3 shadow-sm">
          <Link to={`/herd/${c.id}`} className="font-semibold text-moss-deep underline decoration-1 underline-offset-2 after:absolute after:inset-0">
            {c.name || c.tattoo}
          </Link>
          <p className="text-sm text-grey-700">
            {c.tattoo} · {sexLabels[c.sex]} · born {c.birthDate ?? 'unknown'}
          </p>
          <p className="text-sm">{breedMakeupText(c.breedMakeup)}</p>
          <div className="mt-1 flex flex-wrap items-center gap-2 text-sm">
            <PurityBadge makeup={c.breedMakeup} />
            <CoiValue coi={c.coi} />
            <span className="text-grey-600">{c.onFarm ? c.currentFarm?.name : 'No longer on a farm'}</span>
          </div>
        </li>
      ))}
    </ul>
  );
}

/** The pedigree card of an animal kept by another farm (or known from papers): all the co-op may see. */
export function PedigreeCardFacts({ card }: { card: PedigreeCardDto }) {
  return (
    <dl className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
      <Fact term="Ear tattoo">{card.tattoo ?? '—'}</Fact>
      <Fact term="Sex">{sexLabels[card.sex]}</Fact>
      <Fact term="Born">{card.birthDate ?? 'Unknown'}</Fact>
      <Fact term="Breed make-up">{breedMakeupText(card.breedMakeup)}</Fact>
      <Fact term="Colour or variety">{card.colour || '—'}</Fact>
      <Fact term="Registration number">{card.registrationNumber ?? '—'}</Fact>
      <Fact term="Bred at">{card.breedingFarm?.name ?? (card.breederName || (card.isOutside ? 'Outside the co-op' : '—'))}</Fact>
      <Fact term="Now at">{card.currentFarm?.name ?? (card.isOutside ? 'Known from papers' : 'No longer on a farm')}</Fact>
      <Fact term="COI">{formatCoi(card.coi)}</Fact>
    </dl>
  );
}
