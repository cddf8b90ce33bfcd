import { afterAll, describe, expect, it } from 'vitest';
import { database } from '../../packages/server/src/composition/database';
import { coopDirectoryOf, forgetCoopDirectory } from '../../packages/server/src/db/coop-directory';
import { withTenant } from '../../packages/server/src/db/tenant';
import { asTenant } from '../support/db';
import { createTestCoop, TEST_PASSWORD } from '../support/factories';
import { countingAgentFor } from '../support/statement-counter';
import { testApp } from '../support/test-app';

afterAll(() => testApp().close());

/** A breed of the co-op's own, written as another server instance would: straight to the database, committed. */
async function addBreedElsewhere(coopId: string, name: string): Promise<void> {
  await asTenant(
    coopId,
    (c) =>
      c.query(
        `INSERT INTO breeds (coop_id, name, show_class_count, size_class, doe_first_breeding_min_days, doe_first_breeding_max_days,
           buck_first_breeding_min_days, buck_first_breeding_max_days)
         VALUES ($1, $2, 4, 'medium', 150, 180, 180, 210)`,
        [coopId, name],
      ),
    { commit: true },
  );
}

/** Whether a request sent anything beyond reading its session (the breeds list reads nothing else but the directory). */
const readsBeyondSession = (statements: string[]) => statements.some((sql) => !/\buser_sessions\b/.test(sql));

describe("the co-op's breeds and farms kept in memory", () => {
  it('when nothing changed since the last request, then the next one reads neither breeds nor farms', async () => {
    const coop = await createTestCoop();
    const counting = await countingAgentFor(coop.member.email, TEST_PASSWORD);
    await counting.agent.get('/api/breeds').expect(200);
    const again = await counting.count((agent) => agent.get('/api/breeds'));
    expect(again.res.status).toBe(200);
    expect(again.res.body.breeds.length).toBeGreaterThan(0);
    // Not even a transaction: nothing was sent in it.
    expect(again.statements).toHaveLength(1);
    expect(readsBeyondSession(again.statements)).toBe(false);
  });

  it('when another instance adds a breed, then the very next request here lists it', async () => {
    const coop = await createTestCoop();
    const counting = await countingAgentFor(coop.member.email, TEST_PASSWORD);
    await counting.agent.get('/api/breeds').expect(200);
    await addBreedElsewhere(coop.id, 'Hillside Tan');
    const next = await counting.count((agent) => agent.get('/api/breeds'));
    expect(readsBeyondSession(next.statements)).toBe(true);
    expect(next.res.body.breeds.map((b: { name: string }) => b.name)).toContain('Hillside Tan');
  });

  it("when a farm's name, clock, units or removal change, then the co-op's version moves on; other changes to the farm leave it", async () => {
    const coop = await createTestCoop();
    const version = async () => Number((await asTenant(coop.id, (c) => c.query<{ v: string }>('SELECT coop_directory_version($1) AS v', [coop.id]))).rows[0]!.v);
    const change = (set: string) => asTenant(coop.id, (c) => c.query(`UPDATE farms SET ${set} WHERE id = $1`, [coop.farms[1]!.id]), { commit: true });
    const start = await version();
    await change(`name = 'Brookside Renamed'`);
    expect(await version()).toBe(start + 1);
    await change(`time_zone = 'Europe/Dublin'`);
    await change(`weight_unit = 'kg_g'`);
    expect(await version()).toBe(start + 3);
    await change(`latitude = 44.5, longitude = -93.1`);
    expect(await version()).toBe(start + 3);
  });

  it('when a change to them rolls back, then what the transaction read of its own change is never served to anyone', async () => {
    const coop = await createTestCoop();
    const counting = await countingAgentFor(coop.member.email, TEST_PASSWORD);
    await counting.agent.get('/api/breeds').expect(200);
    const me = (await counting.agent.get('/api/me').expect(200)).body.user;
    expect(me.id).toBe(coop.member.id);
    await expect(
      withTenant({ coopId: coop.id }, async (tx) => {
        await database().query(
          `INSERT INTO breeds (coop_id, name, show_class_count, size_class, doe_first_breeding_min_days, doe_first_breeding_max_days,
             buck_first_breeding_min_days, buck_first_breeding_max_days) VALUES ($1, 'Never Kept', 4, 'medium', 150, 180, 180, 210)`,
          { bind: [coop.id], transaction: tx },
        );
        forgetCoopDirectory(tx, coop.id);
        expect((await coopDirectoryOf(tx, coop.id)).breeds.map((b) => b.name)).toContain('Never Kept');
        throw new Error('rolled back on purpose');
      }),
    ).rejects.toThrow('rolled back on purpose');
    const after = await counting.agent.get('/api/breeds').expect(200);
    expect(after.body.breeds.map((b: { name: string }) => b.name)).not.toContain('Never Kept');
    expect(after.body.breeds.length).toBeGreaterThan(0);
  });
});
