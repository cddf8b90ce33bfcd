import { Op, QueryTypes } from 'sequelize';
import {
  needsAttention, todayIn, type AlmanacTaskDto, type DigestPreferenceDto, type DigestPreferenceInput, type TaskAttention,
} from '@burrowline/shared';
import { database } from '../../db/sequelize';
import { withTenant } from '../../db/tenant';
import type { SessionUser } from '../../lib/session-user';
import { logger } from '../../lib/logger';
import { queueMail } from '../../lib/mail-outbox';
import { composeMail, type MailMessage } from '../../lib/mailer';
import { animalFactsOf } from '../animals/animal-facts.service';
import { ensureCan, farmOf } from '../farms/farm-access';
import { farmClockOf } from '../farms/farm-clock';
import { takeDigestNotifications } from '../notifications/notifications.service';
import { settingsOf } from './cycle-settings.service';
import { DigestSubscription } from './digest-subscription.model';
import { AlmanacTask } from './task.model';
import { presentTasks } from './tasks.service';
import { toTaskRecord } from './task-writer.service';

/** After this hour of the farm's clock a missed morning e-mail is not sent late (it is no morning any more). */
const LAST_HOUR = 12;

export async function getDigestPreference(actor: SessionUser): Promise<DigestPreferenceDto> {
  const farmId = farmOf(actor);
  ensureCan(actor, 'read', 'DigestSubscription', { userId: actor.id, farmId }, 'That preference');
  return withTenant(actor, async (tx) => {
    const row = await DigestSubscription.findByPk(actor.id, { transaction: tx });
    const clock = await farmClockOf(tx, actor.coopId, farmId);
    return { enabled: row?.enabled ?? false, hour: row?.hour ?? 6, timeZone: clock.timeZone };
  });
}

/** Opts the actor in or out of the morning e-mail of their farm's tasks, at an hour of the farm's clock. */
export async function setDigestPreference(actor: SessionUser, input: DigestPreferenceInput): Promise<DigestPreferenceDto> {
  const farmId = farmOf(actor);
  ensureCan(actor, 'update', 'DigestSubscription', { userId: actor.id, farmId }, 'That preference');
  return withTenant(actor, async (tx) => {
    const row = await DigestSubscription.findByPk(actor.id, { transaction: tx, lock: tx.LOCK.UPDATE });
    if (row) {
      row.set({ enabled: input.enabled, hour: input.hour });
      await row.save({ transaction: tx });
    } else {
      await DigestSubscription.create({ userId: actor.id, coopId: actor.coopId, enabled: input.enabled, hour: input.hour }, { transaction: tx });
    }
    const clock = await farmClockOf(tx, actor.coopId, farmId);
    return { enabled: input.enabled, hour: input.hour, timeZone: clock.timeZone };
  });
}

interface Recipient {
  user_id: string;
  coop_id: string;
  farm_id: string;
  email: string;
  name: string;
  time_zone: string;
  hour: number;
}

function hourIn(timeZone: string, now: Date): number {
  const hour = new Intl.DateTimeFormat('en-GB', { timeZone, hour: '2-digit', hourCycle: 'h23' }).format(now);
  return Number(hour);
}

const longDate = (date: string) =>
  new Intl.DateTimeFormat('en-US', { weekday: 'long', month: 'long', day: 'numeric', timeZone: 'UTC' }).format(new Date(`${date}T00:00:00Z`));

function line(task: AlmanacTaskDto): string {
  const who = task.subject ? ` — ${task.subject}` : '';
  const window = task.kind === 'kindling_due' && task.windowStart ? ` (window ${task.windowStart} to ${task.windowEnd})` : '';
  return `• ${task.title}${who}${window}`;
}

interface CoopNews {
  title: string;
  link: string;
}

function compose(recipient: Recipient, farmName: string, today: string, due: AlmanacTaskDto[], overdue: AlmanacTaskDto[], attention: TaskAttention[], news: CoopNews[], appUrl: string): MailMessage {
  // One paragraph per line: the HTML part shows each as its own line, the text part the same.
  const paragraphs: string[] = [];
  if (attention.length > 0) paragraphs.push('Needs attention:', ...attention.map((a) => `• ${a.message}`));
  if (due.length > 0) paragraphs.push('Due today:', ...due.map(line));
  else paragraphs.push('Nothing is planned for today.');
  if (overdue.length > 0) {
    paragraphs.push('Overdue:', ...overdue.map((t) => `${line(t)}, due ${t.dueOn} (${t.daysLate === 1 ? '1 day' : `${t.daysLate} days`} late)`));
  }
  if (news.length > 0) paragraphs.push('From the co-op since yesterday:', ...news.map((n) => `• ${n.title} — ${appUrl}${n.link}`));
  paragraphs.push('In hot weather, check heavily pregnant does and young litters first: rabbits suffer above about 85 °F (29 °C).');
  const counts = [`${due.length} ${due.length === 1 ? 'task' : 'tasks'} today`, overdue.length > 0 ? `${overdue.length} overdue` : null].filter(Boolean).join(', ');
  return composeMail({
    to: recipient.email,
    subject: `Almanac for ${longDate(today)}: ${counts}`,
    greeting: `Good morning, ${recipient.name}.`,
    paragraphs: [`Here is ${farmName}'s day in the Almanac.`, ...paragraphs],
    action: { label: 'Open the Almanac', url: `${appUrl}/almanac` },
    footer: 'You get this because you turned on the morning e-mail in the Almanac settings; turn it off there.',
  });
}

/**
 * The morning e-mail run (called by the scheduled job with its clock): for everyone who opted in and
 * whose farm's clock has reached their hour (and not yet noon), claims the day's delivery (unique per
 * person and farm day, so several app instances or a repeated run send it once), and queues the
 * e-mail of the day's tasks, anything overdue, and what needs attention. A day with nothing to say is
 * claimed but not sent.
 */
export async function sendMorningDigests(opts: { now: Date; appUrl: string }): Promise<{ sent: string[]; quiet: string[] }> {
  // Before any tenant is known: the SECURITY DEFINER look-up of migration 0019.
  const recipients = await database().query<Recipient>('SELECT * FROM almanac_digest_recipients()', { type: QueryTypes.SELECT });
  const sent: string[] = [];
  const quiet: string[] = [];
  for (const recipient of recipients) {
    const hour = hourIn(recipient.time_zone, opts.now);
    if (hour < recipient.hour || hour >= LAST_HOUR) continue;
    const today = todayIn(recipient.time_zone, opts.now);
    try {
      const outcome = await withTenant({ coopId: recipient.coop_id }, async (tx) => {
        const open = await AlmanacTask.findAll({
          where: { farmId: recipient.farm_id, state: { [Op.in]: ['open', 'moved'] }, dueOn: { [Op.lte]: today } },
          transaction: tx,
        });
        const due = open.filter((t) => t.dueOn === today);
        const overdue = open.filter((t) => t.dueOn < today);
        const { settings } = await settingsOf(tx, recipient.farm_id);
        // The e-mail names the doe of each alert, as the banner does.
        const animals = await animalFactsOf(tx, recipient.coop_id, open.flatMap((t) => (t.animalId ? [t.animalId] : [])));
        const does = new Map([...animals.values()].map((a) => [a.id, { id: a.id, name: a.name, tattoo: a.tattoo }]));
        const attention = needsAttention(open.map(toTaskRecord), today, settings, does);
        const claimed = await database().query(
          `INSERT INTO almanac_digest_deliveries (coop_id, user_id, farm_id, local_date, task_count, overdue_count)
           VALUES ($1, $2, $3, $4, $5, $6) ON CONFLICT (user_id, local_date) DO NOTHING RETURNING id`,
          { bind: [recipient.coop_id, recipient.user_id, recipient.farm_id, today, due.length, overdue.length], type: QueryTypes.SELECT, transaction: tx },
        );
        if (claimed.length === 0) return 'already';
        const news = await takeDigestNotifications(tx, recipient.user_id);
        if (open.length === 0 && news.length === 0) return 'quiet';
        const clock = await farmClockOf(tx, recipient.coop_id, recipient.farm_id, opts.now);
        const message = compose(
          recipient, clock.name, today,
          await presentTasks(tx, recipient.coop_id, due, today),
          await presentTasks(tx, recipient.coop_id, overdue, today),
          attention, news, opts.appUrl,
        );
        // Queued with the day's claim: the claim never commits without its e-mail.
        await queueMail(tx, `morning-digest:${recipient.user_id}:${today}`, message);
        return 'queued';
      });
      if (outcome === 'quiet') quiet.push(recipient.email);
      else if (outcome === 'queued') sent.push(recipient.email);
    } catch (error) {
      logger.error('morning e-mail failed', { userId: recipient.user_id, error: String(error) });
    }
  }
  return { sent, quiet };
}
