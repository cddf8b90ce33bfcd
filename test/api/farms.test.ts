import { describe, expect, it } from 'vitest';
import { createTestCoop, TEST_PASSWORD } from '../support/factories';
import { asTenant } from '../support/db';
import { agentFor, signedInAgent } from '../support/test-app';

const profileOf = (farm: Record<string, unknown>) => ({
  name: farm.name,
  location: farm.location,
  timeZone: farm.timeZone,
  weightUnit: farm.weightUnit,
  temperatureUnit: farm.temperatureUnit,
  breedsKept: farm.breedsKept,
  description: farm.description,
  version: farm.version,
});

describe('farm profiles and the members directory', () => {
  it('when a member lists farms, then the directory holds exactly the co-op\'s farms with their members', async () => {
    const coop = await createTestCoop();
    await createTestCoop(); // another co-op's farms must not appear
    const agent = await signedInAgent(coop.member.email, TEST_PASSWORD);
    const res = await agent.get('/api/farms');
    expect(res.status).toBe(200);
    expect(res.body.farms.map((f: { id: string }) => f.id).sort()).toEqual(coop.farms.map((f) => f.id).sort());
    const own = res.body.farms.find((f: { id: string }) => f.id === coop.member.farmId);
    expect(own.members.map((m: { id: string }) => m.id)).toEqual(expect.arrayContaining([coop.admin.id, coop.member.id, coop.apprentice.id]));
  });

  it('when a member edits their own farm profile, then it is saved, its version bumps and the change is kept in history', async () => {
    const coop = await createTestCoop();
    const agent = await signedInAgent(coop.member.email, TEST_PASSWORD);
    const farm = (await agent.get(`/api/farms/${coop.member.farmId}`)).body;
    const res = await agent
      .patch(`/api/farms/${coop.member.farmId}`)
      .send({ ...profileOf(farm), location: 'Lower Meadow Road', weightUnit: 'kg_g', breedsKept: ['Californian', 'Satin'] });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ location: 'Lower Meadow Road', weightUnit: 'kg_g', version: farm.version + 1 });
    const rows = await asTenant(coop.id, async (c) => ({
      farm: (await c.query('SELECT location, weight_unit, breeds_kept FROM farms WHERE id = $1', [coop.member.farmId])).rows[0],
      history: (await c.query('SELECT actor_user_id, changes FROM record_changes WHERE record_id = $1', [coop.member.farmId])).rows,
    }));
    expect(rows.farm).toEqual({ location: 'Lower Meadow Road', weight_unit: 'kg_g', breeds_kept: ['Californian', 'Satin'] });
    expect(rows.history).toHaveLength(1);
    expect(rows.history[0].actor_user_id).toBe(coop.member.id);
    expect(rows.history[0].changes.location).toEqual(['Test County', 'Lower Meadow Road']);
  });

  it('when two people save from the same version, then the second gets a conflict and the first change stands', async () => {
    const coop = await createTestCoop();
    const agent = await signedInAgent(coop.member.email, TEST_PASSWORD);
    const partner = await signedInAgent(coop.admin.email, TEST_PASSWORD); // same farm
    const farm = (await agent.get(`/api/farms/${coop.member.farmId}`)).body;
    expect((await agent.patch(`/api/farms/${coop.member.farmId}`).send({ ...profileOf(farm), location: 'First' })).status).toBe(200);
    const second = await partner.patch(`/api/farms/${coop.member.farmId}`).send({ ...profileOf(farm), location: 'Second' });
    expect(second.status).toBe(409);
    expect(second.body.error.code).toBe('stale_version');
    expect((await agent.get(`/api/farms/${coop.member.farmId}`)).body.location).toBe('First');
  });

  it('when someone who is not of the farm edits it, then it is refused and unchanged', async () => {
    const coop = await createTestCoop();
    const target = coop.farms[0]!.id;
    for (const person of [coop.otherFarmMember, coop.apprentice]) {
      const agent = await signedInAgent(person.email, TEST_PASSWORD);
      const farm = (await agent.get(`/api/farms/${target}`)).body;
      const res = await agent.patch(`/api/farms/${target}`).send({ ...profileOf(farm), name: 'Taken Over' });
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe('forbidden');
    }
    // The admin has co-op powers, not the right to edit another farm.
    const admin = await signedInAgent(coop.admin.email, TEST_PASSWORD);
    const farm1 = (await admin.get(`/api/farms/${coop.farms[1]!.id}`)).body;
    expect((await admin.patch(`/api/farms/${coop.farms[1]!.id}`).send({ ...profileOf(farm1), name: 'Taken Over' })).status).toBe(403);
    const names = await asTenant(coop.id, (c) => c.query('SELECT name FROM farms WHERE coop_id = $1', [coop.id]));
    expect(names.rows.map((r) => r.name)).not.toContain('Taken Over');
  });

  it('when someone who may not edit a farm sends a malformed body, then the answer is 403 or 404, never the field errors', async () => {
    const coop = await createTestCoop();
    const foreign = await createTestCoop();
    const malformed = { name: '', timeZone: 'Mars/Olympus', weightUnit: 'stone', version: 'x' };
    const neighbour = await signedInAgent(coop.otherFarmMember.email, TEST_PASSWORD);
    const refused = await neighbour.patch(`/api/farms/${coop.farms[0]!.id}`).send(malformed);
    expect(refused.status).toBe(403);
    expect(refused.body.error.code).toBe('forbidden');
    const outsider = await signedInAgent(foreign.member.email, TEST_PASSWORD);
    for (const farmId of [coop.farms[0]!.id, '00000000-0000-4000-8000-000000000000']) {
      const hidden = await outsider.patch(`/api/farms/${farmId}`).send(malformed);
      expect(hidden.status).toBe(404);
      expect(hidden.body.error.details).toBeUndefined();
    }
  });

  it('when the input is malformed, then field errors come back and nothing is written', async () => {
    const coop = await createTestCoop();
    const agent = await signedInAgent(coop.member.email, TEST_PASSWORD);
    const farm = (await agent.get(`/api/farms/${coop.member.farmId}`)).body;
    const res = await agent
      .patch(`/api/farms/${coop.member.farmId}`)
      .send({ ...profileOf(farm), name: '', timeZone: 'Mars/Olympus', weightUnit: 'stone', role: 'admin' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    expect(Object.keys(res.body.error.details)).toEqual(expect.arrayContaining(['name', 'timeZone', 'weightUnit']));
    expect(JSON.stringify(res.body)).not.toMatch(/at .*\.ts|SELECT|stack/i);
    const after = (await agent.get(`/api/farms/${coop.member.farmId}`)).body;
    expect(after).toEqual(farm);
  });

  it('when the body is oversized or not JSON, then it is refused with a clear error', async () => {
    const coop = await createTestCoop();
    const agent = await signedInAgent(coop.member.email, TEST_PASSWORD);
    const big = await agent.patch(`/api/farms/${coop.member.farmId}`).send({ description: 'x'.repeat(200_000) });
    expect(big.status).toBe(413);
    expect(big.body.error.code).toBe('payload_too_large');
    const broken = await agent.patch(`/api/farms/${coop.member.farmId}`).set('Content-Type', 'application/json').send('{"name": ');
    expect(broken.status).toBe(400);
    expect(broken.body.error.message).toMatch(/not valid JSON/);
  });

  it('when nobody is signed in, then farms answer 401 and unknown API routes 404 in JSON', async () => {
    expect((await agentFor().get('/api/farms')).status).toBe(401);
    const unknown = await agentFor().get('/api/nothing-here');
    expect(unknown.status).toBe(404);
    expect(unknown.body.error.code).toBe('not_found');
  });
});
