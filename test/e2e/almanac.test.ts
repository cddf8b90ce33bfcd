import { describe, expect, it } from 'vitest';
import { addDays } from '@burrowline/shared';
import { daysAgo, farmToday, litterAs, taskRows } from '../support/almanac';
import { browserTestApp, collectPageErrors, openBrowser, sidewaysScroll } from '../support/browser';
import { asTenant } from '../support/db';
import { createTestCoop, TEST_PASSWORD } from '../support/factories';
import { addAnimalAs } from '../support/herd';

const app = browserTestApp(TEST_PASSWORD);

describe('the Almanac: a member records a service and follows the plan to the litter', () => {
  it('when a member records a service, its palpation, the kindling and a fostering, then the Almanac plans each step and follows the real dates', async () => {
    const coop = await createTestCoop();
    const doe = await addAnimalAs(coop.member, { sex: 'doe', name: 'Marigold', birthDate: '2023-03-01' });
    const buck = await addAnimalAs(coop.member, { sex: 'buck', name: 'Bramwell', birthDate: '2022-09-01' });
    // A second doe of the farm kindled yesterday: the litter to foster kits into.
    const foster = await litterAs(coop.member, { servicedDaysAgo: 32, kindledDaysAgo: 1, bornAlive: 4, doe: 'Tansy' });
    const servicedOn = daysAgo(31);
    const browser = await openBrowser();
    const errors = collectPageErrors(browser.page);
    const { page } = browser;
    try {
      await app.signIn(page, coop.member.email);
      // Commons already shows the farm's week (the other doe's litter has its nest box out in three weeks; nothing today yet).
      await page.getByRole('heading', { name: 'Today', level: 2 }).waitFor();
      await page.getByRole('link', { name: 'Almanac', exact: true }).click();
      await page.getByRole('heading', { name: 'Almanac', level: 1 }).waitFor();
      // Wide screen: the month calendar first.
      expect(await page.getByRole('button', { name: 'Month', exact: true }).getAttribute('aria-pressed')).toBe('true');

      // 1. The service.
      await page.getByRole('link', { name: 'Record a service' }).click();
      await page.getByRole('heading', { name: 'Record a service', level: 1 }).waitFor();
      await page.getByLabel('Doe').selectOption(doe.id);
      await page.getByLabel('Buck').selectOption(buck.id);
      await page.getByLabel('Date of the service').fill(servicedOn);
      await page.getByRole('button', { name: 'Save the service' }).click();
      await page.getByText('Service saved. The Almanac planned its tasks below.').waitFor();
      const tasks = page.getByRole('region', { name: 'Tasks' }).or(page.locator('section[aria-labelledby="service-tasks"]'));
      await expect.poll(() => tasks.getByRole('listitem').count()).toBe(4);
      await page.screenshot({ path: '.data/e2e-almanac-service.png', fullPage: true });

      // 2. Its tasks in the Almanac's agenda: the palpation (day 12) is 19 days late, the kindling (day 31) due today.
      await page.goto(`${app.url}/almanac?view=agenda`);
      const overdue = page.locator('section[aria-labelledby="agenda-overdue"]');
      await expect.poll(() => overdue.getByText(/Palpate · Marigold/).isVisible()).toBe(true);
      await expect.poll(() => overdue.getByText('19 days late').isVisible()).toBe(true);
      const todaySection = page.locator(`section[aria-labelledby="agenda-${farmToday()}"]`);
      await expect.poll(() => todaySection.getByText(/Kindling due · Marigold/).isVisible()).toBe(true);
      await page.screenshot({ path: '.data/e2e-almanac-agenda.png', fullPage: true });

      // 3. The palpation, from the open service.
      await page.getByRole('link', { name: /^Marigold .* × Bramwell/ }).click();
      await page.getByRole('heading', { name: 'Record the palpation' }).waitFor();
      await page.getByRole('radio', { name: 'Yes, positive' }).check();
      await page.getByLabel('Palpated on').fill(addDays(servicedOn, 12));
      await page.getByRole('button', { name: 'Save the palpation' }).click();
      await page.getByText(/\(day 12\): positive/).waitFor();
      await expect.poll(() => page.locator('li', { hasText: 'Palpate' }).getByText('Done', { exact: true }).first().isVisible()).toBe(true);

      // 4. The kindling today (day 31): 11 alive, 1 dead; the litter page shows the plan from today.
      await page.getByLabel('Kindled on').fill(farmToday());
      await page.getByLabel('Born alive').fill('11');
      await page.getByLabel('Born dead').fill('1');
      await page.getByRole('button', { name: 'Save the kindling' }).click();
      await page.getByRole('heading', { name: /^Litter of Marigold/, level: 1 }).waitFor();
      await page.getByText(/^Kindling saved\./).waitFor();
      const litterId = new URL(page.url()).pathname.split('/').pop()!;
      const litterTasks = page.locator('section[aria-labelledby="litter-tasks"]');
      await expect.poll(() => litterTasks.getByText('Nest box out · Marigold', { exact: false }).isVisible()).toBe(true);
      await expect.poll(() => litterTasks.getByText('Wean · Marigold', { exact: false }).isVisible()).toBe(true);

      // 5. A fostering: two kits to Tansy's litter.
      await page.getByLabel('Which way').selectOption('out');
      await page.getByLabel('To the litter of').selectOption(foster.litter.id);
      await page.getByLabel('Number of kits').fill('2');
      await page.getByRole('button', { name: 'Save the fostering' }).click();
      await expect.poll(() => page.getByText(/Fostered out 2 kits to Tansy/).isVisible()).toBe(true);
      const withDoe = page.locator('dt', { hasText: 'With the doe' }).locator('xpath=following-sibling::dd');
      await expect.poll(() => withDoe.innerText()).toBe('9');
      await page.screenshot({ path: '.data/e2e-almanac-litter.png', fullPage: true });
      expect(await sidewaysScroll(page)).toBe(0);

      // 6. The plan followed: the service's palpation and kindling are done, the kindling alert and the
      //    nest box the kindling made moot are skipped, and the litter's jobs count from the real kindling date.
      const serviceRows = Object.fromEntries((await asTenant(coop.id, async (c) => (await c.query(
        `SELECT kind, state FROM almanac_tasks WHERE service_id = (SELECT service_id FROM litters WHERE id = $1)`, [litterId],
      )).rows)).map((r) => [r.kind, r.state]));
      expect(serviceRows).toEqual({ palpation: 'done', nest_box_in: 'skipped', kindling_due: 'done', kindling_overdue: 'skipped' });
      const rows = Object.fromEntries((await taskRows(coop.id, { litterId })).map((r) => [r.key, r.due_on]));
      expect(rows).toMatchObject({ nest_box_out: addDays(farmToday(), 21), weaning: addDays(farmToday(), 42), breed_back: addDays(farmToday(), 35) });
      const counts = await asTenant(coop.id, async (c) => (await c.query(
        `SELECT l.id = $1 AS ours, e.kind, e.kit_count FROM litter_events e JOIN litters l ON l.id = e.litter_id ORDER BY e.kind`, [litterId],
      )).rows);
      expect(counts).toEqual([{ ours: false, kind: 'fostered_in', kit_count: 2 }, { ours: true, kind: 'fostered_out', kit_count: 2 }]);

      // The agenda no longer lists the palpation as late; the nest box out shows in the month three weeks on.
      await page.goto(`${app.url}/almanac?view=agenda`);
      await page.getByRole('heading', { name: 'Almanac', level: 1 }).waitFor();
      await expect.poll(() => page.locator('section[aria-labelledby="agenda-overdue"]').getByText(/Palpate · Marigold/).count()).toBe(0);
      await page.goto(`${app.url}/almanac?view=month&month=${addDays(farmToday(), 21).slice(0, 7)}-01`);
      await expect.poll(() => page.getByRole('button', { name: /tasks?$/ }).filter({ hasText: 'Marigold: Nest box out' }).count()).toBe(1);
      await page.screenshot({ path: '.data/e2e-almanac-month.png', fullPage: true });
      expect(errors).toEqual([]);
    } finally {
      await browser.close();
    }
  });

  it('when a member opens the Almanac on a phone, then the agenda is the default and nothing scrolls sideways', async () => {
    const coop = await createTestCoop();
    await litterAs(coop.member, { servicedDaysAgo: 40, kindledDaysAgo: 9, bornAlive: 7, doe: 'Clover' });
    const browser = await openBrowser({ width: 375, height: 800 });
    const errors = collectPageErrors(browser.page);
    try {
      await app.signIn(browser.page, coop.member.email);
      await browser.page.goto(`${app.url}/almanac`);
      await browser.page.getByRole('heading', { name: 'Almanac', level: 1 }).waitFor();
      expect(await browser.page.getByRole('button', { name: 'Agenda', exact: true }).getAttribute('aria-pressed')).toBe('true');
      await expect.poll(() => browser.page.getByText(/Nest box out · Clover/).isVisible()).toBe(true);
      expect(await sidewaysScroll(browser.page)).toBe(0);
      await browser.page.screenshot({ path: '.data/e2e-almanac-phone.png', fullPage: true });
      expect(errors).toEqual([]);
    } finally {
      await browser.close();
    }
  });
});

describe('Almanac settings in the farm\'s units', () => {
  it('when a pounds-and-ounces farm opens its settings, then the target weight is typed in lb and oz and stored in grams; a kilogram farm sees kg', async () => {
    const coop = await createTestCoop();
    const browser = await openBrowser();
    const errors = collectPageErrors(browser.page);
    const { page } = browser;
    try {
      await app.signIn(page, coop.member.email);
      await page.goto(`${app.url}/almanac/settings`);
      // The default 2,270 g, in the farm's pounds and ounces (no grams box, no "5 lb 0.1 oz" hint).
      await expect.poll(() => page.getByLabel('Target fryer live weight (lb)').inputValue()).toBe('5');
      expect(await page.getByLabel('Target fryer live weight (oz)').inputValue()).toBe('0.07');
      expect(await page.getByText(/\(grams\)/).count()).toBe(0);
      await page.getByLabel('Target fryer live weight (lb)').fill('4');
      await page.getByLabel('Target fryer live weight (oz)').fill('8');
      await page.getByRole('button', { name: 'Save the cycle settings' }).click();
      await page.getByText(/^Saved\./).waitFor();
      // 4 lb 8 oz = 4.5 × 453.59237 g = 2,041.2 g, stored as 2,041 whole grams (NIST Handbook 44 pound).
      const stored = await asTenant(coop.id, async (c) => (await c.query('SELECT settings FROM farm_cycle_settings WHERE farm_id = $1', [coop.farms[0]!.id])).rows[0]);
      expect(stored.settings.targetLiveWeightGrams).toBe(2041);

      // A farm that switches to kilograms sees the same grams in kg and g.
      await asTenant(coop.id, (c) => c.query("UPDATE farms SET weight_unit = 'kg_g' WHERE id = $1", [coop.farms[0]!.id]), { commit: true });
      await page.goto(`${app.url}/almanac/settings`);
      await expect.poll(() => page.getByLabel('Target fryer live weight (kg)').inputValue()).toBe('2');
      expect(await page.getByLabel('Target fryer live weight (g)').inputValue()).toBe('41');
      expect(errors).toEqual([]);
    } finally {
      await browser.close();
    }
  });
});

describe('the service form shows kinship', () => {
  it('when a member picks her buck for a doe he sired, then the litter\'s COI and "her sire" show before she saves; an unrelated buck shows no relation', async () => {
    const coop = await createTestCoop();
    const sire = await addAnimalAs(coop.member, { sex: 'buck', name: 'Hawthorn', birthDate: '2021-05-01' });
    const dam = await addAnimalAs(coop.member, { sex: 'doe', name: 'Sorrel', birthDate: '2021-06-01' });
    const daughter = await addAnimalAs(coop.member, { sex: 'doe', name: 'Clover', birthDate: '2023-02-01', sireId: sire.id, damId: dam.id });
    const stranger = await addAnimalAs(coop.member, { sex: 'buck', name: 'Juniper', birthDate: '2022-03-01' });
    const browser = await openBrowser({ width: 390, height: 844 });
    const { page } = browser;
    const errors = collectPageErrors(page);
    try {
      await app.signIn(page, coop.member.email);
      await page.goto(`${app.url}/almanac/services/new?doeId=${daughter.id}`);
      await page.getByLabel('Buck').selectOption(sire.id);
      const kinship = page.getByTestId('service-kinship');
      // Parent × offspring: the litter's COI is 25 % (Falconer & Mackay, Introduction to Quantitative Genetics, 4th ed., ch. 5).
      await kinship.getByText('25 %').waitFor();
      await kinship.getByText('He is her sire.').waitFor();
      await page.getByLabel('Buck').selectOption(stranger.id);
      await kinship.getByText('No shared ancestor on record.').waitFor();
      expect(await kinship.getByText('0 %', { exact: true }).count()).toBe(1);
      expect(await sidewaysScroll(page)).toBeLessThanOrEqual(0);
      expect(errors).toEqual([]);
    } finally {
      await browser.close();
    }
  });
});
