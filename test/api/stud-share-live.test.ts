import supertest from 'supertest';
import { describe, expect, it } from 'vitest';
import { CSRF_HEADER, RealtimeEvent } from '@burrowline/shared';
import { createTestCoop, TEST_PASSWORD, type TestPerson } from '../support/factories';
import { heardEverythingSoFar, liveTestServer } from '../support/sockets';
import { doeOf, inDays, offeredBuck, thirdFarmMember } from '../support/stud-share';
import { ROOMY_SIGN_IN } from '../support/test-app';

describe('Stud Share: live updates by room', () => {
  const server = liveTestServer({ signIn: ROOMY_SIGN_IN });

  const agentOf = async (person: TestPerson) => {
    const agent = supertest.agent(server.url).set(CSRF_HEADER, '1');
    expect((await agent.post('/api/session').send({ email: person.email, password: TEST_PASSWORD })).status).toBe(200);
    return agent;
  };

  it('when a member requests a buck and the owner accepts, then each side hears the other live, apprentices hear no fee, and a third farm or another co-op hear nothing', async () => {
    const coop = await createTestCoop();
    const other = await createTestCoop();
    const third = await thirdFarmMember(coop);
    const { card } = await offeredBuck(coop, { loanFeeCents: 4_321 });
    const doe = await doeOf(coop.otherFarmMember);

    const owner = await server.kit.listen(coop.member.email);
    const ownersApprentice = await server.kit.listen(coop.apprentice.email);
    const borrower = await server.kit.listen(coop.otherFarmMember.email);
    const thirdFarm = await server.kit.listen(third.email);
    const foreign = await server.kit.listen(other.admin.email);
    const listeners = [[owner, coop.member], [ownersApprentice, coop.apprentice], [borrower, coop.otherFarmMember], [thirdFarm, third], [foreign, other.admin]] as const;

    const requested = await (await agentOf(coop.otherFarmMember)).post('/api/stud-share/loans').send({
      offerId: card.offerId, kind: 'loan', doeIds: [doe.id], farmId: coop.otherFarmMember.farmId, startOn: inDays(3), endOn: inDays(10),
    });
    expect(requested.status).toBe(201);
    for (const [who, person] of listeners) await heardEverythingSoFar(who.socket, person.id);
    const farms = [coop.member.farmId, coop.otherFarmMember.farmId];
    expect(owner.heard.get(RealtimeEvent.studLoanChanged)).toEqual([{ loanId: requested.body.id, buckId: card.buck.id, farmIds: farms, state: 'requested' }]);
    expect(owner.heard.get(RealtimeEvent.notificationsChanged)).toHaveLength(1);
    expect(ownersApprentice.heard.get(RealtimeEvent.studLoanChanged)).toHaveLength(1);
    // The apprentice is not told by the bell, and nothing heard carries the fee.
    expect(ownersApprentice.heard.get(RealtimeEvent.notificationsChanged)).toBeUndefined();
    expect(JSON.stringify([...ownersApprentice.heard.values()])).not.toContain('4321');
    expect(borrower.heard.get(RealtimeEvent.studLoanChanged)).toHaveLength(1);
    expect(borrower.heard.get(RealtimeEvent.notificationsChanged)).toBeUndefined();
    for (const outsider of [thirdFarm, foreign]) {
      expect(outsider.heard.get(RealtimeEvent.studLoanChanged)).toBeUndefined();
      expect(outsider.heard.get(RealtimeEvent.notificationsChanged)).toBeUndefined();
    }

    await (await agentOf(coop.member)).post(`/api/stud-share/loans/${requested.body.id}/accept`).send({ version: requested.body.version }).expect(200);
    for (const [who, person] of listeners) await heardEverythingSoFar(who.socket, person.id);
    expect(borrower.heard.get(RealtimeEvent.studLoanChanged)!.at(-1)).toMatchObject({ state: 'accepted' });
    expect(borrower.heard.get(RealtimeEvent.notificationsChanged)).toHaveLength(1);
    expect(thirdFarm.heard.get(RealtimeEvent.studLoanChanged)).toBeUndefined();
    expect(foreign.heard.get(RealtimeEvent.studLoanChanged)).toBeUndefined();
  });

  it('when a buck is offered or withdrawn, then the whole co-op hears it (his card is co-op-wide), another co-op nothing', async () => {
    const coop = await createTestCoop();
    const other = await createTestCoop();
    const borrower = await server.kit.listen(coop.otherFarmMember.email);
    const foreign = await server.kit.listen(other.member.email);
    const { card } = await offeredBuck(coop);
    await (await agentOf(coop.member)).post(`/api/stud-share/offers/${card.offerId}/withdraw`).send({ version: card.version }).expect(200);
    await heardEverythingSoFar(borrower.socket, coop.otherFarmMember.id);
    await heardEverythingSoFar(foreign.socket, other.member.id);
    expect(borrower.heard.get(RealtimeEvent.studOfferChanged)).toEqual([
      { offerId: card.offerId, buckId: card.buck.id, farmId: coop.member.farmId },
      { offerId: card.offerId, buckId: card.buck.id, farmId: coop.member.farmId },
    ]);
    expect(foreign.heard.get(RealtimeEvent.studOfferChanged)).toBeUndefined();
  });
});
