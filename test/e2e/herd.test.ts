import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { browserTestApp, collectPageErrors, openBrowser } from '../support/browser';

// The demo co-op is loaded into the test cluster by `npm test`, as `npm start` loads it. Clementine is
// Hazelrun's New Zealand doe by Quillfeather's buck; Tobin is a New Zealand buck kept at Saltbush Meadow.
const DEMO = { email: 'member@demo.test', password: 'burrowline-demo' };

const app = browserTestApp(DEMO.password);

/** The API's own figures, read with the browser's session, to check what the screen shows. */
async function api<T>(page: Page, path: string, body?: unknown): Promise<T> {
  return page.evaluate(
    async ([url, payload]) => {
      const res = await fetch(url as string, payload
        ? { method: 'POST', headers: { 'content-type': 'application/json', 'x-burrowline-csrf': '1' }, body: JSON.stringify(payload) }
        : undefined);
      return res.json();
    },
    [path, body] as const,
  ) as Promise<T>;
}

function percent(coi: number): string {
  return `${(coi * 100).toFixed(2).replace(/\.?0+$/, '')} %`;
}

describe.each([
  { label: 'desktop', width: 1280, height: 900 },
  { label: 'phone', width: 375, height: 800 },
])('the Herd on $label', ({ label, width, height }) => {
  it('when a member opens an animal, then she sees its pedigree across farms and its COI, and compares litters with another farm\'s buck', async () => {
    const browser = await openBrowser({ width, height });
    const errors = collectPageErrors(browser.page);
    const { page } = browser;
    try {
      await app.signIn(page, DEMO.email);
      await page.getByRole('link', { name: 'Herd', exact: true }).click();
      await page.getByRole('heading', { name: 'Herd', level: 1 }).waitFor();
      await page.screenshot({ path: `.data/e2e-herd-${label}.png`, fullPage: false });
      const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
      expect(overflow).toBeLessThanOrEqual(0);

      // The search narrows the herd (kept in the address), and the animal opens from its row or card.
      await page.getByLabel('Search').fill('Clementine');
      await page.waitForURL(/search=Clementine/);
      await page.getByRole('link', { name: /^(Clementine|HR-5)$/ }).first().click();
      await page.getByRole('heading', { name: 'Clementine', level: 1 }).waitFor();
      const clementine = await api<{ id: string; coi: number; sire: { id: string; name: string; currentFarm: { name: string } } }>(
        page, `/api/animals/${page.url().split('/').pop()}`,
      );
      expect(clementine.coi).toBeGreaterThan(0);
      await expect.poll(() => page.getByTestId('animal-coi').textContent()).toBe(percent(clementine.coi));

      // Her pedigree runs across farms: the sire is another farm's buck, his sire an outside animal from papers.
      const pedigree = page.getByRole('region', { name: 'Pedigree' });
      await expect.poll(() => pedigree.getByText(clementine.sire.name, { exact: true }).filter({ visible: true }).first().isVisible()).toBe(true);
      await expect.poll(() => pedigree.getByText(clementine.sire.currentFarm.name).filter({ visible: true }).first().isVisible()).toBe(true);
      expect(clementine.sire.currentFarm.name).toBe('Quillfeather Farm');
      await expect.poll(() => pedigree.getByText(/From papers/).filter({ visible: true }).first().isVisible()).toBe(true);
      await page.screenshot({ path: `.data/e2e-herd-animal-${label}.png`, fullPage: true });

      // A litter preview with Saltbush Meadow's buck.
      await page.getByRole('link', { name: 'Litter preview' }).click();
      await page.getByRole('heading', { name: 'Litter preview for Clementine' }).waitFor();
      await page.getByRole('button', { name: 'Across the co-op' }).click();
      await page.getByLabel('Find a buck').fill('Tobin');
      await page.getByRole('button', { name: /Tobin/ }).click();
      const litter = page.getByTestId('trial-litter').filter({ hasText: 'Tobin' });
      await litter.waitFor();
      const cards = await api<{ items: { id: string; name: string }[] }>(page, '/api/pedigree-cards?search=Tobin&sex=buck');
      const tobin = cards.items.find((c) => c.name === 'Tobin')!;
      const trial = await api<{ litters: { coi: number; sire: { currentFarm: { name: string } } }[] }>(page, '/api/trial-matings', {
        damId: clementine.id, sireIds: [tobin.id],
      });
      expect(trial.litters[0]!.sire.currentFarm.name).toBe('Saltbush Meadow');
      expect(trial.litters[0]!.coi).toBeGreaterThan(0); // they share Quillfeather's Bramwell
      await expect.poll(() => litter.getByText(percent(trial.litters[0]!.coi)).isVisible()).toBe(true);
      await expect.poll(() => litter.getByText('Saltbush Meadow').isVisible()).toBe(true);
      await expect.poll(() => litter.getByText('Another farm').isVisible()).toBe(true);
      await expect.poll(() => litter.getByText(/New Zealand/).first().isVisible()).toBe(true);
      await expect.poll(() => litter.getByRole('link', { name: "Ardent's Bramwell" }).isVisible()).toBe(true);
      expect(page.url()).toContain(`bucks=${tobin.id}`);
      // The buck search has narrowed the list to him.
      await expect.poll(() => page.getByRole('list', { name: 'Bucks to compare' }).getByRole('listitem').count()).toBe(1);
      await page.screenshot({ path: `.data/e2e-herd-trial-${label}.png`, fullPage: true });
      expect(await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)).toBeLessThanOrEqual(0);
      expect(errors).toEqual([]);
    } finally {
      await browser.close();
    }
  });
});
