import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { randomBytes, randomUUID } from 'node:crypto';
import { createApp, type AppHandle } from '../../packages/server/src/app';
import type { CardConfig, Config } from '../../packages/server/src/config/env';
import { attachRealtime, closeRealtime } from '../../packages/server/src/lib/realtime';

/** The fake card service the test command started (scripts/lib/fake-card-service.mjs). */
export const fakeCardUrl = () => process.env.FAKE_CARD_SERVICE_URL ?? `http://127.0.0.1:${process.env.STRIPE_API_PORT ?? 12112}`;

/** Card settings of an account of its own on the fake, so files and tests never see each other's webhooks. */
export function cardAccount(): CardConfig {
  return {
    secretKey: `sk_test_${randomUUID().replace(/-/g, '')}`,
    webhookSecret: `whsec_${randomBytes(24).toString('hex')}`,
    apiHost: '127.0.0.1',
    apiPort: Number(new URL(fakeCardUrl()).port),
    apiProtocol: 'http',
  };
}

async function control(path: string, body?: object) {
  const res = await fetch(`${fakeCardUrl()}${path}`, {
    method: body === undefined && path.endsWith('deliveries') ? 'GET' : 'POST',
    headers: { 'content-type': 'application/json' },
    body: body === undefined && path.endsWith('deliveries') ? undefined : JSON.stringify(body ?? {}),
  });
  if (!res.ok) throw new Error(`fake card service ${path}: ${res.status}`);
  return res.json();
}

export const fakeCard = {
  register: (card: CardConfig, webhookUrl: string) => control('/_fake/accounts', { apiKey: card.secretKey, webhookSecret: card.webhookSecret, webhookUrl }),
  switches: (card: CardConfig, switches: { duplicate?: boolean; delayMs?: number; outOfOrder?: boolean; hold?: boolean; retryBaseMs?: number; maxAttempts?: number }) =>
    control(`/_fake/accounts/${card.secretKey}/switches`, switches),
  release: (card: CardConfig) => control(`/_fake/accounts/${card.secretKey}/release`, {}),
  deliveries: (card: CardConfig) => control(`/_fake/accounts/${card.secretKey}/deliveries`) as Promise<{ deliveries: { eventId: string; type: string; attempt: number; status: number }[]; held: number }>,
  /** What the hosted page's buttons do. */
  pay: (sessionId: string) => control(`/_fake/sessions/${sessionId}/pay`, {}),
  decline: (sessionId: string) => control(`/_fake/sessions/${sessionId}/decline`, {}),
};

/** The app listening on a port that can be reused after it closes (a restart). */
export async function cardTestServer(card: CardConfig, port = 0, overrides: Partial<Config> = {}) {
  const server = http.createServer();
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', resolve);
  });
  const actual = (server.address() as AddressInfo).port;
  const url = `http://127.0.0.1:${actual}`;
  const handle: AppHandle = createApp({ appUrl: url, card, ...overrides });
  server.on('request', handle.app);
  attachRealtime(server, handle.realtime);
  return {
    url,
    port: actual,
    handle,
    close: async () => {
      await closeRealtime();
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
      await handle.close();
    },
  };
}

/** Waits until `check` holds, reading again every 100 ms. */
export async function eventually<T>(read: () => Promise<T>, check: (value: T) => boolean, timeoutMs = 15_000): Promise<T> {
  const start = Date.now();
  for (;;) {
    const value = await read();
    if (check(value)) return value;
    if (Date.now() - start > timeoutMs) return value;
    await new Promise((r) => setTimeout(r, 100));
  }
}
