import {
  ageClassOf, daysBetween, pedigreeCompleteness, SWAP_MEAT_CAUTION, seniorRangeFor, weightAgainstStandard, type BreedDto, type CoopPedigree,
  type FarmRefDto, type PedigreeAnimal, type SwapAnimalDto, type SwapListingDto, type SwapOfferDto, type SwapOfferEventDto, type SwapWeightBand,
} from '@burrowline/shared';
import type { SessionUser } from '../../lib/session-user';
import type { PedigreeCardFacts } from '../animals/pedigree.service';
import type { ListingRow, OfferEventRow, OfferRow } from './swap-board-queries';

/** What presenting listings and offers needs, read once per request. */
export interface SwapPresentContext {
  actor: SessionUser;
  farms: Map<string, { id: string; name: string }>;
  breeds: Map<string, BreedDto>;
  cards: Map<string, PedigreeCardFacts>;
  pedigree: CoopPedigree;
  weights: Map<string, { grams: number; weighedOn: string }>;
  groups: Map<string, { name: string; crossLabel: string }>;
  /** The viewer's animal asked about (`mateWith`), for the COI of a litter with each listed animal. */
  mateWith: { id: string; sex: 'doe' | 'buck' } | null;
  /** Prices and trade terms are money: apprentices see none. */
  seesPrices: boolean;
  today: string;
}

const GENERATIONS = 3;

export function farmRef(ctx: Pick<SwapPresentContext, 'farms'>, farmId: string | null): FarmRefDto | null {
  if (!farmId) return null;
  return { id: farmId, name: ctx.farms.get(farmId)?.name ?? 'A former member farm' };
}

/** Share of known ancestor places over three generations (the mean of the per-generation fractions). */
export function completenessOf(pedigree: CoopPedigree, animalId: string): number {
  const known: PedigreeAnimal[] = [];
  let layer = [animalId];
  for (let g = 0; g <= GENERATIONS && layer.length > 0; g++) {
    const next: string[] = [];
    for (const id of layer) {
      const parents = pedigree.parentsOf(id);
      known.push({ id, sireId: parents?.sireId ?? null, damId: parents?.damId ?? null });
      if (parents?.sireId) next.push(parents.sireId);
      if (parents?.damId) next.push(parents.damId);
    }
    layer = next;
  }
  const unique = [...new Map(known.map((k) => [k.id, k])).values()];
  const fractions = pedigreeCompleteness(unique, animalId, GENERATIONS);
  return Number((fractions.reduce((a, b) => a + b, 0) / GENERATIONS).toFixed(3));
}

/** The one breed of a purebred animal, whose band its weight is judged against. */
function breedOf(facts: PedigreeCardFacts, breeds: Map<string, BreedDto>): BreedDto | null {
  const entries = Object.entries(facts.makeup?.breeds ?? {});
  if (entries.length !== 1 || entries[0]![1] < 1) return null;
  return breeds.get(entries[0]![0]) ?? null;
}

function bandOf(facts: PedigreeCardFacts, grams: number, ctx: SwapPresentContext): SwapWeightBand {
  const breed = breedOf(facts, ctx.breeds);
  if (!breed) return 'no_standard';
  const birth = facts.card.birthDate;
  if (birth && ageClassOf(birth, ctx.today, breed.showClassCount) !== 'senior') return 'growing';
  return weightAgainstStandard(grams, seniorRangeFor(facts.sex, breed));
}

export function presentSwapAnimal(animalId: string, listing: Pick<ListingRow, 'share_weights'>, ctx: SwapPresentContext): SwapAnimalDto | null {
  const facts = ctx.cards.get(animalId);
  if (!facts) return null;
  const weight = listing.share_weights ? ctx.weights.get(animalId) : undefined;
  const opposite = ctx.mateWith && ctx.mateWith.sex !== facts.sex && ctx.mateWith.id !== animalId;
  return {
    card: facts.card,
    ageDays: facts.card.birthDate ? daysBetween(facts.card.birthDate, ctx.today) : null,
    completeness: completenessOf(ctx.pedigree, animalId),
    weight: weight ? { ...weight, band: bandOf(facts, weight.grams, ctx) } : null,
    trialCoi: opposite ? Number(Math.min(1, Math.max(0, ctx.pedigree.kinship(animalId, ctx.mateWith!.id))).toFixed(4)) : null,
  };
}

export function presentListing(row: ListingRow, ctx: SwapPresentContext): SwapListingDto {
  const mine = ctx.actor.farmId === row.farm_id;
  const group = row.group_id ? ctx.groups.get(row.group_id) : undefined;
  const wantedBreed = row.wanted_breed_id ? ctx.breeds.get(row.wanted_breed_id) : undefined;
  const live = row.state === 'open' || row.state === 'under_offer';
  return {
    id: row.id,
    kind: row.kind,
    state: row.state,
    farm: farmRef(ctx, row.farm_id)!,
    title: row.title,
    description: row.description,
    priceMode: row.price_mode,
    priceCents: ctx.seesPrices ? row.price_cents : null,
    collectPlace: row.collect_place,
    validUntil: row.valid_until,
    animals: row.animal_ids.map((id) => presentSwapAnimal(id, row, ctx)).filter((a): a is SwapAnimalDto => a !== null),
    photoIds: row.photo_ids,
    grownOut: row.kind === 'grow_out' && row.group_id
      ? { groupId: row.group_id, groupName: group?.name ?? '', crossLabel: group?.crossLabel ?? '', headCount: row.head_count ?? 0, readyOn: row.ready_on }
      : null,
    wanted: row.kind === 'wanted'
      ? { breedId: row.wanted_breed_id, breedName: wantedBreed?.name ?? null, sex: row.wanted_sex, age: row.wanted_age, by: row.wanted_by }
      : null,
    caution: row.kind === 'grow_out' ? SWAP_MEAT_CAUTION : null,
    closedReason: row.closed_reason,
    openOffers: row.open_offers,
    mine,
    canOffer: ctx.seesPrices && !mine && Boolean(ctx.actor.farmId) && live && row.kind !== 'wanted',
    version: row.version,
    createdAt: new Date(row.created_at).toISOString(),
  };
}

export function sideOf(actor: SessionUser, offer: Pick<OfferRow, 'seller_farm_id' | 'buyer_farm_id'>): 'seller' | 'buyer' {
  return actor.farmId === offer.seller_farm_id ? 'seller' : 'buyer';
}

export function presentOffer(row: OfferRow, events: OfferEventRow[], ctx: SwapPresentContext): SwapOfferDto {
  const side = sideOf(ctx.actor, row);
  const acts = ctx.seesPrices && (ctx.actor.farmId === row.seller_farm_id || ctx.actor.farmId === row.buyer_farm_id);
  const open = row.state === 'open';
  const myTurn = open && row.awaiting === side;
  return {
    id: row.id,
    listingId: row.listing_id,
    listingTitle: row.listing_title,
    state: row.state,
    awaiting: row.awaiting,
    seller: farmRef(ctx, row.seller_farm_id)!,
    buyer: farmRef(ctx, row.buyer_farm_id)!,
    priceCents: ctx.seesPrices ? row.price_cents : null,
    tradeAnimals: row.trade_animal_ids.map((id) => ctx.cards.get(id)?.card).filter((c) => c !== undefined),
    message: row.message,
    validUntil: row.valid_until,
    acceptedOn: row.accepted_on,
    closedReason: row.closed_reason,
    events: events.map((e): SwapOfferEventDto => ({
      id: e.id,
      kind: e.kind as SwapOfferEventDto['kind'],
      farm: farmRef(ctx, e.farm_id),
      actorName: e.actor_name,
      priceCents: ctx.seesPrices ? e.price_cents : null,
      tradeAnimalIds: e.trade_animal_ids,
      text: e.text,
      at: new Date(e.created_at).toISOString(),
    })),
    side,
    may: {
      accept: Boolean(acts && myTurn),
      counter: Boolean(acts && myTurn),
      decline: Boolean(acts && myTurn),
      withdraw: Boolean(acts && open && side === 'buyer'),
      confirmCollection: Boolean(acts && row.state === 'accepted' && side === 'buyer'),
      reportFailed: Boolean(acts && row.state === 'accepted'),
    },
    version: row.version,
  };
}
