import type { Transaction } from 'sequelize';
import { RealtimeEvent, rooms, type StudLoanState } from '@burrowline/shared';
import { publish } from '../../lib/realtime';
import type { SessionUser } from '../../lib/session-user';
import { pedigreeCardsIn } from '../animals/pedigree.service';
import { farmTodayIn } from '../farms/farm-clock';
import { farmDirectoryOf } from '../farms/farms.service';
import { namesOf } from '../users/users.service';
import type { StudPresentContext } from './stud-share.presenter';

/** What presenting buck cards and loans needs, read once for the request: farms, the cards of the animals, names. */
export async function studContextFor(
  tx: Transaction,
  actor: SessionUser,
  animalIds: string[],
  userIds: (string | null | undefined)[] = [],
): Promise<StudPresentContext & { cardFacts: Awaited<ReturnType<typeof pedigreeCardsIn>> }> {
  const farms = await farmDirectoryOf(actor.coopId, tx);
  const cardFacts = await pedigreeCardsIn(tx, actor, animalIds);
  const names = userIds.some(Boolean) ? await namesOf(userIds, tx) : new Map<string, string>();
  return { actor, farms, cards: cardFacts, cardFacts, names, today: farmTodayIn(farms, actor.farmId) };
}

/** Buck cards are co-op-wide: an offer's change goes to the co-op room (no fees travel). */
export function announceOffer(tx: Transaction, coopId: string, offer: { id: string; buck_id: string; farm_id: string }): void {
  tx.afterCommit(() => publish(rooms.coop(coopId), RealtimeEvent.studOfferChanged, { offerId: offer.id, buckId: offer.buck_id, farmId: offer.farm_id }));
}

/** A loan's change goes to the two farms' rooms only (their apprentices too: no fees travel). */
export function announceLoan(
  tx: Transaction,
  loan: { id: string; buck_id: string; owner_farm_id: string; borrower_farm_id: string },
  state: StudLoanState,
): void {
  const farmIds = [loan.owner_farm_id, loan.borrower_farm_id];
  tx.afterCommit(() => {
    for (const farmId of farmIds) publish(rooms.farm(farmId), RealtimeEvent.studLoanChanged, { loanId: loan.id, buckId: loan.buck_id, farmIds, state });
  });
}
