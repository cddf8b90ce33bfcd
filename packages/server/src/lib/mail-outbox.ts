import PgBoss from 'pg-boss';
import { QueryTypes, type Transaction } from 'sequelize';
import { database } from '../db/sequelize';
import { withTenant } from '../db/tenant';
import { logger } from './logger';
import { headerSafe, messageIdFor, transmitMail, type MailMessage } from './mailer';

/*
 * Why an outbox table drained by a pg-boss job, and not the job alone: the row is the one durable
 * record of "sent", set in the same transaction that holds the row locked while the mail server
 * accepts the message, so a retry (a timed-out job, a second worker) never sends it twice, and its
 * unique key stays after pg-boss archives and deletes old jobs. The job, written on the same
 * transaction's connection, only wakes a worker at once and retries with back-off; it carries the
 * row's id and co-op, never the message (which may hold a single-use link).
 */

/** The queue and pg-boss schema created by migrations 0033 and 0019. */
export const MAIL_QUEUE = 'mail-outbox';
const BOSS_SCHEMA = 'pgboss';

interface MailJob {
  outboxId: string;
  coopId: string;
}

export interface MailOutboxSettings {
  /** First retry delay after a refused or failed send; each next try waits twice as long. */
  retryDelaySeconds: number;
}

let settings: MailOutboxSettings = { retryDelaySeconds: 5 };

export function configureMailOutbox(next: MailOutboxSettings) {
  settings = next;
}

/** Writes jobs only on a caller's transaction: it never opens a connection of its own. */
const jobWriter = new PgBoss({
  schema: BOSS_SCHEMA,
  db: {
    executeSql: () => Promise.reject(new Error('mail jobs are written on the caller\'s transaction only')),
  },
});

function onTransaction(tx: Transaction): PgBoss.Db {
  return {
    executeSql: async (text, values) => {
      // Sequelize refuses undefined bind values where pg would send NULL.
      const bind = values.map((value: unknown) => (value === undefined ? null : value));
      const rows = await database().query(text, { bind, type: QueryTypes.SELECT, transaction: tx });
      return { rows };
    },
  };
}

/**
 * Queues an e-mail in the caller's tenant transaction: it is sent only if the transaction commits, and
 * is kept until the mail server accepts it. `key` names the event (`application-approved:<id>`); the
 * same key queues nothing a second time. Resolves to whether this call queued it.
 */
export async function queueMail(tx: Transaction, key: string, message: MailMessage): Promise<boolean> {
  const rows = await database().query<{ id: string; coop_id: string }>(
    `INSERT INTO email_outbox (coop_id, idempotency_key, recipient, subject, text_body, html_body, message_id)
     VALUES (current_coop_id(), $1, $2, $3, $4, $5, $6)
     ON CONFLICT (coop_id, idempotency_key) DO NOTHING RETURNING id, coop_id`,
    {
      bind: [key, headerSafe(message.to), headerSafe(message.subject), message.text, message.html, messageIdFor(key)],
      type: QueryTypes.SELECT,
      transaction: tx,
    },
  );
  const row = rows[0];
  if (!row) return false;
  const job: MailJob = { outboxId: row.id, coopId: row.coop_id };
  await jobWriter.send(MAIL_QUEUE, job, { id: row.id, retryDelay: settings.retryDelaySeconds, db: onTransaction(tx) });
  return true;
}

/** Work done after the request has been answered, by the worker of any app process. */
type JobHandler = (data: object) => Promise<void>;
const jobHandlers = new Map<string, JobHandler>();

/** Registers the worker's handler of a queue (created by a migration, as the app role may not). */
export function handleJobs<T extends object>(queue: string, handler: (data: T) => Promise<void>): void {
  jobHandlers.set(queue, handler as JobHandler);
}

/**
 * Queues work for after the answer, in a short transaction of its own: the request costs one insert
 * whatever the work will find, so its timing tells nothing about the data.
 */
export async function enqueueJob(queue: string, data: object): Promise<void> {
  await database().transaction(async (tx) => {
    await jobWriter.send(queue, data, { retryDelay: settings.retryDelaySeconds, db: onTransaction(tx) });
  });
}

/**
 * Queues work in the caller's transaction, so it exists only if the change commits; `startAfter` holds
 * it until then (a reminder before a due date). The job's handler must be safe to run twice.
 */
export async function enqueueJobIn(tx: Transaction, queue: string, data: object, options: { startAfter?: Date } = {}): Promise<void> {
  await jobWriter.send(queue, data, { retryDelay: settings.retryDelaySeconds, startAfter: options.startAfter, db: onTransaction(tx) });
}

interface OutboxRow {
  recipient: string;
  subject: string;
  text_body: string | null;
  html_body: string | null;
  message_id: string;
  sent_at: Date | null;
}

/**
 * Sends one queued e-mail unless it was sent already. The row stays locked while the mail server
 * takes the message and is marked sent in the same transaction, right after the server accepts it.
 * A refusal is recorded and thrown, so the job is retried later.
 */
export async function deliverQueuedMail(job: MailJob): Promise<'sent' | 'already sent'> {
  const outcome = await withTenant({ coopId: job.coopId }, async (tx) => {
    const [row] = await database().query<OutboxRow>(
      'SELECT recipient, subject, text_body, html_body, message_id, sent_at FROM email_outbox WHERE id = $1 FOR UPDATE',
      { bind: [job.outboxId], type: QueryTypes.SELECT, transaction: tx },
    );
    if (!row || row.sent_at) return { state: 'already sent' as const };
    try {
      await transmitMail({ to: row.recipient, subject: row.subject, text: row.text_body ?? '', html: row.html_body ?? '' }, { messageId: row.message_id });
    } catch (error) {
      await database().query('UPDATE email_outbox SET attempts = attempts + 1, last_error = $2 WHERE id = $1', {
        bind: [job.outboxId, String(error).slice(0, 500)],
        transaction: tx,
      });
      return { state: 'failed' as const, error: String(error) };
    }
    await database().query(
      'UPDATE email_outbox SET sent_at = now(), attempts = attempts + 1, last_error = NULL, text_body = NULL, html_body = NULL WHERE id = $1',
      { bind: [job.outboxId], transaction: tx },
    );
    return { state: 'sent' as const };
  });
  if (outcome.state === 'failed') {
    logger.warn('mail not accepted yet, will retry', { outboxId: job.outboxId, error: outcome.error });
    throw new Error(`mail not accepted: ${outcome.error}`);
  }
  return outcome.state;
}

export interface MailWorkerOptions {
  /** The app role's connection (the queue's tables were installed and granted by migrations). */
  connectionString: string;
  pollingIntervalSeconds: number;
}

/** Jobs a worker takes at each look: pg-boss waits a polling interval between looks even when busy. */
const JOBS_PER_FETCH = 10;

/**
 * Works a queue's jobs side by side, a batch per look; a job that throws is failed on its own (to be
 * retried with back-off) while the others of its batch complete.
 */
async function workEach<T extends object>(boss: PgBoss, queue: string, pollingIntervalSeconds: number, handler: (data: T) => Promise<void>) {
  await boss.work<T>(queue, { pollingIntervalSeconds, batchSize: JOBS_PER_FETCH }, async (jobs) => {
    await Promise.all(
      jobs.map(async (job) => {
        try {
          await handler(job.data);
        } catch (error) {
          await boss.fail(queue, job.id, { message: String(error) });
        }
      }),
    );
  });
}

let worker: { boss: Promise<PgBoss | null>; users: number } | null = null;

async function startBoss(opts: MailWorkerOptions): Promise<PgBoss | null> {
  const boss = new PgBoss({
    connectionString: opts.connectionString,
    schema: BOSS_SCHEMA,
    migrate: false,
    schedule: false,
    // Someone must expire jobs of a process that died mid-send, so they are tried again.
    supervise: true,
    max: 2,
    application_name: 'burrowline-mail',
  });
  boss.on('error', (error) => logger.error('mail queue error', { error: String(error) }));
  try {
    await boss.start();
    await workEach<MailJob>(boss, MAIL_QUEUE, opts.pollingIntervalSeconds, async (job) => {
      await deliverQueuedMail(job);
    });
    for (const [queue, handler] of jobHandlers) await workEach(boss, queue, opts.pollingIntervalSeconds, handler);
    return boss;
  } catch (error) {
    logger.error('mail worker not started', { error: String(error) });
    await boss.stop({ graceful: false, wait: true }).catch(() => undefined);
    return null;
  }
}

/**
 * Delivers queued e-mail in this process (the server; in tests, the run's one worker). One
 * worker per process however many apps it builds; resolves the returned stop when the last one closes.
 */
export function startMailWorker(opts: MailWorkerOptions): () => Promise<void> {
  worker ??= { boss: startBoss(opts), users: 0 };
  const current = worker;
  current.users += 1;
  let stopped = false;
  return async () => {
    if (stopped) return;
    stopped = true;
    current.users -= 1;
    if (current.users > 0) return;
    if (worker === current) worker = null;
    const boss = await current.boss;
    await boss?.stop({ graceful: true, wait: true, timeout: 10_000 }).catch(() => undefined);
  };
}
