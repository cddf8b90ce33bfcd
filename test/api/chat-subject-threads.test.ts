import { describe, expect, it } from 'vitest';
import { createTestCoop, TEST_PASSWORD } from '../support/factories';
import { doeOf, offeredBuck, requestAs, thirdFarmMember } from '../support/stud-share';
import { dayAs, siteAs } from '../support/processing-days';
import { signedInAgent } from '../support/test-app';

const agentOf = (email: string) => signedInAgent(email, TEST_PASSWORD);

describe('threads beside a loan and a processing day', () => {
  it('when a loan is requested, then its two farms (and their apprentices) talk in its thread; a third farm and another co-op find none', async () => {
    const coop = await createTestCoop();
    const other = await createTestCoop();
    const { card } = await offeredBuck(coop);
    const loan = await requestAs(coop.otherFarmMember, card.offerId, [(await doeOf(coop.otherFarmMember)).id]);
    const owner = await agentOf(coop.member.email);
    const opened = await owner.post(`/api/chat/subjects/loan/${loan.id}/open`);
    expect(opened.status).toBe(200);
    expect(opened.body.title).toMatch(/^Loan of Bramble/);
    const said = await owner.post(`/api/chat/threads/${opened.body.id}/messages`).send({ clientId: crypto.randomUUID(), body: 'He is ready on Saturday morning.' });
    expect(said.status).toBe(201);
    const borrower = await agentOf(coop.otherFarmMember.email);
    const read = await borrower.get(`/api/chat/threads/${opened.body.id}/messages`);
    expect(read.status).toBe(200);
    expect(JSON.stringify(read.body)).toContain('He is ready on Saturday morning.');
    expect((await (await agentOf(coop.apprentice.email)).get(`/api/chat/threads/${opened.body.id}/messages`)).status).toBe(200);

    const third = await thirdFarmMember(coop);
    const thirdAgent = await agentOf(third.email);
    expect((await thirdAgent.post(`/api/chat/subjects/loan/${loan.id}/open`)).status).toBe(404);
    expect((await thirdAgent.get(`/api/chat/threads/${opened.body.id}/messages`)).status).toBe(404);
    expect((await (await agentOf(other.admin.email)).post(`/api/chat/subjects/loan/${loan.id}/open`)).status).toBe(404);
  });

  it('when a processing day is scheduled, then every member of the co-op reads its thread and another co-op does not', async () => {
    const coop = await createTestCoop();
    const other = await createTestCoop();
    const site = await siteAs(coop.admin, coop);
    const day = await dayAs(coop.admin, site.id);
    const member = await agentOf(coop.otherFarmMember.email);
    const opened = await member.post(`/api/chat/subjects/processing-day/${day.id}/open`);
    expect(opened.status).toBe(200);
    expect(opened.body.title).toContain(`Processing day ${day.date}`);
    expect((await member.post(`/api/chat/threads/${opened.body.id}/messages`).send({ clientId: crypto.randomUUID(), body: 'I can bring the chill tank.' })).status).toBe(201);
    const apprentice = await agentOf(coop.apprentice.email);
    expect(JSON.stringify((await apprentice.get(`/api/chat/threads/${opened.body.id}/messages`)).body)).toContain('I can bring the chill tank.');
    const foreign = await agentOf(other.member.email);
    expect((await foreign.post(`/api/chat/subjects/processing-day/${day.id}/open`)).status).toBe(404);
    expect((await foreign.get(`/api/chat/threads/${opened.body.id}/messages`)).status).toBe(404);
  });
});
