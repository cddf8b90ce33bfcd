import { connectDatabase } from '../../packages/server/src/composition/database';
import { recordCustodyStep, requestStud } from '../../packages/server/src/modules/stud-share/stud-loans.service';
import { asTenant } from './db';
import type { TestCoop } from './factories';
import { actorOf, addAnimalAs } from './herd';
import { acceptAs, custodyStep, doeOf, inDays, offeredBuck, requestAs } from './stud-share';
import { farmToday } from './almanac';

/** Stud Share targets of the matrix: a farm-A buck offered, with a farm-B request for him at some step. */
export const studTargets = ['studRequestA', 'studAcceptedA', 'studHandOverRecordedA', 'studLentA', 'studReturnRecordedA', 'studVisitA'] as const;
export type StudTarget = (typeof studTargets)[number];

export interface StudIds {
  offerId?: string;
  offerVersion?: number;
  buckId?: string;
  /** A buck of farm A not offered yet. */
  freshBuckId?: string;
  loanId?: string;
  loanVersion?: number;
  /** A doe of farm A and one of farm B, for the finder. */
  doeAId?: string;
  doeBId?: string;
}

/** Made fresh for every cell that may change it: a new buck each time, so no cell's booking stands in another's way. */
export async function studTarget(coop: TestCoop, target: string): Promise<StudIds> {
  if (!(studTargets as readonly string[]).includes(target)) return {};
  connectDatabase(process.env.DATABASE_URL!);
  const { buck, card } = await offeredBuck(coop);
  const freshBuck = await addAnimalAs(coop.member, { sex: 'buck', name: 'Matrix buck', birthDate: '2022-05-01' });
  const doeA = await doeOf(coop.member);
  const doeB = await doeOf(coop.otherFarmMember);
  const base = { offerId: card.offerId, offerVersion: card.version, buckId: buck.id, freshBuckId: freshBuck.id, doeAId: doeA.id, doeBId: doeB.id };
  let loan;
  if (target === 'studVisitA') {
    loan = await acceptAs(coop.member, (await requestStud(actorOf(coop.otherFarmMember), {
      offerId: card.offerId, kind: 'service', doeIds: [doeB.id], farmId: coop.otherFarmMember.farmId!, startOn: farmToday(), endOn: farmToday(), message: '',
    })).loan);
  } else {
    loan = await requestAs(coop.otherFarmMember, card.offerId, [doeB.id], { startOn: farmToday(), endOn: inDays(10) });
    if (target !== 'studRequestA') loan = await acceptAs(coop.member, loan);
    if (target === 'studHandOverRecordedA') {
      loan = await recordCustodyStep(actorOf(coop.member), loan.id, 'hand_over', { version: loan.version, on: farmToday(), weightGrams: null, conditionNotes: '', photoId: null });
    }
    if (target === 'studLentA' || target === 'studReturnRecordedA') loan = await custodyStep(coop.member, coop.otherFarmMember, loan, 'hand_over', { on: farmToday() });
    if (target === 'studReturnRecordedA') {
      loan = await recordCustodyStep(actorOf(coop.otherFarmMember), loan.id, 'return', { version: loan.version, on: farmToday(), weightGrams: null, conditionNotes: '', photoId: null });
    }
  }
  return { ...base, loanId: loan.id, loanVersion: loan.version };
}

export function studBody(coop: TestCoop, body: string | undefined, ids: StudIds): object | undefined {
  switch (body) {
    case 'studOffer':
      return { buckId: ids.freshBuckId, loan: true, service: true, loanFeeCents: 1_000, serviceFeeCents: 500 };
    case 'studOfferUpdate':
      return { version: ids.offerVersion, offer: { buckId: ids.buckId, loan: true, service: true, loanFeeCents: 1_200 } };
    case 'studOfferVersion':
      return { version: ids.offerVersion };
    case 'studRequest':
      return { offerId: ids.offerId, kind: 'loan', doeIds: [ids.doeBId], farmId: coop.farms[1]!.id, startOn: inDays(60), endOn: inDays(65) };
    case 'studLoanVersion':
      return { version: ids.loanVersion };
    case 'studDecline':
      return { version: ids.loanVersion, reason: 'Checked by the authorization matrix' };
    case 'studPropose':
      return { version: ids.loanVersion, startOn: inDays(40), endOn: inDays(45) };
    case 'studProposalAnswer':
      return { version: ids.loanVersion, accept: true };
    case 'studCustodyStep':
      return { version: ids.loanVersion, on: farmToday() };
    case 'farmCoordinates':
      return { latitude: 44.98, longitude: -93.27 };
    default:
      return undefined;
  }
}

/** What a refused call must leave as it was: offers, requests and the days held. */
export async function studStateOf(coopId: string) {
  return asTenant(coopId, async (c) => ({
    offers: (await c.query('SELECT id, status, version FROM stud_offers ORDER BY id')).rows,
    loans: (await c.query('SELECT id, state, version FROM stud_loans ORDER BY id')).rows,
    bookings: (await c.query('SELECT count(*)::int AS n FROM stud_bookings')).rows[0].n,
    farms: (await c.query('SELECT id, latitude, longitude FROM farms ORDER BY id')).rows,
  }));
}
