import { describe, expect, it } from 'vitest';
import { createTestCoop, TEST_PASSWORD } from '../support/factories';
import { doeOf, offeredBuck, requestAs, thirdFarmMember } from '../support/stud-share';
import { dayAs, siteAs } from '../support/processing-days';
import { signedInAgent } from '../support/test-app';
import { asTenant } from '../support/db';
import { litterAs } from '../support/almanac';
import { countingAgentFor } from '../support/statement-counter';
import type { ChatThreadListDto } from '@burrowline/shared';
import { registerThreadSubject, subjectFromRows } from '../../packages/server/src/modules/chat/chat-subjects.service';

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

  it('when more kinds of subject have threads, then the thread list still reads them all in the same statements, within its budget', async () => {
    const coop = await createTestCoop();
    const owner = await agentOf(coop.member.email);
    const { litter } = await litterAs(coop.member, { servicedDaysAgo: 40, kindledDaysAgo: 9, bornAlive: 5 });
    const { card } = await offeredBuck(coop);
    const loan = await requestAs(coop.otherFarmMember, card.offerId, [(await doeOf(coop.otherFarmMember)).id]);
    const day = await dayAs(coop.admin, (await siteAs(coop.admin, coop)).id);
    for (const path of [`litter/${litter.id}`, `loan/${loan.id}`, `processing-day/${day.id}`]) {
      expect((await owner.post(`/api/chat/subjects/${path}/open`)).status).toBe(200);
    }
    const counting = await countingAgentFor(coop.member.email, TEST_PASSWORD);
    // The co-op's first list makes its channel; the counts compare the lists after that.
    await counting.count((agent) => agent.get('/api/chat/threads'));
    const three = await counting.count((agent) => agent.get('/api/chat/threads'));
    expect((three.res.body as ChatThreadListDto).items.map((t) => t.subjectType ?? 'channel').sort()).toEqual(['channel', 'litter', 'loan', 'processing-day']);

    // Three more kinds of subject (a farm's page stands in for a listing and the like): each farm's thread is its own people's.
    const kinds = ['budget-farm-one', 'budget-farm-two', 'budget-farm-three'];
    for (const kind of kinds) {
      registerThreadSubject(kind, subjectFromRows<{ id: string; coop_id: string }>({
        rowsSql: (ids) => `SELECT f.id, f.coop_id FROM farms f WHERE f.id = ANY(${ids})`,
        mayRead: (actor, farm) => farm.coop_id === actor.coopId && actor.farmId === farm.id,
        participants: (_tx, farm) => ({ farmIds: [farm.id], userIds: [] }),
        title: () => 'A farm',
        link: (id) => `/farms/${id}`,
      }));
      await asTenant(coop.id, (c) => c.query(
        `INSERT INTO chat_threads (coop_id, kind, subject_type, subject_id, title) SELECT $1, 'subject', $2, id, 'A farm' FROM farms WHERE coop_id = $1`,
        [coop.id, kind],
      ), { commit: true });
    }
    const six = await counting.count((agent) => agent.get('/api/chat/threads'));
    const listed = (six.res.body as ChatThreadListDto).items;
    // Farm A's own three threads are listed; farm B's are not.
    expect(listed.filter((t) => kinds.includes(t.subjectType ?? '')).map((t) => t.subjectId)).toEqual([coop.member.farmId, coop.member.farmId, coop.member.farmId]);
    expect(six.statements.length).toBe(three.statements.length);
    expect(six.own.length).toBeLessThanOrEqual(5);
  });
});
