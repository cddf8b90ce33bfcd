import path from 'node:path';
import pg from 'pg';

interface MaildevMessage {
  id: string;
  subject: string;
  text: string;
  html: string;
  to: { address: string; name?: string }[];
  headers: Record<string, string>;
}

const api = () => {
  const url = process.env.MAILDEV_API;
  if (!url) throw new Error('MAILDEV_API is not set: run the tests with npm test');
  return url;
};

/**
 * Waits for the mail to a unique recipient to reach maildev (never clears the shared inbox). `inbox` is
 * another maildev's web address, for a test that runs a mail server of its own.
 */
export async function waitForMail(to: string, opts: { subject?: RegExp; timeoutMs?: number; inbox?: string } = {}): Promise<MaildevMessage> {
  const deadline = Date.now() + (opts.timeoutMs ?? 10_000);
  while (Date.now() < deadline) {
    const res = await fetch(`${opts.inbox ?? api()}/api/email`);
    const all = (await res.json()) as MaildevMessage[];
    const found = all.filter(
      (m) => m.to.some((r) => r.address.toLowerCase() === to.toLowerCase()) && (!opts.subject || opts.subject.test(m.subject)),
    );
    if (found.length) return found.at(-1)!;
    await new Promise((r) => setTimeout(r, 150));
  }
  throw new Error(`no e-mail to ${to}${opts.subject ? ` matching ${opts.subject}` : ''} arrived`);
}

export async function mailsTo(to: string, inbox = api()): Promise<MaildevMessage[]> {
  const res = await fetch(`${inbox}/api/email`);
  const all = (await res.json()) as MaildevMessage[];
  return all.filter((m) => m.to.some((r) => r.address.toLowerCase() === to.toLowerCase()));
}

export function linkIn(message: MaildevMessage, pathPrefix: string): URL {
  const match = message.text.match(new RegExp(`https?://[^\\s]+${pathPrefix.replace(/[/?]/g, '\\$&')}[^\\s]*`));
  if (!match) throw new Error(`no ${pathPrefix} link in the e-mail`);
  return new URL(match[0]);
}

export interface QueuedMail {
  subject: string;
  idempotency_key: string;
  sent_at: Date | null;
}

/**
 * Every e-mail queued to an address in any co-op of the test database, read as the cluster's superuser
 * (row-level security hides other co-ops from the app role). Queuing is part of the request's
 * transaction, so after the answer this is final: an empty list means no e-mail will ever go.
 */
export async function queuedMailTo(to: string): Promise<QueuedMail[]> {
  const cluster = process.env.PG_CLUSTER_NAME ?? 'pg-test';
  const port = Number(new URL(process.env.DATABASE_URL!).port);
  const client = new pg.Client({ host: path.resolve('.data', `${cluster}-socket`), port, user: 'postgres', database: 'burrowline' });
  await client.connect();
  try {
    const { rows } = await client.query<QueuedMail>(
      'SELECT subject, idempotency_key, sent_at FROM email_outbox WHERE lower(recipient) = lower($1) ORDER BY created_at',
      [to],
    );
    return rows;
  } finally {
    await client.end();
  }
}

/**
 * The e-mails maildev holds for an address once everything queued to it has been sent: the moment
 * to count them ("exactly once"), instead of after a fixed wait.
 */
export async function deliveredMailsTo(to: string, opts: { timeoutMs?: number } = {}): Promise<MaildevMessage[]> {
  const deadline = Date.now() + (opts.timeoutMs ?? 10_000);
  for (;;) {
    const queued = await queuedMailTo(to);
    if (queued.every((m) => m.sent_at)) break;
    if (Date.now() > deadline) throw new Error(`e-mail to ${to} still waiting: ${queued.filter((m) => !m.sent_at).map((m) => m.idempotency_key).join(', ')}`);
    await new Promise((r) => setTimeout(r, 150));
  }
  return mailsTo(to);
}
