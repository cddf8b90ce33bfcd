import { describe, expect, it } from 'vitest';
import { formatWeight, gramsToWeightInput, litterEventCreateSchema, type GrowOutGroupDto } from '@burrowline/shared';
import { recordLitterEvent } from '../../packages/server/src/modules/litters/litters.service';
import { breedingPair, daysAgo, farmToday, serviceAs } from '../support/almanac';
import { browserTestApp, collectPageErrors, openBrowser, sidewaysScroll } from '../support/browser';
import { createTestCoop, createTestMember, TEST_PASSWORD, type TestPerson } from '../support/factories';
import { grownLitterAs } from '../support/grow-out';
import { actorOf } from '../support/herd';
import { testImage } from '../support/herd-files';
import { growingGroupAs } from '../support/mentorship';

const app = browserTestApp(TEST_PASSWORD);

describe('journey 3: an apprentice logs, her mentor reviews and signs off', () => {
  it('when the apprentice logs a weighing with a photo, then her mentor sees it live, returns it, the apprentice corrects it, and once accepted and signed off the group\'s figures include it', async () => {
    const coop = await createTestCoop();
    const group = await growingGroupAs(coop.member);
    const phone = await openBrowser({ width: 390, height: 844 });
    const desk = await openBrowser({ width: 1280, height: 900 });
    const apprentice = phone.page;
    const mentor = desk.page;
    const errors = [...collectPageErrors(apprentice), ...collectPageErrors(mentor)];
    try {
      await app.signIn(mentor, coop.member.email);
      await mentor.goto(`${app.url}/mentorship/review`);
      await mentor.getByRole('heading', { name: 'Review', level: 1 }).waitFor();
      await mentor.getByText('Nothing waits for review.').waitFor();

      // The apprentice in the barn: the chore, the group, the weight, a photo, send (15 minutes is chosen already).
      await app.signIn(apprentice, coop.apprentice.email);
      await apprentice.goto(`${app.url}/mentorship`);
      await apprentice.getByRole('heading', { name: 'Log a chore', level: 1 }).waitFor();
      await apprentice.getByRole('button', { name: 'Weighing', exact: true }).click();
      await apprentice.getByLabel('About').selectOption(`group:${group.id}`);
      // The test farms weigh in pounds and ounces: 7,600 g typed as the scale shows it.
      const scale = gramsToWeightInput(7600, 'lb_oz');
      await apprentice.getByLabel('Weight on the scale (lb)').fill(scale.major);
      await apprentice.getByLabel('Weight on the scale (oz)').fill(scale.minor);
      await apprentice.getByLabel('Head count').fill('8');
      await apprentice.getByLabel('Photos').setInputFiles({ name: 'scale.jpg', mimeType: 'image/jpeg', buffer: await testImage('jpeg') });
      expect(await sidewaysScroll(apprentice)).toBeLessThanOrEqual(0);
      await apprentice.getByRole('button', { name: 'Send for review' }).click();
      await apprentice.getByText('Sent to your mentor for review.').waitFor();

      // It arrives on the mentor's open queue without a reload, with its photo.
      const card = mentor.getByRole('article', { name: `Weighing on ${farmToday()}` });
      await card.waitFor();
      await card.getByText(`Weight: ${formatWeight(7600, 'lb_oz')} for 8 head`).waitFor();
      await card.getByRole('img', { name: 'Photo of weighing' }).waitFor();
      await card.getByRole('button', { name: 'Return…' }).click();
      await card.getByLabel('What should she correct?').fill('That includes the carrier: weigh them again without it');
      await card.getByRole('button', { name: 'Return to her' }).click();
      await card.waitFor({ state: 'detached' });

      // The apprentice reads the comment and corrects the weight.
      await apprentice.goto(`${app.url}/mentorship/log?state=returned`);
      const returned = apprentice.getByRole('article', { name: `Weighing on ${farmToday()}` });
      await returned.getByText('That includes the carrier: weigh them again without it').waitFor();
      const corrected = gramsToWeightInput(7200, 'lb_oz');
      await returned.getByLabel('Corrected weight (lb)').fill(corrected.major);
      await returned.getByLabel('Corrected weight (oz)').fill(corrected.minor);
      await returned.getByRole('button', { name: 'Send corrected entry' }).click();
      await apprentice.getByText('Nothing here.').waitFor();

      // Back in the mentor's queue, live; accepted, the weight enters the group's figures.
      await card.getByText(`Weight: ${formatWeight(7200, 'lb_oz')} for 8 head`).waitFor();
      const before = await mentor.request.get(`${app.url}/api/grow-out/groups/${group.id}`);
      expect(((await before.json()) as GrowOutGroupDto).latest).toBeNull();
      await card.getByRole('button', { name: 'Accept', exact: true }).click();
      await card.waitFor({ state: 'detached' });
      const after = (await (await mentor.request.get(`${app.url}/api/grow-out/groups/${group.id}`)).json()) as GrowOutGroupDto;
      expect(after.latest).toEqual({ weighedOn: farmToday(), gramsPerHead: 900 });

      // The mentor signs off "weighing and recording" on her apprentice's page.
      await mentor.goto(`${app.url}/mentorship/apprentices/${coop.apprentice.id}`);
      const skill = mentor.getByRole('listitem').filter({ has: mentor.getByRole('heading', { name: 'Weighing and recording' }) });
      await skill.getByRole('button', { name: 'Sign off…' }).click();
      await skill.getByLabel('Comment').fill('Tares the scale and records the same day');
      await skill.getByRole('checkbox').first().check();
      await skill.getByRole('button', { name: 'Sign off', exact: true }).click();
      await skill.getByText(`Signed off · ${farmToday()}`).waitFor();

      // The apprentice's skills show it; the group's page shows the accepted weight.
      await apprentice.goto(`${app.url}/mentorship/skills`);
      await apprentice.getByRole('listitem').filter({ has: apprentice.getByRole('heading', { name: 'Weighing and recording' }) }).getByText(`Signed off · ${farmToday()}`).waitFor();
      expect(await sidewaysScroll(apprentice)).toBeLessThanOrEqual(0);
      await mentor.goto(`${app.url}/grow-out`);
      await mentor.getByText(group.name).first().waitFor();
      expect(errors).toEqual([]);
    } finally {
      await phone.close();
      await desk.close();
    }
  });

  it('when an apprentice\'s litter count waits, then only her mentor is offered Accept and Return on the litter\'s page; a farm-mate and the admin see it unverified', async () => {
    const coop = await createTestCoop();
    const farmMate = await createTestMember(coop, { farmIndex: 0 });
    const { litter } = await grownLitterAs(coop.member, 10, 7, 'Marigold');
    await recordLitterEvent(actorOf(coop.apprentice), litter.id, litterEventCreateSchema.parse({ kind: 'lost', on: farmToday(), count: 1, deathCause: 'chilled' }));

    async function reviewButtonsSeenBy(person: TestPerson): Promise<number> {
      const browser = await openBrowser({ width: 390, height: 844 });
      try {
        const errors = collectPageErrors(browser.page);
        await app.signIn(browser.page, person.email);
        await browser.page.goto(`${app.url}/litters/${litter.id}`);
        await browser.page.getByText('Unverified · waiting for review').waitFor();
        // Who mentors whom arrives with its own request: wait for it to settle before counting the buttons.
        await browser.page.waitForLoadState('networkidle');
        const seen = await browser.page.getByRole('button', { name: 'Accept', exact: true }).count();
        expect(errors).toEqual([]);
        return seen;
      } finally {
        await browser.close();
      }
    }
    expect(await reviewButtonsSeenBy(coop.member)).toBe(1);
    expect(await reviewButtonsSeenBy(farmMate)).toBe(0);
    expect(await reviewButtonsSeenBy(coop.admin)).toBe(0);
  });

  it('when the apprentice logs a palpation in three taps and a doe, then her mentor\'s queue shows it as a palpation, unverified, and accepting it closes the empty service', async () => {
    const coop = await createTestCoop();
    const { doe, buck } = await breedingPair(coop.member, { doe: 'Sorrel' });
    const service = await serviceAs(coop.member, { doeId: doe.id, buckId: buck.id, servicedOn: daysAgo(12) });
    const phone = await openBrowser({ width: 390, height: 844 });
    const desk = await openBrowser({ width: 1280, height: 900 });
    const errors = [...collectPageErrors(phone.page), ...collectPageErrors(desk.page)];
    try {
      await app.signIn(phone.page, coop.apprentice.email);
      await phone.page.goto(`${app.url}/mentorship`);
      await phone.page.getByRole('button', { name: 'Palpation', exact: true }).click();
      await phone.page.getByLabel('About').selectOption(`animal:${doe.id}`);
      await phone.page.getByRole('button', { name: 'Empty', exact: true }).click();
      expect(await sidewaysScroll(phone.page)).toBeLessThanOrEqual(0);
      await phone.page.getByRole('button', { name: 'Send for review' }).click();
      await phone.page.getByText('Sent to your mentor for review.').waitFor();

      await app.signIn(desk.page, coop.member.email);
      await desk.page.goto(`${app.url}/mentorship/review`);
      const card = desk.page.getByRole('article', { name: `Palpation on ${farmToday()}` });
      await card.getByText('Palpation: empty (negative) (unverified until accepted)').waitFor();
      await desk.page.goto(`${app.url}/almanac/services/${service.id}`);
      await desk.page.getByText('Unverified: waiting for review').waitFor();
      await desk.page.goto(`${app.url}/mentorship/review`);
      await card.getByRole('button', { name: 'Accept', exact: true }).click();
      await card.waitFor({ state: 'detached' });
      const after = await desk.page.request.get(`${app.url}/api/services/${service.id}`);
      expect(await after.json()).toMatchObject({ status: 'empty', palpations: [{ result: 'negative', reviewState: 'accepted' }] });
      expect(errors).toEqual([]);
    } finally {
      await phone.close();
      await desk.close();
    }
  });
});
