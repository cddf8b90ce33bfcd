import { randomUUID } from 'node:crypto';
import supertest from 'supertest';
import { afterAll, beforeAll } from 'vitest';
import { io as connect, type Socket } from 'socket.io-client';
import { CSRF_HEADER, rooms } from '@burrowline/shared';
import { publish } from '../../packages/server/src/lib/realtime';
import type { Config } from '../../packages/server/src/config/env';
import { listeningServer, sessionCookieOf } from './test-app';
import { TEST_PASSWORD } from './global-setup';

/** A test-only event, never one the product sends; `listen` does not record it. */
const MARKER_EVENT = 'test:marker';

/**
 * Resolves once `socket` (signed in as `userId`) hears a marker published now. One connection delivers events in
 * the order they were published, so anything published before (an event the socket must not get) would have
 * arrived first: "heard nothing" is then a fact, not the silence of a short wait.
 */
export async function heardEverythingSoFar(socket: Socket, userId: string): Promise<void> {
  const marker = randomUUID();
  const arrived = new Promise<void>((resolve) => {
    const onMarker = (payload: { marker?: string }) => {
      if (payload?.marker !== marker) return;
      socket.off(MARKER_EVENT, onMarker);
      resolve();
    };
    socket.on(MARKER_EVENT, onMarker);
  });
  // The product's events are typed; the marker is deliberately not one of them.
  (publish as unknown as (room: string, event: string, payload: unknown) => void)(rooms.user(userId), MARKER_EVENT, { marker });
  await arrived;
}

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
      if (event === MARKER_EVENT) return;
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
