/**
 * Stud Share in the invented co-op: two bucks offered to the co-op, one loan returned long ago that left a
 * litter at the borrowing farm, one buck in a borrower's care now, and one request waiting for its owner.
 * Offers and live requests go through the services (each in its own transaction, after the co-op exists);
 * the returned loan is history, written as the farms' records tell it.
 */
import { addDays, studOfferSchema, studRequestSchema, studVersionSchema, todayIn } from '@burrowline/shared';
import { withTenant } from '../packages/server/src/db/tenant';
import type { SessionUser } from '../packages/server/src/lib/session-user';
import { findUserByEmail } from '../packages/server/src/modules/users/users.service';
import { importReturnedLoan } from '../packages/server/src/modules/stud-share/stud-history.service';
import {
  acceptRequest, confirmCustodyStep, recordCustodyStep, requestStud,
} from '../packages/server/src/modules/stud-share/stud-loans.service';
import { offerBuck } from '../packages/server/src/modules/stud-share/stud-offers.service';
import { rows } from '../packages/server/src/modules/stud-share/stud-share-queries';
import { demoFarms } from './demo-coop';

const ZONE = 'America/Chicago';

async function actorFor(coopId: string, farmKey: string): Promise<SessionUser> {
  const email = demoFarms.find((f) => f.key === farmKey)!.people[0]!.email;
  const user = await withTenant({ coopId }, (tx) => findUserByEmail(email, tx));
  return { id: user!.id, coopId, farmId: user!.farmId, mentorId: null, email: user!.email, name: user!.name, role: user!.role };
}

interface Candidate {
  id: string;
  owning_farm_id: string;
}

/** Loads once: a co-op with any offer already has its Stud Share story. */
export async function loadDemoStudShare(coopId: string): Promise<void> {
  const today = todayIn(ZONE);
  const offered = await withTenant({ coopId }, (tx) => rows(tx, 'SELECT id FROM stud_offers LIMIT 1'));
  if (offered.length > 0) return;
  const actors = new Map<string, SessionUser>();
  for (const farm of demoFarms) actors.set(farm.key, await actorFor(coopId, farm.key));
  const keyOf = (farmId: string) => [...actors.entries()].find(([, a]) => a.farmId === farmId)?.[0];

  // A past litter sired by another farm's buck: the loan it came from, returned.
  const [past] = await withTenant({ coopId }, (tx) => rows<{ sire_id: string; dam_id: string; farm_id: string; serviced_on: string; owning_farm_id: string }>(
    tx,
    `SELECT l.sire_id, l.dam_id, l.farm_id, s.serviced_on::text AS serviced_on, b.owning_farm_id
       FROM litters l JOIN services s ON s.id = l.service_id JOIN animals b ON b.id = l.sire_id
      WHERE l.deleted_at IS NULL AND b.owning_farm_id <> l.farm_id AND b.disposition = 'on_farm' AND b.keeping_farm_id = b.owning_farm_id
        AND s.serviced_on < $1::date - 60
        -- His own farm's services with him hold their days: the past loan must fit between them.
        AND NOT EXISTS (SELECT 1 FROM stud_bookings sb WHERE sb.buck_id = l.sire_id AND sb.during && daterange(s.serviced_on - 20, s.serviced_on + 30, '[]'))
      ORDER BY s.serviced_on DESC LIMIT 1`,
    [today],
  ));
  const bucksOf = (farmId: string, not: string[] = []) => withTenant({ coopId }, (tx) => rows<Candidate>(
    tx,
    `SELECT id, owning_farm_id FROM animals WHERE owning_farm_id = $1 AND keeping_farm_id = $1 AND sex = 'buck' AND lifecycle = 'breeding'
       AND disposition = 'on_farm' AND deleted_at IS NULL AND NOT (id = ANY($2::uuid[])) ORDER BY name, id LIMIT 1`,
    [farmId, not],
  ));
  const first: Candidate | undefined = past ? { id: past.sire_id, owning_farm_id: past.owning_farm_id } : (await bucksOf(actors.get('quillfeather')!.farmId!))[0];
  if (!first) return;
  const firstOwner = actors.get(keyOf(first.owning_farm_id)!)!;
  const secondFarmKey = keyOf(first.owning_farm_id) === 'hazelrun' ? 'quillfeather' : 'hazelrun';
  const [second] = await bucksOf(actors.get(secondFarmKey)!.farmId!, [first.id]);
  if (!second) return;
  const secondOwner = actors.get(secondFarmKey)!;

  const offerA = await offerBuck(firstOwner, studOfferSchema.parse({
    buckId: first.id, loan: true, service: true, loanFeeCents: 3_000, serviceFeeCents: 1_500, longestLoanDays: 42, restDays: 10,
    terms: 'He travels in his own carrier with a week of his pellets. Keep him apart from your bucks, and call if he goes off his feed.',
    travelArea: 'Within Tamsin County', lastHealthCheckOn: addDays(today, -40), rhdv2VaccinatedOn: addDays(today, -150),
  }));
  const offerB = await offerBuck(secondOwner, studOfferSchema.parse({
    buckId: second.id, loan: true, service: false, loanFeeCents: 2_500, longestLoanDays: 28, restDays: 14,
    terms: 'Loaned for one breeding round at a time; back with the papers he left with.', travelArea: 'Tamsin and Harrow counties',
    lastHealthCheckOn: addDays(today, -20), knownConditions: 'A healed nick on the left ear.',
  }));

  if (past) {
    const borrower = actors.get(keyOf(past.farm_id)!)!;
    await withTenant({ coopId }, (tx) => importReturnedLoan(tx, {
      coopId, offerId: offerA.offerId, buckId: first.id, ownerFarmId: first.owning_farm_id, borrowerFarmId: past.farm_id, doeIds: [past.dam_id],
      startOn: addDays(past.serviced_on, -3), endOn: addDays(past.serviced_on, 11), feeCents: 3_000, ownerUserId: firstOwner.id, borrowerUserId: borrower.id,
    }));
  }

  // In care now: lent to another farm for three weeks from today.
  const carerKey = ['wrenfield', 'saltbush', 'cobble-creek'].find((k) => actors.get(k)!.farmId !== first.owning_farm_id)!;
  const carer = actors.get(carerKey)!;
  const doeOf = async (farmId: string) => (await withTenant({ coopId }, (tx) => rows<{ id: string }>(
    tx, `SELECT id FROM animals WHERE keeping_farm_id = $1 AND sex = 'doe' AND lifecycle = 'breeding' AND disposition = 'on_farm' AND deleted_at IS NULL ORDER BY name, id LIMIT 1`, [farmId],
  )))[0]?.id;
  const carersDoe = await doeOf(carer.farmId!);
  if (carersDoe) {
    const { loan } = await requestStud(carer, studRequestSchema.parse({
      offerId: offerA.offerId, kind: 'loan', doeIds: [carersDoe], farmId: carer.farmId, startOn: today, endOn: addDays(today, 20), message: 'For two of our does this round.',
    }));
    const accepted = await acceptRequest(firstOwner, loan.id, studVersionSchema.parse({ version: loan.version }));
    const recorded = await recordCustodyStep(firstOwner, loan.id, 'hand_over', { version: accepted.version, on: today, weightGrams: 4_700, conditionNotes: 'Bright eyes, clean vent, good weight.', photoId: null });
    await confirmCustodyStep(carer, loan.id, 'hand_over', studVersionSchema.parse({ version: recorded.version }));
  }

  // Waiting for its owner: a request for the second buck.
  const askerKey = ['cobble-creek', 'saltbush', 'wrenfield'].find((k) => ![second.owning_farm_id, carer.farmId].includes(actors.get(k)!.farmId!))!;
  const asker = actors.get(askerKey)!;
  const askersDoe = await doeOf(asker.farmId!);
  if (askersDoe) {
    await requestStud(asker, studRequestSchema.parse({
      offerId: offerB.offerId, kind: 'loan', doeIds: [askersDoe], farmId: asker.farmId, startOn: addDays(today, 10), endOn: addDays(today, 24),
      message: 'Our line needs new blood; could he come after the county fair?',
    }));
  }
}
