import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { AnimalDto, StudLoanDto } from '@burrowline/shared';
import { checkReturnOverdue } from '../../packages/server/src/modules/stud-share/stud-loans.service';
import { farmToday, taskRows } from '../support/almanac';
import { appDb, asTenant } from '../support/db';
import { createTestCoop, TEST_PASSWORD, type TestCoop } from '../support/factories';
import { addAnimalAs } from '../support/herd';
import { queuedMailTo } from '../support/mail';
import {
  acceptAs, custodyStep, doeOf, feeTransfersOf, inDays, moveLoanDates, noticesOf, offeredBuck, requestAs, thirdFarmMember,
} from '../support/stud-share';
import { signedInAgent, testApp, type Agent } from '../support/test-app';

const handle = testApp();
let coop: TestCoop;
let owner: Agent;
let borrower: Agent;

beforeAll(async () => {
  coop = await createTestCoop();
  [owner, borrower] = await Promise.all([
    signedInAgent(coop.member.email, TEST_PASSWORD, handle),
    signedInAgent(coop.otherFarmMember.email, TEST_PASSWORD, handle),
  ]);
});
afterAll(async () => {
  await handle.close();
});

const bookingsOf = (buckId: string) =>
  asTenant(coop.id, async (c) => (await c.query(`SELECT loan_id, service_id, lower(during)::text AS start_on FROM stud_bookings WHERE buck_id = $1 ORDER BY lower(during)`, [buckId])).rows);

describe('no double booking, held by the database', () => {
  it('when two overlapping requests are accepted one after the other, then the second answers 409 naming the days and stays waiting', async () => {
    const { buck, card } = await offeredBuck(coop, {}, { name: 'Hawthorn' });
    const doe = await doeOf(coop.otherFarmMember);
    const first = await requestAs(coop.otherFarmMember, card.offerId, [doe.id], { startOn: inDays(10), endOn: inDays(20) });
    const second = await requestAs(coop.otherFarmMember, card.offerId, [doe.id], { startOn: inDays(18), endOn: inDays(25) });
    await owner.post(`/api/stud-share/loans/${first.id}/accept`).send({ version: first.version }).expect(200);
    const clash = await owner.post(`/api/stud-share/loans/${second.id}/accept`).send({ version: second.version });
    expect(clash.status).toBe(409);
    expect(clash.body.error.message).toMatch(/^Hawthorn .* is already lent, visited or serving at home on some of .*; this request stays as it was/);
    expect((await owner.get(`/api/stud-share/loans/${second.id}`).expect(200)).body.state).toBe('requested');
    expect(await bookingsOf(buck.id)).toEqual([{ loan_id: first.id, service_id: null, start_on: inDays(10) }]);
    expect(await feeTransfersOf(coop.id, second.id)).toEqual([]);
  });

  it('when a loan would start within his rest after another, then it is refused; after the rest it is accepted', async () => {
    const { card } = await offeredBuck(coop, { restDays: 7 });
    const doe = await doeOf(coop.otherFarmMember);
    await acceptAs(coop.member, await requestAs(coop.otherFarmMember, card.offerId, [doe.id], { startOn: inDays(10), endOn: inDays(20) }));
    const tooSoon = await requestAs(coop.otherFarmMember, card.offerId, [doe.id], { startOn: inDays(24), endOn: inDays(30) });
    const refused = await owner.post(`/api/stud-share/loans/${tooSoon.id}/accept`).send({ version: tooSoon.version });
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toMatch(/rests at home between loans/);
    const rested = await requestAs(coop.otherFarmMember, card.offerId, [doe.id], { startOn: inDays(28), endOn: inDays(34) });
    await owner.post(`/api/stud-share/loans/${rested.id}/accept`).send({ version: rested.version }).expect(200);
  });

  it('when his own farm records a service with him on a day he is lent out, then it is refused; and a loan over a day of his own service is refused', async () => {
    const { buck, card } = await offeredBuck(coop);
    const ownDoe = await doeOf(coop.member);
    const loan = await acceptAs(coop.member, await requestAs(coop.otherFarmMember, card.offerId, [(await doeOf(coop.otherFarmMember)).id], { startOn: farmToday(), endOn: inDays(6) }));
    expect(loan.state).toBe('accepted');
    const service = await owner.post('/api/services').send({ doeId: ownDoe.id, buckId: buck.id, servicedOn: farmToday(), confirm: true });
    expect(service.status).toBe(409);
    expect(service.body.error.message).toMatch(/lent out or booked on that day/);

    const { buck: other, card: otherCard } = await offeredBuck(coop);
    await owner.post('/api/services').send({ doeId: ownDoe.id, buckId: other.id, servicedOn: farmToday(), confirm: true }).expect(201);
    const over = await requestAs(coop.otherFarmMember, otherCard.offerId, [(await doeOf(coop.otherFarmMember)).id], { startOn: farmToday(), endOn: inDays(5) });
    const refused = await owner.post(`/api/stud-share/loans/${over.id}/accept`).send({ version: over.version });
    expect(refused.status).toBe(409);
    expect((await bookingsOf(other.id)).map((b: { service_id: string | null }) => b.service_id !== null)).toEqual([true]);
  });

  it('when 20 overlapping requests are accepted at the same moment, then exactly one succeeds and the others answer 409 with the reason', async () => {
    const { buck, card } = await offeredBuck(coop, {}, { name: 'Rowan' });
    const doe = await doeOf(coop.otherFarmMember);
    const requests: StudLoanDto[] = [];
    // Every pair overlaps (all hold days 39–50), so at most one can ever be accepted.
    for (let i = 0; i < 20; i++) requests.push(await requestAs(coop.otherFarmMember, card.offerId, [doe.id], { startOn: inDays(30 + (i % 10)), endOn: inDays(50) }));
    const answers = await Promise.all(requests.map((r) => owner.post(`/api/stud-share/loans/${r.id}/accept`).send({ version: r.version })));
    const statuses = answers.map((a) => a.status).sort();
    expect(statuses.filter((s) => s === 200)).toHaveLength(1);
    expect(statuses.filter((s) => s === 409)).toHaveLength(19);
    for (const refused of answers.filter((a) => a.status === 409)) expect(refused.body.error.message).toMatch(/Rowan .* already lent, visited or serving at home/);
    const winner = requests[answers.findIndex((a) => a.status === 200)]!;
    expect(await bookingsOf(buck.id)).toEqual([{ loan_id: winner.id, service_id: null, start_on: winner.startOn }]);
    const fees = await asTenant(coop.id, async (c) => (await c.query(
      `SELECT count(*)::int AS n FROM ledger_transfers WHERE source_type = 'stud_loan' AND source_id = ANY($1)`, [requests.map((r) => r.id)],
    )).rows[0].n);
    expect(fees).toBe(1);
  });
});

describe('hand-over to return', () => {
  it('when the buck is handed over and returned, then custody, the borrower\'s Herd and service form, quarantine on each receiving farm, his litter\'s pedigree and the fee all follow', async () => {
    // Buck and doe are half-siblings (one sire): their litter's COI is 1/8 (Wright's coefficient for
    // half-sib matings; Falconer & Mackay, Introduction to Quantitative Genetics, 4th ed., ch. 5).
    const commonSire = await addAnimalAs(coop.member, { sex: 'buck', name: 'Old Ash', birthDate: '2020-01-01' });
    const { buck, card } = await offeredBuck(coop, {}, { name: 'Alder', sireId: commonSire.id });
    const doe = await doeOf(coop.otherFarmMember, { name: 'Wren', sireId: commonSire.id });
    const loan = await acceptAs(coop.member, await requestAs(coop.otherFarmMember, card.offerId, [doe.id], { startOn: farmToday(), endOn: inDays(14) }));
    expect(await feeTransfersOf(coop.id, loan.id)).toEqual([{ id: `loan:${loan.id}:fee`, status: 'pending', amount_cents: 4_000 }]);

    // The owner records the hand-over; the borrower confirms it.
    const recorded = await owner.post(`/api/stud-share/loans/${loan.id}/hand-over`).send({ version: loan.version, on: farmToday(), weightGrams: 4_650, conditionNotes: 'Bright, good coat' });
    expect(recorded.status).toBe(200);
    expect(recorded.body.actions).toEqual([]);
    expect((await owner.post(`/api/stud-share/loans/${loan.id}/hand-over/confirm`).send({ version: recorded.body.version })).status).toBe(403);
    const confirmed = await borrower.post(`/api/stud-share/loans/${loan.id}/hand-over/confirm`).send({ version: recorded.body.version }).expect(200);
    expect(confirmed.body).toMatchObject({ state: 'handed_over', handOver: { on: farmToday(), weightGrams: 4_650, confirmedBy: { id: coop.otherFarmMember.id } } });

    const herd = await borrower.get('/api/animals?pageSize=200').expect(200);
    // The herd list's row says "on loan here"; his record names both farms.
    expect(herd.body.items.find((a: AnimalDto) => a.id === buck.id)).toMatchObject({ custody: 'on_loan_here' });
    const record = await borrower.get(`/api/animals/${buck.id}`).expect(200);
    expect(record.body).toMatchObject({ custody: 'on_loan_here', owningFarm: { id: coop.member.farmId }, keepingFarm: { id: coop.otherFarmMember.farmId } });
    const stock = await borrower.get('/api/almanac/breeding-stock').expect(200);
    expect(stock.body.bucks.find((b: { id: string }) => b.id === buck.id)).toMatchObject({ onLoanFrom: { id: coop.member.farmId } });
    const custody = await asTenant(coop.id, async (c) => (await c.query(`SELECT kind, to_farm_id FROM animal_custody_events WHERE animal_id = $1 ORDER BY created_at`, [buck.id])).rows);
    expect(custody.at(-1)).toEqual({ kind: 'lent', to_farm_id: coop.otherFarmMember.farmId });
    // The co-op's rule (30 days unless changed) from the day he arrived.
    const quarantineAtBorrower = (await taskRows(coop.id, { animalId: buck.id })).filter((t) => t.kind === 'quarantine_end');
    expect(quarantineAtBorrower).toHaveLength(1);
    expect(quarantineAtBorrower[0]).toMatchObject({ window_start: farmToday(), due_on: inDays(30) });

    // A service at the borrowing farm carries him as sire; the kit kept from it has the half-sib COI.
    const service = await borrower.post('/api/services').send({ doeId: doe.id, buckId: buck.id, servicedOn: farmToday(), confirm: true }).expect(201);
    expect(service.body).toMatchObject({ buck: { id: buck.id } });
    const kit = await addAnimalAs(coop.otherFarmMember, { sex: 'doe', name: 'Kit of the loan', birthDate: farmToday(), sireId: buck.id, damId: doe.id });
    const kitRecord = await borrower.get(`/api/animals/${kit.id}`).expect(200);
    expect(kitRecord.body.coi).toBeCloseTo(0.125, 10);

    // The borrower records the return; the owner confirms it.
    const back = await borrower.post(`/api/stud-share/loans/${loan.id}/return`).send({ version: confirmed.body.version, on: farmToday(), weightGrams: 4_500 }).expect(200);
    const returned = await owner.post(`/api/stud-share/loans/${loan.id}/return/confirm`).send({ version: back.body.version }).expect(200);
    expect(returned.body).toMatchObject({ state: 'returned', return: { on: farmToday(), weightGrams: 4_500 } });
    expect(returned.body.timeline.map((e: { kind: string }) => e.kind)).toEqual([
      'requested', 'accepted', 'hand_over_recorded', 'hand_over_confirmed', 'return_recorded', 'return_confirmed',
    ]);
    const ownHerd = await owner.get(`/api/animals/${buck.id}`).expect(200);
    expect(ownHerd.body).toMatchObject({ custody: 'at_home', keepingFarm: { id: coop.member.farmId } });
    // Home on the same day he left: his own farm gets a quarantine of its own.
    const farms = await asTenant(coop.id, async (c) => (await c.query(`SELECT farm_id FROM almanac_tasks WHERE animal_id = $1 AND kind = 'quarantine_end' ORDER BY created_at`, [buck.id])).rows.map((r) => r.farm_id));
    expect(farms).toEqual([coop.otherFarmMember.farmId, coop.member.farmId]);

    // The fee is posted once at the return; confirming again changes nothing.
    expect(await feeTransfersOf(coop.id, loan.id)).toEqual([{ id: `loan:${loan.id}:fee`, status: 'posted', amount_cents: 4_000 }]);
    expect((await owner.post(`/api/stud-share/loans/${loan.id}/return/confirm`).send({ version: returned.body.version })).status).toBe(409);
    expect(await feeTransfersOf(coop.id, loan.id)).toEqual([{ id: `loan:${loan.id}:fee`, status: 'posted', amount_cents: 4_000 }]);
    const audit = await asTenant(coop.id, async (c) => (await c.query(`SELECT action FROM audit_events WHERE subject_id = $1 ORDER BY created_at`, [loan.id])).rows.map((r) => r.action));
    expect(audit).toEqual(['stud_loan.requested', 'stud_loan.accepted', 'stud_loan.hand_over_recorded', 'stud_loan.hand_over_confirmed', 'stud_loan.return_recorded', 'stud_loan.return_confirmed']);
    const kinds = (await noticesOf(coop.id, loan.id)).map((n) => n.kind);
    expect(kinds).toEqual(expect.arrayContaining(['stud.requested', 'stud.answered', 'stud.handed-over', 'stud.returned']));
  });

  it('when a hand-over is recorded out of the loan\'s dates, in the future, or twice, then it is refused', async () => {
    const { card } = await offeredBuck(coop);
    const loan = await acceptAs(coop.member, await requestAs(coop.otherFarmMember, card.offerId, [(await doeOf(coop.otherFarmMember)).id], { startOn: inDays(2), endOn: inDays(9) }));
    const early = await owner.post(`/api/stud-share/loans/${loan.id}/hand-over`).send({ version: loan.version, on: farmToday() });
    expect(early.status).toBe(400);
    expect(early.body.error.details.on[0]).toMatch(/within the loan/);
    const future = await owner.post(`/api/stud-share/loans/${loan.id}/hand-over`).send({ version: loan.version, on: inDays(3) });
    expect(future.status).toBe(400);
    expect(future.body.error.details.on[0]).toMatch(/before it happens/);
    const notReturned = await owner.post(`/api/stud-share/loans/${loan.id}/return`).send({ version: loan.version, on: farmToday() });
    expect(notReturned.status).toBe(409);
  });

  it('when a stud service visit is accepted and then recorded, then its fee goes pending, then posted, once', async () => {
    const { card } = await offeredBuck(coop);
    const loan = await acceptAs(coop.member, await requestAs(coop.otherFarmMember, card.offerId, [(await doeOf(coop.otherFarmMember)).id], { kind: 'service', startOn: farmToday(), endOn: farmToday() }));
    expect(await feeTransfersOf(coop.id, loan.id)).toEqual([{ id: `stud-service:${loan.id}:fee`, status: 'pending', amount_cents: 1_500 }]);
    expect((await borrower.post(`/api/stud-share/loans/${loan.id}/service`).send({ version: loan.version })).status).toBe(403);
    const served = await owner.post(`/api/stud-share/loans/${loan.id}/service`).send({ version: loan.version }).expect(200);
    expect(served.body.state).toBe('served');
    expect(await feeTransfersOf(coop.id, loan.id)).toEqual([{ id: `stud-service:${loan.id}:fee`, status: 'posted', amount_cents: 1_500 }]);
    expect((await owner.post(`/api/stud-share/loans/${loan.id}/service`).send({ version: served.body.version })).status).toBe(409);
  });
});

describe('an overdue return', () => {
  it('when the buck is a day past his return, then both farms are told once (bell and e-mail), a third farm nothing, and a re-run adds nothing', async () => {
    const third = await thirdFarmMember(coop);
    const { card } = await offeredBuck(coop, {}, { name: 'Sorrel' });
    const accepted = await acceptAs(coop.member, await requestAs(coop.otherFarmMember, card.offerId, [(await doeOf(coop.otherFarmMember)).id], { startOn: farmToday(), endOn: inDays(5) }));
    const loan = await custodyStep(coop.member, coop.otherFarmMember, accepted, 'hand_over', { on: farmToday() });
    expect(loan.state).toBe('handed_over');
    const queued = await appDb(async (c) => (await c.query(`SELECT start_after FROM pgboss.job WHERE name = 'stud-return-overdue' AND data->>'loanId' = $1`, [loan.id])).rows);
    expect(queued).toHaveLength(1);
    expect(new Date(queued[0].start_after).toISOString()).toBe(`${inDays(6)}T12:00:00.000Z`);
    expect(await checkReturnOverdue({ coopId: coop.id, loanId: loan.id })).toBe('not overdue');

    await moveLoanDates(coop.id, loan.id, inDays(-20), inDays(-2));
    expect(await checkReturnOverdue({ coopId: coop.id, loanId: loan.id })).toBe('told');
    expect(await checkReturnOverdue({ coopId: coop.id, loanId: loan.id })).toBe('already told');
    const told = (await noticesOf(coop.id, loan.id)).filter((n) => n.kind === 'stud.return-overdue');
    expect(told.map((n) => n.user_id).sort()).toEqual([coop.admin.id, coop.member.id, coop.otherFarmMember.id].sort());
    expect(told[0]!.title).toMatch(/^Overdue: Sorrel/);
    for (const person of [coop.member, coop.otherFarmMember]) {
      expect((await queuedMailTo(person.email)).filter((m) => /Overdue: Sorrel/.test(m.subject))).toHaveLength(1);
    }
    expect(await queuedMailTo(third.email)).toEqual([]);
    const seen = await borrower.get(`/api/stud-share/loans/${loan.id}`).expect(200);
    expect(seen.body.overdue).toBe(true);
    expect(seen.body.timeline.at(-1)).toMatchObject({ kind: 'overdue' });
  });
});
