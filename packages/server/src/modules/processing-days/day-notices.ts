import type { Transaction } from 'sequelize';
import { RealtimeEvent, rooms, type ProcessingDayChangedPayload } from '@burrowline/shared';
import { publish } from '../../lib/realtime';
import { notify } from '../notifications/notifications.service';
import type { DayRow } from './processing-days-store';

/** What the people of a day are told: notices (bell and e-mail by preference) and the co-op room's live hint. */

export const dayLink = (dayId: string) => `/processing-days/${dayId}`;

export function dayWords(day: Pick<DayRow, 'date' | 'start_time'>, siteName: string): string {
  return `${day.date} at ${day.start_time}, ${siteName}`;
}

/** After commit, to the co-op room: the capacity bar and the day's page refetch. No names or money travel. */
export function announceDay(tx: Transaction, coopId: string, payload: ProcessingDayChangedPayload): void {
  tx.afterCommit(() => publish(rooms.coop(coopId), RealtimeEvent.processingDayChanged, payload));
}

export async function noticeDayScheduled(tx: Transaction, o: { coopId: string; farmIds: string[]; actorId: string; day: DayRow; siteName: string }): Promise<void> {
  const when = dayWords(o.day, o.siteName);
  await notify(tx, {
    coopId: o.coopId, farmIds: o.farmIds, exceptUserId: o.actorId, kind: 'day.scheduled',
    title: `Processing day scheduled: ${when}`, body: `Book by ${o.day.sign_up_deadline}; ${o.day.capacity_head} places.`,
    link: dayLink(o.day.id),
    mail: { subject: `Processing day on ${o.day.date}`, text: `A shared processing day is scheduled for ${when}. Book your places by ${o.day.sign_up_deadline}.` },
    key: `processing-day:${o.day.id}:scheduled`,
  });
}

export async function noticePlaceOffered(tx: Transaction, o: { coopId: string; farmId: string; bookingId: string; day: DayRow; siteName: string; head: number; expiresAt: Date; round: number }): Promise<void> {
  const until = o.expiresAt.toISOString().slice(0, 16).replace('T', ' ');
  const when = dayWords(o.day, o.siteName);
  await notify(tx, {
    coopId: o.coopId, farmIds: [o.farmId], kind: 'day.place-offered',
    title: `A place opened for your ${o.head} head on ${o.day.date}: confirm by ${until} UTC`,
    link: dayLink(o.day.id),
    mail: {
      subject: `A place opened on the processing day of ${o.day.date}`,
      text: `Places opened on the processing day of ${when} for the ${o.head} head on your waitlisted booking. Confirm by ${until} UTC, or the places pass to the next farm on the waitlist.`,
    },
    key: `processing-booking:${o.bookingId}:offered:${o.round}`,
  });
}

export async function noticeBookingChanged(tx: Transaction, o: { coopId: string; farmId: string; actorId: string | null; bookingId: string; version: number; day: DayRow; title: string; text: string }): Promise<void> {
  await notify(tx, {
    coopId: o.coopId, farmIds: [o.farmId], ...(o.actorId ? { exceptUserId: o.actorId } : {}), kind: 'day.booking-changed',
    title: o.title, link: dayLink(o.day.id), mail: { subject: `Your booking for the processing day of ${o.day.date}`, text: o.text },
    key: `processing-booking:${o.bookingId}:changed:${o.version}`,
  });
}

export async function noticeDayChanged(tx: Transaction, o: { coopId: string; farmIds: string[]; actorId: string; day: DayRow; siteName: string; what: string }): Promise<void> {
  await notify(tx, {
    coopId: o.coopId, farmIds: o.farmIds, exceptUserId: o.actorId, kind: 'day.changed',
    title: `Processing day changed: ${o.what}`, body: dayWords(o.day, o.siteName), link: dayLink(o.day.id),
    mail: { subject: `The processing day of ${o.day.date} changed`, text: `The processing day you booked changed: ${o.what}. It is now ${dayWords(o.day, o.siteName)}.` },
    key: `processing-day:${o.day.id}:changed:${o.day.version}`,
  });
}

export async function noticeReminder(tx: Transaction, o: { coopId: string; farmIds: string[]; day: DayRow; siteName: string; which: 'deadline' | 'day-before' }): Promise<void> {
  const when = dayWords(o.day, o.siteName);
  const deadline = o.which === 'deadline';
  await notify(tx, {
    coopId: o.coopId, farmIds: o.farmIds, kind: 'day.reminder',
    title: deadline ? `Bookings for ${o.day.date} close on ${o.day.sign_up_deadline}` : `Processing day tomorrow: ${when}`,
    link: dayLink(o.day.id),
    mail: deadline
      ? { subject: `Processing day of ${o.day.date}: bookings close ${o.day.sign_up_deadline}`, text: `Change or cancel your booking for ${when} by the end of ${o.day.sign_up_deadline}; after that only the admin can.` }
      : { subject: `Processing day tomorrow (${o.day.date})`, text: `The processing day is tomorrow: ${when}. Bring your booked head, gloves and what you signed up to bring. Chill carcasses promptly to 40 °F / 4.4 °C or below.` },
    // Once per person and day, whichever worker or run gets there first.
    key: `processing-day:${o.day.id}:reminder:${o.which}:${deadline ? o.day.sign_up_deadline : o.day.date}`,
  });
}
