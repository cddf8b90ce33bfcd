import { afterAll, describe, expect, it } from 'vitest';
import { createTestCoop, TEST_PASSWORD } from '../support/factories';
import { growingGroupAs } from '../support/health-yield';
import { bookingBody, bookingRows, dayAs, siteAs, transfersOf } from '../support/processing-days';
import { ROOMY_SIGN_IN, signedInAgent, testApp } from '../support/test-app';

const handle = testApp({ signIn: ROOMY_SIGN_IN });
afterAll(async () => {
  await handle.close();
});

describe('processing days: no overbooking under load', () => {
  it('when 50 bookings of one head race for the last 10 places, then exactly 10 are booked, 40 wait in a definite order, and nothing is lost', async () => {
    const coop = await createTestCoop();
    const site = await siteAs(coop.admin, coop, { capacityHeadPerDay: 100 });
    const day = await dayAs(coop.admin, site.id, { capacityHead: 40 });
    const groups: { id: string }[] = [];
    for (let i = 0; i < 6; i++) groups.push((await growingGroupAs(coop.member, { kindledDaysAgo: 70, heads: 14, name: `Pen ${i}` })).group);
    const member = await signedInAgent(coop.member.email, TEST_PASSWORD, handle);
    const url = `/api/processing-days/${day.id}/bookings`;
    // 30 of the 40 places are taken first.
    await member.post(url).send(bookingBody(coop.farms[0]!.id, [{ groupId: groups[5]!.id, head: 14 }, { groupId: groups[4]!.id, head: 14 }, { groupId: groups[3]!.id, head: 2 }])).expect(201);
    const bodies = Array.from({ length: 50 }, (_, i) => bookingBody(coop.farms[0]!.id, [{ groupId: groups[i % 4]!.id, head: 1 }]));
    const answers = await Promise.all(bodies.map((body) => member.post(url).send(body)));
    expect(answers.map((a) => a.status)).toEqual(Array(50).fill(201));
    expect(answers.filter((a) => a.body.status === 'booked')).toHaveLength(10);
    expect(answers.filter((a) => a.body.status === 'waitlisted')).toHaveLength(40);

    const rows = await bookingRows(coop.id, day.id);
    expect(rows).toHaveLength(51);
    expect(rows.filter((r) => r.status === 'booked').reduce((n, r) => n + r.head, 0)).toBe(40);
    // Taken one at a time under the day's lock: the first ten in the queue are booked, every later one waits.
    expect(rows.slice(1).map((r) => r.status)).toEqual([...Array(10).fill('booked'), ...Array(40).fill('waitlisted')]);
    const positions = answers.filter((a) => a.body.status === 'waitlisted').map((a) => a.body.waitlistPosition as number).sort((x, y) => x - y);
    expect(positions).toEqual(Array.from({ length: 40 }, (_, i) => i + 1));
    // One pending fee per booked place, none for the waiting.
    const fees = await transfersOf(coop.id, 'processing-booking:%');
    expect(fees).toHaveLength(11);
    expect(fees.every((f) => f.status === 'pending')).toBe(true);

    // The same 50 requests again (a retry storm) answer the originals and write nothing.
    const retries = await Promise.all(bodies.map((body) => member.post(url).send(body)));
    expect(retries.map((a) => a.status)).toEqual(Array(50).fill(200));
    expect(retries.map((a) => a.body.id).sort()).toEqual(answers.map((a) => a.body.id).sort());
    expect(await bookingRows(coop.id, day.id)).toHaveLength(51);
    expect(await transfersOf(coop.id, 'processing-booking:%')).toHaveLength(11);
  });
});
