import { describe, expect, it } from 'vitest';
import { litterAs } from '../support/almanac';
import { browserTestApp, collectPageErrors, openBrowser, sidewaysScroll } from '../support/browser';
import { createTestCoop, TEST_PASSWORD } from '../support/factories';

const app = browserTestApp(TEST_PASSWORD);

describe('the litters screen pages on the server', () => {
  it('when a member pages and sorts the litters, then the address keeps the view through a reload, and a phone shows the page as cards', async () => {
    const coop = await createTestCoop();
    // Twelve litters, kindled a day apart, the newest with the most kits.
    for (let i = 0; i < 12; i += 1) {
      await litterAs(coop.member, { servicedDaysAgo: 50 - i, kindledDaysAgo: 19 - i, bornAlive: 1 + (i % 10), doe: `Doe ${String(i).padStart(2, '0')}` });
    }
    const browser = await openBrowser();
    const errors = collectPageErrors(browser.page);
    const { page } = browser;
    const table = page.getByRole('table', { name: 'Litters' });
    try {
      await app.signIn(page, coop.member.email);
      await page.goto(`${app.url}/litters?pageSize=10`);
      await page.getByRole('heading', { name: 'Litters', level: 1 }).waitFor();
      await expect.poll(() => table.locator('tbody tr').count()).toBe(10);
      await page.getByText('1–10 of 12 litters').waitFor();
      // Latest kindling first: the first row is the twelfth doe's litter.
      expect(await table.locator('tbody tr').first().getByRole('link').textContent()).toContain('Doe 11');

      await page.getByRole('button', { name: 'Next' }).click();
      await page.getByText('11–12 of 12 litters').waitFor();
      expect(new URL(page.url()).searchParams.get('page')).toBe('2');
      await expect.poll(() => table.locator('tbody tr').count()).toBe(2);

      await page.getByRole('button', { name: 'Born alive' }).click();
      await expect.poll(() => new URL(page.url()).searchParams.get('sort')).toBe('bornAlive');
      expect(new URL(page.url()).searchParams.get('page')).toBeNull(); // a new sort starts again at page 1
      await page.reload();
      await page.getByText('1–10 of 12 litters').waitFor();
      // A count sorts most first on the first click: ten kits born alive (the tenth doe's litter).
      await expect.poll(async () => (await table.locator('tbody tr').first().getByRole('link').textContent()) ?? '').toContain('Doe 09');
      await page.getByRole('button', { name: 'Born alive' }).click();
      await expect.poll(() => new URL(page.url()).searchParams.get('dir')).toBe('asc');
      // Then fewest first: one kit, the first doe's litter before the eleventh's (kindled later).
      await expect.poll(async () => (await table.locator('tbody tr').first().getByRole('link').textContent()) ?? '').toContain('Doe 00');
      expect(await table.locator('tbody tr').nth(1).getByRole('link').textContent()).toContain('Doe 10');
      expect(errors).toEqual([]);
    } finally {
      await browser.close();
    }

    const phone = await openBrowser({ width: 390, height: 844 });
    try {
      await app.signIn(phone.page, coop.member.email);
      await phone.page.goto(`${app.url}/litters?pageSize=10&status=nursing`);
      await expect.poll(() => phone.page.getByRole('list', { name: 'Litters' }).getByRole('listitem').count()).toBe(10);
      expect(await sidewaysScroll(phone.page)).toBeLessThanOrEqual(0);
      await phone.page.screenshot({ path: '.data/e2e-litters-phone.png', fullPage: true });
    } finally {
      await phone.close();
    }
  });
});
