import type { Transaction } from 'sequelize';
import { addDays, defineAbilityFor, ErrorCode, subjectOf, type CoopLedgerDto, type DuesSetInput } from '@burrowline/shared';
import { withTenant } from '../../db/tenant';
import { AppError } from '../../lib/app-error';
import { enqueueJobIn, handleJobs, queueMail } from '../../lib/mail-outbox';
import type { SessionUser } from '../../lib/session-user';
import { getCoop } from '../coops/coops.service';
import { farmDirectoryOf } from '../farms/farms.service';
import { activeFarmMembers } from '../users/users.service';
import { cents, selectRows } from './ledger-books';
import { coopLedger, duesOfFarms, duesPeriodOf, postTransfer } from './ledger.service';
import { duesReminderMail } from './ledger.mail';

/** The queue of dues reminders (created by migration 0043). */
export const DUES_REMINDER_QUEUE = 'ledger-dues-reminders';

interface DuesReminderJob {
  coopId: string;
  year: number;
  appUrl: string;
}

/** The charge of one farm's dues of a year: its id is derived from both, so it is posted once. */
export const duesTransferId = (year: number, farmId: string) => `dues:${year}:${farmId}`;

/** The UTC instant the reminder of a period goes out (the due date less the days before, at 09:00 UTC). */
export function reminderInstant(dueOn: string, daysBefore: number): Date {
  return new Date(`${addDays(dueOn, -daysBefore)}T09:00:00Z`);
}

/**
 * The admin sets a year's dues: each farm of the co-op is charged once (farm → co-op dues), and a reminder
 * is queued for the days before the due date. The due date and reminder may change later; the amount may
 * not once farms are charged (a correction changes what one farm owes).
 */
export async function setDues(actor: SessionUser, year: number, input: DuesSetInput, appUrl: string): Promise<CoopLedgerDto> {
  if (!defineAbilityFor(actor).can('manage', subjectOf('Ledger', { coopId: actor.coopId }))) {
    throw new AppError(ErrorCode.forbidden, 403, 'Only the co-op\'s admin sets the dues');
  }
  if (Number(input.dueOn.slice(0, 4)) < year - 1 || Number(input.dueOn.slice(0, 4)) > year + 1) {
    throw AppError.validation({ dueOn: [`Choose a due date near ${year}`] });
  }
  await withTenant(actor, (tx) => chargeDues(tx, actor.coopId, year, input, { setBy: actor.id, appUrl }));
  return coopLedger(actor);
}

/**
 * Sets a year's dues inside the caller's transaction (the admin's request, the demo data): charges each farm
 * of the co-op once and queues the reminder.
 */
export async function chargeDues(tx: Transaction, coopId: string, year: number, input: DuesSetInput, opts: { setBy: string | null; appUrl: string; bookedOn?: string }): Promise<void> {
  const existing = await duesPeriodOf(tx, year);
  if (existing && cents(existing.amount_cents) !== input.amountCents) {
    throw AppError.conflict(`The ${year} dues are already set at ${cents(existing.amount_cents)} cents; correct a farm's charge instead`);
  }
  const [{ id }] = await selectRows<{ id: string }>(
    tx,
    `INSERT INTO dues_periods (coop_id, year, amount_cents, due_on, reminder_days_before, set_by) VALUES (current_coop_id(), $1, $2, $3, $4, $5)
     ON CONFLICT (coop_id, year) DO UPDATE SET due_on = EXCLUDED.due_on, reminder_days_before = EXCLUDED.reminder_days_before,
       version = dues_periods.version + 1, updated_at = now()
     RETURNING id`,
    [year, input.amountCents, input.dueOn, input.reminderDaysBefore, opts.setBy],
  ) as [{ id: string }];
  for (const farm of (await farmDirectoryOf(coopId, tx)).values()) {
    await postTransfer(tx, {
      id: duesTransferId(year, farm.id), kind: 'dues', debit: { farmId: farm.id }, credit: { coop: 'coop_dues' }, amountCents: input.amountCents,
      sourceType: 'dues_period', sourceId: id, memo: `${year} dues`, postedBy: opts.setBy, bookedOn: opts.bookedOn,
    });
  }
  const job: DuesReminderJob = { coopId, year, appUrl: opts.appUrl };
  await enqueueJobIn(tx, DUES_REMINDER_QUEUE, job, { startAfter: reminderInstant(input.dueOn, input.reminderDaysBefore) });
}

/**
 * The reminder run of a period: every farm that still owes some of it gets one e-mail per member (never an
 * apprentice), keyed by period, farm and person, so a second run or a changed due date sends nothing twice.
 */
export async function sendDuesReminders(job: DuesReminderJob, now: Date = new Date()): Promise<number> {
  return withTenant({ coopId: job.coopId }, async (tx) => {
    const period = await duesPeriodOf(tx, job.year);
    if (!period) return 0;
    // A reminder queued for an earlier due date waits for the current one.
    if (now < reminderInstant(period.due_on, period.reminder_days_before)) return 0;
    // A reminder is sent before the due date; one that runs after it (a server down for weeks) stays quiet.
    if (now > new Date(`${period.due_on}T23:59:59Z`)) return 0;
    const directory = await farmDirectoryOf(job.coopId, tx);
    const dues = await duesOfFarms(tx, [...directory.keys()]);
    const coop = await getCoop(job.coopId, tx);
    const money = new Intl.NumberFormat('en-US', { style: 'currency', currency: coop?.currency ?? 'USD' });
    const people = await activeFarmMembers(job.coopId, tx);
    let queued = 0;
    for (const [farmId, list] of dues) {
      const owed = list.find((d) => d.year === job.year)?.owedCents ?? 0;
      if (owed <= 0) continue;
      for (const person of people.filter((u) => u.farmId === farmId)) {
        const mail = duesReminderMail({
          to: person.email, name: person.name, coopName: coop?.name ?? 'Your co-op', farmName: directory.get(farmId)?.name ?? 'Your farm',
          year: job.year, owed: money.format(owed / 100), dueOn: period.due_on, url: `${job.appUrl}/ledger`,
        });
        if (await queueMail(tx, `dues-reminder:${period.id}:${farmId}:${person.id}`, mail)) queued++;
      }
    }
    return queued;
  });
}

handleJobs<DuesReminderJob>(DUES_REMINDER_QUEUE, async (job) => {
  await sendDuesReminders(job);
});

