import { createAdapter } from '@socket.io/postgres-adapter';
import pg from 'pg';
import { logger } from './logger';

/**
 * Socket.IO's PostgreSQL adapter: an event published on one app instance is sent with NOTIFY and every other
 * instance emits it to its own sockets in that room; large payloads go through `socket_io_attachments`
 * (migration 0120). Its own small pool: one connection held for LISTEN, one for NOTIFY and the clean-up.
 */
export function postgresAdapter(connectionString: string) {
  const pool = new pg.Pool({ connectionString, max: 2, application_name: 'burrowline-realtime' });
  // A lost connection (a database restart) must not end the process: the adapter listens again by itself.
  pool.on('error', (error) => logger.warn('realtime database connection lost', { error: String(error) }));
  pool.on('connect', (client) => client.on('error', (error) => logger.warn('realtime database connection lost', { error: String(error) })));
  const adapter = createAdapter(pool, {
    tableName: 'socket_io_attachments',
    errorHandler: (error) => logger.warn('realtime across instances failed', { error: String(error) }),
  });
  return { adapter, close: () => pool.end() };
}
