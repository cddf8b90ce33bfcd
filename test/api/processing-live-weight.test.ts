import { afterAll, describe, expect, it } from 'vitest';
import { daysAgo, farmToday } from '../support/almanac';
import { createTestCoop, TEST_PASSWORD } from '../support/factories';
import { weighGroupAs } from '../support/grow-out';
import { growingGroupAs, healthYieldCounts } from '../support/health-yield';
import { addAnimalAs } from '../support/herd';
import { ROOMY_SIGN_IN, signedInAgent, testApp } from '../support/test-app';

const handle = testApp({ signIn: ROOMY_SIGN_IN });
const agentOf = (email: string) => signedInAgent(email, TEST_PASSWORD, handle);
afterAll(async () => {
  await handle.close();
});

describe('processed live weight against the last weigh-in', () => {
  it("when a group's processed live weight is far below its last weigh-in carried to the day, then the record asks to confirm (422, nothing written) and is kept once confirmed; a weight near it passes at once", async () => {
    const coop = await createTestCoop();
    const { group } = await growingGroupAs(coop.member, { kindledDaysAgo: 80, heads: 6, name: 'Larch pen' });
    await weighGroupAs(coop.member, group.id, { weighedOn: daysAgo(10), totalGrams: 6 * 2000, headCount: 6 });
    const agent = await agentOf(coop.member.email);
    const before = await healthYieldCounts(coop.id);
    // 1,000 g a head ten days after 2,000 g a head: a slip of the scale or the head count.
    const slip = { groupId: group.id, processedOn: farmToday(), headCount: 2, liveGrams: 2000, hotCarcassGrams: 1100 };
    const asked = await agent.post('/api/processing-records').send(slip);
    expect(asked.status).toBe(422);
    expect(asked.body.error.code).toBe('confirmation_required');
    expect(asked.body.error.details.liveGrams[0]).toMatch(new RegExp(`^1000 g a head is far below the last weigh-in \\(2000 g on ${daysAgo(10)}, about \\d+ g 10 days on\\)`));
    expect(await healthYieldCounts(coop.id)).toEqual(before);

    const kept = await agent.post('/api/processing-records').send({ ...slip, confirm: true });
    expect(kept.status).toBe(201);
    expect(kept.body).toMatchObject({ liveGrams: 2000, headCount: 2 });

    const near = await agent.post('/api/processing-records').send({ groupId: group.id, processedOn: farmToday(), headCount: 2, liveGrams: 2 * 2250, hotCarcassGrams: 2 * 1250 });
    expect(near.status).toBe(201);
  });

  it("when an animal's processed live weight is far above its last weigh-in, then it asks to confirm; with no weigh-in at all nothing is asked", async () => {
    const coop = await createTestCoop();
    const weighed = await addAnimalAs(coop.member, { name: 'Tamsin', sex: 'doe', birthDate: daysAgo(100), lifecycle: 'junior' });
    const unweighed = await addAnimalAs(coop.member, { name: 'Quill', sex: 'buck', birthDate: daysAgo(100), lifecycle: 'junior' });
    const agent = await agentOf(coop.member.email);
    await agent.post('/api/weigh-ins').send({ animalId: weighed.id, totalGrams: 2500, weighedOn: daysAgo(5) }).expect(201);
    const heavy = { animalId: weighed.id, processedOn: farmToday(), liveGrams: 5000, hotCarcassGrams: 2800 };
    const asked = await agent.post('/api/processing-records').send(heavy);
    expect(asked.status).toBe(422);
    expect(asked.body.error.details.liveGrams[0]).toMatch(new RegExp(`^5000 g a head is far above the last weigh-in \\(2500 g on ${daysAgo(5)}`));
    await agent.post('/api/processing-records').send({ ...heavy, confirm: true }).expect(201);
    await agent.post('/api/processing-records').send({ animalId: unweighed.id, processedOn: farmToday(), liveGrams: 5000, hotCarcassGrams: 2800 }).expect(201);
  });
});
