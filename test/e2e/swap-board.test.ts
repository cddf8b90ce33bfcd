import { describe, expect, it } from 'vitest';
import { CSRF_HEADER } from '@burrowline/shared';
import { browserTestApp, collectPageErrors, openBrowser, sidewaysScroll } from '../support/browser';
import { asTenant } from '../support/db';
import { createTestCoop, TEST_PASSWORD } from '../support/factories';
import { addAnimalAs } from '../support/herd';
import { testImage } from '../support/herd-files';

const app = browserTestApp(TEST_PASSWORD);
// Live updates arrive over the socket; give each a little room on a busy machine.
const LIVE = { timeout: 15_000 };

describe('Swap Board: a doe changes hands between two farms', () => {
  it('when the seller lists a doe, the buyer offers and the seller accepts, then the doe arrives in the buyer\'s herd with her pedigree picture intact', async () => {
    const coop = await createTestCoop();
    const seller = coop.member;
    const buyer = coop.otherFarmMember;
    const sire = await addAnimalAs(seller, { sex: 'buck', name: 'Thornapple', birthDate: '2022-03-01' });
    const dam = await addAnimalAs(seller, { sex: 'doe', name: 'Bluebell', birthDate: '2022-04-01' });
    const doe = await addAnimalAs(seller, { sex: 'doe', name: 'Marigold', birthDate: '2025-05-01', sireId: sire.id, damId: dam.id });

    // The seller at the farm computer; the buyer on her phone.
    const him = await openBrowser();
    const her = await openBrowser({ width: 390, height: 844 });
    const errors = [...collectPageErrors(him.page), ...collectPageErrors(her.page)];
    try {
      await app.signIn(him.page, seller.email);
      await app.signIn(her.page, buyer.email);

      // 1. He lists Marigold for $65.
      await him.page.goto(`${app.url}/swap-board/new`);
      await him.page.getByLabel('Title').fill('Marigold, junior doe');
      await him.page.getByRole('checkbox', { name: /Marigold/ }).check();
      await him.page.getByLabel('Asking price').fill('65.00');
      await him.page.getByLabel('Where to collect (optional)').fill('Farm gate');
      await him.page.getByRole('button', { name: 'List it' }).click();
      await him.page.waitForURL(/\/swap-board\/listings\/[0-9a-f-]{36}$/);
      const listingUrl = him.page.url();
      await him.page.getByRole('heading', { name: 'Marigold, junior doe', level: 1 }).waitFor();

      // 1b. He adds a photo of her to the herd, then edits the listing: a photo picked among hers and a new place to collect.
      const uploaded = await him.page.request.post(`${app.url}/api/animals/${doe.id}/photos`, {
        headers: { [CSRF_HEADER]: '1' },
        multipart: { photos: { name: 'marigold.jpg', mimeType: 'image/jpeg', buffer: await testImage('jpeg', { width: 80, height: 60 }) } },
      });
      expect(uploaded.status()).toBe(201);
      await him.page.reload();
      await him.page.getByRole('button', { name: 'Edit the listing' }).click();
      const editor = him.page.getByRole('form', { name: 'Edit the listing' });
      await editor.getByRole('list', { name: 'Photos to show' }).getByRole('checkbox').check();
      await editor.getByLabel('Where to collect (optional)').fill('Farm gate, Saturdays');
      await editor.getByRole('button', { name: 'Save the changes' }).click();
      await him.page.getByRole('img', { name: 'Photo 1 of Marigold, junior doe' }).waitFor();
      await him.page.getByText('Collect at Farm gate, Saturdays').waitFor();

      // 2. She finds the card on the board, opens it, sees the pedigree picture and offers $60.
      await her.page.goto(`${app.url}/swap-board`);
      const card = her.page.getByTestId('listing-card').filter({ hasText: 'Marigold, junior doe' });
      await card.getByText('$65.00').waitFor(LIVE);
      expect(await sidewaysScroll(her.page)).toBe(0);
      await card.click();
      await her.page.getByRole('heading', { name: 'Marigold, junior doe', level: 1 }).waitFor();
      const picture = her.page.getByTestId('pedigree-picture');
      await picture.locator(':visible', { hasText: /^Thornapple$/ }).first().waitFor();
      await picture.locator(':visible', { hasText: /^Bluebell$/ }).first().waitFor();
      await her.page.getByLabel('Price (leave empty for a trade only)').fill('60.00');
      await her.page.getByRole('button', { name: 'Send the offer' }).click();
      await her.page.getByTestId('offer-thread').getByText('Waiting for the other farm.').waitFor();
      expect(await sidewaysScroll(her.page)).toBe(0);

      // 3. His listing page shows the offer arrive without a reload; he accepts.
      await him.page.goto(listingUrl);
      const offer = him.page.getByTestId('offer-thread').filter({ hasText: '$60.00' });
      await offer.getByRole('button', { name: 'Accept' }).click(LIVE);
      await offer.getByText('Accepted, awaiting collection').waitFor();

      // 4. Her page follows live; she confirms the collection.
      await her.page.getByTestId('offer-thread').getByText('Accepted, awaiting collection').waitFor(LIVE);
      await her.page.getByRole('button', { name: 'We collected them' }).click();
      await her.page.getByTestId('offer-thread').getByText('Collected').waitFor();

      // 4b. He sold her, yet keeps her pedigree certificate from the sold listing.
      await him.page.goto(listingUrl);
      const papers = him.page.getByRole('link', { name: 'Pedigree PDF' });
      await papers.waitFor();
      expect(await papers.getAttribute('href')).toBe(`/api/pedigree-certificates/${doe.id}`);
      const certificate = await him.page.request.get(`${app.url}/api/pedigree-certificates/${doe.id}`);
      expect(certificate.status()).toBe(200);
      expect(certificate.headers()['content-type']).toBe('application/pdf');

      // 5. Marigold is in her herd, and her pedigree picture still shows her sire and dam.
      await her.page.goto(`${app.url}/herd/${doe.id}`);
      await her.page.getByRole('heading', { name: /Marigold/, level: 1 }).waitFor();
      await her.page.locator('a:visible', { hasText: /^Thornapple$/ }).first().waitFor();
      await her.page.locator('a:visible', { hasText: /^Bluebell$/ }).first().waitFor();
      const stored = await asTenant(coop.id, async (c) => (await c.query(
        'SELECT owning_farm_id, keeping_farm_id, breeding_farm_id, sire_id, dam_id FROM animals WHERE id = $1', [doe.id],
      )).rows[0]);
      expect(stored).toEqual({ owning_farm_id: buyer.farmId, keeping_farm_id: buyer.farmId, breeding_farm_id: seller.farmId, sire_id: sire.id, dam_id: dam.id });
      expect(errors).toEqual([]);
    } finally {
      await him.close();
      await her.close();
    }
  });
});
