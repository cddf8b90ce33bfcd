import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { createTestCoop, TEST_PASSWORD } from '../support/factories';
import { agentFor, signedInAgent, testApp } from '../support/test-app';

describe('what browsers and proxies may keep', () => {
  it('when the API answers, whether with data, an error or a refusal, then the answer says no-store', async () => {
    const coop = await createTestCoop();
    const agent = await signedInAgent(coop.member.email, TEST_PASSWORD);
    const answers = [
      await agent.get('/api/me'),
      await agent.get(`/api/farms/${coop.member.farmId}`),
      await agent.patch(`/api/farms/${coop.member.farmId}`).send({ name: '' }),
      await agentFor().get('/api/farms'),
      await agentFor().get('/api/nothing-here'),
    ];
    expect(answers.map((res) => res.status)).toEqual([200, 200, 400, 401, 404]);
    answers.forEach((res, i) => expect(res.headers['cache-control'], `answer ${i}`).toBe('no-store'));
  });

  describe('the built client', () => {
    const dist = fs.mkdtempSync(path.join(os.tmpdir(), 'burrowline-dist-'));
    fs.mkdirSync(path.join(dist, 'assets'));
    fs.writeFileSync(path.join(dist, 'index.html'), '<!doctype html><title>Burrowline</title>');
    fs.writeFileSync(path.join(dist, 'assets', 'app.js'), 'console.log(1);');
    fs.writeFileSync(path.join(dist, 'assets', 'app.js.map'), '{"version":3,"sources":["secret.ts"]}');
    const production = testApp({ env: 'production', clientDist: dist });
    const development = testApp({ env: 'development', clientDist: dist });
    afterAll(async () => {
      await production.close();
      await development.close();
      fs.rmSync(dist, { recursive: true, force: true });
    });

    it('when a source map is asked for in production, then it is not there; the bundle itself is', async () => {
      expect((await supertest(production.app).get('/assets/app.js')).status).toBe(200);
      const map = await supertest(production.app).get('/assets/app.js.map');
      expect(map.status).toBe(404);
      expect(map.text).not.toContain('secret.ts');
      // Outside production the map is served, for debugging.
      expect((await supertest(development.app).get('/assets/app.js.map')).text).toContain('secret.ts');
    });
  });
});
