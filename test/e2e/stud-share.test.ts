import supertest from 'supertest';
import { describe, expect, it } from 'vitest';
import { addDays, CSRF_HEADER } from '@burrowline/shared';
import { daysAgo, farmToday } from '../support/almanac';
import { browserTestApp, collectPageErrors, openBrowser, sidewaysScroll } from '../support/browser';
import { asTenant } from '../support/db';
import { createTestCoop, TEST_PASSWORD } from '../support/factories';
import { addAnimalAs } from '../support/herd';

const app = browserTestApp(TEST_PASSWORD);
// Live updates arrive over the socket; give each a little room on a busy machine.
const LIVE = { timeout: 15_000 };

describe('Stud Share: a member borrows a buck from another farm (journey 2)', () => {
  it("when a member asks for a buck from her doe and his owner lends him, then each sees the other's steps arrive without a reload, and the litter he sired at her farm carries his pedigree", async () => {
    const coop = await createTestCoop();
    const owner = coop.member;
    const requester = coop.otherFarmMember;
    const buck = await addAnimalAs(owner, { sex: 'buck', name: 'Bramble', birthDate: '2022-05-01' });
    const doe = await addAnimalAs(requester, { sex: 'doe', name: 'Hazelnut', birthDate: '2023-01-10' });
    const ownerApi = supertest.agent(app.url).set(CSRF_HEADER, '1');
    expect((await ownerApi.post('/api/session').send({ email: owner.email, password: TEST_PASSWORD })).status).toBe(200);
    const offered = await ownerApi.post('/api/stud-share/offers').send({ buckId: buck.id, loan: true, service: false, loanFeeCents: 2_500, longestLoanDays: 30, travelArea: 'Within Test County' });
    expect(offered.status).toBe(201);
    const today = farmToday();

    // She works from her phone; he sits at the farm computer.
    const her = await openBrowser({ width: 390, height: 844 });
    const him = await openBrowser();
    const errors = [...collectPageErrors(her.page), ...collectPageErrors(him.page)];
    try {
      await app.signIn(her.page, requester.email);
      await app.signIn(him.page, owner.email);
      await him.page.goto(`${app.url}/stud-share/offers`);
      await him.page.getByText('Nobody has asked for your bucks yet.').waitFor();

      // 1. From her doe's page to the finder: every ranking factor and the one line that explains the order.
      await her.page.goto(`${app.url}/herd/${doe.id}`);
      await her.page.getByRole('link', { name: 'Find a stud buck' }).click();
      await her.page.getByRole('heading', { name: 'Bucks for Hazelnut', level: 1 }).waitFor();
      expect((await her.page.getByTestId('finder-order').textContent())?.length).toBeGreaterThan(10);
      const found = her.page.getByTestId('finder-card').filter({ hasText: 'Bramble' });
      await found.getByText("Litter's COI").waitFor();
      await found.getByText('No shared ancestors').waitFor();
      await found.getByText('$25.00').waitFor();
      expect(await sidewaysScroll(her.page)).toBe(0);

      // 2. His page: the doe is ticked already; she asks for three weeks from today.
      await found.getByRole('link', { name: 'Bramble' }).click();
      await her.page.getByRole('heading', { name: 'Bramble', level: 1 }).waitFor();
      await her.page.getByTestId('availability-calendar').waitFor();
      expect(await her.page.getByRole('checkbox', { name: /Hazelnut/ }).isChecked()).toBe(true);
      await her.page.getByLabel('First day with you').fill(today);
      await her.page.getByLabel('Last day with you').fill(addDays(today, 20));
      await her.page.getByLabel('Message (optional)').fill('For her second litter');
      expect(await sidewaysScroll(her.page)).toBe(0);
      await her.page.getByRole('button', { name: 'Send the request' }).click();
      await her.page.waitForURL(/\/stud-share\/loans\/[0-9a-f-]{36}$/);
      const loanUrl = her.page.url();
      await her.page.getByTestId('loan-state').getByText('Asked, waiting for the owner').waitFor();

      // 3. His screen shows the request arrive; he accepts.
      const request = him.page.getByTestId('loan-item').filter({ hasText: 'Bramble' });
      await request.getByText('Waiting for your answer').waitFor(LIVE);
      await request.getByRole('link', { name: /Bramble for/ }).click();
      await him.page.getByRole('button', { name: 'Accept', exact: true }).click();
      await him.page.getByTestId('loan-state').getByText('Accepted, not yet handed over').waitFor();

      // 4. Her page follows without a reload.
      await her.page.getByTestId('loan-state').getByText('Accepted, not yet handed over').waitFor(LIVE);

      // 5. He records the hand-over (date, weight, condition); she confirms it on her phone.
      await him.page.getByRole('button', { name: 'Record the hand-over' }).click();
      await him.page.getByLabel('Handed over on').fill(today);
      await him.page.getByLabel('His weight (lb)').fill('10');
      await him.page.getByLabel('His weight (oz)').fill('4');
      await him.page.getByLabel('His condition').fill('Bright eyes, clean nose, good coat');
      await him.page.getByRole('button', { name: 'Record the hand-over' }).click();
      await him.page.getByTestId('custody-hand-over').getByText('Waiting for confirmation').waitFor();
      await her.page.getByRole('button', { name: 'Confirm the hand-over' }).click(LIVE);
      await her.page.getByTestId('loan-state').getByText('With you on loan').waitFor();
      await her.page.getByTestId('custody-hand-over').getByText(/Confirmed by/).waitFor();
      await her.page.getByTestId('biosecurity-caution').waitFor();
      await him.page.getByTestId('loan-state').getByText('Away on loan').waitFor(LIVE);
      expect(await sidewaysScroll(her.page)).toBe(0);

      // 6. At her farm: a service by him (he is in her service form as on loan), then the kindling.
      await her.page.goto(`${app.url}/almanac/services/new?doeId=${doe.id}`);
      await her.page.getByLabel('Buck').selectOption(buck.id);
      expect(await her.page.getByLabel('Buck').locator('option:checked').textContent()).toMatch(/on loan from/);
      await her.page.getByLabel('Date of the service').fill(daysAgo(31));
      await her.page.getByRole('button', { name: 'Save the service' }).click();
      await her.page.getByText('Service saved. The Almanac planned its tasks below.').waitFor();
      await her.page.getByLabel('Kindled on').fill(today);
      await her.page.getByLabel('Born alive').fill('8');
      await her.page.getByLabel('Born dead').fill('0');
      await her.page.getByRole('button', { name: 'Save the kindling' }).click();
      await her.page.getByRole('heading', { name: /^Litter of Hazelnut/, level: 1 }).waitFor();
      const litterUrl = her.page.url();

      // 7. She records his return; he confirms it; both pages show him back home.
      await her.page.goto(loanUrl);
      await her.page.getByRole('button', { name: 'Record the return' }).click();
      await her.page.getByLabel('Returned on').fill(today);
      await her.page.getByRole('button', { name: 'Record the return' }).click();
      await her.page.getByTestId('custody-return').getByText('Waiting for confirmation').waitFor();
      await him.page.getByRole('button', { name: 'Confirm the return' }).click(LIVE);
      await him.page.getByTestId('loan-state').getByText('Back home').waitFor();
      await her.page.getByTestId('loan-state').getByText('Back home').waitFor(LIVE);
      const stages = her.page.getByTestId('loan-stages').getByRole('listitem');
      expect(await stages.allTextContents()).toEqual([
        expect.stringMatching(/^Requested/), expect.stringMatching(/^Accepted/), expect.stringMatching(/^Handed over/), expect.stringMatching(/^Returned/),
      ]);
      expect(await her.page.getByTestId('loan-stages').getByText('To come').count()).toBe(0);

      // 8. He is home, and the litter stays in her herd with him as sire.
      await her.page.goto(litterUrl);
      await her.page.getByText(/^By Bramble/).waitFor();
      const litterId = litterUrl.split('/').at(-1)!;
      const rows = await asTenant(coop.id, async (c) => (await c.query(
        `SELECT l.farm_id, l.sire_id, l.dam_id, b.owning_farm_id, b.keeping_farm_id
           FROM litters l JOIN animals b ON b.id = l.sire_id WHERE l.id = $1`,
        [litterId],
      )).rows);
      expect(rows).toEqual([{ farm_id: requester.farmId, sire_id: buck.id, dam_id: doe.id, owning_farm_id: owner.farmId, keeping_farm_id: owner.farmId }]);
      // His owner sees the litter he sired away in his get's record.
      await him.page.goto(`${app.url}/stud-share/bucks/${offered.body.offerId}`);
      const getRecord = him.page.getByRole('region', { name: "His get's record" });
      await getRecord.getByText('Litters sired').waitFor();
      expect(await getRecord.locator('dd').first().textContent()).toBe('1');
      expect(errors).toEqual([]);
    } finally {
      await her.close();
      await him.close();
    }
  });

  it('when the owner proposes other dates, then the member sees them arrive and takes them, the owner sees her answer live, and his apprentice follows the loan without any fee', async () => {
    const coop = await createTestCoop();
    const owner = coop.member;
    const requester = coop.otherFarmMember;
    const buck = await addAnimalAs(owner, { sex: 'buck', name: 'Thistle', birthDate: '2022-04-01' });
    const doe = await addAnimalAs(requester, { sex: 'doe', name: 'Clementine', birthDate: '2023-02-01' });
    const ownerApi = supertest.agent(app.url).set(CSRF_HEADER, '1');
    const requesterApi = supertest.agent(app.url).set(CSRF_HEADER, '1');
    expect((await ownerApi.post('/api/session').send({ email: owner.email, password: TEST_PASSWORD })).status).toBe(200);
    expect((await requesterApi.post('/api/session').send({ email: requester.email, password: TEST_PASSWORD })).status).toBe(200);
    const offered = await ownerApi.post('/api/stud-share/offers').send({ buckId: buck.id, loan: true, service: false, loanFeeCents: 4_000, longestLoanDays: 30 });
    expect(offered.status).toBe(201);
    const today = farmToday();
    const asked = await requesterApi.post('/api/stud-share/loans').send({
      offerId: offered.body.offerId, kind: 'loan', doeIds: [doe.id], farmId: requester.farmId, startOn: addDays(today, 10), endOn: addDays(today, 20), message: '',
    });
    expect(asked.status).toBe(201);
    const loanUrl = `${app.url}/stud-share/loans/${asked.body.id}`;

    const her = await openBrowser();
    const him = await openBrowser({ width: 390, height: 844 });
    const apprentice = await openBrowser({ width: 390, height: 844 });
    const errors = [...collectPageErrors(her.page), ...collectPageErrors(him.page), ...collectPageErrors(apprentice.page)];
    try {
      await app.signIn(her.page, requester.email);
      await app.signIn(him.page, owner.email);
      await app.signIn(apprentice.page, coop.apprentice.email);
      await her.page.goto(loanUrl);
      await her.page.getByTestId('loan-state').getByText('Asked, waiting for the owner').waitFor();
      await apprentice.page.goto(loanUrl);
      await apprentice.page.getByTestId('loan-state').getByText('Waiting for your answer').waitFor();

      // He offers two days later instead.
      await him.page.goto(loanUrl);
      await him.page.getByRole('button', { name: 'Propose other dates' }).click();
      await him.page.getByLabel('First day').fill(addDays(today, 12));
      await him.page.getByLabel('Last day').fill(addDays(today, 22));
      await him.page.getByRole('button', { name: 'Send these dates' }).click();
      await him.page.getByTestId('loan-state').getByText('Other dates offered, waiting for them').waitFor();
      expect(await sidewaysScroll(him.page)).toBe(0);

      // Her page shows his dates without a reload; she takes them.
      await her.page.getByTestId('loan-state').getByText('Other dates offered: your answer').waitFor(LIVE);
      await her.page.getByText(/^The owner offers .* instead$/).waitFor();
      await her.page.getByRole('button', { name: 'Take these dates' }).click();
      await her.page.getByTestId('loan-state').getByText('Accepted, not yet handed over').waitFor();

      // His phone and the apprentice's follow live; the apprentice can do nothing and sees no money.
      await him.page.getByTestId('loan-state').getByText('Accepted, not yet handed over').waitFor(LIVE);
      await apprentice.page.getByTestId('loan-state').getByText('Accepted, not yet handed over').waitFor(LIVE);
      expect(await apprentice.page.getByTestId('loan-actions').count()).toBe(0);
      expect(await apprentice.page.getByText('$').count()).toBe(0);
      expect(await apprentice.page.getByText('Fee', { exact: true }).count()).toBe(0);
      await her.page.getByText('$40.00').waitFor();
      const [row] = await asTenant(coop.id, async (c) => (await c.query('SELECT start_on::text, end_on::text, state FROM stud_loans WHERE id = $1', [asked.body.id])).rows);
      expect(row).toEqual({ start_on: addDays(today, 12), end_on: addDays(today, 22), state: 'accepted' });
      expect(errors).toEqual([]);
    } finally {
      await her.close();
      await him.close();
      await apprentice.close();
    }
  });
});
