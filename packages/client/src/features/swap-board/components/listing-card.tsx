import { Link } from 'react-router-dom';
import { Rabbit, TriangleAlert } from 'lucide-react';
import type { SwapAnimalDto, SwapListingDto } from '@burrowline/shared';
import { Badge } from '../../../components/ui/badge';
import { BreedMakeupBar, breedMakeupText, CoiValue, formatCoi, useWeightUnit } from '../../herd';
import { useMoney } from '../../../lib/money';
import { animalName } from '../../../lib/names';
import { weight } from '../../../lib/weights';
import { ageText, bandLabels, kindLabels, listingStateLabels } from '../swap-board-labels';

export function priceText(listing: SwapListingDto, money: (cents: number | null) => string): string {
  if (listing.priceMode === 'trade') return 'Trade';
  if (listing.priceMode === 'offers') return 'Offers';
  return listing.priceCents === null ? 'Price set' : money(listing.priceCents);
}

/** The numbers a buyer looks at first, for one listed animal. */
export function AnimalFigures({ animal }: { animal: SwapAnimalDto }) {
  const unit = useWeightUnit();
  const c = animal.card;
  return (
    <div className="space-y-1 text-sm">
      <p className="font-semibold text-bark">
        {animalName(c)} · {c.sex === 'doe' ? 'Doe' : 'Buck'} · {ageText(animal.ageDays)}
      </p>
      <p className="text-grey-700">{breedMakeupText(c.breedMakeup)}</p>
      <BreedMakeupBar makeup={c.breedMakeup} />
      <dl className="grid grid-cols-2 gap-x-3 gap-y-1">
        <dt className="text-grey-600">COI</dt>
        <dd><CoiValue coi={c.coi} /></dd>
        <dt className="text-grey-600">Pedigree</dt>
        <dd>{Math.round(animal.completeness * 100)} % known (3 gen.)</dd>
        <dt className="text-grey-600">Weight</dt>
        <dd>{animal.weight ? `${weight(animal.weight.grams, unit)}, ${bandLabels[animal.weight.band]}` : 'Not shared'}</dd>
        {animal.trialCoi !== null && (
          <>
            <dt className="text-grey-600">Litter with yours</dt>
            <dd className="font-semibold">COI {formatCoi(animal.trialCoi)}</dd>
          </>
        )}
      </dl>
    </div>
  );
}

/** A listing on the board: its picture, kind, price and the first animal's figures; the whole card opens it. */
export function ListingCard({ listing }: { listing: SwapListingDto }) {
  const money = useMoney();
  const first = listing.animals[0];
  const photo = listing.photoIds[0];
  return (
    <Link
      to={`/swap-board/listings/${listing.id}`}
      className="block min-w-0 overflow-hidden rounded-2xl border border-grey-200 bg-white shadow-sm transition hover:border-moss focus-visible:outline-3 focus-visible:outline-moss"
      data-testid="listing-card"
    >
      {photo ? (
        <img src={`/api/photos/${photo}/thumbnail`} alt={`Photo of ${listing.title}`} className="aspect-[4/3] w-full object-cover" loading="lazy" />
      ) : (
        <div className="flex h-20 w-full items-center justify-center bg-oat text-moss" aria-hidden="true">
          <Rabbit className="size-10" />
        </div>
      )}
      <div className="space-y-3 p-4">
        <div className="flex flex-wrap items-center gap-2">
          <Badge tone={listing.kind === 'wanted' ? 'straw' : 'moss'}>{kindLabels[listing.kind]}</Badge>
          {listing.state !== 'open' && <Badge tone="neutral">{listingStateLabels[listing.state]}</Badge>}
          {listing.caution && (
            <Badge tone="clay">
              <TriangleAlert className="mr-1 size-4" aria-hidden="true" />
              Meat rules apply
            </Badge>
          )}
        </div>
        <h3 className="text-lg font-bold break-words text-bark">{listing.title}</h3>
        <p className="flex flex-wrap justify-between gap-2 text-sm text-grey-700">
          <span>{listing.farm.name}</span>
          {listing.kind !== 'wanted' && <span className="text-base font-bold text-moss-deep">{priceText(listing, money)}</span>}
        </p>
        {first && <AnimalFigures animal={first} />}
        {listing.animals.length > 1 && <p className="text-sm text-grey-600">and {listing.animals.length - 1} more</p>}
        {listing.grownOut && (
          <p className="text-sm text-grey-700">
            {listing.grownOut.headCount} head · {listing.grownOut.crossLabel || listing.grownOut.groupName}
            {listing.grownOut.readyOn ? ` · ready about ${listing.grownOut.readyOn}` : ''}
          </p>
        )}
        {listing.wanted && (
          <p className="text-sm text-grey-700">
            {[listing.wanted.breedName, listing.wanted.sex, listing.wanted.age].filter(Boolean).join(' · ') || 'Any'}
            {listing.wanted.by ? ` · by ${listing.wanted.by}` : ''}
          </p>
        )}
        <p className="text-sm text-grey-600">Until {listing.validUntil}{listing.openOffers > 0 ? ` · ${listing.openOffers} offer${listing.openOffers === 1 ? '' : 's'}` : ''}</p>
      </div>
    </Link>
  );
}

/** Cards in a grid: one column on phones, two or three on wider screens. */
export function ListingGrid({ listings, empty }: { listings: SwapListingDto[]; empty: string }) {
  if (listings.length === 0) return <p className="text-grey-600">{empty}</p>;
  return (
    <div className="grid grid-cols-1 gap-4 sm:grid-cols-2 xl:grid-cols-3 [&>*]:min-w-0">
      {listings.map((l) => (
        <ListingCard key={l.id} listing={l} />
      ))}
    </div>
  );
}
