import { afterAll, describe, expect, it } from 'vitest';
import { largestRemainder, type BookingDto, type ProcessingDayDto, type ProcessingDaySummaryDto } from '@burrowline/shared';
import { splitSharedCosts } from '../../packages/server/src/modules/processing-days/day-close.service';
import { farmToday } from '../support/almanac';
import { asTenant } from '../support/db';
import { createTestCoop, TEST_PASSWORD } from '../support/factories';
import { growingGroupAs, treatmentAs } from '../support/health-yield';
import { binaryParser, pdfText } from '../support/herd-files';
import { waitForMail } from '../support/mail';
import { bookingBody, bookingRows, dayAs, dayBody, inDays, moveDay, siteAs, transfersOf } from '../support/processing-days';
import { ROOMY_SIGN_IN, signedInAgent, testApp } from '../support/test-app';

const handle = testApp({ signIn: ROOMY_SIGN_IN });
const agentOf = (email: string) => signedInAgent(email, TEST_PASSWORD, handle);
afterAll(async () => {
  await handle.close();
});

const noticesOf = (coopId: string, userId: string) =>
  asTenant(coopId, async (c) => (await c.query('SELECT kind, key, link FROM notifications WHERE user_id = $1 ORDER BY created_at, key', [userId])).rows as { kind: string; key: string; link: string }[]);

describe('processing days: scheduling', () => {
  it('when the admin schedules a day, then it has the default stations, the cautions with their sources, and every other member is told', async () => {
    const coop = await createTestCoop();
    const site = await siteAs(coop.admin, coop);
    const admin = await agentOf(coop.admin.email);
    const res = await admin.post('/api/processing-days').send(dayBody(site.id));
    expect(res.status).toBe(201);
    const day = res.body as ProcessingDayDto;
    expect(day).toMatchObject({ status: 'scheduled', capacity: { capacityHead: 20, bookedHead: 0, freeHead: 20, chillCapacityHead: 40 }, feePerHeadCents: 150, hostFarmId: coop.farms[0]!.id });
    expect(day.stations.map((s) => [s.name, s.places.length])).toEqual([['Dispatch', 2], ['Skinning', 3], ['Evisceration', 3], ['Chilling', 1], ['Packing', 2], ['Clean-up', 2]]);
    expect(day.equipment.map((e) => e.name)).toEqual(['Chill tank', 'Propane burner']);
    // USDA FSIS, "Rabbit from Farm to Table": keep at 40 °F or below; cook rabbit to 160 °F.
    const chill = day.cautions.find((c) => c.id === 'chill')!;
    expect(chill.title).toContain('40 °F / 4.4 °C');
    expect(chill.source).toContain('USDA FSIS');
    expect(day.cautions.find((c) => c.id === 'cooking')!.title).toContain('160 °F / 71 °C');
    expect(day.cautions.map((c) => c.id)).toEqual(['knives', 'dispatch', 'tularemia', 'chill', 'cooking', 'selling']);
    expect((await noticesOf(coop.id, coop.otherFarmMember.id)).filter((n) => n.kind === 'day.scheduled')).toEqual([{ kind: 'day.scheduled', key: `processing-day:${day.id}:scheduled`, link: `/processing-days/${day.id}` }]);
    expect(await noticesOf(coop.id, coop.admin.id)).toEqual([]);
    // Apprentices see the day without money.
    const apprentice = await agentOf(coop.apprentice.email);
    const seen = (await apprentice.get(`/api/processing-days/${day.id}`).expect(200)).body as ProcessingDayDto;
    expect(seen.feePerHeadCents).toBeUndefined();
    expect(seen.expectedCosts).toBeUndefined();
  });

  it('when a host farm member schedules, then only a site whose host the admin allows accepts it; the capacity stays within the site\'s', async () => {
    const coop = await createTestCoop();
    const closed = await siteAs(coop.admin, coop);
    const open = await siteAs(coop.admin, coop, { hostMaySchedule: true, capacityHeadPerDay: 30 });
    const member = await agentOf(coop.member.email);
    expect((await member.post('/api/processing-days').send(dayBody(closed.id))).status).toBe(403);
    expect((await member.post('/api/processing-days').send(dayBody(open.id))).status).toBe(201);
    const other = await agentOf(coop.otherFarmMember.email);
    expect((await other.post('/api/processing-days').send(dayBody(open.id))).status).toBe(403);
    const tooBig = await member.post('/api/processing-days').send(dayBody(open.id, { capacityHead: 31 }));
    expect(tooBig.status).toBe(400);
    expect(tooBig.body.error.details.capacityHead[0]).toContain('at most 30 head a day');
    const late = await member.post('/api/processing-days').send(dayBody(open.id, { signUpDeadline: inDays(15) }));
    expect(late.status).toBe(400);
    expect(late.body.error.details.signUpDeadline).toEqual(['The sign-up deadline must be on or before the day']);
  });
});

describe('processing days: booking', () => {
  it('when a member books head from a group, then the places are taken and the fee is one pending transfer however often the request is sent', async () => {
    const coop = await createTestCoop();
    const site = await siteAs(coop.admin, coop);
    const day = await dayAs(coop.admin, site.id);
    const { group } = await growingGroupAs(coop.member, { kindledDaysAgo: 70, heads: 8, name: 'Clover pen' });
    const member = await agentOf(coop.member.email);
    const body = bookingBody(coop.farms[0]!.id, [{ groupId: group.id, head: 5 }]);
    const first = await member.post(`/api/processing-days/${day.id}/bookings`).send(body);
    expect(first.status).toBe(201);
    expect(first.body).toMatchObject({ status: 'booked', head: 5, feeCents: 750, lines: [{ groupId: group.id, label: 'Clover pen', head: 5 }], waitlistPosition: null });
    const again = await member.post(`/api/processing-days/${day.id}/bookings`).send(body);
    expect(again.status).toBe(200);
    expect(again.body.id).toBe(first.body.id);
    expect(await transfersOf(coop.id, `processing-booking:${first.body.id}:%`)).toEqual([
      { id: `processing-booking:${first.body.id}:fee:0`, kind: 'processing_fee', status: 'pending', amount_cents: 750 },
    ]);
    // Only 3 head of the group are left to book.
    const more = await member.post(`/api/processing-days/${day.id}/bookings`).send(bookingBody(coop.farms[0]!.id, [{ groupId: group.id, head: 4 }]));
    expect(more.status).toBe(400);
    expect(more.body.error.details['items.0.head']).toEqual(['Clover pen has 3 head left to book']);
    // Another farm's member and the apprentice cannot book for the farm.
    expect((await (await agentOf(coop.otherFarmMember.email)).post(`/api/processing-days/${day.id}/bookings`).send(bookingBody(coop.farms[0]!.id, [{ groupId: group.id, head: 1 }]))).status).toBe(403);
    expect((await (await agentOf(coop.apprentice.email)).post(`/api/processing-days/${day.id}/bookings`).send(bookingBody(coop.farms[0]!.id, [{ groupId: group.id, head: 1 }]))).status).toBe(403);
  });

  it('when a group is under a medicine withdrawal on the day, then booking it is refused with the date it becomes eligible, and nothing is written', async () => {
    const coop = await createTestCoop();
    const site = await siteAs(coop.admin, coop);
    const day = await dayAs(coop.admin, site.id, { date: inDays(14) });
    const { group } = await growingGroupAs(coop.member, { kindledDaysAgo: 70, heads: 6, name: 'Sorrel pen' });
    // Last dose yesterday with a 20-day withdrawal: the withdrawal ends 19 days from today, so it may be processed from day 20.
    await treatmentAs(coop.member, { groupId: group.id, startedOn: inDays(-3), lastDoseOn: inDays(-1), withdrawalDays: 20 });
    const member = await agentOf(coop.member.email);
    const candidates = await member.get(`/api/processing-days/${day.id}/candidates`).query({ farmId: coop.farms[0]!.id }).expect(200);
    expect(candidates.body.items).toEqual([expect.objectContaining({ groupId: group.id, eligible: false, eligibleOn: inDays(20), headAvailable: 6 })]);
    const res = await member.post(`/api/processing-days/${day.id}/bookings`).send(bookingBody(coop.farms[0]!.id, [{ groupId: group.id, head: 2 }]));
    expect(res.status).toBe(400);
    expect(res.body.error.details['items.0.groupId']).toEqual([`Sorrel pen is under a medicine withdrawal (Coccidiosis course) on ${inDays(14)}: it may be processed from ${inDays(20)}`]);
    expect(await bookingRows(coop.id, day.id)).toEqual([]);
    // On a day after the withdrawal the same group books.
    const later = await dayAs(coop.admin, site.id, { date: inDays(21), signUpDeadline: inDays(18) });
    expect((await member.post(`/api/processing-days/${later.id}/bookings`).send(bookingBody(coop.farms[0]!.id, [{ groupId: group.id, head: 2 }]))).status).toBe(201);
  });

  it('when the day is full, then bookings wait in order; a cancellation offers the places in that order, e-mails the promoted member, and the confirmed place carries its fee', async () => {
    const coop = await createTestCoop();
    const site = await siteAs(coop.admin, coop);
    const day = await dayAs(coop.admin, site.id, { capacityHead: 10 });
    const a = await growingGroupAs(coop.member, { kindledDaysAgo: 70, heads: 12, name: 'Aster pen' });
    const b = await growingGroupAs(coop.otherFarmMember, { kindledDaysAgo: 70, heads: 12, name: 'Bramble pen' });
    const member = await agentOf(coop.member.email);
    const other = await agentOf(coop.otherFarmMember.email);
    const url = `/api/processing-days/${day.id}/bookings`;
    const big = (await member.post(url).send(bookingBody(coop.farms[0]!.id, [{ groupId: a.group.id, head: 8 }])).expect(201)).body as BookingDto;
    const waiting = (await other.post(url).send(bookingBody(coop.farms[1]!.id, [{ groupId: b.group.id, head: 4 }])).expect(201)).body as BookingDto;
    expect(waiting).toMatchObject({ status: 'waitlisted', waitlistPosition: 1 });
    // Two places are free, but a booking behind the waitlist does not jump it.
    const small = (await member.post(url).send(bookingBody(coop.farms[0]!.id, [{ groupId: a.group.id, head: 1 }])).expect(201)).body as BookingDto;
    expect(small).toMatchObject({ status: 'waitlisted', waitlistPosition: 2 });
    expect(await transfersOf(coop.id, `processing-booking:${waiting.id}:%`)).toEqual([]);
    const dayNow = (await member.get(`/api/processing-days/${day.id}`).expect(200)).body as ProcessingDayDto;
    expect(dayNow.capacity).toMatchObject({ bookedHead: 8, waitlistedHead: 5, freeHead: 2 });

    await member.post(`${url}/${big.id}/cancel`).send({ version: big.version }).expect(200);
    expect(await transfersOf(coop.id, `processing-booking:${big.id}:%`)).toEqual([{ id: `processing-booking:${big.id}:fee:0`, kind: 'processing_fee', status: 'voided', amount_cents: 1200 }]);
    const rows = await bookingRows(coop.id, day.id);
    expect(rows.map((r) => [r.id, r.status])).toEqual([[big.id, 'cancelled'], [waiting.id, 'offered'], [small.id, 'offered']]);
    const mail = await waitForMail(coop.otherFarmMember.email, { subject: /A place opened on the processing day/ });
    expect(mail.text).toContain('for the 4 head on your waitlisted booking');
    expect(mail.text).toMatch(/Confirm by \d{4}-\d{2}-\d{2} \d{2}:\d{2} UTC/);

    const list = (await other.get(url).expect(200)).body as { items: BookingDto[] };
    const offered = list.items.find((x) => x.id === waiting.id)!;
    expect(offered).toMatchObject({ status: 'offered', canConfirm: true });
    const confirmed = await other.post(`${url}/${waiting.id}/confirm`).send({ version: offered.version });
    expect(confirmed.status).toBe(200);
    expect(confirmed.body.status).toBe('booked');
    expect(await transfersOf(coop.id, `processing-booking:${waiting.id}:%`)).toEqual([{ id: `processing-booking:${waiting.id}:fee:0`, kind: 'processing_fee', status: 'pending', amount_cents: 600 }]);
    expect((await other.post(`${url}/${waiting.id}/confirm`).send({ version: confirmed.body.version })).status).toBe(409);
  });

  it('when the capacity grows, then the waitlist is offered the new places in order; it cannot shrink below what is booked', async () => {
    const coop = await createTestCoop();
    const site = await siteAs(coop.admin, coop);
    const day = await dayAs(coop.admin, site.id, { capacityHead: 4 });
    const { group } = await growingGroupAs(coop.otherFarmMember, { kindledDaysAgo: 70, heads: 10 });
    const other = await agentOf(coop.otherFarmMember.email);
    const url = `/api/processing-days/${day.id}/bookings`;
    await other.post(url).send(bookingBody(coop.farms[1]!.id, [{ groupId: group.id, head: 4 }])).expect(201);
    const second = (await other.post(url).send(bookingBody(coop.farms[1]!.id, [{ groupId: group.id, head: 3 }])).expect(201)).body as BookingDto;
    expect(second.status).toBe('waitlisted');
    const admin = await agentOf(coop.admin.email);
    const smaller = await admin.patch(`/api/processing-days/${day.id}`).send({ version: day.version, capacityHead: 3 });
    expect(smaller.status).toBe(400);
    const grown = await admin.patch(`/api/processing-days/${day.id}`).send({ version: day.version, capacityHead: 7 });
    expect(grown.status).toBe(200);
    expect(grown.body.capacity).toMatchObject({ capacityHead: 7, bookedHead: 4, offeredHead: 3, freeHead: 0, waitlistedHead: 0 });
    expect((await bookingRows(coop.id, day.id)).map((r) => r.status)).toEqual(['booked', 'offered']);
    // The booked farm hears of the change.
    expect((await noticesOf(coop.id, coop.otherFarmMember.id)).map((n) => n.kind)).toContain('day.changed');
  });

  it('when the deadline has passed, then the farm can no longer change or cancel, and the admin still can', async () => {
    const coop = await createTestCoop();
    const site = await siteAs(coop.admin, coop);
    const day = await dayAs(coop.admin, site.id);
    const { group } = await growingGroupAs(coop.member, { kindledDaysAgo: 70, heads: 6 });
    const member = await agentOf(coop.member.email);
    const url = `/api/processing-days/${day.id}/bookings`;
    const booking = (await member.post(url).send(bookingBody(coop.farms[0]!.id, [{ groupId: group.id, head: 3 }])).expect(201)).body as BookingDto;
    const changed = (await member.patch(`${url}/${booking.id}`).send({ version: booking.version, items: [{ groupId: group.id, head: 2 }] }).expect(200)).body as BookingDto;
    expect(changed).toMatchObject({ head: 2, feeCents: 300 });
    expect(await transfersOf(coop.id, `processing-booking:${booking.id}:%`)).toEqual([
      { id: `processing-booking:${booking.id}:fee:0`, kind: 'processing_fee', status: 'voided', amount_cents: 450 },
      { id: `processing-booking:${booking.id}:fee:1`, kind: 'processing_fee', status: 'pending', amount_cents: 300 },
    ]);
    await moveDay(coop.id, day.id, { deadline: inDays(-1) });
    const late = await member.patch(`${url}/${booking.id}`).send({ version: changed.version, items: [{ groupId: group.id, head: 1 }] });
    expect(late.status).toBe(403);
    expect(late.body.error.message).toBe(`Bookings closed on ${inDays(-1)}; ask the co-op's admin`);
    expect((await member.post(`${url}/${booking.id}/cancel`).send({ version: changed.version })).status).toBe(403);
    expect((await member.post(url).send(bookingBody(coop.farms[0]!.id, [{ groupId: group.id, head: 1 }]))).status).toBe(403);
    const admin = await agentOf(coop.admin.email);
    const cancelled = await admin.post(`${url}/${booking.id}/cancel`).send({ version: changed.version, reason: 'Sick kits' });
    expect(cancelled.status).toBe(200);
    expect(cancelled.body.status).toBe('cancelled');
    expect((await transfersOf(coop.id, `processing-booking:${booking.id}:%`)).map((t) => t.status)).toEqual(['voided', 'voided']);
    // The farm hears the admin cancelled (by e-mail: bookings changing default to at once).
    const mail = await waitForMail(coop.member.email, { subject: /Your booking for the processing day/ });
    expect(mail.text).toContain('cancelled the booking of 2 head');
  });
});

describe('processing days: roster and equipment', () => {
  it('when members sign up, then places fill in order; apprentices only when their farm allows; the host sees who brings what', async () => {
    const coop = await createTestCoop();
    const site = await siteAs(coop.admin, coop);
    const day = await dayAs(coop.admin, site.id, { stations: [{ name: 'Dispatch', places: 1 }, { name: 'Skinning', places: 2 }] });
    const [dispatch, skinning] = day.stations;
    const member = await agentOf(coop.member.email);
    const other = await agentOf(coop.otherFarmMember.email);
    const apprentice = await agentOf(coop.apprentice.email);
    const url = `/api/processing-days/${day.id}/stations`;
    await member.post(`${url}/${dispatch!.id}/sign-up`).send({}).expect(200);
    expect((await other.post(`${url}/${dispatch!.id}/sign-up`).send({})).status).toBe(409);
    expect((await member.post(`${url}/${skinning!.id}/sign-up`).send({})).status).toBe(409);
    expect((await apprentice.post(`${url}/${skinning!.id}/sign-up`).send({})).status).toBe(403);
    await member.put(`/api/processing-days/farm-settings/${coop.farms[0]!.id}`).send({ apprenticesMayStaff: true }).expect(200);
    expect((await other.put(`/api/processing-days/farm-settings/${coop.farms[0]!.id}`).send({ apprenticesMayStaff: false })).status).toBe(404);
    // Skinning is dangerous work: the co-op's rule wants her mentor's sign-off first (its own test is in mentorship.test.ts).
    await member.put(`/api/mentorship/apprentices/${coop.apprentice.id}/skills/skinning`).send({ state: 'signed-off', comment: 'Clean cuts, safe knife work' }).expect(200);
    const page = (await apprentice.post(`${url}/${skinning!.id}/sign-up`).send({}).expect(200)).body as ProcessingDayDto;
    expect(page.stations.map((s) => [s.name, s.filled, s.places.map((p) => p.userId)])).toEqual([
      ['Dispatch', 1, [coop.member.id]], ['Skinning', 1, [coop.apprentice.id, null]],
    ]);
    const [tank] = day.equipment;
    // A farm without places on the day brings nothing; once booked it may.
    expect((await other.post(`/api/processing-days/${day.id}/equipment/${tank!.id}/claim`).send({ farmId: coop.farms[1]!.id })).status).toBe(409);
    const { group } = await growingGroupAs(coop.otherFarmMember, { kindledDaysAgo: 70, heads: 3 });
    await other.post(`/api/processing-days/${day.id}/bookings`).send(bookingBody(coop.farms[1]!.id, [{ groupId: group.id, head: 3 }])).expect(201);
    const claimed = (await other.post(`/api/processing-days/${day.id}/equipment/${tank!.id}/claim`).send({ farmId: coop.farms[1]!.id }).expect(200)).body as ProcessingDayDto;
    expect(claimed.equipment[0]).toMatchObject({ name: 'Chill tank', broughtByFarmId: coop.farms[1]!.id, broughtByFarmName: coop.farms[1]!.name });
    expect((await member.post(`/api/processing-days/${day.id}/equipment/${tank!.id}/claim`).send({ farmId: coop.farms[0]!.id })).status).toBe(409);
  });
});

describe('processing days: the day, its yields, fees and shared costs', () => {
  it('when 31 head are split a 10,000-cent cost 7/11/13, then the largest remainder gives 2258, 3548 and 4194 cents', () => {
    // Worked example: quotas 10,000 × 7/31 = 2258.06, × 11/31 = 3548.39, × 13/31 = 4193.55; floors sum to 9,999 and the
    // one cent left goes to the largest remainder (0.55).
    expect(largestRemainder(10_000, [7, 11, 13])).toEqual([2258, 3548, 4194]);
    const split = splitSharedCosts(10_000, [{ farmId: 'a', head: 7 }, { farmId: 'b', head: 11 }, { farmId: 'c', head: 13 }]);
    expect([...split.values()].reduce((n, v) => n + v, 0)).toBe(10_000);
  });

  it('when the day is checked in, its yields recorded and closed, then fees post for head processed, costs split to the cent, once; the summary and sheet show it', async () => {
    const coop = await createTestCoop();
    const site = await siteAs(coop.admin, coop);
    const day = await dayAs(coop.admin, site.id, { capacityHead: 20, expectedCosts: [{ label: 'Bags', amountCents: 1_000 }, { label: 'Ice', amountCents: 2_333 }] });
    const a = await growingGroupAs(coop.member, { kindledDaysAgo: 75, heads: 8, name: 'Aster pen' });
    const b = await growingGroupAs(coop.otherFarmMember, { kindledDaysAgo: 75, heads: 8, name: 'Bramble pen' });
    const member = await agentOf(coop.member.email);
    const other = await agentOf(coop.otherFarmMember.email);
    const admin = await agentOf(coop.admin.email);
    const url = `/api/processing-days/${day.id}`;
    const bookA = (await member.post(`${url}/bookings`).send(bookingBody(coop.farms[0]!.id, [{ groupId: a.group.id, head: 4 }])).expect(201)).body as BookingDto;
    const bookB = (await other.post(`${url}/bookings`).send(bookingBody(coop.farms[1]!.id, [{ groupId: b.group.id, head: 5 }])).expect(201)).body as BookingDto;
    // Check-in opens on the day.
    expect((await admin.post(`${url}/bookings/${bookA.id}/check-in`).send({ version: bookA.version, headBrought: 4 })).status).toBe(409);
    await moveDay(coop.id, day.id, { date: farmToday(), deadline: inDays(-2) });
    expect((await other.post(`${url}/bookings/${bookA.id}/check-in`).send({ version: bookA.version, headBrought: 4 })).status).toBe(403);
    const inA = (await member.post(`${url}/bookings/${bookA.id}/check-in`).send({ version: bookA.version, headBrought: 4 }).expect(200)).body as BookingDto;
    const inB = (await admin.post(`${url}/bookings/${bookB.id}/check-in`).send({ version: bookB.version, headBrought: 3 }).expect(200)).body as BookingDto;
    expect([inA.headBrought, inB.headBrought]).toEqual([4, 3]);

    const yieldA = await member.post(`${url}/yields`).send({ bookingId: bookA.id, groupId: a.group.id, headCount: 4, liveGrams: 9_200, hotCarcassGrams: 5_060, trimmedHead: 1, outcomeReason: 'Bruised hind leg trimmed' });
    expect(yieldA.status).toBe(201);
    expect(yieldA.body).toMatchObject({ headCount: 4, processedOn: farmToday(), hotDressOutPercent: 55 });
    expect((await other.post(`${url}/yields`).send({ bookingId: bookB.id, groupId: b.group.id, headCount: 4, liveGrams: 9_000, hotCarcassGrams: 4_900 })).status).toBe(400);
    expect((await admin.post(`${url}/yields`).send({ bookingId: bookB.id, groupId: b.group.id, headCount: 3, liveGrams: 6_900, hotCarcassGrams: 3_700 })).status).toBe(403);
    await other.post(`${url}/yields`).send({ bookingId: bookB.id, groupId: b.group.id, headCount: 3, liveGrams: 6_900, hotCarcassGrams: 3_795, condemnedHead: 1, outcomeReason: 'White spots on the liver' }).expect(201);

    const current = (await admin.get(url).expect(200)).body as ProcessingDayDto;
    const closed = await admin.post(`${url}/close`).send({ version: current.version });
    expect(closed.status).toBe(200);
    const summary = closed.body as ProcessingDaySummaryDto;
    // 3,333 cents by 4 and 3 head: 1904.57 and 1428.43 → 1905 and 1428.
    expect(summary).toMatchObject({ status: 'closed', headProcessed: 7, feesPosted: true, totalSharedCostCents: 3_333 });
    expect(summary.farms.find((f) => f.farmId === coop.farms[0]!.id)).toMatchObject({ headBooked: 4, headBrought: 4, headProcessed: 4, dressOut: 0.55, trimmedHead: 1, feeCents: 600, sharedCostCents: 1_905 });
    expect(summary.farms.find((f) => f.farmId === coop.farms[1]!.id)).toMatchObject({ headBooked: 5, headBrought: 3, headProcessed: 3, dressOut: 0.55, condemnedHead: 1, feeCents: 450, sharedCostCents: 1_428 });
    expect(summary.outcomes.map((o) => [o.outcome, o.head, o.reason])).toEqual([['trimmed', 1, 'Bruised hind leg trimmed'], ['condemned', 1, 'White spots on the liver']]);
    expect(summary.byBreed.reduce((n, x) => n + x.headProcessed, 0)).toBe(7);

    const expected = [
      { id: `processing-booking:${bookA.id}:fee:0`, kind: 'processing_fee', status: 'posted', amount_cents: 600 },
      { id: `processing-booking:${bookB.id}:fee:0`, kind: 'processing_fee', status: 'voided', amount_cents: 750 },
      { id: `processing-booking:${bookB.id}:fee:final`, kind: 'processing_fee', status: 'posted', amount_cents: 450 },
    ].sort((x, y) => x.id.localeCompare(y.id));
    expect(await transfersOf(coop.id, 'processing-booking:%')).toEqual(expected);
    const costs = await transfersOf(coop.id, `processing-day:${day.id}:%`);
    expect(costs.map((c) => c.amount_cents).reduce((n, v) => n + v, 0)).toBe(3_333);
    expect(costs).toHaveLength(2);
    // Closing again changes nothing.
    expect((await admin.post(`${url}/close`).send({ version: current.version + 1 })).status).toBe(409);
    expect(await transfersOf(coop.id, 'processing-booking:%')).toEqual(expected);
    expect(await transfersOf(coop.id, `processing-day:${day.id}:%`)).toEqual(costs);
    // The apprentice reads the summary without money.
    const apprentice = await agentOf(coop.apprentice.email);
    const plain = (await apprentice.get(`${url}/summary`).expect(200)).body as ProcessingDaySummaryDto;
    expect(plain.totalSharedCostCents).toBeUndefined();
    expect(plain.farms.every((f) => f.feeCents === undefined && f.sharedCostCents === undefined)).toBe(true);

    const sheet = await member.get(`${url}/sheet.pdf`).buffer(true).parse(binaryParser);
    expect(sheet.status).toBe(200);
    expect(sheet.headers['content-type']).toBe('application/pdf');
    const { pages, text } = await pdfText(sheet.body as Buffer);
    expect(pages).toBe(2);
    expect(text).toContain(`Processing day ${farmToday()}`);
    expect(text).toContain('Chill promptly to 40 °F / 4.4 °C or below');
    expect(text).toContain('Aster pen (4)');
    expect(text).toContain('[ ] Chill tank');
    expect(text).toContain(`Yields of ${farmToday()}`);
    expect(text).toContain('White spots on the liver');
  });
});

describe('processing days: in the Almanac', () => {
  it('when a farm books a day, then it shows in that farm\'s agenda and iCalendar feed (and the host\'s), not in an unbooked farm\'s', async () => {
    const coop = await createTestCoop();
    // The site is farm B's, so farm A is only a booker.
    const site = await siteAs(coop.admin, coop, { hostFarmId: coop.farms[1]!.id });
    const day = await dayAs(coop.admin, site.id, { date: inDays(8), signUpDeadline: inDays(5), startTime: '06:45' });
    const member = await agentOf(coop.member.email);
    const agenda = async (agent: Awaited<ReturnType<typeof agentOf>>) => (await agent.get('/api/almanac/shared-days').query({ days: 14 }).expect(200)).body.days as { id: string; title: string }[];
    expect(await agenda(member)).toEqual([]);
    const { group } = await growingGroupAs(coop.member, { kindledDaysAgo: 70, heads: 4 });
    await member.post(`/api/processing-days/${day.id}/bookings`).send(bookingBody(coop.farms[0]!.id, [{ groupId: group.id, head: 3 }])).expect(201);
    expect(await agenda(member)).toEqual([expect.objectContaining({ id: day.id, date: inDays(8), title: `Processing day 06:45 at ${site.name} (3 head booked)`, link: `/processing-days/${day.id}` })]);
    expect((await agenda(await agentOf(coop.otherFarmMember.email))).map((d) => d.title)).toEqual([`Processing day 06:45 at ${site.name}, hosting`]);
    const made = await member.post('/api/almanac/calendar-feed').expect(201);
    const feed = await member.get(new URL(made.body.url).pathname).expect(200);
    const text = feed.text.replace(/\r\n /g, '');
    expect(text).toContain(`UID:shared-day-${day.id}`);
    expect(text).toContain(`SUMMARY:Processing day 06:45 at ${site.name} (3 head booked)`);
    expect(text).toContain(`DTSTART;VALUE=DATE:${inDays(8).replace(/-/g, '')}`);
  });
});
