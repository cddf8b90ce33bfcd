import { afterAll, describe, expect, it } from 'vitest';
import type { BookingDto } from '@burrowline/shared';
import { connectDatabase } from '../../packages/server/src/composition/database';
import { lapseOffer, OFFER_CONFIRM_HOURS } from '../../packages/server/src/modules/processing-days/bookings.service';
import { reminderInstant, sendDayReminders } from '../../packages/server/src/modules/processing-days/processing-days.service';
import { asTenant, ownerDb } from '../support/db';
import { createTestCoop, TEST_PASSWORD } from '../support/factories';
import { growingGroupAs } from '../support/health-yield';
import { deliveredMailsTo, queuedMailTo } from '../support/mail';
import { bookingBody, bookingRows, dayAs, inDays, siteAs } from '../support/processing-days';
import { ROOMY_SIGN_IN, signedInAgent, testApp } from '../support/test-app';

const handle = testApp({ signIn: ROOMY_SIGN_IN });
const agentOf = (email: string) => signedInAgent(email, TEST_PASSWORD, handle);
afterAll(async () => {
  await handle.close();
});

const jobsOf = (queue: string, key: string, value: string) =>
  ownerDb(async (c) => (await c.query(`SELECT data, start_after FROM pgboss.job WHERE name = $1 AND data->>$2 = $3 ORDER BY start_after`, [queue, key, value])).rows as { data: Record<string, string>; start_after: Date }[]);

describe('processing days: reminders and offers (job queue)', () => {
  it('when the reminders run twice at once and again later, then each booked person has one notice and one e-mail per reminder; the apprentice and unbooked farms none', async () => {
    connectDatabase(process.env.DATABASE_URL!);
    const coop = await createTestCoop();
    const site = await siteAs(coop.admin, coop);
    const day = await dayAs(coop.admin, site.id, { date: inDays(9), signUpDeadline: inDays(6) });
    const queued = await jobsOf('processing-day-reminders', 'dayId', day.id);
    expect(queued.map((j) => [j.data.which, j.start_after.toISOString()])).toEqual([
      ['deadline', `${inDays(5)}T09:00:00.000Z`], ['day-before', `${inDays(8)}T09:00:00.000Z`],
    ]);
    const { group } = await growingGroupAs(coop.otherFarmMember, { kindledDaysAgo: 70, heads: 5 });
    const other = await agentOf(coop.otherFarmMember.email);
    await other.post(`/api/processing-days/${day.id}/bookings`).send(bookingBody(coop.farms[1]!.id, [{ groupId: group.id, head: 5 }])).expect(201);

    const job = { coopId: coop.id, dayId: day.id, which: 'deadline' as const };
    // Before its moment (a job queued for earlier dates) it stays quiet.
    expect(await sendDayReminders(job, new Date(reminderInstant({ date: inDays(9), sign_up_deadline: inDays(6) }, 'deadline').getTime() - 60_000))).toBe(0);
    const at = reminderInstant({ date: inDays(9), sign_up_deadline: inDays(6) }, 'deadline');
    await Promise.all([sendDayReminders(job, at), sendDayReminders(job, at)]);
    await sendDayReminders(job, new Date(at.getTime() + 3_600_000));
    const notices = await asTenant(coop.id, async (c) => (await c.query('SELECT user_id, kind FROM notifications WHERE kind = $1', ['day.reminder'])).rows);
    expect(notices).toEqual([{ user_id: coop.otherFarmMember.id, kind: 'day.reminder' }]);
    const mails = await deliveredMailsTo(coop.otherFarmMember.email);
    expect(mails.filter((m) => /bookings close/.test(m.subject))).toHaveLength(1);
    expect(mails.find((m) => /bookings close/.test(m.subject))!.text).toContain(`by the end of ${inDays(6)}`);
    expect(await queuedMailTo(coop.member.email)).toEqual([]);
    expect(await queuedMailTo(coop.apprentice.email)).toEqual([]);

    const dayBefore = { ...job, which: 'day-before' as const };
    await sendDayReminders(dayBefore, reminderInstant({ date: inDays(9), sign_up_deadline: inDays(6) }, 'day-before'));
    await sendDayReminders(dayBefore, reminderInstant({ date: inDays(9), sign_up_deadline: inDays(6) }, 'day-before'));
    const after = await deliveredMailsTo(coop.otherFarmMember.email);
    expect(after.filter((m) => /Processing day tomorrow/.test(m.subject))).toHaveLength(1);
  });

  it('when an offered place is not confirmed in time, then it lapses once and the next on the waitlist is offered the places', async () => {
    connectDatabase(process.env.DATABASE_URL!);
    const coop = await createTestCoop();
    const site = await siteAs(coop.admin, coop);
    const day = await dayAs(coop.admin, site.id, { capacityHead: 3 });
    const a = await growingGroupAs(coop.member, { kindledDaysAgo: 70, heads: 6 });
    const b = await growingGroupAs(coop.otherFarmMember, { kindledDaysAgo: 70, heads: 6 });
    const member = await agentOf(coop.member.email);
    const other = await agentOf(coop.otherFarmMember.email);
    const url = `/api/processing-days/${day.id}/bookings`;
    const first = (await member.post(url).send(bookingBody(coop.farms[0]!.id, [{ groupId: a.group.id, head: 3 }])).expect(201)).body as BookingDto;
    const second = (await other.post(url).send(bookingBody(coop.farms[1]!.id, [{ groupId: b.group.id, head: 2 }])).expect(201)).body as BookingDto;
    const third = (await member.post(url).send(bookingBody(coop.farms[0]!.id, [{ groupId: a.group.id, head: 2 }])).expect(201)).body as BookingDto;
    await member.post(`${url}/${first.id}/cancel`).send({ version: first.version }).expect(200);
    // Only the first waiting (2 head) fits the 3 places; the next 2 wait behind it.
    const offered = (await other.get(url).expect(200)).body.items.find((x: BookingDto) => x.id === second.id) as BookingDto;
    expect(offered.status).toBe('offered');
    const expires = new Date(offered.offerExpiresAt!);
    expect(expires.getTime() - Date.now()).toBeGreaterThan((OFFER_CONFIRM_HOURS - 1) * 3_600_000);
    expect((await jobsOf('processing-day-offers', 'bookingId', second.id)).map((j) => j.start_after.toISOString())).toEqual([expires.toISOString()]);
    expect((await bookingRows(coop.id, day.id)).map((r) => r.status)).toEqual(['cancelled', 'offered', 'waitlisted']);

    // Early runs change nothing; at the moment it lapses, once.
    expect(await lapseOffer({ coopId: coop.id, dayId: day.id, bookingId: second.id }, new Date(expires.getTime() - 1_000))).toBe(false);
    expect(await lapseOffer({ coopId: coop.id, dayId: day.id, bookingId: second.id }, expires)).toBe(true);
    expect(await lapseOffer({ coopId: coop.id, dayId: day.id, bookingId: second.id }, expires)).toBe(false);
    expect((await bookingRows(coop.id, day.id)).map((r) => [r.id, r.status])).toEqual([[first.id, 'cancelled'], [second.id, 'cancelled'], [third.id, 'offered']]);
    const late = await other.post(`${url}/${second.id}/confirm`).send({ version: offered.version });
    expect(late.status).toBe(409);
    const mails = await deliveredMailsTo(coop.otherFarmMember.email);
    expect(mails.map((m) => m.subject)).toEqual(expect.arrayContaining([expect.stringMatching(/A place opened/), expect.stringMatching(/Your booking for the processing day/)]));
  });
});
