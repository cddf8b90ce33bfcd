import { randomUUID } from 'node:crypto';
import { asTenant } from './db';
import type { TestCoop } from './factories';

/** A fresh unread notification of farm A's member: only that person may read it or mark it. */
export async function notificationTarget(coop: TestCoop, target: string): Promise<{ notificationId?: string }> {
  if (target !== 'notificationA') return {};
  const rows = await asTenant(coop.id, (c) => c.query<{ id: string }>(
    `INSERT INTO notifications (coop_id, user_id, kind, title, link, key, delivery)
     VALUES ($1, $2, 'stud.requested', 'Checked by the authorization matrix', '/', $3, 'never') RETURNING id`,
    [coop.id, coop.member.id, `matrix:${randomUUID()}`],
  ), { commit: true });
  return { notificationId: rows.rows[0]!.id };
}

export function notificationBody(body: string | undefined): object | undefined {
  return body === 'notificationPreferences' ? { preferences: [{ kind: 'stud.requested', delivery: 'never' }] } : undefined;
}

/** What a refused call must leave as it was: who has read what. */
export async function notificationStateOf(coopId: string) {
  return (await asTenant(coopId, (c) => c.query('SELECT id, read_at FROM notifications ORDER BY id'))).rows;
}
