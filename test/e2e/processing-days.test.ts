import supertest from 'supertest';
import { describe, expect, it } from 'vitest';
import { addDays, CSRF_HEADER, type BookingListDto } from '@burrowline/shared';
import { farmToday } from '../support/almanac';
import { browserTestApp, collectPageErrors, openBrowser, sidewaysScroll } from '../support/browser';
import { createTestCoop, TEST_PASSWORD } from '../support/factories';
import { breedLitterAs, groupAs } from '../support/grow-out';
import { growingGroupAs, treatmentAs } from '../support/health-yield';
import { catalogueBreeds } from '../support/herd';
import { dayAs, inDays, moveDay, siteAs } from '../support/processing-days';

const app = browserTestApp(TEST_PASSWORD);

describe('processing days: scheduling, booking with a waiting list, the day itself', () => {
  it('when one farm cancels, then the waitlisted farm is offered the place and confirms it, and both day pages show the places change without a reload', async () => {
    const coop = await createTestCoop();
    const [farmA, farmB] = coop.farms as [{ id: string; name: string }, { id: string; name: string }];
    const breeds = await catalogueBreeds(coop.id);
    // Each farm has a grow-out group of eight fryers, ten weeks old.
    for (const [person, name] of [[coop.member, 'Hazel pen'], [coop.otherFarmMember, 'Rowan pen']] as const) {
      const { litter } = await breedLitterAs(person, { kindledDaysAgo: 70, kits: 8, sireBreedId: breeds['Californian']!.id, damBreedId: breeds['New Zealand']!.id });
      await groupAs(person, { name, formedOn: addDays(farmToday(), -35), targetGrams: 2270, litters: [{ litterId: litter.id, heads: 8 }] });
    }
    const dayDate = addDays(farmToday(), 14);

    const admin = await openBrowser();
    const hazel = await openBrowser();
    // The second member is on her phone.
    const rowan = await openBrowser({ width: 390, height: 844 });
    const errors = [...collectPageErrors(admin.page), ...collectPageErrors(hazel.page), ...collectPageErrors(rowan.page)];
    try {
      // 1. The admin adds the site and schedules a day of ten places.
      await app.signIn(admin.page, coop.admin.email);
      await admin.page.goto(`${app.url}/processing-days/sites`);
      const siteForm = admin.page.getByRole('form', { name: 'Add a site' });
      await siteForm.getByLabel('Site name', { exact: true }).fill('Hollow barn');
      await siteForm.getByLabel('Host farm', { exact: true }).selectOption(farmA.id);
      await siteForm.getByLabel('Capacity (head a day)', { exact: true }).fill('40');
      await siteForm.getByLabel('Chill capacity (head at once)', { exact: true }).fill('30');
      await siteForm.getByLabel('Address', { exact: true }).fill('12 Bramble Lane, Test County');
      await siteForm.getByRole('button', { name: 'Add the site' }).click();
      await admin.page.getByRole('heading', { name: 'Hollow barn' }).waitFor();

      await admin.page.goto(`${app.url}/processing-days`);
      await admin.page.getByRole('link', { name: 'Schedule a day' }).click();
      const schedule = admin.page.getByRole('form', { name: 'Schedule a processing day' });
      await schedule.getByLabel('Capacity (head)', { exact: true }).fill('10');
      await schedule.getByLabel('Date', { exact: true }).fill(dayDate);
      await schedule.getByLabel('Start time', { exact: true }).fill('08:30');
      await schedule.getByLabel('Sign-up deadline', { exact: true }).fill(addDays(farmToday(), 10));
      await schedule.getByLabel('Fee per head', { exact: true }).fill('1.50');
      await schedule.getByRole('button', { name: 'Schedule the day' }).click();
      await admin.page.waitForURL(/\/processing-days\/[0-9a-f-]{36}$/);
      const dayUrl = admin.page.url();
      const dayId = dayUrl.split('/').pop()!;
      await admin.page.getByTestId('capacity-free').getByText('10', { exact: true }).waitFor();
      await admin.page.getByTestId('day-cautions').getByRole('listitem').filter({ hasText: 'Gloves when dressing (tularemia)' }).waitFor();

      // 2. Both members open the day; neither reloads from here on.
      await app.signIn(hazel.page, coop.member.email);
      await app.signIn(rowan.page, coop.otherFarmMember.email);
      await hazel.page.goto(dayUrl);
      await rowan.page.goto(dayUrl);
      for (const page of [hazel.page, rowan.page]) await page.getByTestId('capacity-free').getByText('10', { exact: true }).waitFor();

      // 3. Hazel books six of her eight; Rowan sees the places go.
      const hazelBooking = hazel.page.getByTestId('my-booking');
      await hazelBooking.getByRole('spinbutton', { name: 'Head from Hazel pen' }).fill('6');
      await hazelBooking.getByRole('button', { name: 'Book 6 head' }).click();
      await hazelBooking.getByText('Booked', { exact: true }).waitFor();
      await rowan.page.getByTestId('capacity-booked').getByText('6', { exact: true }).waitFor({ timeout: 15_000 });
      await rowan.page.getByTestId('capacity-free').getByText('4', { exact: true }).waitFor();

      // 4. Rowan wants six too: only four are free, so she joins the waiting list; Hazel sees her waiting.
      const rowanBooking = rowan.page.getByTestId('my-booking');
      await rowanBooking.getByRole('spinbutton', { name: 'Head from Rowan pen' }).fill('6');
      await rowanBooking.getByRole('button', { name: 'Join the waiting list: 6 head' }).click();
      await rowanBooking.getByText('Waiting list', { exact: true }).waitFor();
      await rowanBooking.getByTestId('waitlist-position').getByText('next in line').waitFor();
      await hazel.page.getByTestId('capacity-waiting').getByText('6', { exact: true }).waitFor({ timeout: 15_000 });
      await rowan.page.screenshot({ path: '.data/e2e-processing-day-waitlisted-390.png', fullPage: true });

      // 5. Hazel cancels: Rowan is offered the place at once, on the page she has open, and confirms it.
      await hazelBooking.getByRole('button', { name: 'Cancel booking' }).click();
      await hazelBooking.getByRole('button', { name: 'Yes, cancel' }).click();
      const offer = rowan.page.getByTestId('offered-place');
      await offer.getByText('A place is free for your 6 head.').waitFor({ timeout: 15_000 });
      await offer.getByRole('button', { name: 'Confirm my place' }).click();
      await rowanBooking.getByText('Booked', { exact: true }).waitFor();

      // Hazel's page follows: six booked (Rowan's), four free, nobody waiting; she may book again.
      await hazel.page.getByTestId('capacity-booked').getByText('6', { exact: true }).waitFor({ timeout: 15_000 });
      await hazel.page.getByTestId('capacity-waiting').getByText('0', { exact: true }).waitFor();
      await hazel.page.getByTestId('capacity-free').getByText('4', { exact: true }).waitFor();
      await hazelBooking.getByRole('button', { name: /^Book \d+ head$/ }).waitFor();

      // What the server holds: farm A's booking cancelled, farm B's booked for six.
      const api = supertest.agent(app.url).set(CSRF_HEADER, '1');
      expect((await api.post('/api/session').send({ email: coop.admin.email, password: TEST_PASSWORD })).status).toBe(200);
      const res = await api.get(`/api/processing-days/${dayId}/bookings`);
      expect(res.status).toBe(200);
      const byFarm = Object.fromEntries((res.body as BookingListDto).items.map((b) => [b.farmId, { status: b.status, head: b.head }]));
      expect(byFarm).toEqual({ [farmA.id]: { status: 'cancelled', head: 6 }, [farmB.id]: { status: 'booked', head: 6 } });

      // The day page on a phone: nothing scrolls sideways.
      expect(await sidewaysScroll(rowan.page)).toBe(0);
      await rowan.page.screenshot({ path: '.data/e2e-processing-day-booked-390.png', fullPage: true });
      expect(errors).toEqual([]);
    } finally {
      await admin.close();
      await hazel.close();
      await rowan.close();
    }
  });

  it('when a group is under a medicine withdrawal on the day, then the phone shows it refused with the date it may go; the other group is booked, checked in at the gate, its yields recorded, and the summary shows its dress-out', async () => {
    const coop = await createTestCoop();
    const farmB = coop.farms[1]!;
    const site = await siteAs(coop.admin, coop);
    const day = await dayAs(coop.admin, site.id, { date: inDays(14), signUpDeadline: inDays(10), capacityHead: 20 });
    const { group: sorrel } = await growingGroupAs(coop.otherFarmMember, { kindledDaysAgo: 60, heads: 6, name: 'Sorrel pen' });
    const { group: birch } = await growingGroupAs(coop.otherFarmMember, { kindledDaysAgo: 70, heads: 8, name: 'Birch pen' });
    // Last dose yesterday, 20 days' withdrawal: still withdrawn on the day (in 14 days), eligible from day 20.
    await treatmentAs(coop.otherFarmMember, { groupId: sorrel.id, startedOn: inDays(-3), lastDoseOn: inDays(-1), withdrawalDays: 20 });
    const eligibleText = new Intl.DateTimeFormat('en-US', { day: 'numeric', month: 'short', year: 'numeric', timeZone: 'UTC' }).format(new Date(`${inDays(20)}T00:00:00Z`));

    const rowan = await openBrowser({ width: 390, height: 844 });
    const admin = await openBrowser();
    const errors = [...collectPageErrors(rowan.page), ...collectPageErrors(admin.page)];
    try {
      await app.signIn(rowan.page, coop.otherFarmMember.email);
      await rowan.page.goto(`${app.url}/processing-days/${day.id}`);
      const booking = rowan.page.getByTestId('my-booking');
      const refused = booking.getByTestId(`candidate-${sorrel.id}`);
      await refused.getByTestId('withdrawal-refusal').getByText(`Medicine withdrawal on the day: may be processed from ${eligibleText}.`).waitFor();
      expect(await refused.getByRole('spinbutton').count()).toBe(0);
      expect(await sidewaysScroll(rowan.page)).toBe(0);

      const clear = booking.getByTestId(`candidate-${birch.id}`);
      await clear.getByRole('button', { name: 'One more from Birch pen' }).click();
      expect(await clear.getByRole('spinbutton', { name: 'Head from Birch pen' }).inputValue()).toBe('1');
      await clear.getByRole('spinbutton', { name: 'Head from Birch pen' }).fill('5');
      await booking.getByRole('button', { name: 'Book 5 head' }).click();
      await booking.getByTestId('my-booking-head').getByText('5 head').waitFor();

      // The day comes: the host's admin counts five at the gate.
      await moveDay(coop.id, day.id, { date: farmToday(), deadline: farmToday() });
      await app.signIn(admin.page, coop.admin.email);
      await admin.page.goto(`${app.url}/processing-days/${day.id}`);
      const gate = admin.page.getByTestId(`booking-${farmB.id}`);
      await gate.getByRole('button', { name: 'Check in' }).click();
      await gate.getByText('Checked in: 5 head').waitFor();
      // The admin is not shown the farm's groups, so the farm records its own yields.
      expect(await gate.getByRole('button', { name: 'Record yields' }).count()).toBe(0);

      await rowan.page.reload();
      const own = rowan.page.getByTestId(`booking-${farmB.id}`);
      await own.getByText('Checked in: 5 head').waitFor();
      await own.getByRole('button', { name: 'Record yields' }).click();
      const yields = own.getByRole('form', { name: `Yields of ${farmB.name}` });
      await yields.getByLabel('Head in this batch', { exact: true }).fill('5');
      await yields.getByLabel('Live, all head (lb)', { exact: true }).fill('25');
      await yields.getByLabel('Hot carcass (lb)', { exact: true }).fill('14');
      await yields.getByRole('button', { name: 'Save the yields' }).click();
      await yields.getByText('Saved: 5 head, dress-out 56.0 %.').waitFor();

      await rowan.page.getByRole('link', { name: 'Summary' }).click();
      const farmCard = rowan.page.getByTestId(`summary-farm-${farmB.id}`);
      await farmCard.getByText('56.0 %', { exact: true }).waitFor();
      await rowan.page.getByRole('img', { name: /^Dress-out per farm: / }).getByText('56.0 %').waitFor();
      expect(await sidewaysScroll(rowan.page)).toBe(0);
      await rowan.page.screenshot({ path: '.data/e2e-processing-day-summary-390.png', fullPage: true });
      expect(errors).toEqual([]);
    } finally {
      await rowan.close();
      await admin.close();
    }
  });
});
