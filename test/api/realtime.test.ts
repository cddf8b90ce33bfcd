import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { io as connect, type Socket } from 'socket.io-client';
import { CSRF_HEADER, RealtimeEvent } from '@burrowline/shared';
import { createTestCoop, TEST_PASSWORD } from '../support/factories';
import { heardEverythingSoFar } from '../support/sockets';
import { listeningServer, sessionCookieOf } from '../support/test-app';
import { asTenant, ownerDb } from '../support/db';

let server: Awaited<ReturnType<typeof listeningServer>>;
const sockets: Socket[] = [];

beforeAll(async () => {
  server = await listeningServer({ socketSessionCheckSeconds: 0.2 });
});
afterAll(async () => {
  for (const s of sockets) s.close();
  await server.close();
});

async function signIn(email: string) {
  const res = await supertest(server.url).post('/api/session').set(CSRF_HEADER, '1').send({ email, password: TEST_PASSWORD });
  expect(res.status).toBe(200);
  return sessionCookieOf(res);
}

function openSocket(cookie?: string, origin?: string): Socket {
  const headers: Record<string, string> = {};
  if (cookie) headers.cookie = cookie;
  if (origin) headers.origin = origin;
  const socket = connect(server.url, { transports: ['websocket'], extraHeaders: headers, reconnection: false, forceNew: true });
  sockets.push(socket);
  return socket;
}

const connected = (socket: Socket) =>
  new Promise<void>((resolve, reject) => {
    if (socket.connected) return resolve();
    socket.once('connect', () => resolve());
    socket.once('connect_error', reject);
  });

const refused = (socket: Socket) =>
  new Promise<Error>((resolve, reject) => {
    socket.once('connect', () => reject(new Error('the socket was let in')));
    socket.once('connect_error', resolve);
  });

describe('live updates over Socket.IO', () => {
  it('when a farm profile changes, then the co-op\'s signed-in sockets hear it and another co-op\'s do not', async () => {
    const ours = await createTestCoop();
    const theirs = await createTestCoop();
    const editorCookie = await signIn(ours.member.email);
    const watcher = openSocket(await signIn(ours.otherFarmMember.email));
    const outsider = openSocket(await signIn(theirs.member.email));
    await Promise.all([connected(watcher), connected(outsider)]);

    const heard: string[] = [];
    const outsiderHeard: string[] = [];
    watcher.on(RealtimeEvent.farmUpdated, (p: { farmId: string }) => heard.push(p.farmId));
    outsider.on(RealtimeEvent.farmUpdated, (p: { farmId: string }) => outsiderHeard.push(p.farmId));

    const farm = (await supertest(server.url).get(`/api/farms/${ours.member.farmId}`).set('Cookie', editorCookie)).body;
    const patch = await supertest(server.url)
      .patch(`/api/farms/${ours.member.farmId}`)
      .set('Cookie', editorCookie)
      .set(CSRF_HEADER, '1')
      .send({
        name: farm.name, location: 'Over the Hill', timeZone: farm.timeZone, weightUnit: farm.weightUnit,
        temperatureUnit: farm.temperatureUnit, breedsKept: farm.breedsKept, description: farm.description, version: farm.version,
      });
    expect(patch.status).toBe(200);
    await expect.poll(() => heard, { timeout: 3000 }).toEqual([ours.member.farmId]);
    await heardEverythingSoFar(outsider, theirs.member.id);
    expect(outsiderHeard).toEqual([]);
  });

  it('when a socket has no session, then the handshake is refused', async () => {
    const error = await refused(openSocket());
    expect(error).toBeInstanceOf(Error);
  });

  it('when a socket comes from a foreign origin, then it is refused even with a valid session', async () => {
    const coop = await createTestCoop();
    const error = await refused(openSocket(await signIn(coop.member.email), 'https://evil.example'));
    expect(error).toBeInstanceOf(Error);
  });

  it('when the person signs out, then their socket is disconnected at once', async () => {
    const coop = await createTestCoop();
    const cookie = await signIn(coop.member.email);
    const socket = openSocket(cookie);
    await connected(socket);
    const disconnected = new Promise<string>((resolve) => socket.once('disconnect', resolve));
    const out = await supertest(server.url).delete('/api/session').set('Cookie', cookie).set(CSRF_HEADER, '1');
    expect(out.status).toBe(204);
    expect(await disconnected).toBe('io server disconnect');
    // The old cookie cannot open a new one.
    expect(await refused(openSocket(cookie))).toBeInstanceOf(Error);
  });

  it('when a session ends on its own (expired, removed) or the account is disabled, then its socket is dropped', async () => {
    const coop = await createTestCoop();
    const cookie = await signIn(coop.member.email);
    const socket = openSocket(cookie);
    await connected(socket);
    const ended = new Promise<{ reason: string }>((resolve) => socket.once(RealtimeEvent.sessionEnded, resolve));
    const sid = decodeURIComponent(cookie.split('=')[1]!).slice(2).split('.')[0]!;
    await ownerDb((c) => c.query('DELETE FROM user_sessions WHERE sid = $1', [sid]));
    expect((await ended).reason).toBe('session_expired');

    const other = openSocket(await signIn(coop.otherFarmMember.email));
    await connected(other);
    const dropped = new Promise<string>((resolve) => other.once('disconnect', resolve));
    await asTenant(coop.id, (c) => c.query('UPDATE users SET disabled_at = now() WHERE id = $1', [coop.otherFarmMember.id]), { commit: true });
    expect(await dropped).toBe('io server disconnect');
  });
});
