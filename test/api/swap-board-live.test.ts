import { randomUUID } from 'node:crypto';
import supertest from 'supertest';
import { describe, expect, it } from 'vitest';
import { CSRF_HEADER, RealtimeEvent } from '@burrowline/shared';
import { createTestCoop, TEST_PASSWORD, type TestPerson } from '../support/factories';
import { heardEverythingSoFar, liveTestServer } from '../support/sockets';
import { thirdFarmMember } from '../support/stud-share';
import { inDays, listedDoe } from '../support/swap-board';
import { ROOMY_SIGN_IN } from '../support/test-app';

describe('Swap Board: live updates by room', () => {
  const server = liveTestServer({ signIn: ROOMY_SIGN_IN });

  const agentOf = async (person: TestPerson) => {
    const agent = supertest.agent(server.url).set(CSRF_HEADER, '1');
    expect((await agent.post('/api/session').send({ email: person.email, password: TEST_PASSWORD })).status).toBe(200);
    return agent;
  };

  it('when a buyer offers and the seller accepts, then the two farms hear the offer after commit, the co-op hears the listing change without prices, another co-op nothing', async () => {
    const coop = await createTestCoop();
    const other = await createTestCoop();
    const third = await thirdFarmMember(coop);
    const { listing } = await listedDoe(coop.member, { priceCents: 8_765 });

    const seller = await server.kit.listen(coop.member.email);
    const sellersApprentice = await server.kit.listen(coop.apprentice.email);
    const buyer = await server.kit.listen(coop.otherFarmMember.email);
    const thirdFarm = await server.kit.listen(third.email);
    const foreign = await server.kit.listen(other.admin.email);
    const listeners = [[seller, coop.member], [sellersApprentice, coop.apprentice], [buyer, coop.otherFarmMember], [thirdFarm, third], [foreign, other.admin]] as const;

    const offered = await (await agentOf(coop.otherFarmMember)).post('/api/swap-board/offers').send({ listingId: listing.id, priceCents: 8_000, validUntil: inDays(5) });
    expect(offered.status).toBe(201);
    for (const [who, person] of listeners) await heardEverythingSoFar(who.socket, person.id);
    const farms = [coop.member.farmId, coop.otherFarmMember.farmId];
    expect(seller.heard.get(RealtimeEvent.swapOfferChanged)).toEqual([{ offerId: offered.body.id, listingId: listing.id, farmIds: farms, state: 'open' }]);
    expect(seller.heard.get(RealtimeEvent.notificationsChanged)).toHaveLength(1);
    expect(sellersApprentice.heard.get(RealtimeEvent.swapOfferChanged)).toHaveLength(1);
    expect(JSON.stringify([...sellersApprentice.heard.values()])).not.toContain('8000');
    expect(thirdFarm.heard.get(RealtimeEvent.swapOfferChanged)).toBeUndefined();
    expect(thirdFarm.heard.get(RealtimeEvent.swapListingChanged)).toEqual([{ listingId: listing.id, farmId: coop.member.farmId, state: 'under_offer' }]);
    expect(foreign.heard.get(RealtimeEvent.swapListingChanged)).toBeUndefined();
    expect(foreign.heard.get(RealtimeEvent.swapOfferChanged)).toBeUndefined();

    await (await agentOf(coop.member)).post(`/api/swap-board/offers/${offered.body.id}/accept`).send({ version: offered.body.version, key: randomUUID() }).expect(200);
    for (const [who, person] of listeners) await heardEverythingSoFar(who.socket, person.id);
    expect(buyer.heard.get(RealtimeEvent.swapOfferChanged)!.at(-1)).toMatchObject({ state: 'accepted' });
    expect(buyer.heard.get(RealtimeEvent.notificationsChanged)).toHaveLength(1);
    expect(buyer.heard.get(RealtimeEvent.herdChanged)?.some((e) => (e as { farmId: string }).farmId === coop.otherFarmMember.farmId)).toBe(true);
    expect(thirdFarm.heard.get(RealtimeEvent.swapListingChanged)!.at(-1)).toMatchObject({ state: 'sold' });
    expect(thirdFarm.heard.get(RealtimeEvent.swapOfferChanged)).toBeUndefined();
    expect(foreign.heard.get(RealtimeEvent.swapListingChanged)).toBeUndefined();
  });

  it('when an accept is refused, then nobody hears anything of it (events go out after commit only)', async () => {
    const coop = await createTestCoop();
    const { listing } = await listedDoe(coop.member);
    const buyerAgent = await agentOf(coop.otherFarmMember);
    const offered = await buyerAgent.post('/api/swap-board/offers').send({ listingId: listing.id, priceCents: 1_000, validUntil: inDays(5) }).expect(201);
    const seller = await server.kit.listen(coop.member.email);
    // The buyer may not accept her own offer: refused inside the transaction.
    expect((await buyerAgent.post(`/api/swap-board/offers/${offered.body.id}/accept`).send({ version: offered.body.version, key: randomUUID() })).status).toBe(403);
    await heardEverythingSoFar(seller.socket, coop.member.id);
    expect(seller.heard.get(RealtimeEvent.swapOfferChanged)).toBeUndefined();
    expect(seller.heard.get(RealtimeEvent.swapListingChanged)).toBeUndefined();
  });
});
