import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CSRF_HEADER } from '@burrowline/shared';
import { cardAccount, cardTestServer, fakeCard } from '../support/card-service';
import { collectPageErrors, openBrowser, sidewaysScroll, signInAt } from '../support/browser';
import { createTestCoop, TEST_PASSWORD, type TestCoop } from '../support/factories';
import { checkBooks } from '../support/ledger';

const card = cardAccount();
let server: Awaited<ReturnType<typeof cardTestServer>>;
let coop: TestCoop;

beforeAll(async () => {
  server = await cardTestServer(card);
  await fakeCard.register(card, `${server.url}/api/card-webhooks`);
  coop = await createTestCoop();
  const admin = supertest.agent(server.url).set(CSRF_HEADER, '1');
  expect((await admin.post('/api/session').send({ email: coop.admin.email, password: TEST_PASSWORD })).status).toBe(200);
  expect((await admin.put('/api/ledger/dues/2027').send({ amountCents: 6_000, dueOn: '2027-03-31', reminderDaysBefore: 14 })).status).toBe(200);
  // The card service confirms a moment after the payer comes back, so the return page is seen waiting.
  await fakeCard.switches(card, { delayMs: 2_500 });
});

afterAll(async () => {
  await server.close();
});

describe('ledger: a member pays dues by card', () => {
  it('when a member pays on the card page, then the return page waits for the card service, and her balance and the admin\'s books change live', async () => {
    const member = await openBrowser();
    const adminBrowser = await openBrowser();
    const errors = [...collectPageErrors(member.page), ...collectPageErrors(adminBrowser.page)];
    try {
      await signInAt(adminBrowser.page, server.url, coop.admin.email, TEST_PASSWORD);
      await adminBrowser.page.goto(`${server.url}/ledger/coop`);
      const farmRow = adminBrowser.page.getByTestId(`coop-farm-${coop.farms[0]!.id}`);
      await farmRow.getByText('2027 dues: $60.00 owed').waitFor();

      await signInAt(member.page, server.url, coop.member.email, TEST_PASSWORD);
      await member.page.getByRole('link', { name: 'Ledger', exact: true }).first().click();
      await member.page.getByRole('heading', { name: 'Ledger', level: 1 }).waitFor();
      const youOwe = member.page.getByTestId('balance-you-owe');
      await youOwe.getByText('$60.00', { exact: true }).waitFor();

      // A second tab of hers keeps the Ledger open while she pays in the first.
      const watching = await member.context.newPage();
      await watching.goto(`${server.url}/ledger`);
      await watching.getByTestId('balance-you-owe').getByText('$60.00', { exact: true }).waitFor();

      await member.page.getByRole('button', { name: 'Pay 2027 dues by card ($60.00)' }).click();
      await member.page.waitForURL(/\/pay\/cs_test_/);
      await member.page.getByText('$60.00').waitFor();
      await member.page.getByRole('button', { name: 'Pay', exact: true }).click();

      await member.page.waitForURL(/\/ledger\/card-return\?checkout=/);
      await member.page.getByText(/Processing… waiting for the card service/).waitFor();
      await member.page.getByText('$60.00 is posted to your farm\'s account.').waitFor({ timeout: 20_000 });

      // Live, with no reload: her other tab and the admin's books.
      await watching.getByTestId('balance-you-owe').getByText('$0.00', { exact: true }).waitFor({ timeout: 15_000 });
      await watching.getByTestId('dues-2027').getByText('Paid').waitFor();
      await farmRow.getByText('2027 dues paid').waitFor({ timeout: 15_000 });
      await adminBrowser.page.getByTestId('books-total').getByText(/The books balance/).waitFor();

      const books = await checkBooks(coop.id);
      expect(books.mismatches).toEqual([]);
      expect(books.postedTotal).toBe(0);
      expect(books.balances.get(coop.farms[0]!.id)).toBe(0);

      // The Ledger on a phone: cards, nothing scrolling sideways.
      await watching.setViewportSize({ width: 390, height: 844 });
      await watching.reload();
      await watching.getByTestId('balance-you-owe').waitFor();
      expect(await sidewaysScroll(watching)).toBe(0);
      expect(errors).toEqual([]);
    } finally {
      await member.close();
      await adminBrowser.close();
    }
  });

  it('when an apprentice signs in, then no Ledger appears in the menu and its address shows no money', async () => {
    const apprentice = await openBrowser();
    try {
      await signInAt(apprentice.page, server.url, coop.apprentice.email, TEST_PASSWORD);
      await apprentice.page.getByRole('link', { name: 'Herd', exact: true }).first().waitFor();
      expect(await apprentice.page.getByRole('link', { name: 'Ledger', exact: true }).count()).toBe(0);
      await apprentice.page.goto(`${server.url}/ledger`);
      await apprentice.page.getByRole('heading', { name: 'Not open to you' }).waitFor();
      expect(await apprentice.page.getByText('$').count()).toBe(0);
    } finally {
      await apprentice.close();
    }
  });
});
