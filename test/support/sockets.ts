import supertest from 'supertest';
import { afterAll, beforeAll } from 'vitest';
import { io as connect, type Socket } from 'socket.io-client';
import { CSRF_HEADER } from '@burrowline/shared';
import type { Config } from '../../packages/server/src/config/env';
import { listeningServer, sessionCookieOf } from './test-app';
import { TEST_PASSWORD } from './global-setup';

/** Sockets of one test file, signed in through a listening server, closed together at the end. */
export function socketKit(url: () => string) {
  const open: Socket[] = [];

  async function signInCookie(email: string, password = TEST_PASSWORD): Promise<string> {
    const res = await supertest(url()).post('/api/session').set(CSRF_HEADER, '1').send({ email, password });
    if (res.status !== 200) throw new Error(`sign-in of ${email} failed: ${res.status}`);
    return sessionCookieOf(res);
  }

  /** A connected socket for the person, with every event it hears recorded by name. */
  async function listen(email: string): Promise<{ socket: Socket; cookie: string; heard: Map<string, unknown[]> }> {
    const cookie = await signInCookie(email);
    const socket = connect(url(), { transports: ['websocket'], extraHeaders: { cookie }, reconnection: false, forceNew: true });
    open.push(socket);
    const heard = new Map<string, unknown[]>();
    socket.onAny((event: string, payload: unknown) => {
      if (!heard.has(event)) heard.set(event, []);
      heard.get(event)!.push(payload);
    });
    await new Promise<void>((resolve, reject) => {
      socket.once('connect', () => resolve());
      socket.once('connect_error', reject);
    });
    return { socket, cookie, heard };
  }

  const closeAll = () => {
    for (const socket of open) socket.close();
  };

  return { signInCookie, listen, closeAll };
}

/**
 * A listening server and a socket kit for one describe block: started before its tests, sockets and
 * server closed after. `url` is the server's address once it listens.
 */
export function liveTestServer(overrides: Partial<Config> = {}) {
  let server: Awaited<ReturnType<typeof listeningServer>> | undefined;
  const kit = socketKit(() => server!.url);
  beforeAll(async () => {
    server = await listeningServer(overrides);
  });
  afterAll(async () => {
    kit.closeAll();
    await server?.close();
  });
  return {
    kit,
    get url() {
      return server!.url;
    },
  };
}
