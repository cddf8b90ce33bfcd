import type { Transaction } from 'sequelize';
import { addDays, type NotificationKind, type SwapListingState } from '@burrowline/shared';
import { AppError } from '../../lib/app-error';
import type { SessionUser } from '../../lib/session-user';
import { pedigreeCardsIn } from '../animals/pedigree.service';
import { quarantinesCovering } from '../almanac/quarantine.service';
import { withdrawalsCovering } from '../almanac/treatments.service';
import { recordAudit } from '../audit/audit.service';
import type { FieldMessages } from '../farms/farm-access';
import { notify } from '../notifications/notifications.service';
import { announceListing, announceOffer } from './swap-board-context';
import { rows, type ListingRow, type OfferRow } from './swap-board-queries';

/** The steps both the listings and the offers take: history, notices, closing, and the stock checks. */

export const listingLink = (listingId: string) => `/swap-board/listings/${listingId}`;

/**
 * Why an animal cannot change hands from this farm today, field by field: not the farm's own, on loan,
 * gone from the farm, under a medicine withdrawal, or in its arrival quarantine. Empty when all may go.
 */
export async function stockRefusals(
  tx: Transaction,
  actor: SessionUser,
  farmId: string,
  animalIds: string[],
  today: string,
  field: string,
): Promise<FieldMessages> {
  const errors: FieldMessages = {};
  if (animalIds.length === 0) return errors;
  const cards = await pedigreeCardsIn(tx, actor, animalIds);
  const withdrawals = await withdrawalsCovering(tx, actor.coopId, { animalIds }, today);
  const quarantines = await quarantinesCovering(tx, animalIds, today);
  animalIds.forEach((id, i) => {
    const facts = cards.get(id);
    const path = `${field}.${i}`;
    if (!facts || facts.card.isOutside || facts.owningFarmId !== farmId) {
      errors[path] = [`${facts?.label ?? 'That animal'} is not owned by your farm: only the farm's own animals change hands`];
      return;
    }
    if (!facts.onFarm) errors[path] = [`${facts.label} is no longer on the farm`];
    else if (facts.keepingFarmId !== farmId) errors[path] = [`${facts.label} is on loan at another farm; list it once it is back home`];
    else if (withdrawals.animals.has(id)) {
      const w = withdrawals.animals.get(id)!;
      errors[path] = [`${facts.label} is under a medicine withdrawal (${w.treatment}) until ${w.withdrawalEndsOn}; it may change hands from ${addDays(w.withdrawalEndsOn, 1)}`];
    } else if (quarantines.has(id)) {
      errors[path] = [`${facts.label} is in its arrival quarantine until ${quarantines.get(id)}; it may change hands once the quarantine ends`];
    }
  });
  return errors;
}

/** Appends a step to the offer's thread (and the audit log), and announces the offer to its two farms. */
export async function recordOfferEvent(
  tx: Transaction,
  actor: SessionUser | null,
  offer: Pick<OfferRow, 'id' | 'coop_id' | 'listing_id' | 'seller_farm_id' | 'buyer_farm_id'>,
  state: OfferRow['state'],
  step: { kind: string; text: string; priceCents?: number | null; tradeAnimalIds?: string[] },
): Promise<void> {
  await rows(
    tx,
    'INSERT INTO swap_offer_events (coop_id, offer_id, kind, farm_id, actor_id, price_cents, trade_animal_ids, text) VALUES ($1, $2, $3, $4, $5, $6, $7::uuid[], $8)',
    [offer.coop_id, offer.id, step.kind, actor?.farmId ?? null, actor?.id ?? null, step.priceCents ?? null, step.tradeAnimalIds ?? [], step.text],
  );
  await recordAudit({ coopId: offer.coop_id, actorUserId: actor?.id ?? null, action: `swap_offer.${step.kind}`, subjectType: 'swap_offer', subjectId: offer.id, details: { state } }, tx);
  announceOffer(tx, offer, state);
}

/** Tells the farms (never a third one) by the bell and e-mail per each person's choice. */
export async function tell(
  tx: Transaction,
  actor: SessionUser | null,
  input: { coopId: string; farmIds: string[]; kind: NotificationKind; key: string; title: string; link: string; text?: string },
): Promise<void> {
  await notify(tx, {
    coopId: input.coopId,
    farmIds: input.farmIds,
    exceptUserId: actor?.id,
    kind: input.kind,
    title: input.title,
    link: input.link,
    mail: { subject: input.title, text: `${input.title}.\n\n${input.text ?? 'Open the listing on the Swap Board to see the offer thread and answer it.'}` },
    key: input.key,
  });
}

/** Sets a listing's state (and why it closed), bumping its version, and announces it to the co-op. */
export async function setListingState(tx: Transaction, listing: ListingRow, state: SwapListingState, reason: string | null = null): Promise<void> {
  await rows(
    tx,
    'UPDATE swap_listings SET state = $2, closed_reason = coalesce($3, closed_reason), version = version + 1, updated_at = now() WHERE id = $1',
    [listing.id, state, reason],
  );
  announceListing(tx, listing, state);
}

/**
 * Declines every open offer of a listing (but `exceptOfferId`) with a notice to each buyer: the listing
 * is sold, withdrawn or expired.
 */
export async function closeOpenOffers(
  tx: Transaction,
  actor: SessionUser | null,
  listing: ListingRow,
  state: 'declined' | 'expired',
  reason: string,
  exceptOfferId: string | null = null,
): Promise<void> {
  const open = await rows<OfferRow>(
    tx,
    `UPDATE swap_offers SET state = $2, closed_reason = $3, version = version + 1, updated_at = now()
      WHERE listing_id = $1 AND state = 'open' AND id IS DISTINCT FROM $4::uuid
      RETURNING id, coop_id, listing_id, seller_farm_id, buyer_farm_id`,
    [listing.id, state, reason, exceptOfferId],
  );
  for (const offer of open) {
    await recordOfferEvent(tx, actor, offer, state, { kind: state, text: reason });
    await tell(tx, actor, {
      coopId: listing.coop_id, farmIds: [offer.buyer_farm_id], kind: 'swap.answered', key: `swap-closed:${offer.id}`,
      title: `Your offer on “${listing.title}” is ${state}: ${reason}`, link: listingLink(listing.id),
    });
  }
}

export function requireListingState(listing: ListingRow, states: SwapListingState[], refusal: string): void {
  if (!states.includes(listing.state)) throw AppError.conflict(refusal);
}
