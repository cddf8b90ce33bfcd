import PgBoss from 'pg-boss';
import { logger } from '../../lib/logger';
import { sendMorningDigests } from './morning-digest.service';

/** The queue and pg-boss schema created by migration 0019. */
export const DIGEST_QUEUE = 'almanac-morning-digest';
const BOSS_SCHEMA = 'pgboss';
/** Every quarter of an hour: each farm's morning hour is reached within 15 minutes, whatever its time zone. */
const DIGEST_CRON = '*/15 * * * *';

export interface DigestSchedulerOptions {
  /** The app role's connection (the queue's tables were installed and granted by the migration). */
  connectionString: string;
  appUrl: string;
  /** The clock the run reads "now" from; tests set it to a chosen morning. */
  clock?: () => Date;
  /** Put the quarter-hourly schedule in place (one instance's timekeeper fires it for all). */
  schedule?: boolean;
  /** Run jobs in this process. */
  work?: boolean;
  pollingIntervalSeconds?: number;
}

export interface DigestScheduler {
  /** Queues one run now (as the schedule does every quarter hour); resolves to the job id. */
  runNow: () => Promise<string | null>;
  /** Resolves when a job queued before has been worked (for tests and the shutdown). */
  stop: () => Promise<void>;
  boss: PgBoss;
}

/**
 * The morning e-mail's job queue, in PostgreSQL (pg-boss): a queued run survives a restart (it waits in
 * the table until a worker takes it), and runs once even with several app instances (a job is fetched
 * by one worker with SKIP LOCKED, the cron fires once per slot across instances, and the delivery row
 * is unique per person and day).
 */
export async function startDigestScheduler(opts: DigestSchedulerOptions): Promise<DigestScheduler> {
  const clock = opts.clock ?? (() => new Date());
  const boss = new PgBoss({
    connectionString: opts.connectionString,
    schema: BOSS_SCHEMA,
    migrate: false,
    schedule: opts.schedule ?? true,
    supervise: true,
    max: 3,
    application_name: 'burrowline-almanac',
  });
  boss.on('error', (error) => logger.error('job queue error', { error: String(error) }));
  await boss.start();
  if (opts.schedule ?? true) await boss.schedule(DIGEST_QUEUE, DIGEST_CRON, {}, { tz: 'UTC' });
  if (opts.work ?? true) {
    await boss.work(DIGEST_QUEUE, { pollingIntervalSeconds: opts.pollingIntervalSeconds ?? 2, batchSize: 1 }, async () => {
      const result = await sendMorningDigests({ now: clock(), appUrl: opts.appUrl });
      if (result.sent.length > 0) logger.info('morning e-mails sent', { count: result.sent.length });
      return { sent: result.sent.length, quiet: result.quiet.length };
    });
  }
  return {
    boss,
    runNow: () => boss.send(DIGEST_QUEUE, { requestedAt: clock().toISOString() }),
    stop: () => boss.stop({ graceful: true, wait: true, timeout: 10_000 }),
  };
}
