/**
 * E-mail through the outbox: nothing acknowledged is lost, and nothing is sent twice. The server runs
 * as `npm start` runs it, in its own process, on its own PostgreSQL cluster and with its own mail
 * server, so the mail server can be stopped and the server killed without disturbing other test files.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import path from 'node:path';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CSRF_HEADER } from '@burrowline/shared';
import { withTenant } from '../../packages/server/src/db/tenant';
import { deliverQueuedMail, queueMail } from '../../packages/server/src/lib/mail-outbox';
import { composeMail } from '../../packages/server/src/lib/mailer';
import { root } from '../../scripts/lib/bootstrap.mjs';
import { asTenant } from '../support/db';
import { applicationBody, createTestCoop } from '../support/factories';
import { mailsTo, waitForMail } from '../support/mail';
import { ownServer, stopChild, waitUntil } from '../support/own-server';
import { testApp } from '../support/test-app';

const SMTP_PORT = 1962;
const INBOX = 'http://127.0.0.1:1963';
/** Nothing listens here: a mail server that is down. */
const DEAD_SMTP_PORT = 1964;
const ADMIN = { email: 'admin@demo.test', password: 'burrowline-demo' };
const DEMO_COOP = 'larkspur-hollow';

const server = ownServer({
  cluster: 'pg-mail-outbox',
  pgPort: 25462,
  appPort: 3962,
  env: {
    SESSION_SECRET: 'mail-outbox-secret-mail-outbox-secret-0123',
    SMTP_HOST: '127.0.0.1',
    SMTP_PORT: String(SMTP_PORT),
    MAIL_POLL_SECONDS: '0.5',
    MAIL_RETRY_DELAY_SECONDS: '1',
    MORNING_EMAIL_JOBS: 'false',
  },
});
let maildev: ChildProcess | null = null;

async function startMailServer() {
  maildev = spawn(process.execPath, [
    path.join(root, 'node_modules', 'maildev', 'dist', 'bin', 'maildev.js'),
    '--smtp', String(SMTP_PORT), '--ip', '127.0.0.1', '--web', INBOX.split(':').at(-1)!, '--web-ip', '127.0.0.1', '--silent',
  ], { stdio: ['ignore', 'ignore', 'inherit'] });
  await waitUntil(async () => (await fetch(`${INBOX}/api/healthz`)).ok, 'maildev did not start', 30_000, 100);
}

async function stopMailServer() {
  const child = maildev;
  maildev = null;
  await stopChild(child);
}

interface OutboxRow {
  attempts: number;
  last_error: string | null;
  sent_at: Date | null;
  message_id: string;
}

/** Read as the cluster's superuser: row-level security does not hide rows from it. */
async function outboxRow(key: string): Promise<OutboxRow | undefined> {
  return (await server.superuserQuery<OutboxRow>('SELECT attempts, last_error, sent_at, message_id FROM email_outbox WHERE idempotency_key = $1', [key]))[0];
}

async function signedInAdmin() {
  const agent = supertest.agent(server.url).set(CSRF_HEADER, '1');
  expect((await agent.post('/api/session').send(ADMIN)).status).toBe(200);
  return agent;
}

/** A new application to the demo co-op, from a unique address. */
async function apply() {
  const body = applicationBody();
  const res = await supertest(server.url).post(`/api/apply/${DEMO_COOP}`).set(CSRF_HEADER, '1').send(body);
  expect(res.status).toBe(201);
  return { id: res.body.id as string, email: body.email };
}

async function sentRow(key: string): Promise<OutboxRow> {
  await waitUntil(async () => Boolean((await outboxRow(key))?.sent_at), `the e-mail ${key} was not marked sent`);
  return (await outboxRow(key))!;
}

// A cluster of its own, migrated and seeded: it can take minutes while the whole suite shares two cores.
beforeAll(async () => {
  await startMailServer();
  await server.setUp();
}, 300_000);

afterAll(async () => {
  await server.tearDown();
  await stopMailServer();
  await testApp().close();
});

describe('e-mail through the outbox', () => {
  it('when the mail server is down while an application is approved, then the e-mail waits, is retried, and arrives exactly once when the server is back', async () => {
    const admin = await signedInAdmin();
    const application = await apply();
    await stopMailServer();

    const approved = await admin.post(`/api/applications/${application.id}/approval`).send({});
    expect(approved.status).toBe(200);
    const key = `application-approved:${application.id}`;
    // The worker has tried and been refused: the e-mail is kept, not sent.
    await waitUntil(async () => ((await outboxRow(key))?.attempts ?? 0) >= 1, 'the worker never tried to send');
    const refused = (await outboxRow(key))!;
    expect(refused.sent_at).toBeNull();
    expect(refused.last_error).toMatch(/ECONNREFUSED|connect/i);

    await startMailServer();
    const sent = await sentRow(key);
    const mails = (await mailsTo(application.email, INBOX)).filter((m) => /^Welcome to /.test(m.subject));
    expect(mails).toHaveLength(1);
    expect(mails[0]!.headers['message-id']).toBe(sent.message_id);
    expect(mails[0]!.text).toContain('/set-password?token=');
  }, 90_000);

  it('when the server is killed with SIGKILL right after answering an approval, then the restarted server sends the e-mail exactly once', async () => {
    // The first instance's mail server is unreachable, so the e-mail certainly was not sent before the kill.
    await server.stop();
    await server.start({ SMTP_PORT: String(DEAD_SMTP_PORT), MAIL_POLL_SECONDS: '30' });
    const admin = await signedInAdmin();
    const application = await apply();
    const approved = await admin.post(`/api/applications/${application.id}/approval`).send({});
    expect(approved.status).toBe(200);
    await server.stop('SIGKILL');

    // The answer meant the commit: the e-mail is in the outbox, unsent.
    const key = `application-approved:${application.id}`;
    const kept = await outboxRow(key);
    expect(kept).toBeDefined();
    expect(kept!.sent_at).toBeNull();
    expect(await mailsTo(application.email, INBOX)).toEqual([]);

    await server.start();
    const sent = await sentRow(key);
    const mail = await waitForMail(application.email, { inbox: INBOX, subject: /^Welcome to / });
    expect(mail.headers['message-id']).toBe(sent.message_id);
    expect((await mailsTo(application.email, INBOX)).filter((m) => /^Welcome to /.test(m.subject))).toHaveLength(1);
  }, 90_000);

  it('when one event queues its e-mail twice and its job runs again after the send, then one e-mail goes out', async () => {
    // In this process, against the test run's own database and mail server.
    testApp();
    const coop = await createTestCoop();
    const to = `outbox-${randomUUID()}@example.test`;
    const key = `test-notice:${coop.id}`;
    const message = composeMail({ to, subject: 'One notice', greeting: 'Hello,', paragraphs: ['This goes once.'] });
    const first = await withTenant({ coopId: coop.id }, (tx) => queueMail(tx, key, message));
    const again = await withTenant({ coopId: coop.id }, (tx) => queueMail(tx, key, { ...message, subject: 'A second notice' }));
    expect([first, again]).toEqual([true, false]);

    const row = async () =>
      asTenant(coop.id, async (c) => (await c.query<{ id: string; sent_at: Date | null }>('SELECT id, sent_at FROM email_outbox WHERE idempotency_key = $1', [key])).rows);
    await waitUntil(async () => (await row()).some((r) => r.sent_at), 'the e-mail was not marked sent', 15_000);
    const rows = await row();
    expect(rows).toHaveLength(1);
    // A retried job after the send finds it sent and sends nothing.
    expect(await deliverQueuedMail({ outboxId: rows[0]!.id, coopId: coop.id })).toBe('already sent');
    const mails = await mailsTo(to);
    expect(mails.map((m) => m.subject)).toEqual(['One notice']);
  });
});
