import { describe, expect, it } from 'vitest';
import { daysAgo, farmToday } from '../support/almanac';
import { browserTestApp, collectPageErrors, openBrowser, sidewaysScroll } from '../support/browser';
import { asTenant } from '../support/db';
import { createTestCoop, TEST_PASSWORD } from '../support/factories';
import { addAnimalAs } from '../support/herd';

const app = browserTestApp(TEST_PASSWORD);

describe('a weighing round on a phone', () => {
  it('when a member weighs three juniors in a row on the number pad and keeps one unusual weight after the warning, then the round is saved once and each animal shows its weight', async () => {
    const coop = await createTestCoop();
    const born = daysAgo(70);
    const animals = await Promise.all(['Bramble', 'Sorrel', 'Wick'].map((name) => addAnimalAs(coop.member, { name, sex: 'buck', birthDate: born, lifecycle: 'junior' })));
    const idOf = (name: string) => animals.find((a) => a.name === name)!.id;
    // Typed in pounds and ounces (the farm's units); 1 lb = 453.59237 g (NIST Handbook 44, App. C).
    const typed: Record<string, { lb: string; oz: string; grams: number }> = {
      Bramble: { lb: '4', oz: '4', grams: 1928 }, // 4.25 lb = 1,927.77 g
      Sorrel: { lb: '1', oz: '8', grams: 680 }, //   1.5 lb = 680.39 g: under the usual band at 70 days
      Wick: { lb: '4', oz: '', grams: 1814 }, //     4 lb = 1,814.37 g
    };

    const browser = await openBrowser({ width: 390, height: 844 });
    const errors = collectPageErrors(browser.page);
    const { page } = browser;
    try {
      await app.signIn(page, coop.member.email);
      await page.goto(`${app.url}/grow-out`);
      await page.getByRole('link', { name: 'Weighing round' }).click();
      await page.getByRole('link', { name: 'Every growing animal' }).click();
      const pad = page.getByLabel('Number pad');
      const tap = async (digits: string) => {
        for (const key of digits) await pad.getByRole('button', { name: key === '.' ? 'Point' : key, exact: true }).click();
      };

      for (let i = 1; i <= 3; i++) {
        await page.getByText(`${i} of 3`).waitFor();
        const name = (await page.getByRole('heading', { level: 2 }).first().textContent())!.trim();
        const weight = typed[name]!;
        await page.getByText('Usual for the age').waitFor();
        await tap(weight.lb);
        if (weight.oz) {
          await page.getByRole('button', { name: 'Ounces' }).click();
          await tap(weight.oz);
        }
        await page.getByRole('button', { name: 'Next', exact: true }).click();
        if (name === 'Sorrel') {
          await page.getByText('Is that right?').waitFor();
          await expect.poll(() => page.getByText(/^1 lb 8 oz is light at 70 days: 2 lb 15\.5 oz – 7 lb 14\.8 oz is usual$/).count()).toBe(1);
          await page.getByRole('button', { name: 'Keep 1 lb 8 oz' }).click();
        }
      }
      expect(await sidewaysScroll(page)).toBe(0);
      await page.getByRole('heading', { name: 'Check and save' }).waitFor();
      await page.getByText('Kept after a warning').waitFor();
      await page.getByRole('button', { name: 'Save 3 weights' }).click();
      await page.getByText('Saved 3 weigh-ins').waitFor();

      const stored = await asTenant(coop.id, async (c) => (await c.query(
        `SELECT animal_id, total_grams, weighed_on::text AS weighed_on, round_id FROM weigh_ins WHERE coop_id = $1 ORDER BY total_grams`, [coop.id])).rows);
      expect(stored.map((r) => [r.animal_id, r.total_grams, r.weighed_on])).toEqual([
        [idOf('Sorrel'), 680, farmToday()], [idOf('Wick'), 1814, farmToday()], [idOf('Bramble'), 1928, farmToday()],
      ]);
      expect(new Set(stored.map((r) => r.round_id)).size).toBe(1);

      for (const [name, shown] of [['Bramble', '4 lb 4 oz'], ['Sorrel', '1 lb 8 oz'], ['Wick', '4 lb 0 oz']] as const) {
        await page.goto(`${app.url}/herd/${idOf(name)}`);
        await page.getByRole('heading', { name, level: 1 }).waitFor();
        await page.getByText(new RegExp(`^${shown} on `)).first().waitFor();
      }
      expect(errors).toEqual([]);
    } finally {
      await browser.close();
    }
  });

  it('when a member ticks two animals on the Herd list and taps "Weigh these", then the round weighs just those two and saves their weights', async () => {
    const coop = await createTestCoop();
    const born = daysAgo(70);
    const [fern, moss, reed] = await Promise.all(['Fern', 'Moss', 'Reed'].map((name) => addAnimalAs(coop.member, { name, sex: 'doe', birthDate: born, lifecycle: 'junior' })));

    for (const width of [1280, 390]) {
      const browser = await openBrowser({ width, height: 844 });
      const errors = collectPageErrors(browser.page);
      const { page } = browser;
      try {
        await app.signIn(page, coop.member.email);
        await page.goto(`${app.url}/herd`);
        if (width < 768) {
          await page.getByRole('button', { name: 'Choose animals to weigh' }).click();
          const cards = page.getByRole('list', { name: 'Animals of the herd' });
          // The whole card is the target: a tap near its foot ticks the animal.
          const fernCard = cards.getByRole('listitem').filter({ hasText: 'Fern' });
          const box = (await fernCard.boundingBox())!;
          await fernCard.click({ position: { x: box.width / 2, y: box.height - 12 } });
          await cards.getByRole('checkbox', { name: 'Moss' }).check();
          expect(await cards.getByRole('checkbox', { name: 'Fern' }).isChecked()).toBe(true);
          expect(await sidewaysScroll(page)).toBe(0);
        } else {
          // A gloved finger's target: the box's label is 44 px each way.
          // The list may draw again as its data settles: the box is measured once it stands still on the page.
          const label = page.locator('label', { has: page.getByRole('checkbox', { name: 'Choose Fern' }) });
          await expect.poll(async () => {
            const target = await label.boundingBox();
            return target ? Math.min(target.width, target.height) : 0;
          }).toBeGreaterThanOrEqual(44);
          await page.getByRole('checkbox', { name: 'Choose Fern' }).check();
          await page.getByRole('checkbox', { name: 'Choose Moss' }).check();
        }
        const bar = page.getByRole('region', { name: 'Chosen animals' });
        await bar.getByText('2 animals chosen').waitFor();
        await bar.getByRole('link', { name: 'Weigh these' }).click();

        await page.getByText('1 of 2').waitFor();
        const weighed: string[] = [];
        for (let i = 1; i <= 2; i++) {
          await page.getByText(`${i} of 2`).waitFor();
          weighed.push((await page.getByRole('heading', { level: 2 }).first().textContent())!.trim());
          const pad = page.getByLabel('Number pad');
          await pad.getByRole('button', { name: '4', exact: true }).click();
          await page.getByRole('button', { name: 'Next', exact: true }).click();
        }
        expect(weighed.sort()).toEqual(['Fern', 'Moss']);
        await page.getByRole('button', { name: 'Save 2 weights' }).click();
        await page.getByText('Saved 2 weigh-ins').waitFor();
        expect(errors).toEqual([]);
      } finally {
        await browser.close();
      }
    }

    // Typed 4 lb each time; 4 lb = 1,814.37 g (1 lb = 453.59237 g, NIST Handbook 44, App. C).
    const stored = await asTenant(coop.id, async (c) => (await c.query(
      `SELECT animal_id, total_grams, round_id FROM weigh_ins WHERE coop_id = $1`, [coop.id])).rows);
    expect(stored.filter((r) => r.animal_id === fern!.id).map((r) => r.total_grams)).toEqual([1814, 1814]);
    expect(stored.filter((r) => r.animal_id === moss!.id).map((r) => r.total_grams)).toEqual([1814, 1814]);
    expect(stored.some((r) => r.animal_id === reed!.id)).toBe(false);
    expect(new Set(stored.map((r) => r.round_id)).size).toBe(2);
  });
});
