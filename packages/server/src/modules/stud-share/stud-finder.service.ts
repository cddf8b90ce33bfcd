import {
  ErrorCode, greatCircleKm, litterMakeupClass, rankStuds, STUD_ORDER_EXPLAINED, type StudCandidate, type StudFinderDto, type StudFinderQuery,
  type StudFinderRowDto,
} from '@burrowline/shared';
import { withTenant } from '../../db/tenant';
import { AppError } from '../../lib/app-error';
import type { SessionUser } from '../../lib/session-user';
import { coopPedigreeIn, makeupPresenterIn, pedigreeCardsIn } from '../animals/pedigree.service';
import { farmStudFactsOf } from '../farms/farms.service';
import { blocksOf } from './stud-offers.service';
import { studContextFor } from './stud-share-context';
import { presentBuckCard, seesFees } from './stud-share.presenter';
import { emptyGetRecord, getRecordsOf, OFFER_COLUMNS, OFFER_EXTRAS, rows, type OfferRow } from './stud-share-queries';

const ORDER_BY_SORT: Record<StudFinderQuery['sort'], string> = {
  rank: STUD_ORDER_EXPLAINED,
  coi: 'Lowest litter COI first (ties in the default order).',
  fee: 'Lowest fee first, no fee before any (ties in the default order).',
  distance: 'Nearest farm first; farms without coordinates last (ties in the default order).',
  growth: 'Fastest-growing get first; no record last (ties in the default order).',
};

/**
 * The finder from one of the farm's does: every buck offered by another farm of the co-op, ranked for
 * the litter he would sire with her (see rankStuds), with his get's record, availability in her dates,
 * fee and distance; filtered, then paged. The whole co-op's pedigree is kept in memory, so ranking 200
 * bucks costs one pass over their ancestors, not a read of the pedigree.
 */
export async function findStuds(actor: SessionUser, q: StudFinderQuery): Promise<StudFinderDto> {
  return withTenant(actor, async (tx) => {
    const offerWhere = ["o.status = 'offered'", 'o.farm_id IS DISTINCT FROM $2'];
    if (q.kind === 'loan') offerWhere.push('o.offers_loan');
    if (q.kind === 'service') offerWhere.push('o.offers_service');
    const offers = await rows<OfferRow>(
      tx,
      `SELECT ${OFFER_COLUMNS}, ${OFFER_EXTRAS} FROM stud_offers o JOIN animals a ON a.id = o.buck_id
       WHERE o.coop_id = $1 AND ${offerWhere.join(' AND ')} AND a.deleted_at IS NULL AND a.disposition = 'on_farm'`,
      [actor.coopId, actor.farmId],
    );
    const ctx = await studContextFor(tx, actor, [q.damId, ...offers.map((o) => o.buck_id)]);
    const dam = ctx.cardFacts.get(q.damId);
    if (!dam) throw AppError.notFound('That doe');
    if (!actor.farmId || (dam.owningFarmId !== actor.farmId && dam.keepingFarmId !== actor.farmId)) {
      throw new AppError(ErrorCode.forbidden, 403, 'Find a buck for one of your farm\'s does');
    }
    if (dam.sex !== 'doe') throw AppError.validation({ damId: [`${dam.label} is a buck; choose a doe`] });

    const pedigree = await coopPedigreeIn(tx, actor.coopId);
    const records = await getRecordsOf(tx, actor.coopId, offers.map((o) => o.buck_id));
    const places = await farmStudFactsOf(actor.coopId, tx);
    const here = places.get(actor.farmId);
    const dated = Boolean(q.from && q.to);
    const busy = dated ? await blocksOf(tx, offers.map((o) => o.buck_id), q.from!, q.to!) : new Map();
    const feeOf = (o: OfferRow) => (q.kind === 'service' || (!q.kind && !o.offers_loan) ? o.service_fee_cents : o.loan_fee_cents);
    const distanceOf = (o: OfferRow) => {
      const there = places.get(o.farm_id);
      if (here?.latitude == null || here.longitude == null || there?.latitude == null || there.longitude == null) return null;
      return Math.round(greatCircleKm({ latitude: here.latitude, longitude: here.longitude }, { latitude: there.latitude, longitude: there.longitude }) * 10) / 10;
    };

    type Candidate = StudCandidate & { offer: OfferRow; fee: number | null; distanceKm: number | null; available: boolean | null };
    const candidates: Candidate[] = [];
    for (const offer of offers) {
      const buck = ctx.cardFacts.get(offer.buck_id);
      if (!buck) continue;
      const fee = feeOf(offer);
      const distanceKm = distanceOf(offer);
      const available = dated ? !(busy.get(offer.buck_id)?.length) : null;
      if (q.breedId && !(buck.makeup?.breeds[q.breedId] && buck.makeup.breeds[q.breedId]! > 0)) continue;
      if (q.maxFeeCents !== undefined && (fee ?? 0) > q.maxFeeCents) continue;
      if (q.maxDistanceKm !== undefined && (distanceKm === null || distanceKm > q.maxDistanceKm)) continue;
      if (q.freeOnly && available === false) continue;
      candidates.push({
        buckId: offer.buck_id, label: buck.label, makeup: buck.makeup,
        getDailyGainGrams: records.get(offer.buck_id)?.record.meanDailyGainGrams ?? null,
        offer, fee, distanceKm, available,
      });
    }

    const ranked = rankStuds(pedigree, { id: q.damId, makeup: dam.makeup }, candidates);
    const ordered = [...ranked];
    const nullsLast = (a: number | null, b: number | null, dir = 1) => (a === b ? 0 : a === null ? 1 : b === null ? -1 : dir * (a - b));
    if (q.sort === 'coi') ordered.sort((a, b) => a.litterCoi - b.litterCoi || a.rank - b.rank);
    if (q.sort === 'fee') ordered.sort((a, b) => (a.candidate.fee ?? 0) - (b.candidate.fee ?? 0) || a.rank - b.rank);
    if (q.sort === 'distance') ordered.sort((a, b) => nullsLast(a.candidate.distanceKm, b.candidate.distanceKm) || a.rank - b.rank);
    if (q.sort === 'growth') ordered.sort((a, b) => nullsLast(a.candidate.getDailyGainGrams, b.candidate.getDailyGainGrams, -1) || a.rank - b.rank);
    const page = ordered.slice((q.page - 1) * q.pageSize, q.page * q.pageSize);

    const ancestorNames = await pedigreeCardsIn(tx, actor, page.flatMap((r) => r.sharedAncestorIds));
    const presentMakeup = await makeupPresenterIn(tx, actor);
    const feesShown = seesFees(actor);
    const items: StudFinderRowDto[] = page.map((row) => {
      const found = records.get(row.candidate.buckId);
      const getRecord = found?.record ?? emptyGetRecord();
      return {
        rank: row.rank,
        card: presentBuckCard(row.candidate.offer, ctx, getRecord, found?.littersAll ?? 0),
        litterCoi: row.litterCoi,
        litterMakeup: presentMakeup(row.litterMakeup),
        makeupClass: litterMakeupClass(row.litterMakeup),
        sharedAncestors: row.sharedAncestorIds.map((id) => {
          const card = ancestorNames.get(id)?.card;
          return { id, name: card?.name ?? '', tattoo: card?.tattoo ?? null };
        }),
        getRecord,
        available: row.candidate.available,
        feeCents: feesShown ? row.candidate.fee : null,
        distanceKm: row.candidate.distanceKm,
        explanation: row.explanation,
      };
    });
    return { dam: dam.card, order: ORDER_BY_SORT[q.sort], items, total: ranked.length, page: q.page, pageSize: q.pageSize };
  });
}
