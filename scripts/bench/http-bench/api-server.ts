// The API as the benchmark runs it: the real app on its own port (0: any free one), in a process of its
// own (so the load tool does not share its event loop). Prints "ready <port>" once listening.
import http from 'node:http';

const { createApp } = await import('../../../packages/server/src/app');
const { connectDatabase } = await import('../../../packages/server/src/composition/database');
connectDatabase(process.env.DATABASE_URL!, Number(process.env.DATABASE_POOL_MAX ?? 10));
const server = http.createServer();
await new Promise<void>((resolve) => server.listen(Number(process.argv[2]), '127.0.0.1', resolve));
const port = (server.address() as { port: number }).port;
server.on('request', createApp({ appUrl: `http://127.0.0.1:${port}` }).app);
console.log(`ready ${port}`);
process.on('SIGTERM', () => process.exit(0));
// The benchmark holds our stdin open: when it goes (even killed), so do we.
process.stdin.on('end', () => process.exit(0));
process.stdin.resume();
