import supertest from 'supertest';
import { describe, expect, it } from 'vitest';
import { CSRF_HEADER, RealtimeEvent } from '@burrowline/shared';
import { createTestCoop, TEST_PASSWORD } from '../support/factories';
import { transferId } from '../support/ledger';
import { heardEverythingSoFar, liveTestServer } from '../support/sockets';
import { ROOMY_SIGN_IN } from '../support/test-app';

describe('ledger: live updates', () => {
  const server = liveTestServer({ signIn: ROOMY_SIGN_IN });

  it('when a fee is posted between two farms, then both farms\' members and the admins hear it, the apprentice and a third party nothing', async () => {
    const coop = await createTestCoop();
    const other = await createTestCoop();
    const member = await server.kit.listen(coop.member.email);
    const otherFarm = await server.kit.listen(coop.otherFarmMember.email);
    const apprentice = await server.kit.listen(coop.apprentice.email);
    const admin = await server.kit.listen(coop.admin.email);
    const foreign = await server.kit.listen(other.admin.email);
    const agent = supertest.agent(server.url).set(CSRF_HEADER, '1');
    expect((await agent.post('/api/session').send({ email: coop.admin.email, password: TEST_PASSWORD })).status).toBe(200);
    const res = await agent.post('/api/ledger/transfers').send({ id: transferId('live'), kind: 'stud_fee', debit: { farmId: coop.farms[0]!.id }, credit: { farmId: coop.farms[1]!.id }, amountCents: 1_800 });
    expect(res.status).toBe(201);
    for (const [who, person] of [[member, coop.member], [otherFarm, coop.otherFarmMember], [apprentice, coop.apprentice], [admin, coop.admin], [foreign, other.admin]] as const) {
      await heardEverythingSoFar(who.socket, person.id);
    }
    const farms = [coop.farms[0]!.id, coop.farms[1]!.id].sort();
    expect((member.heard.get(RealtimeEvent.ledgerChanged) as { farmIds: string[] }[]).map((p) => [...p.farmIds].sort())).toContainEqual(farms);
    expect(otherFarm.heard.get(RealtimeEvent.ledgerChanged)).toBeDefined();
    expect(admin.heard.get(RealtimeEvent.ledgerChanged)).toBeDefined();
    // The payload carries farm ids only, never an amount.
    expect(JSON.stringify(member.heard.get(RealtimeEvent.ledgerChanged))).not.toContain('1800');
    expect(apprentice.heard.get(RealtimeEvent.ledgerChanged)).toBeUndefined();
    expect(foreign.heard.get(RealtimeEvent.ledgerChanged)).toBeUndefined();
  });
});
