import { describe, expect, it } from 'vitest';
import { browserTestApp, collectPageErrors, openBrowser, sidewaysScroll } from '../support/browser';
import { createTestCoop, TEST_PASSWORD } from '../support/factories';

const app = browserTestApp(TEST_PASSWORD);

describe('Co-op Chat in the browser', () => {
  it('when two members of different farms post in the channel, then each sees the other\'s message arrive live, the sender sees hers at once, and a mention is highlighted', async () => {
    const coop = await createTestCoop();
    const phone = await openBrowser({ width: 390, height: 844 });
    const desk = await openBrowser({ width: 1280, height: 900 });
    const phoneErrors = collectPageErrors(phone.page);
    const deskErrors = collectPageErrors(desk.page);
    try {
      await app.signIn(phone.page, coop.member.email);
      await app.signIn(desk.page, coop.otherFarmMember.email);

      // On the phone: the list, then the channel on a screen of its own.
      await phone.page.goto(`${app.url}/chat`);
      await phone.page.getByRole('heading', { name: 'Co-op Chat', level: 1 }).waitFor();
      expect(await sidewaysScroll(phone.page)).toBeLessThanOrEqual(0);
      await phone.page.getByRole('link', { name: /Co-op channel/ }).click();
      await phone.page.getByText('Live', { exact: true }).waitFor();

      // On the desk: the channel opens beside the list.
      await desk.page.goto(`${app.url}/chat`);
      const deskMessages = desk.page.getByRole('list', { name: 'Messages' });
      await desk.page.getByText('Live', { exact: true }).waitFor();

      const phoneBox = phone.page.getByLabel('Write a message');
      await phoneBox.fill('Anyone have spare hay for Saturday?');
      await phoneBox.press('Enter');
      const phoneMessages = phone.page.getByRole('list', { name: 'Messages' });
      await phoneMessages.getByText('Anyone have spare hay for Saturday?').waitFor();
      // No reload on the desk: it arrives over the socket.
      await deskMessages.getByText('Anyone have spare hay for Saturday?').waitFor();
      await expect.poll(() => phoneMessages.getByText('Sending…').count()).toBe(0);

      // The answer mentions her through the autocomplete; it arrives live on the phone, highlighted.
      const deskBox = desk.page.getByLabel('Write a message');
      await deskBox.fill(`@${coop.member.name.slice(0, 6)}`);
      await desk.page.getByRole('option', { name: new RegExp(coop.member.name) }).click();
      await deskBox.press('End');
      await deskBox.pressSequentially('yes, 4 bales at the shed');
      await deskBox.press('Enter');
      const mention = phoneMessages.locator('mark', { hasText: `@${coop.member.name}` });
      await mention.waitFor();
      await phoneMessages.getByText(/yes, 4 bales at the shed/).waitFor();
      await deskMessages.getByText(/yes, 4 bales at the shed/).waitFor();

      // Each message once on each screen.
      expect(await phoneMessages.getByText('Anyone have spare hay for Saturday?').count()).toBe(1);
      expect(await deskMessages.getByText('Anyone have spare hay for Saturday?').count()).toBe(1);
      expect(await deskMessages.getByText(/yes, 4 bales at the shed/).count()).toBe(1);
      expect(await sidewaysScroll(phone.page)).toBeLessThanOrEqual(0);
      expect(phoneErrors).toEqual([]);
      expect(deskErrors).toEqual([]);
    } finally {
      await phone.close();
      await desk.close();
    }
  });
});
