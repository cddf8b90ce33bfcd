// A small reverse proxy for running several app instances locally (`npm run start:cluster`): plain Node, no
// dependencies. Each HTTP request goes to the next instance that answers its health check; a WebSocket upgrade
// is piped to one instance and stays there, so Socket.IO over WebSocket needs no sticky sessions. Production
// uses a real load balancer (docs/deploy.md); this one is for trying the cluster on one machine.
//   node scripts/lib/round-robin-proxy.mjs --port 3000 --upstream 3001 --upstream 3002
import http from 'node:http';
import net from 'node:net';
import { parseArgs } from 'node:util';

const { values } = parseArgs({
  options: {
    port: { type: 'string', default: '3000' },
    upstream: { type: 'string', multiple: true, default: [] },
    silent: { type: 'boolean', default: false },
  },
});
const upstreams = values.upstream.map((port) => ({ port: Number(port), up: true }));
if (upstreams.length === 0) {
  console.error('round-robin-proxy: give at least one --upstream <port>');
  process.exit(1);
}
const say = (message) => {
  if (!values.silent) process.stdout.write(`[proxy] ${message}\n`);
};

let next = 0;
function pick() {
  for (let i = 0; i < upstreams.length; i += 1) {
    const candidate = upstreams[(next + i) % upstreams.length];
    if (candidate.up) {
      next = (next + i + 1) % upstreams.length;
      return candidate;
    }
  }
  return null;
}

// An instance that stops answering is left out until it answers again.
async function checkHealth() {
  await Promise.all(
    upstreams.map(async (u) => {
      const wasUp = u.up;
      try {
        u.up = (await fetch(`http://127.0.0.1:${u.port}/api/health`, { signal: AbortSignal.timeout(2000) })).ok;
      } catch {
        u.up = false;
      }
      if (wasUp !== u.up) say(`instance :${u.port} is ${u.up ? 'up' : 'down'}`);
    }),
  );
}
setInterval(() => void checkHealth(), 1000).unref();

function forwardedHeaders(req) {
  const client = req.socket.remoteAddress ?? '';
  const prior = req.headers['x-forwarded-for'];
  return { ...req.headers, 'x-forwarded-for': prior ? `${prior}, ${client}` : client, 'x-forwarded-proto': 'http' };
}

const server = http.createServer((req, res) => {
  const target = pick();
  if (!target) {
    res.writeHead(503, { 'content-type': 'application/json', 'retry-after': '1' });
    res.end(JSON.stringify({ error: { code: 'unavailable', message: 'No app instance answers' } }));
    return;
  }
  const upstream = http.request(
    { host: '127.0.0.1', port: target.port, method: req.method, path: req.url, headers: forwardedHeaders(req) },
    (answer) => {
      res.writeHead(answer.statusCode ?? 502, answer.rawHeaders);
      answer.pipe(res);
    },
  );
  upstream.on('error', () => {
    // Refused before anything was sent back: the instance is gone; the health check will leave it out.
    target.up = false;
    if (!res.headersSent) {
      res.writeHead(502, { 'content-type': 'application/json', 'retry-after': '1' });
      res.end(JSON.stringify({ error: { code: 'bad_gateway', message: 'The app instance went away; try again' } }));
    } else res.destroy();
  });
  req.pipe(upstream);
});

server.on('upgrade', (req, clientSocket, head) => {
  const target = pick();
  if (!target) return clientSocket.destroy();
  const upstream = net.connect(target.port, '127.0.0.1', () => {
    const headers = forwardedHeaders(req);
    const lines = [`${req.method} ${req.url} HTTP/${req.httpVersion}`];
    for (const [name, value] of Object.entries(headers)) for (const v of [].concat(value)) lines.push(`${name}: ${v}`);
    upstream.write(`${lines.join('\r\n')}\r\n\r\n`);
    if (head?.length) upstream.write(head);
    upstream.pipe(clientSocket);
    clientSocket.pipe(upstream);
  });
  upstream.on('error', () => clientSocket.destroy());
  clientSocket.on('error', () => upstream.destroy());
});

await checkHealth();
server.listen(Number(values.port), '127.0.0.1', () => say(`listening on :${values.port}, instances ${upstreams.map((u) => `:${u.port}`).join(' ')}`));
// Open WebSockets would hold a graceful close for ever; the instances behind see their clients go and reconnect.
const stop = () => process.exit(0);
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
