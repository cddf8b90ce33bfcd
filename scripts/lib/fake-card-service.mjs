// A local stand-in for the few endpoints of the card service (Stripe's API) that Burrowline uses, so
// development and tests never reach the network: create and retrieve a Checkout Session, a hosted page
// with Pay and Decline, the redirect back, and webhook deliveries signed with Stripe's documented scheme
// (`Stripe-Signature: t=<unix>,v1=<HMAC-SHA256(secret, "<t>.<body>")>`), retried with back-off.
//
// Accounts are keyed by their secret API key, like the real service: each has a webhook URL and secret
// (set through the control API below, or `--account key,whsec,url` on the command line), so tests on
// one fake each talk to their own app. Plain Node with no dependencies: it runs before packages load.
//
// Control API (not part of the real service, for tests and `npm start`):
//   POST /_fake/accounts                 { apiKey, webhookUrl, webhookSecret }
//   POST /_fake/accounts/:key/switches   { duplicate, delayMs, outOfOrder, hold, retryBaseMs, maxAttempts }
//   POST /_fake/accounts/:key/release    delivers held events (in reverse order when outOfOrder)
//   GET  /_fake/accounts/:key/deliveries every delivery attempt with its answer
//   POST /_fake/sessions/:id/pay|decline what the hosted page's buttons do, for API tests
//   GET  /_fake/health
import { createHmac, randomBytes } from 'node:crypto';
import http from 'node:http';
import { pathToFileURL } from 'node:url';

const defaultSwitches = () => ({ duplicate: false, delayMs: 0, outOfOrder: false, hold: false, retryBaseMs: 500, maxAttempts: 8 });

/** Stripe's form encoding (`a[b][0][c]=1`) back into an object. */
function parseForm(text) {
  const out = {};
  for (const [rawKey, value] of new URLSearchParams(text)) {
    const parts = rawKey.replace(/\]/g, '').split('[');
    let node = out;
    parts.forEach((part, i) => {
      const last = i === parts.length - 1;
      const nextIsIndex = !last && /^\d+$/.test(parts[i + 1]);
      if (last) node[part] = value;
      else node = node[part] ??= nextIsIndex ? [] : {};
    });
  }
  return out;
}

const id = (prefix) => `${prefix}_test_${randomBytes(12).toString('hex')}`;

function escapeHtml(text) {
  return String(text).replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]);
}

export function signatureHeader(payload, secret, timestamp = Math.floor(Date.now() / 1000)) {
  const signature = createHmac('sha256', secret).update(`${timestamp}.${payload}`, 'utf8').digest('hex');
  return `t=${timestamp},v1=${signature}`;
}

/** Starts the fake on 127.0.0.1:`port` (0 picks a free one). */
export async function startFakeCardService({ port = 0, accounts = [], log = () => {} } = {}) {
  const accountsByKey = new Map();
  const sessions = new Map();
  const idempotent = new Map();
  const timers = new Set();
  let baseUrl = '';

  function account(apiKey) {
    let found = accountsByKey.get(apiKey);
    if (!found) {
      found = { apiKey, webhookUrl: null, webhookSecret: null, switches: defaultSwitches(), held: [], deliveries: [] };
      accountsByKey.set(apiKey, found);
    }
    return found;
  }
  for (const a of accounts) Object.assign(account(a.apiKey), { webhookUrl: a.webhookUrl, webhookSecret: a.webhookSecret });

  function later(ms, fn) {
    const timer = setTimeout(() => {
      timers.delete(timer);
      fn();
    }, ms);
    timers.add(timer);
  }

  async function deliver(acct, event, attempt) {
    if (!acct.webhookUrl || !acct.webhookSecret) return;
    const payload = JSON.stringify(event);
    let status;
    try {
      const res = await fetch(acct.webhookUrl, {
        method: 'POST',
        headers: { 'content-type': 'application/json', 'stripe-signature': signatureHeader(payload, acct.webhookSecret), 'user-agent': 'Stripe/1.0 (+https://stripe.com/docs/webhooks)' },
        body: payload,
        signal: AbortSignal.timeout(10_000),
      });
      status = res.status;
      await res.arrayBuffer();
    } catch {
      status = 0;
    }
    acct.deliveries.push({ eventId: event.id, type: event.type, attempt, status, at: new Date().toISOString() });
    log(`webhook ${event.type} ${event.id} attempt ${attempt} → ${status || 'no answer'}`);
    // Like the real service: anything but a 2xx is tried again later, each wait twice the one before.
    if ((status < 200 || status >= 300) && attempt < acct.switches.maxAttempts) {
      later(acct.switches.retryBaseMs * 2 ** (attempt - 1), () => void deliver(acct, event, attempt + 1));
    }
  }

  function send(acct, event) {
    const copies = acct.switches.duplicate ? 2 : 1;
    for (let i = 0; i < copies; i++) {
      if (acct.switches.hold || acct.switches.outOfOrder) acct.held.push(event);
      else later(acct.switches.delayMs, () => void deliver(acct, event, 1));
    }
  }

  function release(acct) {
    const events = acct.switches.outOfOrder ? [...acct.held].reverse() : [...acct.held];
    acct.held = [];
    // One after the other, so "out of order" really arrives in that order.
    let chain = Promise.resolve();
    for (const event of events) chain = chain.then(() => deliver(acct, event, 1));
    return chain.then(() => events.length);
  }

  function eventFor(acct, type, object) {
    return {
      id: id('evt'), object: 'event', api_version: '2025-01-01', created: Math.floor(Date.now() / 1000), livemode: false,
      type, data: { object: { ...object } }, pending_webhooks: 1, request: { id: null, idempotency_key: null },
    };
  }

  function settle(session, outcome) {
    const acct = account(session._apiKey);
    if (session.status !== 'open') return session;
    if (outcome === 'pay') {
      session.status = 'complete';
      session.payment_status = 'paid';
      session.payment_intent = id('pi');
      send(acct, eventFor(acct, 'checkout.session.completed', publicSession(session)));
    } else {
      session.status = 'expired';
      send(acct, eventFor(acct, 'checkout.session.expired', publicSession(session)));
    }
    return session;
  }

  function publicSession(session) {
    return Object.fromEntries(Object.entries(session).filter(([key]) => key !== '_apiKey'));
  }

  function createSession(apiKey, params) {
    const lineItems = params.line_items ?? [];
    const amount = lineItems.reduce((sum, item) => sum + Number(item.price_data?.unit_amount ?? 0) * Number(item.quantity ?? 1), 0);
    const currency = (lineItems[0]?.price_data?.currency ?? 'usd').toLowerCase();
    if (!params.success_url || amount <= 0) return { status: 400, body: { error: { type: 'invalid_request_error', message: 'success_url and line_items with a positive amount are required' } } };
    const sessionId = id('cs');
    const session = {
      id: sessionId, object: 'checkout.session', mode: params.mode ?? 'payment', status: 'open', payment_status: 'unpaid',
      amount_total: amount, amount_subtotal: amount, currency, client_reference_id: params.client_reference_id ?? null,
      customer_email: params.customer_email ?? null, metadata: params.metadata ?? {}, success_url: params.success_url,
      cancel_url: params.cancel_url ?? null, url: `${baseUrl}/pay/${sessionId}`, payment_intent: null, livemode: false,
      created: Math.floor(Date.now() / 1000), expires_at: Math.floor(Date.now() / 1000) + 24 * 3600, _apiKey: apiKey,
    };
    sessions.set(sessionId, session);
    return { status: 200, body: publicSession(session) };
  }

  function hostedPage(session) {
    const amount = new Intl.NumberFormat('en-US', { style: 'currency', currency: session.currency.toUpperCase() }).format(session.amount_total / 100);
    const name = session.metadata?.description ?? 'Payment';
    const done = session.status !== 'open';
    return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>Test card payment</title><style>body{font-family:system-ui,sans-serif;background:#f4f4f6;margin:0;padding:24px;color:#222}
main{max-width:420px;margin:40px auto;background:#fff;border-radius:12px;padding:24px;box-shadow:0 2px 12px #0002}
.amount{font-size:2rem;font-weight:700;margin:8px 0 24px}button{width:100%;min-height:48px;font-size:1rem;border-radius:8px;border:0;margin-top:12px;cursor:pointer}
.pay{background:#1f4f8f;color:#fff}.decline{background:#eee;color:#333}.note{font-size:.8rem;color:#666;margin-top:16px}</style></head>
<body><main><p>Local test card page — no real card is charged</p><h1>${escapeHtml(name)}</h1><p class="amount">${escapeHtml(amount)}</p>
${done ? `<p>This checkout is ${escapeHtml(session.status)}.</p>` : `<form method="post" action="/pay/${session.id}/pay"><button class="pay" type="submit">Pay</button></form>
<form method="post" action="/pay/${session.id}/decline"><button class="decline" type="submit">Decline</button></form>`}
<p class="note">A stand-in for the card service's hosted checkout, for development and tests.</p></main></body></html>`;
  }

  const readBody = (req) => new Promise((resolve, reject) => {
    const chunks = [];
    req.on('data', (c) => chunks.push(c));
    req.on('end', () => resolve(Buffer.concat(chunks).toString('utf8')));
    req.on('error', reject);
  });

  const json = (res, status, body) => {
    res.writeHead(status, { 'content-type': 'application/json', 'request-id': id('req') });
    res.end(JSON.stringify(body));
  };

  const server = http.createServer(async (req, res) => {
    try {
      const url = new URL(req.url ?? '/', 'http://fake');
      const path = url.pathname;
      const body = await readBody(req);

      if (path === '/_fake/health') return json(res, 200, { ok: true });
      if (req.method === 'POST' && path === '/_fake/accounts') {
        const input = JSON.parse(body || '{}');
        const acct = account(input.apiKey);
        Object.assign(acct, { webhookUrl: input.webhookUrl, webhookSecret: input.webhookSecret, switches: defaultSwitches(), held: [], deliveries: [] });
        return json(res, 200, { apiKey: acct.apiKey });
      }
      let m = path.match(/^\/_fake\/accounts\/([^/]+)\/(switches|release|deliveries)$/);
      if (m) {
        const acct = account(decodeURIComponent(m[1]));
        if (m[2] === 'switches') Object.assign(acct.switches, JSON.parse(body || '{}'));
        if (m[2] === 'release') return json(res, 200, { released: await release(acct) });
        if (m[2] === 'deliveries') return json(res, 200, { deliveries: acct.deliveries, held: acct.held.length });
        return json(res, 200, acct.switches);
      }
      m = path.match(/^\/(?:_fake\/sessions|pay)\/(cs_test_[a-f0-9]+)\/(pay|decline)$/);
      if (m && req.method === 'POST') {
        const session = sessions.get(m[1]);
        if (!session) return json(res, 404, { error: { message: 'No such checkout session' } });
        settle(session, m[2]);
        if (path.startsWith('/_fake/')) return json(res, 200, publicSession(session));
        const target = (m[2] === 'pay' ? session.success_url : session.cancel_url ?? session.success_url).replace('{CHECKOUT_SESSION_ID}', session.id);
        res.writeHead(303, { location: target });
        return res.end();
      }
      m = path.match(/^\/pay\/(cs_test_[a-f0-9]+)$/);
      if (m && req.method === 'GET') {
        const session = sessions.get(m[1]);
        if (!session) {
          res.writeHead(404, { 'content-type': 'text/plain' });
          return res.end('No such checkout');
        }
        res.writeHead(200, { 'content-type': 'text/html; charset=utf-8' });
        return res.end(hostedPage(session));
      }

      // The card service's API: a secret key in the Authorization header.
      if (path.startsWith('/v1/')) {
        const apiKey = (req.headers.authorization ?? '').replace(/^Bearer\s+/i, '');
        if (!apiKey.startsWith('sk_')) return json(res, 401, { error: { type: 'invalid_request_error', message: 'Invalid API Key provided' } });
        if (req.method === 'POST' && path === '/v1/checkout/sessions') {
          const key = req.headers['idempotency-key'];
          const cacheKey = key ? `${apiKey}:${key}` : null;
          if (cacheKey && idempotent.has(cacheKey)) {
            const cached = idempotent.get(cacheKey);
            if (cached.body !== body) return json(res, 400, { error: { type: 'idempotency_error', message: 'Keys for idempotent requests can only be used with the same parameters they were first used with.' } });
            res.setHeader('idempotent-replayed', 'true');
            return json(res, cached.status, cached.response);
          }
          const created = createSession(apiKey, parseForm(body));
          if (cacheKey) idempotent.set(cacheKey, { body, status: created.status, response: created.body });
          return json(res, created.status, created.body);
        }
        m = path.match(/^\/v1\/checkout\/sessions\/([^/]+)$/);
        if (req.method === 'GET' && m) {
          const session = sessions.get(m[1]);
          if (!session || session._apiKey !== apiKey) return json(res, 404, { error: { type: 'invalid_request_error', message: `No such checkout.session: '${m[1]}'` } });
          return json(res, 200, publicSession(session));
        }
        return json(res, 404, { error: { type: 'invalid_request_error', message: `Unrecognized request URL (${req.method}: ${path}).` } });
      }
      json(res, 404, { error: { message: 'Not found' } });
    } catch (error) {
      json(res, 500, { error: { message: String(error) } });
    }
  });

  await new Promise((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', resolve);
  });
  baseUrl = `http://127.0.0.1:${server.address().port}`;
  return {
    url: baseUrl,
    port: server.address().port,
    close: async () => {
      for (const timer of timers) clearTimeout(timer);
      timers.clear();
      server.closeAllConnections();
      await new Promise((resolve) => server.close(() => resolve()));
    },
  };
}

// As a program: `node scripts/lib/fake-card-service.mjs --port 12111 [--account key,whsec,url]…`
if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  const args = process.argv.slice(2);
  const port = Number(args[args.indexOf('--port') + 1] ?? 12111);
  const accounts = [];
  args.forEach((arg, i) => {
    if (arg === '--account') {
      const [apiKey, webhookSecret, webhookUrl] = args[i + 1].split(',');
      accounts.push({ apiKey, webhookSecret, webhookUrl });
    }
  });
  const quiet = args.includes('--silent');
  const fake = await startFakeCardService({ port, accounts, log: quiet ? () => {} : (line) => console.log(`[fake card service] ${line}`) });
  console.log(`[fake card service] listening on ${fake.url}`);
  const stop = () => fake.close().then(() => process.exit(0));
  process.on('SIGTERM', stop);
  process.on('SIGINT', stop);
}
