import { beforeAll, describe, expect, it } from 'vitest';
import { createTestCoop, TEST_PASSWORD, type TestCoop } from '../support/factories';
import { asTenant } from '../support/db';
import { agentFor, signedInAgent, type Agent } from '../support/test-app';
import { authorizationMatrix, type Persona } from './authorization-matrix';

let coop: TestCoop;
let foreign: TestCoop;

beforeAll(async () => {
  [coop, foreign] = await Promise.all([createTestCoop(), createTestCoop()]);
});

async function agentOf(persona: Persona): Promise<Agent> {
  if (persona === 'anonymous') return agentFor();
  const person = persona === 'otherCoop' ? foreign.admin : coop[persona];
  return signedInAgent(person.email, TEST_PASSWORD);
}

async function farmProfileBody(farmId: string) {
  const row = await asTenant(coop.id, (c) => c.query('SELECT * FROM farms WHERE id = $1', [farmId]));
  const f = row.rows[0];
  return {
    name: f.name, location: `Checked ${Date.now()}`, timeZone: f.time_zone, weightUnit: f.weight_unit,
    temperatureUnit: f.temperature_unit, breedsKept: f.breeds_kept, description: f.description, version: f.version,
  };
}

describe('authorization matrix', () => {
  for (const row of authorizationMatrix) {
    for (const [persona, status] of Object.entries(row.expect) as [Persona, number][]) {
      it(`when ${persona} calls ${row.method} ${row.path} on ${row.target}, then it answers ${status}`, async () => {
        const agent = await agentOf(persona);
        const farmId = row.target === 'farmA' ? coop.farms[0]!.id : row.target === 'farmB' ? coop.farms[1]!.id : '';
        const url = row.path.replace(':farmId', farmId);
        const body = row.body === 'farmProfile' ? await farmProfileBody(farmId) : undefined;
        const before = farmId ? await farmProfileBody(farmId) : null;
        const method = row.method.toLowerCase() as 'get' | 'patch' | 'delete' | 'post';
        const res = await agent[method](url).send(body);
        expect(res.status).toBe(status);
        if (status >= 400) {
          expect(res.body.error.code).toBeTypeOf('string');
          if (before) expect((await farmProfileBody(farmId)).version).toBe(before.version); // a refusal changes nothing
        }
      });
    }
  }
});
