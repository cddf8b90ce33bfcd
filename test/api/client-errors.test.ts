import { afterAll, describe, expect, it } from 'vitest';
import { agentFor, testApp } from '../support/test-app';

const handle = testApp();
afterAll(async () => {
  await handle.close();
});

describe('malformed requests answer 4xx, not 500', () => {
  it('when a JSON body says it is gzip-compressed but is not, then the answer is 400 in the usual error shape', async () => {
    const res = await agentFor(handle)
      .post('/api/session')
      .set('Content-Type', 'application/json')
      .set('Content-Encoding', 'gzip')
      .send('{"email":"someone@example.test","password":"whatever-it-is"}');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
  });

  it('when a path holds a broken percent-escape, then the public form and the calendar feed answer 400', async () => {
    for (const path of ['/api/apply/%E0%A4%A', '/api/calendar-feeds/%E0%A4%A.ics', '/api/calendar-feeds/%E0%A4%A']) {
      const res = await agentFor(handle).get(path);
      expect(res.status, path).toBe(400);
      expect(res.body.error.code, path).toBe('validation_failed');
    }
    const post = await agentFor(handle).post('/api/apply/%E0%A4%A').send({});
    expect(post.status).toBe(400);
  });
});
