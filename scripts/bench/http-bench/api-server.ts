// The API as the benchmark runs it: the real app on its own port, in a process of its own (so the load
// tool does not share its event loop). Prints "ready" once listening.
import http from 'node:http';

const port = Number(process.argv[2]);
const { createApp } = await import('../../../packages/server/src/app');
const { connectDatabase } = await import('../../../packages/server/src/composition/database');
connectDatabase(process.env.DATABASE_URL!, Number(process.env.DATABASE_POOL_MAX ?? 10));
const handle = createApp({ appUrl: `http://127.0.0.1:${port}` });
const server = http.createServer(handle.app);
server.listen(port, '127.0.0.1', () => console.log('ready'));
process.on('SIGTERM', () => process.exit(0));
