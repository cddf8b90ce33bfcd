import Stripe from 'stripe';
import type { CardConfig } from '../../config/env';

/**
 * The card service's SDK (Stripe's official Node library), pointed where the configuration says: the real
 * service when no host is set, the local fake in development and tests. One client per configuration.
 */
const clients = new Map<string, Stripe>();

export function cardClient(config: CardConfig): Stripe {
  const key = JSON.stringify(config);
  let client = clients.get(key);
  if (!client) {
    client = new Stripe(config.secretKey, {
      ...(config.apiHost ? { host: config.apiHost } : {}),
      ...(config.apiPort ? { port: config.apiPort } : {}),
      ...(config.apiProtocol ? { protocol: config.apiProtocol } : {}),
      maxNetworkRetries: 2,
      timeout: 15_000,
      appInfo: { name: 'Burrowline' },
    });
    clients.set(key, client);
  }
  return client;
}
