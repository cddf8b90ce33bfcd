import { QueryTypes, type Transaction } from 'sequelize';
import {
  notificationKindNames, notificationKinds, RealtimeEvent, rooms,
  type NotificationDelivery, type NotificationDto, type NotificationKind, type NotificationListDto, type NotificationListQuery,
  type NotificationPreferencesDto, type NotificationPreferencesInput,
} from '@burrowline/shared';
import { database } from '../../db/sequelize';
import { withTenant } from '../../db/tenant';
import { AppError } from '../../lib/app-error';
import { queueMail } from '../../lib/mail-outbox';
import { composeMail } from '../../lib/mailer';
import { publish } from '../../lib/realtime';
import type { SessionUser } from '../../lib/session-user';
import { ensureCan } from '../farms/farm-access';
import { presentNotification, type NotificationRow } from './notifications.presenter';

export interface NotificationInput {
  coopId: string;
  /** Recipients by id. */
  userIds?: string[];
  /** And/or every active member of these farms. */
  farmIds?: string[];
  /** Include the farms' apprentices (never for money). */
  apprentices?: boolean;
  /** Usually the actor: nobody is told of their own action. */
  exceptUserId?: string;
  kind: NotificationKind;
  title: string;
  body?: string;
  /** A path inside the app, e.g. "/stud-share/loans/<id>". */
  link: string;
  /** Sent by e-mail per each person's preference for this kind: at once, in the morning e-mail, or never. */
  mail?: { subject: string; text: string };
  /** The same key never tells anyone twice (retried requests, re-run jobs). */
  key: string;
}

let appUrl = 'http://127.0.0.1:3000';

/** Where the e-mails' links point (the app's public address). */
export function configureNotifications(opts: { appUrl: string }) {
  appUrl = opts.appUrl;
}

interface Recipient {
  id: string;
  email: string;
  name: string;
  delivery: NotificationDelivery | null;
}

/**
 * Tells the named people (and the members of the named farms) inside the caller's transaction: a row each
 * in the bell, an e-mail queued through the outbox for those who want it at once, and after commit a live
 * event to each person's own room. Nobody outside `userIds`/`farmIds` is ever told.
 */
export async function notify(tx: Transaction, input: NotificationInput): Promise<void> {
  const userIds = [...new Set(input.userIds ?? [])];
  const farmIds = [...new Set(input.farmIds ?? [])];
  if (userIds.length === 0 && farmIds.length === 0) return;
  if (!input.link.startsWith('/')) throw new Error(`A notification's link is a path inside the app, not ${input.link}`);
  const recipients = await database().query<Recipient>(
    `SELECT u.id, u.email, u.name, p.delivery
       FROM users u
       LEFT JOIN notification_preferences p ON p.user_id = u.id AND p.kind = $5
      WHERE u.coop_id = $1 AND u.disabled_at IS NULL AND u.password_hash IS NOT NULL
        AND (u.id = ANY($2::uuid[]) OR (u.farm_id = ANY($3::uuid[]) AND ($4 OR u.role <> 'apprentice')))
        AND u.id IS DISTINCT FROM $6::uuid`,
    {
      bind: [input.coopId, userIds, farmIds, input.apprentices === true, input.kind, input.exceptUserId ?? null],
      type: QueryTypes.SELECT,
      transaction: tx,
    },
  );
  if (recipients.length === 0) return;
  const fallback = notificationKinds[input.kind].defaultDelivery;
  const deliveries = recipients.map((r) => r.delivery ?? fallback);
  const inserted = await database().query<{ user_id: string; id: string }>(
    `INSERT INTO notifications (coop_id, user_id, kind, title, body, link, key, delivery, mail_subject, mail_text)
     SELECT $1, r.user_id, $2, $3, $4, $5, $6, r.delivery, $7, $8
       FROM unnest($9::uuid[], $10::text[]) AS r(user_id, delivery)
     ON CONFLICT (user_id, key) DO NOTHING
     RETURNING user_id, id`,
    {
      bind: [
        input.coopId, input.kind, input.title, input.body ?? null, input.link, input.key,
        input.mail?.subject ?? null, input.mail?.text ?? null, recipients.map((r) => r.id), deliveries,
      ],
      type: QueryTypes.SELECT,
      transaction: tx,
    },
  );
  const told = new Set(inserted.map((row) => row.user_id));
  for (const [index, recipient] of recipients.entries()) {
    if (!told.has(recipient.id) || !input.mail || deliveries[index] !== 'immediately') continue;
    await queueMail(tx, `notification:${input.key}:${recipient.id}`, composeMail({
      to: recipient.email,
      subject: input.mail.subject,
      greeting: `Hello ${recipient.name},`,
      paragraphs: input.mail.text.split(/\n{2,}/),
      action: { label: 'Open in Burrowline', url: `${appUrl}${input.link}` },
      footer: 'You get this e-mail at once because of your notification settings; change them under the bell.',
    }));
  }
  if (told.size === 0) return;
  const unread = await unreadCounts(tx, [...told]);
  tx.afterCommit(() => {
    for (const userId of told) {
      publish(rooms.user(userId), RealtimeEvent.notificationsChanged, { unread: unread.get(userId) ?? 0, title: input.title, link: input.link });
    }
  });
}

async function unreadCounts(tx: Transaction, userIds: string[]): Promise<Map<string, number>> {
  const rows = await database().query<{ user_id: string; unread: number }>(
    `SELECT user_id, count(*)::int AS unread FROM notifications WHERE user_id = ANY($1::uuid[]) AND read_at IS NULL GROUP BY user_id`,
    { bind: [userIds], type: QueryTypes.SELECT, transaction: tx },
  );
  return new Map(rows.map((row) => [row.user_id, row.unread]));
}

function ensureOwn(actor: SessionUser, action: 'read' | 'update') {
  ensureCan(actor, action, 'Notification', { userId: actor.id }, 'Those notifications');
}

/** The actor's notifications, newest first, a page at a time, with the unread count for the bell. */
export async function listNotifications(actor: SessionUser, query: NotificationListQuery): Promise<NotificationListDto> {
  ensureOwn(actor, 'read');
  return withTenant(actor, async (tx) => {
    const offset = (query.page - 1) * query.pageSize;
    const rows = await database().query<NotificationRow & { total: number; unread: number }>(
      `WITH mine AS (SELECT * FROM notifications WHERE user_id = $1 AND ($4 = false OR read_at IS NULL))
       SELECT page.*, counts.total, counts.unread
         FROM (SELECT count(*)::int AS total,
                      (SELECT count(*)::int FROM notifications WHERE user_id = $1 AND read_at IS NULL) AS unread
                 FROM mine) counts
         LEFT JOIN LATERAL (
           SELECT id, kind, title, body, link, created_at, read_at FROM mine ORDER BY created_at DESC, id DESC LIMIT $2 OFFSET $3
         ) page ON true`,
      { bind: [actor.id, query.pageSize, offset, query.unread === 'true'], type: QueryTypes.SELECT, transaction: tx },
    );
    const first = rows[0];
    return {
      items: rows.filter((row) => row.id !== null).map(presentNotification),
      total: first?.total ?? 0,
      unread: first?.unread ?? 0,
      page: query.page,
      pageSize: query.pageSize,
    };
  });
}

/** The bell's count alone: asked on every screen, so one indexed count. */
export async function unreadCount(actor: SessionUser): Promise<{ unread: number }> {
  ensureOwn(actor, 'read');
  return withTenant(actor, async (tx) => ({ unread: (await unreadCounts(tx, [actor.id])).get(actor.id) ?? 0 }));
}

/** Marks one of the actor's notifications read (again is harmless); another person's is "not found". */
export async function markRead(actor: SessionUser, notificationId: string): Promise<NotificationDto> {
  ensureOwn(actor, 'update');
  return withTenant(actor, async (tx) => {
    const rows = await database().query<NotificationRow>(
      `UPDATE notifications SET read_at = coalesce(read_at, now()) WHERE id = $1 AND user_id = $2
       RETURNING id, kind, title, body, link, created_at, read_at`,
      { bind: [notificationId, actor.id], type: QueryTypes.SELECT, transaction: tx },
    );
    const row = rows[0];
    if (!row) throw AppError.notFound('That notification');
    await announceCount(tx, actor.id);
    return presentNotification(row);
  });
}

export async function markAllRead(actor: SessionUser): Promise<{ unread: number; marked: number }> {
  ensureOwn(actor, 'update');
  return withTenant(actor, async (tx) => {
    const rows = await database().query<{ id: string }>(
      'UPDATE notifications SET read_at = now() WHERE user_id = $1 AND read_at IS NULL RETURNING id',
      { bind: [actor.id], type: QueryTypes.SELECT, transaction: tx },
    );
    await announceCount(tx, actor.id);
    return { unread: 0, marked: rows.length };
  });
}

/** The person's other open screens update their bell too. */
async function announceCount(tx: Transaction, userId: string) {
  const unread = (await unreadCounts(tx, [userId])).get(userId) ?? 0;
  tx.afterCommit(() => publish(rooms.user(userId), RealtimeEvent.notificationsChanged, { unread, title: null, link: null }));
}

async function preferencesOf(tx: Transaction, actor: SessionUser): Promise<NotificationPreferencesDto> {
  const rows = await database().query<{ kind: string; delivery: NotificationDelivery; morning: boolean | null }>(
    `SELECT p.kind, p.delivery, NULL::boolean AS morning FROM notification_preferences p WHERE p.user_id = $1
     UNION ALL SELECT NULL, NULL, d.enabled FROM almanac_digest_subscriptions d WHERE d.user_id = $1`,
    { bind: [actor.id], type: QueryTypes.SELECT, transaction: tx },
  );
  const chosen = new Map(rows.filter((row) => row.kind !== null).map((row) => [row.kind, row.delivery]));
  return {
    preferences: notificationKindNames.map((kind) => {
      const info = notificationKinds[kind];
      return { kind, label: info.label, area: info.area, defaultDelivery: info.defaultDelivery, delivery: chosen.get(kind) ?? info.defaultDelivery };
    }),
    morningEmailOn: rows.some((row) => row.morning === true),
  };
}

export async function getNotificationPreferences(actor: SessionUser): Promise<NotificationPreferencesDto> {
  ensureOwn(actor, 'read');
  return withTenant(actor, (tx) => preferencesOf(tx, actor));
}

/** Saves the actor's choices; a choice equal to the kind's default is stored as no choice. */
export async function setNotificationPreferences(actor: SessionUser, input: NotificationPreferencesInput): Promise<NotificationPreferencesDto> {
  ensureOwn(actor, 'update');
  return withTenant(actor, async (tx) => {
    for (const { kind, delivery } of input.preferences) {
      if (delivery === notificationKinds[kind].defaultDelivery) {
        await database().query('DELETE FROM notification_preferences WHERE user_id = $1 AND kind = $2', { bind: [actor.id, kind], transaction: tx });
      } else {
        await database().query(
          `INSERT INTO notification_preferences (user_id, coop_id, kind, delivery) VALUES ($1, $2, $3, $4)
           ON CONFLICT (user_id, kind) DO UPDATE SET delivery = EXCLUDED.delivery, updated_at = now()`,
          { bind: [actor.id, actor.coopId, kind, delivery], transaction: tx },
        );
      }
    }
    return preferencesOf(tx, actor);
  });
}

/**
 * For the morning e-mail: the person's notifications waiting for it, marked as carried in the same
 * transaction (so a digest that is not committed carries them again tomorrow).
 */
export async function takeDigestNotifications(tx: Transaction, userId: string): Promise<{ title: string; text: string; link: string }[]> {
  return database().query<{ title: string; text: string; link: string }>(
    `UPDATE notifications SET digested_at = now()
      WHERE user_id = $1 AND delivery = 'digest' AND digested_at IS NULL AND mail_text IS NOT NULL
      RETURNING title, mail_text AS text, link`,
    { bind: [userId], type: QueryTypes.SELECT, transaction: tx },
  );
}
