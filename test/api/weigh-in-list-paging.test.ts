import { beforeAll, describe, expect, it } from 'vitest';
import type { AnimalDetailDto, WeighInDto } from '@burrowline/shared';
import { asTenant } from '../support/db';
import { createTestCoop, TEST_PASSWORD, type TestCoop } from '../support/factories';
import { addAnimalAs } from '../support/herd';
import { sharedSignedInAgent, type Agent } from '../support/test-app';

type Series = { weighIns: WeighInDto[]; total: number; page: number; pageSize: number };

describe("an animal's weigh-ins page in the database", () => {
  let coop: TestCoop;
  let member: Agent;
  let doe: AnimalDetailDto;
  /** Grams in the order entered: two a month, the second of each month entered twice (a re-weigh). */
  const entered: number[] = [];

  const series = async (query: Record<string, string | number> = {}) => {
    const res = await member.get(`/api/animals/${doe.id}/weigh-ins`).query(query);
    expect(res.status).toBe(200);
    return res.body as Series;
  };

  beforeAll(async () => {
    coop = await createTestCoop();
    member = await sharedSignedInAgent(coop.member.email, TEST_PASSWORD);
    doe = await addAnimalAs(coop.member, { sex: 'doe', birthDate: '2023-01-10' });
    for (let month = 1; month <= 6; month += 1) {
      for (const [day, grams] of [['01', 3000 + month * 100], ['15', 3050 + month * 100], ['15', 3060 + month * 100]] as const) {
        const res = await member.post('/api/weigh-ins').send({ animalId: doe.id, totalGrams: grams, weighedOn: `2024-0${month}-${day}` });
        expect(res.status).toBe(201);
        entered.push(grams);
      }
    }
  });

  it('when the series is read, then it is the whole life oldest first by default, and pages either way with the same total', async () => {
    const whole = await series();
    expect({ total: whole.total, page: whole.page, pageSize: whole.pageSize }).toEqual({ total: 18, page: 1, pageSize: 500 });
    expect(whole.weighIns.map((w) => w.totalGrams)).toEqual(entered);
    const pages = [await series({ pageSize: 7 }), await series({ pageSize: 7, page: 2 }), await series({ pageSize: 7, page: 3 })];
    expect(pages.map((p) => p.total)).toEqual([18, 18, 18]);
    expect(pages.flatMap((p) => p.weighIns.map((w) => w.totalGrams))).toEqual(entered);
    const latest = await series({ dir: 'desc', pageSize: 4 });
    expect(latest.weighIns.map((w) => w.totalGrams)).toEqual([...entered].reverse().slice(0, 4));
    const past = await series({ page: 9, pageSize: 7 });
    expect({ weighIns: past.weighIns, total: past.total }).toEqual({ weighIns: [], total: 18 });
  });

  it('when the query is malformed, then it is a 400 naming each bad field, and nothing is written', async () => {
    const count = () => asTenant(coop.id, async (c) => (await c.query('SELECT count(*)::int AS n FROM weigh_ins WHERE animal_id = $1', [doe.id])).rows[0].n as number);
    const before = await count();
    for (const [query, fields] of [[{ pageSize: 0 }, ['pageSize']], [{ pageSize: 501, dir: 'newest' }, ['dir', 'pageSize']], [{ page: -1 }, ['page']]] as const) {
      const res = await member.get(`/api/animals/${doe.id}/weigh-ins`).query(query);
      expect({ query, status: res.status, fields: Object.keys(res.body.error?.details ?? {}).sort() }).toEqual({ query, status: 400, fields: [...fields] });
    }
    expect((await member.get(`/api/animals/${doe.id}/weigh-ins`).query({ farmId: coop.farms[1]!.id })).status).toBe(400);
    expect(await count()).toBe(before);
  });

  it('when another farm or another co-op asks for the series, then it is refused and shows no weights', async () => {
    const neighbour = await (await sharedSignedInAgent(coop.otherFarmMember.email, TEST_PASSWORD)).get(`/api/animals/${doe.id}/weigh-ins`);
    expect(neighbour.status).toBe(403);
    expect(JSON.stringify(neighbour.body)).not.toContain('3160');
    const foreign = await createTestCoop();
    expect((await (await sharedSignedInAgent(foreign.member.email, TEST_PASSWORD)).get(`/api/animals/${doe.id}/weigh-ins`)).status).toBe(404);
  });
});
