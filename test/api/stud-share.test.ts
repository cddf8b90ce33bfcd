import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BuckCardDto, StudLoanDto } from '@burrowline/shared';
import { asTenant } from '../support/db';
import { createTestCoop, TEST_PASSWORD, type TestCoop } from '../support/factories';
import { waitForMail } from '../support/mail';
import {
  acceptAs, doeOf, feeTransfersOf, inDays, noticesOf, offeredBuck, requestAs, thirdFarmMember,
} from '../support/stud-share';
import { actorOf, addAnimalAs } from '../support/herd';
import { testImage } from '../support/herd-files';
import { loadConfig } from '../../packages/server/src/config/env';
import { addAnimalPhotos } from '../../packages/server/src/modules/photos/photos.service';
import { serviceAs } from '../support/almanac';
import { signedInAgent, testApp, type Agent } from '../support/test-app';

const handle = testApp();
let coop: TestCoop;
let owner: Agent;
let ownersApprentice: Agent;
let borrower: Agent;

beforeAll(async () => {
  coop = await createTestCoop();
  [owner, ownersApprentice, borrower] = await Promise.all([
    signedInAgent(coop.member.email, TEST_PASSWORD, handle),
    signedInAgent(coop.apprentice.email, TEST_PASSWORD, handle),
    signedInAgent(coop.otherFarmMember.email, TEST_PASSWORD, handle),
  ]);
});
afterAll(async () => {
  await handle.close();
});

const offerBody = (buckId: string, extra: Record<string, unknown> = {}) => ({
  buckId, loan: true, service: false, loanFeeCents: 3_500, serviceFeeCents: null, longestLoanDays: 30, restDays: 5,
  terms: 'Keep him apart from other bucks.', travelArea: 'Within Harlan County', lastHealthCheckOn: '2024-05-01', rhdv2VaccinatedOn: '2024-04-12',
  knownConditions: '', ...extra,
});

describe('offering a buck', () => {
  it('when a member offers a buck of her farm, then the co-op reads his card with the offer, his health facts and "proven" from the records', async () => {
    const buck = await addAnimalAs(coop.member, { sex: 'buck', name: 'Juniper', birthDate: '2022-06-01' });
    const res = await owner.post('/api/stud-share/offers').send(offerBody(buck.id));
    expect(res.status).toBe(201);
    const card = res.body as BuckCardDto;
    expect(card).toMatchObject({
      status: 'offered', loan: true, service: false, loanFeeCents: 3_500, feesVisible: true, longestLoanDays: 30, restDays: 5,
      travelArea: 'Within Harlan County', canEdit: true, canRequest: false,
      health: { lastHealthCheckOn: '2024-05-01', rhdv2VaccinatedOn: '2024-04-12', proven: false, littersSired: 0 },
    });
    expect(card.buck).toMatchObject({ id: buck.id, name: 'Juniper', sex: 'buck' });

    const seen = await borrower.get(`/api/stud-share/offers/${card.offerId}`).expect(200);
    expect(seen.body).toMatchObject({ offerId: card.offerId, loanFeeCents: 3_500, canEdit: false, canRequest: true });
    // The apprentice sees the buck, never the fee.
    const apprenticeSees = await ownersApprentice.get(`/api/stud-share/offers/${card.offerId}`).expect(200);
    expect(apprenticeSees.body).toMatchObject({ loanFeeCents: null, serviceFeeCents: null, feesVisible: false, canEdit: false, canRequest: false });
    const listed = await borrower.get('/api/stud-share/offers?pageSize=100').expect(200);
    expect(listed.body.items.map((c: BuckCardDto) => c.offerId)).toContain(card.offerId);
  });

  it('when he has sired a recorded litter, then his card says proven, counted from the records', async () => {
    const { buck, card } = await offeredBuck(coop);
    const doe = await doeOf(coop.member);
    const service = await serviceAs(coop.member, { doeId: doe.id, buckId: buck.id, servicedOn: inDays(-40) });
    await asTenant(coop.id, async (c) => {
      await c.query(
        `INSERT INTO litters (coop_id, farm_id, service_id, dam_id, sire_id, kindled_on, born_alive, born_dead) VALUES ($1, $2, $3, $4, $5, $6, 7, 0)`,
        [coop.id, coop.member.farmId, service.id, doe.id, buck.id, inDays(-9)],
      );
    }, { commit: true });
    const seen = await borrower.get(`/api/stud-share/offers/${card.offerId}`).expect(200);
    expect(seen.body.health).toMatchObject({ proven: true, littersSired: 1 });
    expect(seen.body.getRecord).toMatchObject({ littersSired: 1, meanBornAlive: 7 });
  });

  it('when someone not of his farm, an apprentice, or for a doe tries to offer, then it is refused and nothing is stored', async () => {
    const buck = await addAnimalAs(coop.member, { sex: 'buck', name: 'Not yours' });
    const doe = await addAnimalAs(coop.member, { sex: 'doe' });
    const other = await createTestCoop();
    const foreign = await signedInAgent(other.member.email, TEST_PASSWORD, handle);

    expect((await borrower.post('/api/stud-share/offers').send(offerBody(buck.id))).status).toBe(403);
    expect((await ownersApprentice.post('/api/stud-share/offers').send(offerBody(buck.id))).status).toBe(403);
    expect((await foreign.post('/api/stud-share/offers').send(offerBody(buck.id))).status).toBe(404);
    const asDoe = await owner.post('/api/stud-share/offers').send(offerBody(doe.id));
    expect(asDoe.status).toBe(400);
    expect(asDoe.body.error.details.buckId[0]).toMatch(/is a doe/);
    const nothing = await owner.post('/api/stud-share/offers').send(offerBody(buck.id, { loan: false, service: false }));
    expect(nothing.status).toBe(400);
    expect(nothing.body.error.details.loan[0]).toMatch(/on loan, for stud service, or both/);
    const stored = await asTenant(coop.id, async (c) => (await c.query('SELECT count(*)::int AS n FROM stud_offers WHERE buck_id = ANY($1)', [[buck.id, doe.id]])).rows[0].n);
    expect(stored).toBe(0);

    await owner.post('/api/stud-share/offers').send(offerBody(buck.id)).expect(201);
    const twice = await owner.post('/api/stud-share/offers').send(offerBody(buck.id));
    expect(twice.status).toBe(409);
  });

  it('when the owner withdraws an offer, then other farms no longer find his card; offered again, he is back; a stale version is refused', async () => {
    const { card } = await offeredBuck(coop);
    const withdrawn = await owner.post(`/api/stud-share/offers/${card.offerId}/withdraw`).send({ version: card.version }).expect(200);
    expect(withdrawn.body.status).toBe('withdrawn');
    await borrower.get(`/api/stud-share/offers/${card.offerId}`).expect(404);
    const listed = await borrower.get('/api/stud-share/offers?pageSize=100').expect(200);
    expect(listed.body.items.map((c: BuckCardDto) => c.offerId)).not.toContain(card.offerId);
    const mine = await owner.get('/api/stud-share/offers?scope=mine&pageSize=100').expect(200);
    expect(mine.body.items.find((c: BuckCardDto) => c.offerId === card.offerId)?.status).toBe('withdrawn');
    expect((await owner.post(`/api/stud-share/offers/${card.offerId}/publish`).send({ version: card.version })).status).toBe(409);
    await owner.post(`/api/stud-share/offers/${card.offerId}/publish`).send({ version: withdrawn.body.version }).expect(200);
    await borrower.get(`/api/stud-share/offers/${card.offerId}`).expect(200);
  });

  it('when the owner edits his offer, then the new terms show and the change is kept in its history; the other farm may not edit', async () => {
    const { buck, card } = await offeredBuck(coop);
    const body = { version: card.version, offer: offerBody(buck.id, { loanFeeCents: 5_000, service: true, serviceFeeCents: 2_000 }) };
    expect((await borrower.put(`/api/stud-share/offers/${card.offerId}`).send(body)).status).toBe(403);
    const res = await owner.put(`/api/stud-share/offers/${card.offerId}`).send(body).expect(200);
    expect(res.body).toMatchObject({ loanFeeCents: 5_000, serviceFeeCents: 2_000, service: true, version: card.version + 1 });
    const history = await asTenant(coop.id, async (c) => (await c.query(`SELECT changes FROM record_changes WHERE record_id = $1`, [card.offerId])).rows);
    expect(history[0].changes.loan_fee_cents).toEqual([4_000, 5_000]);
    expect((await owner.put(`/api/stud-share/offers/${card.offerId}`).send(body)).status).toBe(409);
  });
});

describe('requesting a buck', () => {
  it('when a member requests a loan, then the owner\'s farm is told at once (bell and e-mail with a link), never the requester nor a third farm', async () => {
    const third = await thirdFarmMember(coop);
    const { card } = await offeredBuck(coop, {}, { name: 'Bramble' });
    const doe = await doeOf(coop.otherFarmMember, { name: 'Clover' });
    const res = await borrower.post('/api/stud-share/loans').send({
      offerId: card.offerId, kind: 'loan', doeIds: [doe.id], farmId: coop.otherFarmMember.farmId, startOn: inDays(5), endOn: inDays(19), message: 'For her spring litter',
    });
    expect(res.status).toBe(201);
    const loan = res.body as StudLoanDto;
    expect(loan).toMatchObject({ state: 'requested', kind: 'loan', feeCents: 4_000, actions: ['cancel'] });
    expect(loan.timeline.map((e) => e.kind)).toEqual(['requested']);
    expect(loan.does.map((d) => d.id)).toEqual([doe.id]);

    const told = await noticesOf(coop.id, loan.id);
    expect(told.map((n) => n.user_id).sort()).toEqual([coop.admin.id, coop.member.id].sort());
    expect(told.every((n) => n.kind === 'stud.requested' && /asks for Bramble/.test(n.title))).toBe(true);
    const mail = await waitForMail(coop.member.email, { subject: /asks for Bramble/ });
    expect(mail.text).toContain(`/stud-share/loans/${loan.id}`);
    expect(told.map((n) => n.user_id)).not.toContain(third.id);
    expect(told.map((n) => n.user_id)).not.toContain(coop.apprentice.id);

    // The owner sees the request with its actions; a third farm cannot know it exists.
    const seen = await owner.get(`/api/stud-share/loans/${loan.id}`).expect(200);
    expect(seen.body.actions).toEqual(['accept', 'decline', 'propose']);
    const thirdAgent = await signedInAgent(third.email, TEST_PASSWORD, handle);
    await thirdAgent.get(`/api/stud-share/loans/${loan.id}`).expect(404);
    expect((await thirdAgent.post(`/api/stud-share/loans/${loan.id}/accept`).send({ version: 0 })).status).toBe(404);
    const apprenticeSees = await ownersApprentice.get(`/api/stud-share/loans/${loan.id}`).expect(200);
    expect(apprenticeSees.body).toMatchObject({ feeCents: null, feesVisible: false, actions: [] });
    expect((await ownersApprentice.post(`/api/stud-share/loans/${loan.id}/accept`).send({ version: 0 })).status).toBe(403);
  });

  it('when a request breaks a rule, then it is refused with the reason: own buck, kind not offered, past or too long, a doe not kept', async () => {
    const { card } = await offeredBuck(coop, { service: false, longestLoanDays: 10 });
    const doe = await doeOf(coop.otherFarmMember);
    const ownDoe = await doeOf(coop.member);
    const base = { offerId: card.offerId, kind: 'loan', doeIds: [doe.id], farmId: coop.otherFarmMember.farmId, startOn: inDays(2), endOn: inDays(8) };
    const refusal = async (agent: Agent, body: Record<string, unknown>) => {
      const res = await agent.post('/api/stud-share/loans').send({ ...base, ...body });
      expect(res.status).toBe(400);
      return res.body.error.details as Record<string, string[]>;
    };
    expect((await refusal(owner, { doeIds: [ownDoe.id], farmId: coop.member.farmId })).offerId?.[0]).toMatch(/your own farm's buck/);
    expect((await refusal(borrower, { kind: 'service', endOn: inDays(2) })).kind?.[0]).toMatch(/not offered for stud service/);
    expect((await refusal(borrower, { startOn: inDays(-3) })).startOn?.[0]).toMatch(/from today on/);
    expect((await refusal(borrower, { endOn: inDays(20) })).endOn?.[0]).toMatch(/10 days at most/);
    expect((await refusal(borrower, { doeIds: [ownDoe.id] }))['doeIds.0']?.[0]).toMatch(/doe your farm keeps/);
    expect((await borrower.post('/api/stud-share/loans').send({ ...base, farmId: coop.member.farmId })).status).toBe(403);
    const apprenticeAsks = await ownersApprentice.post('/api/stud-share/loans').send({ ...base, farmId: coop.member.farmId });
    expect(apprenticeAsks.status).toBe(403);
    const stored = await asTenant(coop.id, async (c) => (await c.query('SELECT count(*)::int AS n FROM stud_loans WHERE offer_id = $1', [card.offerId])).rows[0].n);
    expect(stored).toBe(0);
  });

  it('when the same request is sent twice with its id, then there is one request', async () => {
    const { card } = await offeredBuck(coop);
    const doe = await doeOf(coop.otherFarmMember);
    const body = { id: randomUUID(), offerId: card.offerId, kind: 'loan', doeIds: [doe.id], farmId: coop.otherFarmMember.farmId, startOn: inDays(4), endOn: inDays(9) };
    const first = await borrower.post('/api/stud-share/loans').send(body).expect(201);
    const again = await borrower.post('/api/stud-share/loans').send(body).expect(200);
    expect(again.body.id).toBe(first.body.id);
    expect((await owner.post('/api/stud-share/loans').send(body)).status).toBe(409);
  });

  it('when the owner declines with a reason, then the requester reads it and is told; nothing is booked or charged', async () => {
    const { card } = await offeredBuck(coop);
    const loan = await requestAs(coop.otherFarmMember, card.offerId, [(await doeOf(coop.otherFarmMember)).id]);
    expect((await owner.post(`/api/stud-share/loans/${loan.id}/decline`).send({ version: loan.version, reason: 'ok' })).status).toBe(400);
    expect((await borrower.post(`/api/stud-share/loans/${loan.id}/decline`).send({ version: loan.version, reason: 'Not me' })).status).toBe(403);
    const res = await owner.post(`/api/stud-share/loans/${loan.id}/decline`).send({ version: loan.version, reason: 'He is resting after a long season' }).expect(200);
    expect(res.body).toMatchObject({ state: 'declined', declineReason: 'He is resting after a long season', actions: [] });
    const told = (await noticesOf(coop.id, loan.id)).filter((n) => n.kind === 'stud.answered');
    expect(told.map((n) => n.user_id)).toEqual([coop.otherFarmMember.id]);
    expect(told[0]!.title).toMatch(/declines.*resting/);
    expect(await feeTransfersOf(coop.id, loan.id)).toEqual([]);
    expect((await owner.post(`/api/stud-share/loans/${loan.id}/accept`).send({ version: res.body.version })).status).toBe(409);
  });

  it('when the owner proposes other dates, then the requester accepts them and the loan holds the new dates; declining a proposal ends it', async () => {
    const { card } = await offeredBuck(coop);
    const doe = await doeOf(coop.otherFarmMember);
    const loan = await requestAs(coop.otherFarmMember, card.offerId, [doe.id], { startOn: inDays(3), endOn: inDays(10) });
    const proposed = await owner.post(`/api/stud-share/loans/${loan.id}/propose`).send({ version: loan.version, startOn: inDays(12), endOn: inDays(20), message: 'After the show' }).expect(200);
    expect(proposed.body).toMatchObject({ state: 'dates_proposed', proposedStartOn: inDays(12), proposedEndOn: inDays(20) });
    expect((await owner.post(`/api/stud-share/loans/${loan.id}/proposal-answer`).send({ version: proposed.body.version, accept: true })).status).toBe(403);
    const told = (await noticesOf(coop.id, loan.id)).filter((n) => n.kind === 'stud.dates-proposed');
    expect(told.map((n) => n.user_id)).toEqual([coop.otherFarmMember.id]);
    const accepted = await borrower.post(`/api/stud-share/loans/${loan.id}/proposal-answer`).send({ version: proposed.body.version, accept: true }).expect(200);
    expect(accepted.body).toMatchObject({ state: 'accepted', startOn: inDays(12), endOn: inDays(20), proposedStartOn: null });
    expect(accepted.body.timeline.map((e: { kind: string }) => e.kind)).toEqual(['requested', 'dates_proposed', 'proposal_accepted']);
    expect(await feeTransfersOf(coop.id, loan.id)).toEqual([{ id: `loan:${loan.id}:fee`, status: 'pending', amount_cents: 4_000 }]);

    const other = await requestAs(coop.otherFarmMember, card.offerId, [doe.id], { startOn: inDays(40), endOn: inDays(45) });
    const proposedAgain = await owner.post(`/api/stud-share/loans/${other.id}/propose`).send({ version: other.version, startOn: inDays(60), endOn: inDays(65) }).expect(200);
    const declined = await borrower.post(`/api/stud-share/loans/${other.id}/proposal-answer`).send({ version: proposedAgain.body.version, accept: false, reason: 'Too late for us' }).expect(200);
    expect(declined.body.state).toBe('cancelled');
  });

  it('when the requester cancels an accepted loan before the hand-over, then his days are free again and the pending fee is voided, once', async () => {
    const { card } = await offeredBuck(coop);
    const doe = await doeOf(coop.otherFarmMember);
    const loan = await acceptAs(coop.member, await requestAs(coop.otherFarmMember, card.offerId, [doe.id]));
    expect((await owner.post(`/api/stud-share/loans/${loan.id}/cancel`).send({ version: loan.version })).status).toBe(403);
    const cancelled = await borrower.post(`/api/stud-share/loans/${loan.id}/cancel`).send({ version: loan.version, reason: 'She kindled early' }).expect(200);
    expect(cancelled.body.state).toBe('cancelled');
    expect(await feeTransfersOf(coop.id, loan.id)).toEqual([{ id: `loan:${loan.id}:fee`, status: 'voided', amount_cents: 4_000 }]);
    expect((await borrower.post(`/api/stud-share/loans/${loan.id}/cancel`).send({ version: cancelled.body.version })).status).toBe(409);
    const told = (await noticesOf(coop.id, loan.id)).filter((n) => n.kind === 'stud.cancelled');
    expect(told.map((n) => n.user_id).sort()).toEqual([coop.admin.id, coop.member.id].sort());
    // The same dates can be accepted for someone else now.
    const again = await acceptAs(coop.member, await requestAs(coop.otherFarmMember, card.offerId, [doe.id]));
    expect(again.state).toBe('accepted');
  });

  it('when the lists are asked, then each side sees its own requests and those made of its bucks', async () => {
    const { card } = await offeredBuck(coop);
    const loan = await requestAs(coop.otherFarmMember, card.offerId, [(await doeOf(coop.otherFarmMember)).id], { startOn: inDays(70), endOn: inDays(75) });
    const mine = await borrower.get('/api/stud-share/loans?side=requests&pageSize=100').expect(200);
    expect(mine.body.items.map((l: StudLoanDto) => l.id)).toContain(loan.id);
    const received = await owner.get('/api/stud-share/loans?side=offers&open=true&pageSize=100').expect(200);
    expect(received.body.items.map((l: StudLoanDto) => l.id)).toContain(loan.id);
    const notMine = await owner.get('/api/stud-share/loans?side=requests&pageSize=100').expect(200);
    expect(notMine.body.items.map((l: StudLoanDto) => l.id)).not.toContain(loan.id);
    expect((await owner.get('/api/stud-share/loans?side=sideways')).status).toBe(400);
  });
});

describe('photos shown through Stud Share', () => {
  const limits = () => {
    const { photoMaxBytes, photosPerAnimal, photosPerUpload } = loadConfig().uploads;
    return { photoMaxBytes, photosPerAnimal, photosPerUpload };
  };
  const photoOf = async (animalId: string, caption: string) =>
    (await addAnimalPhotos(actorOf(coop.member), animalId, { files: [{ buffer: await testImage('jpeg', { width: 40, height: 40 }) }], caption }, limits()))[0]!.id;

  it('when the owner picks photos for his card, then the co-op opens them while he is offered; a photo he did not pick stays the farm\'s', async () => {
    const { buck, card } = await offeredBuck(coop);
    const picked = await photoOf(buck.id, 'On the grooming table');
    const kept = await photoOf(buck.id, 'Private: the vet visit');
    const edited = await owner.put(`/api/stud-share/offers/${card.offerId}`).send({ version: card.version, offer: offerBody(buck.id, { photoIds: [picked] }) }).expect(200);
    expect(edited.body.photos).toEqual([{ id: picked, url: `/api/photos/${picked}` }]);
    await borrower.get(`/api/photos/${picked}`).expect(200);
    await borrower.get(`/api/photos/${kept}`).expect(404);
    const notHis = await owner.put(`/api/stud-share/offers/${card.offerId}`).send({ version: edited.body.version, offer: offerBody(buck.id, { photoIds: [randomUUID()] }) });
    expect(notHis.status).toBe(400);
    await owner.post(`/api/stud-share/offers/${card.offerId}/withdraw`).send({ version: edited.body.version }).expect(200);
    await borrower.get(`/api/photos/${picked}`).expect(404);
  });

  it('when a hand-over is recorded with a photo, then the other farm opens it and a third farm cannot', async () => {
    const third = await thirdFarmMember(coop);
    const { buck, card } = await offeredBuck(coop);
    const loan = await acceptAs(coop.member, await requestAs(coop.otherFarmMember, card.offerId, [(await doeOf(coop.otherFarmMember)).id], { startOn: inDays(0), endOn: inDays(7) }));
    const photo = await photoOf(buck.id, 'Leaving home');
    await owner.post(`/api/stud-share/loans/${loan.id}/hand-over`).send({ version: loan.version, on: inDays(0), photoId: photo }).expect(200);
    await borrower.get(`/api/photos/${photo}`).expect(200);
    const thirdAgent = await signedInAgent(third.email, TEST_PASSWORD, handle);
    await thirdAgent.get(`/api/photos/${photo}`).expect(404);
  });
});
