import { randomUUID } from 'node:crypto';
import { afterAll, describe, expect, it } from 'vitest';
import type { PedigreeCardDto } from '@burrowline/shared';
import { createTestCoop, TEST_PASSWORD } from '../support/factories';
import { addAnimalAs } from '../support/herd';
import { ROOMY_SIGN_IN, signedInAgent, testApp } from '../support/test-app';

const handle = testApp({ signIn: ROOMY_SIGN_IN });
const agentOf = (email: string) => signedInAgent(email, TEST_PASSWORD, handle);
afterAll(async () => {
  await handle.close();
});

describe('finding a parent', () => {
  it('when a tattoo is typed whole, then the animal with exactly that tattoo comes first, then those it begins, then the rest, each with its sex and birth date', async () => {
    const coop = await createTestCoop();
    const tag = `Q${randomUUID().slice(0, 4).toUpperCase()}`;
    // Names in the opposite order of the ranking, so only the ranking can put them right.
    await addAnimalAs(coop.member, { tattoo: `${tag}-25`, name: 'Able', sex: 'doe', birthDate: '2024-02-01' });
    await addAnimalAs(coop.member, { tattoo: `X${tag}-2`, name: 'Bea', sex: 'doe', birthDate: '2024-02-01' });
    await addAnimalAs(coop.otherFarmMember, { tattoo: `${tag}-20`, name: 'Cora', sex: 'doe', birthDate: '2024-02-01' });
    await addAnimalAs(coop.member, { tattoo: `${tag}-2`, name: 'Dot', sex: 'doe', birthDate: '2023-05-10' });
    await addAnimalAs(coop.member, { tattoo: `${tag}-21`, name: 'Ebb', sex: 'buck', birthDate: '2024-02-01' });
    const agent = await agentOf(coop.member.email);
    const res = await agent.get('/api/pedigree-cards').query({ search: `${tag}-2`.toLowerCase(), sex: 'doe', pageSize: 8 }).expect(200);
    const cards = res.body.items as PedigreeCardDto[];
    expect(cards.map((c) => c.tattoo)).toEqual([`${tag}-2`, `${tag}-25`, `${tag}-20`, `X${tag}-2`]);
    expect(cards[0]).toMatchObject({ name: 'Dot', sex: 'doe', birthDate: '2023-05-10' });
    expect(res.body.total).toBe(4);

    const byName = await agent.get('/api/pedigree-cards').query({ search: 'dot', sex: 'doe' }).expect(200);
    expect((byName.body.items as PedigreeCardDto[]).filter((c) => c.tattoo?.includes(tag)).map((c) => c.name)).toEqual(['Dot']);
  });
});
