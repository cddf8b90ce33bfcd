import { describe, expect, it } from 'vitest';
import { withTenant } from '../../packages/server/src/db/tenant';
import { notify } from '../../packages/server/src/modules/notifications/notifications.service';
import { browserTestApp, collectPageErrors, openBrowser, sidewaysScroll } from '../support/browser';
import { createTestCoop, TEST_PASSWORD } from '../support/factories';

const app = browserTestApp(TEST_PASSWORD);

describe('the bell', () => {
  it('when a request for her farm arrives, then the open screen shows it live; opening it goes to its subject and it counts as read', async () => {
    const coop = await createTestCoop();
    const browser = await openBrowser({ width: 390, height: 844 });
    const { page } = browser;
    const errors = collectPageErrors(page);
    try {
      await app.signIn(page, coop.member.email);
      const bell = page.getByRole('link', { name: /^Notifications/ });
      await expect.poll(() => bell.textContent()).not.toMatch(/\d/);
      // Live once the page's socket has joined her rooms.
      await page.locator('html[data-live="connected"]').waitFor({ state: 'attached' });

      await withTenant({ coopId: coop.id }, (tx) => notify(tx, {
        coopId: coop.id, farmIds: [coop.farms[0]!.id], kind: 'stud.requested', title: 'Wren Hollow asks for Bramble, 3–17 March',
        link: '/herd', key: `e2e:${coop.id}`,
      }));
      // No reload: the count and a short notice arrive over the socket.
      await page.getByRole('status').getByRole('link', { name: 'Wren Hollow asks for Bramble, 3–17 March' }).waitFor();
      await expect.poll(() => bell.textContent()).toContain('1');

      await bell.click();
      await page.getByRole('heading', { name: 'Notifications', level: 1 }).waitFor();
      expect(await sidewaysScroll(page)).toBeLessThanOrEqual(0);
      await page.getByRole('main').getByRole('link', { name: /Unread: Wren Hollow asks for Bramble/ }).click();
      await page.getByRole('heading', { name: 'Herd', level: 1 }).waitFor();
      await expect.poll(() => bell.textContent()).not.toMatch(/\d/);

      // Her e-mail choice is saved and shown again.
      await page.goto(`${app.url}/notifications`);
      await page.getByLabel('Someone asks for one of your bucks').selectOption('digest');
      await page.getByRole('button', { name: 'Save e-mail preferences' }).click();
      await page.getByText('Saved.').waitFor();
      await page.reload();
      expect(await page.getByLabel('Someone asks for one of your bucks').inputValue()).toBe('digest');
      expect(errors).toEqual([]);
    } finally {
      await browser.close();
    }
  });

  it('when the admin uses a phone, then the bar holds five places and the rest open under "More"', async () => {
    const coop = await createTestCoop();
    const browser = await openBrowser({ width: 390, height: 844 });
    const { page } = browser;
    try {
      await app.signIn(page, coop.admin.email);
      const bar = page.getByRole('navigation', { name: 'Main' }).last();
      expect(await bar.locator(':scope > ul > li').count()).toBe(5);
      await bar.getByRole('button', { name: 'More' }).click();
      await bar.getByRole('link', { name: /^Admin/ }).click();
      await page.getByRole('heading', { name: /Admin|Applications/, level: 1 }).waitFor();
      // The sheet closes on arrival, and "More" shows where she is.
      expect(await bar.getByRole('link', { name: /^Admin/ }).count()).toBe(0);
      expect(await sidewaysScroll(page)).toBeLessThanOrEqual(0);
    } finally {
      await browser.close();
    }
  });
});
