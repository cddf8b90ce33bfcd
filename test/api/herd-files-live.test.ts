import { randomUUID } from 'node:crypto';
import supertest from 'supertest';
import { describe, expect, it } from 'vitest';
import { CSRF_HEADER, RealtimeEvent } from '@burrowline/shared';
import { createTestCoop } from '../support/factories';
import { csv, HEADER, testImage } from '../support/herd-files';
import { heardEverythingSoFar, liveTestServer } from '../support/sockets';

describe('herd files: live updates', () => {
  const server = liveTestServer();
  const { kit } = server;

  it('when an import is confirmed, then the farm\'s other sockets hear herd:changed once, the co-op hears pedigree:changed, another co-op nothing; staging alone says nothing', async () => {
    const coop = await createTestCoop();
    const foreign = await createTestCoop();
    const partner = await kit.listen(coop.admin.email); // same farm
    const neighbour = await kit.listen(coop.otherFarmMember.email);
    const outsider = await kit.listen(foreign.member.email);
    const cookie = await kit.signInCookie(coop.member.email);
    const api = supertest(server.url);
    const staged = await api.post('/api/herd-imports').set(CSRF_HEADER, '1').set('cookie', cookie)
      .attach('file', Buffer.from(csv(HEADER, 'LV1,Ash,buck,Satin,2022-01-01,,', 'LV2,Birch,doe,Satin,2022-01-01,,', 'LV3,Cedar,doe,Satin,2023-01-01,LV1,LV2')), 'live.csv');
    expect(staged.status).toBe(201);
    await heardEverythingSoFar(partner.socket, coop.admin.id);
    expect(partner.heard.get(RealtimeEvent.herdChanged)).toBeUndefined();

    const confirmed = await api.post(`/api/herd-imports/${staged.body.id}/confirmation`).set(CSRF_HEADER, '1').set('cookie', cookie).send({ idempotencyKey: randomUUID() });
    expect(confirmed.status).toBe(200);
    await expect.poll(() => partner.heard.get(RealtimeEvent.herdChanged)?.length ?? 0).toBe(1);
    expect(partner.heard.get(RealtimeEvent.herdChanged)![0]).toEqual({ farmId: coop.farms[0]!.id, animalId: null });
    await expect.poll(() => neighbour.heard.get(RealtimeEvent.pedigreeChanged)?.length ?? 0).toBe(1);
    expect(neighbour.heard.get(RealtimeEvent.pedigreeChanged)![0]).toEqual({ changedCount: 3 });
    expect(neighbour.heard.get(RealtimeEvent.herdChanged)).toBeUndefined();
    expect(outsider.heard.size).toBe(0);

    // A photo added to one of them refreshes the farm's open screens too.
    const animalId = staged.body.rows.items[2].animalId as string;
    const photo = await api.post(`/api/animals/${animalId}/photos`).set(CSRF_HEADER, '1').set('cookie', cookie)
      .attach('photos', await testImage('jpeg', { width: 40, height: 40 }), { filename: 'cedar.jpg', contentType: 'image/jpeg' });
    expect(photo.status).toBe(201);
    await expect.poll(() => partner.heard.get(RealtimeEvent.herdChanged)?.length ?? 0).toBe(2);
    expect(partner.heard.get(RealtimeEvent.herdChanged)![1]).toEqual({ farmId: coop.farms[0]!.id, animalId });
    expect(neighbour.heard.get(RealtimeEvent.herdChanged)).toBeUndefined();
  });
});
