import { randomUUID } from 'node:crypto';
import {
  addDays, studCustodyStepSchema, studOfferSchema, studRequestSchema, studVersionSchema, type BuckCardDto, type StudCustodyStepInput,
  type StudLoanDto, type StudOfferBody, type StudRequestInput,
} from '@burrowline/shared';
import { connectDatabase } from '../../packages/server/src/composition/database';
import { withTenant } from '../../packages/server/src/db/tenant';
import { createFarm } from '../../packages/server/src/modules/farms/farms.service';
import { offerBuck } from '../../packages/server/src/modules/stud-share/stud-offers.service';
import {
  acceptRequest, confirmCustodyStep, recordCustodyStep, requestStud,
} from '../../packages/server/src/modules/stud-share/stud-loans.service';
import { farmToday } from './almanac';
import { asTenant } from './db';
import { createTestMember, type TestCoop, type TestPerson } from './factories';
import { actorOf, addAnimalAs } from './herd';

/** A farm day `n` days from the test farms' today (Chicago's clock). */
export const inDays = (n: number) => addDays(farmToday(), n);

/**
 * A buck of farm A (`coop.member`) offered to the co-op, on loan and for service, with fees of 40.00 per
 * loan and 15.00 per service unless `offer` says otherwise.
 */
export async function offeredBuck(coop: TestCoop, offer: Partial<StudOfferBody> = {}, fields: { name?: string; sireId?: string; damId?: string; breedId?: string } = {}) {
  connectDatabase(process.env.DATABASE_URL!);
  const buck = await addAnimalAs(coop.member, { sex: 'buck', name: fields.name ?? `Bramble ${randomUUID().slice(0, 4)}`, birthDate: '2022-11-02', sireId: fields.sireId, damId: fields.damId, breedId: fields.breedId });
  const card: BuckCardDto = await offerBuck(actorOf(coop.member), studOfferSchema.parse({
    buckId: buck.id, loan: true, service: true, loanFeeCents: 4_000, serviceFeeCents: 1_500, longestLoanDays: 42, restDays: 7, ...offer,
  }));
  return { buck, card };
}

/** A grown doe kept by the person's farm. */
export async function doeOf(person: TestPerson, fields: { name?: string; sireId?: string; damId?: string; breedId?: string } = {}) {
  connectDatabase(process.env.DATABASE_URL!);
  return addAnimalAs(person, { sex: 'doe', name: fields.name ?? `Clover ${randomUUID().slice(0, 4)}`, birthDate: '2023-01-10', sireId: fields.sireId, damId: fields.damId, breedId: fields.breedId });
}

/** Farm B's member asks for the offer (a loan over `days` from `from` days ahead unless the body says otherwise). */
export async function requestAs(person: TestPerson, offerId: string, doeIds: string[], body: Partial<StudRequestInput> = {}): Promise<StudLoanDto> {
  connectDatabase(process.env.DATABASE_URL!);
  const { loan } = await requestStud(actorOf(person), studRequestSchema.parse({
    offerId, kind: 'loan', doeIds, farmId: person.farmId, startOn: inDays(3), endOn: inDays(20), ...body,
  }));
  return loan;
}

export async function acceptAs(person: TestPerson, loan: StudLoanDto): Promise<StudLoanDto> {
  return acceptRequest(actorOf(person), loan.id, studVersionSchema.parse({ version: loan.version }));
}

/** Records a hand-over or return as `recorder` and confirms it as `confirmer` (through the services). */
export async function custodyStep(
  recorder: TestPerson,
  confirmer: TestPerson,
  loan: StudLoanDto,
  step: 'hand_over' | 'return',
  body: Partial<StudCustodyStepInput> & { on: string },
): Promise<StudLoanDto> {
  const recorded = await recordCustodyStep(actorOf(recorder), loan.id, step, studCustodyStepSchema.parse({ version: loan.version, ...body }));
  return confirmCustodyStep(actorOf(confirmer), loan.id, step, studVersionSchema.parse({ version: recorded.version }));
}

/** Sets a loan's dates in the database (to put a loan in the past: requests are for today on). */
export async function moveLoanDates(coopId: string, loanId: string, startOn: string, endOn: string): Promise<void> {
  await asTenant(coopId, async (c) => {
    await c.query('UPDATE stud_loans SET start_on = $2, end_on = $3 WHERE id = $1', [loanId, startOn, endOn]);
    await c.query(`UPDATE stud_bookings SET during = daterange($2::date, $3::date, '[]'), held = daterange($2::date, $3::date + 1) WHERE loan_id = $1`, [loanId, startOn, endOn]);
  }, { commit: true });
}

/** A third farm of the co-op with one member: party to nothing, it must hear of nothing. */
export async function thirdFarmMember(coop: TestCoop): Promise<TestPerson> {
  connectDatabase(process.env.DATABASE_URL!);
  const farm = await withTenant({ coopId: coop.id }, (tx) => createFarm(coop.id, {
    name: `Farm C-${randomUUID().slice(0, 8)}`, location: 'Test County', timeZone: 'America/Chicago', weightUnit: 'lb_oz', temperatureUnit: 'F', breedsKept: [], description: '',
  }, tx));
  return createTestMember({ ...coop, farms: [...coop.farms, { id: farm.id, name: farm.name }] }, { farmIndex: coop.farms.length });
}

/** The Ledger transfers of a loan, as stored. */
export async function feeTransfersOf(coopId: string, loanId: string) {
  return asTenant(coopId, async (c) => (await c.query(
    `SELECT id, status, amount_cents::int AS amount_cents FROM ledger_transfers WHERE source_type = 'stud_loan' AND source_id = $1 ORDER BY id`,
    [loanId],
  )).rows as { id: string; status: string; amount_cents: number }[]);
}

/** The notifications people received about a loan (any kind), as stored. */
export async function noticesOf(coopId: string, loanId: string) {
  return asTenant(coopId, async (c) => (await c.query(
    `SELECT user_id, kind, title FROM notifications WHERE link = $1 ORDER BY created_at`,
    [`/stud-share/loans/${loanId}`],
  )).rows as { user_id: string; kind: string; title: string }[]);
}
