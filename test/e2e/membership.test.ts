import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { browserTestApp, collectPageErrors, openBrowser, sidewaysScroll } from '../support/browser';
import { asTenant, ownerDb } from '../support/db';
import { linkIn, waitForMail } from '../support/mail';

// The demo co-op is loaded into the test cluster by `npm test`, as `npm start` loads it.
const DEMO = { slug: 'larkspur-hollow', coop: 'Larkspur Hollow Rabbit Cooperative', admin: 'admin@demo.test', adminName: 'Odalys Brenner', member: 'priya@demo.test', password: 'burrowline-demo' };

const app = browserTestApp(DEMO.password);

async function fillApplication(page: Page, who: { name: string; email: string; farm: string }) {
  await page.getByLabel('Your name').fill(who.name);
  await page.getByLabel('E-mail').fill(who.email);
  await page.getByLabel('Phone (optional)').fill('555-0199');
  await page.getByLabel('Farm name').fill(who.farm);
  await page.getByLabel('Location').fill('Gorse Hill, Tamsin County');
  await page.getByLabel('Time zone').selectOption('America/Chicago');
  await page.getByLabel('Breeds kept').fill('New Zealand, Champagne d\'Argent');
  await page.getByLabel('Breeding does').fill('8');
  await page.getByLabel('Breeding bucks').fill('2');
  await page
    .getByLabel('How do you quarantine new stock?')
    .fill('Newcomers live 30 days in the old goat shed at the far end of the yard, with their own feeders and a separate pair of boots.');
  await page.getByRole('radio', { name: 'No' }).check();
  await page.getByRole('checkbox', { name: 'Lending or borrowing stud bucks' }).check();
  await page.getByRole('checkbox', { name: /I have read the rules of/ }).check();
}

describe('membership: a breeder applies, the admin approves, the new member signs in', () => {
  it('when the applicant sends the form, then the admin\'s open queue shows it live, the approval e-mail lets them in, and Commons shows their farm', async () => {
    const tag = randomUUID().slice(0, 6);
    const who = { name: `Rosalind Gorse ${tag}`, email: `rosalind-${tag}@example.test`, farm: `Gorse Hill Rabbitry ${tag}` };
    const admin = await openBrowser();
    const applicant = await openBrowser();
    const neighbour = await openBrowser();
    const adminErrors = collectPageErrors(admin.page);
    const applicantErrors = collectPageErrors(applicant.page);
    try {
      // The admin has the queue open; a member has Commons open.
      await app.signIn(admin.page, DEMO.admin);
      await admin.page.getByRole('link', { name: /^Admin/ }).click();
      await admin.page.getByRole('heading', { name: 'Applications', level: 1 }).waitFor();
      await app.signIn(neighbour.page, DEMO.member);

      // The applicant fills the public form.
      await applicant.page.goto(`${app.url}/apply/${DEMO.slug}`);
      await applicant.page.getByRole('heading', { name: `Apply to join ${DEMO.coop}` }).waitFor();
      await expect.poll(() => applicant.page.getByRole('region', { name: `Rules of ${DEMO.coop}` }).innerText()).toMatch(/quarantine period/);
      await applicant.page.getByRole('button', { name: 'Send application' }).click();
      await expect.poll(() => applicant.page.getByText("Agree to the co-op's rules to send your application").isVisible()).toBe(true);
      await fillApplication(applicant.page, who);
      await applicant.page.screenshot({ path: '.data/e2e-apply-form.png', fullPage: true });
      await applicant.page.getByRole('button', { name: 'Send application' }).click();
      await applicant.page.getByRole('heading', { name: 'Application sent' }).waitFor();
      await waitForMail(who.email, { subject: /received your application/i });

      // It appears in the admin's open queue without a reload, marked new, with the badge in the navigation.
      const row = admin.page.getByRole('link', { name: who.name });
      await expect.poll(() => row.isVisible(), { timeout: 10_000 }).toBe(true);
      await expect.poll(() => admin.page.getByRole('link', { name: /^Admin\s*,\s*\d+ new applications$/ }).isVisible()).toBe(true);
      await admin.page.screenshot({ path: '.data/e2e-admin-queue.png', fullPage: true });

      await row.click();
      await admin.page.getByRole('heading', { name: who.name, level: 1 }).waitFor();
      await expect.poll(() => admin.page.getByText('Newcomers live 30 days in the old goat shed', { exact: false }).isVisible()).toBe(true);
      await admin.page.getByRole('button', { name: 'Approve', exact: true }).click();
      await expect.poll(() => admin.page.getByLabel('Farm name').inputValue()).toBe(who.farm);
      await admin.page.getByRole('button', { name: 'Approve and send link' }).click();
      await admin.page.getByText(`Approved by ${DEMO.adminName}`).waitFor();
      await admin.page.screenshot({ path: '.data/e2e-admin-approved.png', fullPage: true });

      // The other members' directory shows the new farm live.
      const directory = neighbour.page.getByRole('list', { name: 'Members directory' });
      await expect.poll(() => directory.getByText(who.farm).isVisible(), { timeout: 10_000 }).toBe(true);

      // The applicant opens the link from the e-mail, sets a password, signs in and lands on Commons with their farm.
      const welcome = await waitForMail(who.email, { subject: /Welcome to/ });
      await applicant.page.goto(linkIn(welcome, '/set-password?token=').toString());
      await applicant.page.getByLabel('New password').fill('gorse-hill-kindling-77');
      await applicant.page.getByLabel('Confirm password').fill('gorse-hill-kindling-77');
      await applicant.page.getByRole('button', { name: 'Set password' }).click();
      await applicant.page.getByText('Your password is set. Sign in with it now.').waitFor();
      expect(await applicant.page.getByLabel('E-mail').inputValue()).toBe(who.email);
      await applicant.page.getByLabel('Password').fill('gorse-hill-kindling-77');
      await applicant.page.getByRole('button', { name: 'Sign in' }).click();
      await applicant.page.getByRole('heading', { name: 'Commons', level: 1 }).waitFor();
      await expect.poll(() => applicant.page.getByText(who.farm).first().isVisible()).toBe(true);
      await expect.poll(() => applicant.page.getByRole('list', { name: 'Members directory' }).getByText(who.farm).isVisible()).toBe(true);
      // A member sees no admin area.
      expect(await applicant.page.getByRole('link', { name: /^Admin/ }).count()).toBe(0);
      await applicant.page.screenshot({ path: '.data/e2e-new-member-commons.png', fullPage: true });

      expect(adminErrors).toEqual([]);
      expect(applicantErrors).toEqual([]);
    } finally {
      await admin.close();
      await applicant.close();
      await neighbour.close();
    }
  });

  it('when the form and the admin pages are opened on a phone, then they read as cards with nothing scrolling sideways', async () => {
    const phone = await openBrowser({ width: 375, height: 812 });
    const errors = collectPageErrors(phone.page);
    const { page } = phone;
    try {
      await page.goto(`${app.url}/apply/${DEMO.slug}`);
      await page.getByRole('button', { name: 'Send application' }).waitFor();
      expect(await sidewaysScroll(page)).toBeLessThanOrEqual(0);
      await page.screenshot({ path: '.data/e2e-apply-form-phone.png', fullPage: true });

      await app.signIn(page, DEMO.admin);
      for (const [path, heading, shot] of [
        ['/admin/applications?status=all', 'Applications', 'queue'],
        ['/admin/members', 'Members', 'members'],
        ['/admin/audit', 'Audit log', 'audit'],
        ['/admin/rules', 'Co-op rules', 'rules'],
      ] as const) {
        await page.goto(`${app.url}${path}`);
        await page.getByRole('heading', { name: heading, level: 1 }).waitFor();
        await page.screenshot({ path: `.data/e2e-admin-${shot}-phone.png`, fullPage: true });
        expect(await sidewaysScroll(page), `${path} scrolls sideways`).toBeLessThanOrEqual(0);
      }
      // The roster on a phone is a list of cards, one per person.
      await page.goto(`${app.url}/admin/members?q=Priya`);
      await expect.poll(() => page.getByRole('list', { name: 'Members' }).getByRole('listitem').count()).toBe(1);
      expect(errors).toEqual([]);
    } finally {
      await phone.close();
    }
  });

  it('when a member opens the admin pages by address, then they are turned away', async () => {
    const browser = await openBrowser();
    try {
      await app.signIn(browser.page, DEMO.member);
      await browser.page.goto(`${app.url}/admin/applications`);
      await browser.page.getByRole('heading', { name: 'Not open to you' }).waitFor();
      // Turned away means nothing of the queue reached the page, not only a heading above it.
      expect(await browser.page.getByRole('heading', { name: 'Not open to you' }).isVisible()).toBe(true);
      // The refusal says why and who can help; a reload would change nothing, so none is offered.
      expect(await browser.page.getByText("The co-op's admin pages are for its admins.").isVisible()).toBe(true);
      expect(await browser.page.getByText("ask your co-op's coordinator").isVisible()).toBe(true);
      expect(await browser.page.getByRole('button', { name: /reload|try again/i }).count()).toBe(0);
      expect(await browser.page.getByRole('link', { name: 'Go to Commons' }).isVisible()).toBe(true);
      expect(await browser.page.getByRole('heading', { name: 'Applications', level: 1 }).count()).toBe(0);
      expect(await browser.page.getByText(/@example\.test/).count()).toBe(0);
    } finally {
      await browser.close();
    }
  });

  it('when a member opens another farm\'s litter by address, then the page names the missing litter and leads back to her litters, not "No such farm"', async () => {
    const member = await ownerDb(async (c) => (await c.query('SELECT coop_id, farm_id FROM users WHERE email = $1', [DEMO.member])).rows[0] as { coop_id: string; farm_id: string });
    const other = await asTenant(member.coop_id, async (c) => (await c.query('SELECT id FROM litters WHERE farm_id <> $1 LIMIT 1', [member.farm_id])).rows[0] as { id: string });
    const browser = await openBrowser();
    try {
      await app.signIn(browser.page, DEMO.member);
      await browser.page.goto(`${app.url}/litters/${other.id}`);
      await browser.page.getByRole('heading', { name: 'That litter was not found' }).waitFor();
      expect(await browser.page.getByText('No such farm').count()).toBe(0);
      expect(await browser.page.getByRole('link', { name: 'Back to the litters' }).isVisible()).toBe(true);
    } finally {
      await browser.close();
    }
  });
});
