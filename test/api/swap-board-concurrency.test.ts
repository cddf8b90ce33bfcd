import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SwapOfferDto } from '@burrowline/shared';
import { asTenant } from '../support/db';
import { createTestCoop, TEST_PASSWORD, type TestCoop } from '../support/factories';
import { thirdFarmMember } from '../support/stud-share';
import { custodyOf, listAs, listedDoe, offerAs, stockOf } from '../support/swap-board';
import { signedInAgent, testApp, type Agent } from '../support/test-app';

const handle = testApp();
let coop: TestCoop;
let seller: Agent;

beforeAll(async () => {
  coop = await createTestCoop();
  seller = await signedInAgent(coop.member.email, TEST_PASSWORD, handle);
});
afterAll(async () => {
  await handle.close();
});

const salesOf = (offerIds: string[]) =>
  asTenant(coop.id, async (c) => (await c.query(
    `SELECT count(*)::int AS n FROM ledger_transfers WHERE source_type = 'swap_offer' AND source_id = ANY($1)`, [offerIds],
  )).rows[0].n as number);

const movesOf = (animalId: string) =>
  asTenant(coop.id, async (c) => (await c.query(`SELECT count(*)::int AS n FROM animal_custody_events WHERE animal_id = $1 AND kind = 'transferred'`, [animalId])).rows[0].n as number);

describe('no double sale', () => {
  it('when 20 different offers on one listing are accepted at the same moment, then exactly one is accepted and the 19 others answer 409 saying it is sold', async () => {
    const { doe, listing } = await listedDoe(coop.member, { title: 'Clover, much wanted' });
    const offers: SwapOfferDto[] = [];
    for (let i = 0; i < 20; i++) offers.push(await offerAs(coop.otherFarmMember, listing.id, { priceCents: 5_000 + i * 10 }));
    const answers = await Promise.all(offers.map((o) => seller.post(`/api/swap-board/offers/${o.id}/accept`).send({ version: o.version, key: randomUUID() })));
    const statuses = answers.map((a) => a.status);
    expect(statuses.filter((s) => s === 200)).toHaveLength(1);
    expect(statuses.filter((s) => s === 409)).toHaveLength(19);
    for (const refused of answers.filter((a) => a.status === 409)) expect(refused.body.error.message).toBe('“Clover, much wanted” is sold already: another offer was accepted first');
    const winner = offers[statuses.indexOf(200)]!;
    expect(await salesOf(offers.map((o) => o.id))).toBe(1);
    expect(await movesOf(doe.id)).toBe(1);
    const states = await asTenant(coop.id, async (c) => (await c.query('SELECT id, state FROM swap_offers WHERE listing_id = $1', [listing.id])).rows as { id: string; state: string }[]);
    expect(states.filter((s) => s.state === 'accepted').map((s) => s.id)).toEqual([winner.id]);
    expect(states.filter((s) => s.state === 'declined')).toHaveLength(19);
  });

  it('when one doe is in two listings and an offer on each is accepted at the same moment, then she is sold once and the other answers 409 with the reason', async () => {
    const doe = await stockOf(coop.member, { name: 'Saffron' });
    const alone = await listAs(coop.member, { title: 'Saffron alone', animalIds: [doe.id] });
    const withSister = await listAs(coop.member, { title: 'Saffron and sister', animalIds: [doe.id, (await stockOf(coop.member)).id] });
    const third = await thirdFarmMember(coop);
    const first = await offerAs(coop.otherFarmMember, alone.id);
    const second = await offerAs(third, withSister.id);
    const [a, b] = await Promise.all([
      seller.post(`/api/swap-board/offers/${first.id}/accept`).send({ version: first.version, key: randomUUID() }),
      seller.post(`/api/swap-board/offers/${second.id}/accept`).send({ version: second.version, key: randomUUID() }),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
    const refused = a.status === 409 ? a : b;
    // Whichever came second finds her gone: its listing was closed by the first sale, or she is no longer the farm's.
    expect(refused.body.error.message).toMatch(/is withdrawn; no offer can be accepted|can no longer change hands/);
    expect(await movesOf(doe.id)).toBe(1);
    expect(await salesOf([first.id, second.id])).toBe(1);
    const won = a.status === 200 ? coop.otherFarmMember : third;
    expect((await custodyOf(coop.id, doe.id)).owning_farm_id).toBe(won.farmId);
  });
});
