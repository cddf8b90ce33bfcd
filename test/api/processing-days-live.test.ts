import supertest from 'supertest';
import { describe, expect, it } from 'vitest';
import { CSRF_HEADER, RealtimeEvent, type ProcessingDayChangedPayload } from '@burrowline/shared';
import { createTestCoop, TEST_PASSWORD } from '../support/factories';
import { growingGroupAs } from '../support/health-yield';
import { bookingBody, dayBody, siteAs } from '../support/processing-days';
import { heardEverythingSoFar, liveTestServer } from '../support/sockets';
import { ROOMY_SIGN_IN } from '../support/test-app';

describe('processing days: live updates', () => {
  const server = liveTestServer({ signIn: ROOMY_SIGN_IN });

  it('when a day is scheduled and a member books, then everyone of the co-op hears the capacity change (no money, no names), another co-op nothing', async () => {
    const coop = await createTestCoop();
    const other = await createTestCoop();
    const site = await siteAs(coop.admin, coop);
    const { group } = await growingGroupAs(coop.otherFarmMember, { kindledDaysAgo: 70, heads: 6 });
    const member = await server.kit.listen(coop.member.email);
    const apprentice = await server.kit.listen(coop.apprentice.email);
    const foreign = await server.kit.listen(other.member.email);
    const signIn = async (email: string) => {
      const agent = supertest.agent(server.url).set(CSRF_HEADER, '1');
      expect((await agent.post('/api/session').send({ email, password: TEST_PASSWORD })).status).toBe(200);
      return agent;
    };
    const admin = await signIn(coop.admin.email);
    const day = (await admin.post('/api/processing-days').send(dayBody(site.id, { capacityHead: 4 })).expect(201)).body as { id: string };
    const booker = await signIn(coop.otherFarmMember.email);
    await booker.post(`/api/processing-days/${day.id}/bookings`).send(bookingBody(coop.farms[1]!.id, [{ groupId: group.id, head: 3 }])).expect(201);
    for (const [who, person] of [[member, coop.member], [apprentice, coop.apprentice], [foreign, other.member]] as const) await heardEverythingSoFar(who.socket, person.id);
    const heard = member.heard.get(RealtimeEvent.processingDayChanged) as ProcessingDayChangedPayload[];
    expect(heard.map((p) => [p.dayId, p.what])).toEqual([[day.id, 'scheduled'], [day.id, 'capacity']]);
    expect(heard[1]!.capacity).toEqual({ capacityHead: 4, bookedHead: 3, offeredHead: 0, waitlistedHead: 0, freeHead: 1 });
    expect(JSON.stringify(heard)).not.toContain('450');
    expect(JSON.stringify(heard)).not.toContain(coop.farms[1]!.name);
    expect(apprentice.heard.get(RealtimeEvent.processingDayChanged)).toHaveLength(2);
    expect(foreign.heard.get(RealtimeEvent.processingDayChanged)).toBeUndefined();
  });
});
