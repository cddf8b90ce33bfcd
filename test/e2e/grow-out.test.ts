import { describe, expect, it } from 'vitest';
import { daysAgo, farmToday } from '../support/almanac';
import { browserTestApp, collectPageErrors, openBrowser, sidewaysScroll } from '../support/browser';
import { asTenant } from '../support/db';
import { createTestCoop, TEST_PASSWORD } from '../support/factories';
import { breedLitterAs, groupAs, weighGroupAs } from '../support/grow-out';
import { catalogueBreeds } from '../support/herd';

const app = browserTestApp(TEST_PASSWORD);

describe('grow-out: a member weighs a group, records feed and reads the breed comparison', () => {
  it('when a member weighs a growing group, then its projected ready date moves; the feed she records and corrects is in the feed book and the group; the breed comparison shows the cross', async () => {
    const coop = await createTestCoop();
    const breeds = await catalogueBreeds(coop.id);
    // A Californian buck over a New Zealand doe: 8 kits, kindled 42 days ago, weaned into a group at 35 days.
    const { litter } = await breedLitterAs(coop.member, {
      kindledDaysAgo: 42, kits: 8, sireBreedId: breeds['Californian']!.id, damBreedId: breeds['New Zealand']!.id, doe: 'Juniper', buck: 'Cobalt',
    });
    const group = await groupAs(coop.member, { name: 'Juniper spring pen', formedOn: daysAgo(7), targetGrams: 2270, litters: [{ litterId: litter.id, heads: 8 }] });
    // Two weigh-ins already: about 31 g a day per head.
    await weighGroupAs(coop.member, group.id, { weighedOn: daysAgo(7), totalGrams: 8 * 760, headCount: 8 });
    await weighGroupAs(coop.member, group.id, { weighedOn: daysAgo(3), totalGrams: 8 * 885, headCount: 8 });

    // The phone's clock is set to UTC+14, a day ahead of the farm (America/Chicago) most hours: the forms must
    // still default to the farm's today, which is the latest day the server accepts.
    const browser = await openBrowser({ timezoneId: 'Pacific/Kiritimati' });
    const errors = collectPageErrors(browser.page);
    const { page } = browser;
    try {
      await app.signIn(page, coop.member.email);
      await page.getByRole('link', { name: 'Grow-out', exact: true }).click();
      await page.getByRole('heading', { name: 'Grow-out groups', level: 1 }).waitFor();
      await page.getByRole('link', { name: 'Juniper spring pen' }).first().click();
      await page.getByRole('heading', { name: 'Juniper spring pen', level: 1 }).waitFor();

      // 1. Weigh the group today: a fast few days bring the projected date forward.
      const projected = page.getByTestId('projected-date');
      await projected.waitFor();
      const before = (await projected.textContent())!.trim();
      const weighForm = page.getByRole('form', { name: 'Weigh the group' });
      expect(await weighForm.getByLabel('Weighed on').inputValue()).toBe(farmToday());
      await weighForm.getByLabel('Total weight (lb)').fill('18');
      await weighForm.getByLabel('Total weight (oz)').fill('0');
      await weighForm.getByLabel('Head count').fill('8');
      await weighForm.getByRole('button', { name: /save|record/i }).click();
      await expect.poll(async () => (await projected.textContent())!.trim(), { timeout: 15_000 }).not.toBe(before);
      // The model and why it was chosen sit behind the disclosure.
      await page.getByText('How is this worked out?').first().click();
      await page.getByText(/Model: /).first().waitFor();
      const stored = await asTenant(coop.id, async (c) => (await c.query(`SELECT total_grams, head_count FROM weigh_ins WHERE group_id = $1 ORDER BY weighed_on DESC, created_at DESC LIMIT 1`, [group.id])).rows);
      expect(stored).toEqual([{ total_grams: 8165, head_count: 8 }]); // 18 lb = 8,164.66 g (NIST HB44: 1 lb = 453.59237 g)
      await page.screenshot({ path: '.data/e2e-grow-out-group.png', fullPage: true });

      // 2. Record feed: a purchase, then feed given to the group.
      await page.getByRole('navigation', { name: 'Grow-out' }).getByRole('link', { name: 'Feed' }).click();
      await page.getByRole('heading', { name: 'Feed', level: 1 }).waitFor();
      const purchase = page.getByRole('form', { name: 'Record a feed purchase' });
      await purchase.getByLabel('Bought on').fill(daysAgo(10));
      await purchase.getByLabel('Feed', { exact: true }).fill('Grower pellets 16 %');
      await purchase.getByLabel('Bag weight (lb)').fill('50');
      await purchase.getByLabel('Bags').fill('2');
      await purchase.getByLabel('Price paid').fill('38.50');
      await purchase.getByLabel('Crude protein (%)').fill('16');
      await purchase.getByRole('button', { name: /save|record/i }).click();
      await page.getByText('Grower pellets 16 %').first().waitFor();

      const given = page.getByRole('form', { name: 'Record feed given' });
      await given.getByLabel('Given on').fill(daysAgo(1));
      await given.getByLabel('Period from').fill(daysAgo(7));
      await given.getByLabel('Amount (lb)').fill('30');
      await given.getByLabel('Feed given to').selectOption('group');
      await given.getByLabel('Group').selectOption(group.id);
      await given.getByRole('button', { name: /save|record/i }).click();
      await expect
        .poll(async () => (await asTenant(coop.id, async (c) => (await c.query(`SELECT coalesce(sum(grams), 0)::int AS g FROM feed_uses WHERE coop_id = $1`, [coop.id])).rows[0].g)))
        .toBe(13608); // 30 lb = 13,607.77 g

      // She mistyped: 25 lb, not 30. The correction replaces the entry; the old one is kept as deleted.
      await page.getByRole('list', { name: 'Feed given' }).getByRole('button', { name: /^Correct the feed given on/ }).first().click();
      const correction = page.getByRole('form', { name: 'Correct feed given' });
      await expect.poll(async () => correction.getByLabel('Amount (lb)').inputValue()).toBe('30');
      await correction.getByLabel('Amount (lb)').fill('25');
      await page.screenshot({ path: '.data/e2e-grow-out-feed-correction.png', fullPage: true });
      await correction.getByRole('button', { name: 'Save correction' }).click();
      await page.getByText(/^Correction saved/).waitFor();
      await page.getByRole('form', { name: 'Record feed given' }).waitFor();
      const feedRows = async () => (await asTenant(coop.id, async (c) => (await c.query(`SELECT grams, deleted_at IS NOT NULL AS deleted FROM feed_uses WHERE coop_id = $1 ORDER BY deleted_at NULLS LAST`, [coop.id])).rows));
      await expect.poll(feedRows).toEqual([{ grams: 13608, deleted: true }, { grams: 11340, deleted: false }]); // 25 lb = 11,339.81 g
      await page.screenshot({ path: '.data/e2e-grow-out-feed.png', fullPage: true });

      // 3. The breed comparison: the cross is there, with its litter behind it.
      await page.getByRole('navigation', { name: 'Grow-out' }).getByRole('link', { name: 'Performance' }).click();
      await page.getByRole('heading', { name: 'Performance', level: 1 }).waitFor();
      await page.getByRole('button', { name: 'Breeds & crosses' }).click();
      const comparison = page.locator('section[aria-labelledby="breeds-heading"]');
      await comparison.getByRole('heading', { name: 'Breeds and crosses' }).waitFor();
      await comparison.getByText('Californian × New Zealand').first().waitFor();
      await page.screenshot({ path: '.data/e2e-grow-out-breeds.png', fullPage: true });
      expect(errors).toEqual([]);

      // A phone: the group's page fits the width.
      await page.setViewportSize({ width: 375, height: 800 });
      await page.goto(`${app.url}/grow-out/groups/${group.id}`);
      await page.getByRole('heading', { name: 'Juniper spring pen', level: 1 }).waitFor();
      expect(await sidewaysScroll(page)).toBeLessThanOrEqual(0);
      await page.screenshot({ path: '.data/e2e-grow-out-group-phone.png', fullPage: true });
    } finally {
      await browser.close();
    }
  });
});
