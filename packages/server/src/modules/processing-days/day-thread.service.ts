import { QueryTypes } from 'sequelize';
import { defineAbilityFor, subjectOf } from '@burrowline/shared';
import { database } from '../../db/sequelize';
import type { SessionUser } from '../../lib/session-user';
import { subjectFromRows } from '../chat/chat-subjects.service';

interface DayRow {
  id: string;
  coop_id: string;
  host_farm_id: string;
  date: string;
  site_name: string;
}

const daysSql = (ids: string) =>
  `SELECT d.id, d.coop_id, d.host_farm_id, d.date::text AS date, s.name AS site_name
     FROM processing_days d JOIN processing_sites s ON s.id = d.site_id
    WHERE d.id = ANY(${ids})`;

const mayReadDay = (actor: SessionUser, day: DayRow) => defineAbilityFor(actor).can('read', subjectOf('ProcessingDay', { coopId: day.coop_id }));

/**
 * A processing day's thread: the whole co-op reads it, as it reads the day; the host and the farms with a place
 * (booked, offered or waiting) are its people, told of new messages.
 */
export const processingDayThreadSubject = subjectFromRows<DayRow>({
  rowsSql: daysSql,
  mayRead: mayReadDay,
  async participants(tx, day) {
    const booked = await database().query<{ farm_id: string }>(
      `SELECT DISTINCT farm_id FROM processing_bookings WHERE day_id = $1 AND status <> 'cancelled'`,
      { bind: [day.id], type: QueryTypes.SELECT, transaction: tx },
    );
    return { farmIds: [...new Set([day.host_farm_id, ...booked.map((b) => b.farm_id)])], userIds: [] };
  },
  title: (day) => (day ? `Processing day ${day.date} at ${day.site_name}` : 'A processing day'),
  link: (subjectId) => `/processing-days/${subjectId}`,
});
