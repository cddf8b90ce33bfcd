import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import type { AlmanacSummaryDto, DoeBoardDto } from '@burrowline/shared';
import { browserTestApp, collectPageErrors, openBrowser, sidewaysScroll } from '../support/browser';

// The demo co-op is loaded into the test cluster by `npm test`, as `npm start` loads it: Hazelrun's member
// keeps does at every stage (serviced, palpated, nursing, overdue, growing); one is past her kindling day.
const DEMO = { email: 'member@demo.test', password: 'burrowline-demo' };

const app = browserTestApp(DEMO.password);

/** The board as the API answers it, read with the browser's session, to check what the screen shows. */
async function boardOf(page: Page, query: string): Promise<DoeBoardDto> {
  return page.evaluate(async (q) => (await fetch(`/api/almanac/doe-board?${q}`)).json(), query) as Promise<DoeBoardDto>;
}

/** The names on the cards of the morning's round, top to bottom. */
async function cardNames(page: Page): Promise<string[]> {
  const round = page.getByRole('list', { name: "The farm's does and where each stands" });
  return round.getByRole('listitem').getByRole('link').allTextContents();
}

const nameOf = (d: { name: string; tattoo: string | null }) => (d.name && d.tattoo ? `${d.name} (${d.tattoo})` : d.name || d.tattoo || '');

describe('the doe board on a phone', () => {
  it('when a member opens the doe board, then each card shows a doe\'s state and next job, and the round sorts by what is due', async () => {
    const browser = await openBrowser({ width: 390, height: 844 });
    const errors = collectPageErrors(browser.page);
    const { page } = browser;
    try {
      await app.signIn(page, DEMO.email);
      // Commons' attention banner names the doe past her kindling day and links to her page.
      const summary = (await page.evaluate(async () => (await fetch('/api/almanac/summary')).json())) as AlmanacSummaryDto;
      const overdue = summary.attention.find((a) => a.kind === 'kindling_overdue');
      expect(overdue?.doe).toBeDefined();
      const doeLink = page.getByRole('link', { name: nameOf(overdue!.doe!), exact: true });
      await expect.poll(() => doeLink.isVisible()).toBe(true);
      expect(await doeLink.getAttribute('href')).toBe(`/herd/${overdue!.doe!.id}`);
      expect(overdue!.message).toContain('after service and no kits recorded: check her');

      // From Commons' Today card to the round.
      await page.getByRole('link', { name: "Doe board: the morning's round" }).click();
      await page.getByRole('heading', { name: 'Doe board', level: 1 }).waitFor();
      expect(await sidewaysScroll(page)).toBeLessThanOrEqual(0);

      const byDue = await boardOf(page, 'sort=due');
      expect(byDue.items.length).toBeGreaterThan(2);
      await expect.poll(() => cardNames(page)).toEqual(byDue.items.map(nameOf));

      // A doe's card: her state in words and her next job.
      const first = byDue.items[0]!;
      const card = page.getByRole('list', { name: "The farm's does and where each stands" }).getByRole('listitem').first();
      expect(await page.locator('table').isVisible()).toBe(false);
      expect(await card.getByText(first.cycle.label, { exact: true }).isVisible()).toBe(true);
      expect(await card.getByText(first.cycle.next!.label, { exact: true }).isVisible()).toBe(true);
      const nursing = byDue.items.find((d) => d.cycle.state === 'nursing');
      expect(nursing?.cycle.label).toMatch(/^Nursing \d+ kits?, day \d+$/);
      const round = page.getByRole('list', { name: "The farm's does and where each stands" });
      await expect.poll(() => round.getByText(nursing!.cycle.label, { exact: true }).isVisible()).toBe(true);

      // Sorting by name and back to what is due: the server's order each time, kept in the address.
      await page.getByRole('button', { name: 'Name', exact: true }).click();
      await page.waitForURL(/sort=name/);
      const byName = await boardOf(page, 'sort=name');
      expect(byName.items.map(nameOf)).not.toEqual(byDue.items.map(nameOf));
      await expect.poll(() => cardNames(page)).toEqual(byName.items.map(nameOf));
      await page.getByRole('button', { name: 'What is due', exact: true }).click();
      await page.waitForURL((url) => !url.search.includes('sort='));
      await expect.poll(() => cardNames(page)).toEqual(byDue.items.map(nameOf));
      // What is due comes first: the dates of the next jobs never go backwards down the round.
      const dates = byDue.items.map((d) => d.cycle.next?.on ?? '9999-12-31');
      expect([...dates].sort()).toEqual(dates);

      // The whole card opens the doe, whose page carries her breeding record.
      await card.click({ position: { x: 30, y: 70 } });
      await page.getByRole('heading', { name: first.name || first.tattoo!, level: 1 }).waitFor();
      await page.getByRole('region', { name: 'Breeding record' }).waitFor();
      expect(errors).toEqual([]);
    } finally {
      await browser.close();
    }
  });
});
