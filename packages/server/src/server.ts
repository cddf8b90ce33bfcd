import http from 'node:http';
import { createApp } from './app';
import { closeDatabase } from './db/sequelize';
import { logger } from './lib/logger';
import { attachRealtime, closeRealtime } from './lib/realtime';
import { startDigestScheduler, type DigestScheduler } from './modules/almanac/digest-scheduler';

/** HTTP + Socket.IO on one port, with a graceful shutdown that lets requests in flight finish. */
export async function startServer() {
  const handle = createApp();
  const server = http.createServer(handle.app);
  attachRealtime(server, handle.realtime);
  await new Promise<void>((resolve) => server.listen(handle.config.port, handle.config.host, resolve));
  logger.info('listening', { url: handle.config.appUrl, port: handle.config.port });
  // The Almanac's morning e-mail: a PostgreSQL job queue, so a run survives a restart and goes once across instances.
  const digest: DigestScheduler | null = handle.config.morningEmailJobs
    ? await startDigestScheduler({ connectionString: handle.config.databaseUrl, appUrl: handle.config.appUrl }).catch((error: unknown) => {
        logger.error('morning e-mail jobs not started', { error: String(error) });
        return null;
      })
    : null;

  let closing = false;
  const shutdown = async (signal: string) => {
    if (closing) return;
    closing = true;
    logger.info('shutting down', { signal });
    setTimeout(() => process.exit(1), 10_000).unref();
    await closeRealtime();
    await digest?.stop().catch(() => undefined);
    await new Promise<void>((resolve) => server.close(() => resolve()));
    await handle.close();
    await closeDatabase();
    process.exit(0);
  };
  process.on('SIGINT', () => void shutdown('SIGINT'));
  process.on('SIGTERM', () => void shutdown('SIGTERM'));
  return server;
}

await startServer();
