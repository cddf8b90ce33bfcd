import http from 'node:http';
import type { AddressInfo } from 'node:net';
import supertest from 'supertest';
import { CSRF_HEADER } from '@burrowline/shared';
import { createApp, type AppHandle } from '../../packages/server/src/app';
import type { Config } from '../../packages/server/src/config/env';
import { attachRealtime, closeRealtime } from '../../packages/server/src/lib/realtime';

/** Sign-in limits loose enough for a file that signs many people in (the limits have their own tests). */
export const ROOMY_SIGN_IN: Config['signIn'] = { windowSeconds: 60, maxPerIp: 100_000, maxFailuresPerAccount: 100_000, maxFailuresPerAccountAllAddresses: 100_000, maxResetsPerIp: 100_000 };

let shared: AppHandle | null = null;

/**
 * The app as `createApp()` builds it, against the test run's real PostgreSQL and maildev. Files that run
 * one after another in a worker share it; closing it (a file's `afterAll`) lets the next file build anew.
 */
export function testApp(overrides: Partial<Config> = {}): AppHandle {
  if (Object.keys(overrides).length > 0) return createApp(overrides);
  if (!shared) {
    const handle = createApp();
    const close = handle.close;
    handle.close = async () => {
      if (shared === handle) shared = null;
      await close();
    };
    shared = handle;
  }
  return shared;
}

export type Agent = ReturnType<typeof supertest.agent>;

/** A cookie-keeping client that sends the CSRF header like our web client does. */
export function agentFor(handle: AppHandle = testApp()): Agent {
  return supertest.agent(handle.app).set(CSRF_HEADER, '1');
}

export async function signedInAgent(email: string, password: string, handle: AppHandle = testApp()): Promise<Agent> {
  const agent = agentFor(handle);
  const res = await agent.post('/api/session').send({ email, password });
  if (res.status !== 200) throw new Error(`sign-in of ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
  return agent;
}

const sharedAgents = new WeakMap<AppHandle, Map<string, Promise<Agent>>>();

/**
 * A client signed in once per person and app, then shared by the tests that act as that person (every
 * test co-op has its own people, so files never share one). For tests that only act as the person; a test that signs out, changes the person's
 * password or account, or checks sessions uses its own `signedInAgent`.
 */
export function sharedSignedInAgent(email: string, password: string, handle: AppHandle = testApp()): Promise<Agent> {
  const agents = sharedAgents.get(handle) ?? new Map<string, Promise<Agent>>();
  sharedAgents.set(handle, agents);
  let agent = agents.get(email);
  if (!agent) {
    agent = signedInAgent(email, password, handle);
    agents.set(email, agent);
    // A failed sign-in is not kept: the next test tries again and reports its own failure.
    agent.catch(() => agents.delete(email));
  }
  return agent;
}

/** A listening HTTP + Socket.IO server on a free loopback port, as server.ts builds it. */
export async function listeningServer(overrides: Partial<Config> = {}) {
  const server = http.createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as AddressInfo;
  const url = `http://127.0.0.1:${port}`;
  const handle = createApp({ appUrl: url, ...overrides });
  server.on('request', handle.app);
  attachRealtime(server, handle.realtime);
  return {
    url,
    handle,
    close: async () => {
      await closeRealtime();
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
      await handle.close();
    },
  };
}

/** The session cookie from a sign-in response, for clients that are not supertest (sockets, browsers). */
export function sessionCookieOf(res: supertest.Response): string {
  const cookies = ([] as string[]).concat(res.headers['set-cookie'] ?? []);
  const cookie = cookies.find((c) => c.startsWith('burrowline.sid='));
  if (!cookie) throw new Error('no session cookie in the response');
  return cookie.split(';')[0]!;
}
