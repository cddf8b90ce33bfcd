import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { collectPageErrors, openBrowser } from '../support/browser';
import { listeningServer, signedInAgent } from '../support/test-app';

// The demo co-op is loaded into the test cluster by `npm test`, as `npm start` loads it.
const DEMO = { email: 'member@demo.test', password: 'burrowline-demo', farm: 'Hazelrun Rabbitry' };

let server: Awaited<ReturnType<typeof listeningServer>>;
beforeAll(async () => {
  server = await listeningServer();
});
afterAll(async () => {
  // Leave the demo farm in pounds, as other browser tests expect it.
  const agent = await signedInAgent(DEMO.email, DEMO.password, server.handle);
  const me = (await agent.get('/api/me')).body;
  const farm = (await agent.get(`/api/farms/${me.user.farmId}`)).body;
  await agent.patch(`/api/farms/${farm.id}`).send({
    name: farm.name, location: farm.location, timeZone: farm.timeZone, weightUnit: 'lb_oz', temperatureUnit: farm.temperatureUnit,
    breedsKept: farm.breedsKept, description: farm.description, version: farm.version,
  });
  await server.close();
});

describe.each([
  { label: 'desktop', width: 1280, height: 900 },
  { label: 'phone', width: 360, height: 780 },
])('the demo member on $label', ({ label, width, height }) => {
  it('when she signs in, then Commons shows her farm and the directory, and her profile edit shows at once', async () => {
    const browser = await openBrowser({ width, height });
    const errors = collectPageErrors(browser.page);
    const { page } = browser;
    try {
      await page.goto(`${server.url}/`);
      await page.waitForURL(/\/sign-in/);
      await page.getByLabel('E-mail').fill(DEMO.email);
      await page.getByLabel('Password').fill(DEMO.password);
      await page.getByRole('button', { name: 'Sign in' }).click();

      await page.getByRole('heading', { name: 'Commons', level: 1 }).waitFor();
      await expect.poll(() => page.getByText(DEMO.farm).first().isVisible()).toBe(true);
      const directory = page.getByRole('list', { name: 'Members directory' });
      // The five demo farms (other browser tests may admit more).
      await expect.poll(() => directory.getByRole('listitem').count()).toBeGreaterThanOrEqual(5);
      for (const farm of ['Quillfeather Farm', 'Hazelrun Rabbitry', 'Cobble Creek Homestead', 'Wrenfield Acres', 'Saltbush Meadow']) {
        expect(await directory.getByRole('heading', { name: farm }).count()).toBe(1);
      }

      // No horizontal scrolling at phone width.
      const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
      expect(overflow).toBeLessThanOrEqual(0);

      await page.getByRole('link', { name: 'Edit profile' }).first().click();
      await page.getByRole('heading', { name: 'Edit farm profile' }).waitFor();
      const location = `Hazelrun Road, north barn (${label})`;
      await page.getByLabel('Location').fill(location);
      await page.getByLabel('Weight units').selectOption('kg_g');
      await page.getByRole('button', { name: 'Save profile' }).click();

      await page.getByRole('heading', { name: DEMO.farm, level: 1 }).waitFor();
      await expect.poll(() => page.getByText(location).first().isVisible()).toBe(true);
      await expect.poll(() => page.getByText('Kilograms and grams').isVisible()).toBe(true);

      await page.getByRole('link', { name: 'Commons', exact: true }).click();
      await expect.poll(() => directory.getByText(location).isVisible()).toBe(true);
      await page.screenshot({ path: `.data/e2e-commons-${label}.png`, fullPage: true });
      expect(errors).toEqual([]);
    } finally {
      await browser.close();
    }
  });
});

describe('two people at once', () => {
  it('when one member edits her farm, then another member\'s open Commons updates without a reload', async () => {
    const editor = await openBrowser();
    const watcher = await openBrowser();
    try {
      for (const [browser, email] of [[editor, DEMO.email], [watcher, 'priya@demo.test']] as const) {
        await browser.page.goto(`${server.url}/sign-in`);
        await browser.page.getByLabel('E-mail').fill(email);
        await browser.page.getByLabel('Password').fill(DEMO.password);
        await browser.page.getByRole('button', { name: 'Sign in' }).click();
        await browser.page.getByRole('heading', { name: 'Commons', level: 1 }).waitFor();
      }
      await editor.page.getByRole('link', { name: 'Edit profile' }).first().click();
      const location = `Live edit ${Date.now()}`;
      await editor.page.getByLabel('Location').fill(location);
      await editor.page.getByRole('button', { name: 'Save profile' }).click();
      const directory = watcher.page.getByRole('list', { name: 'Members directory' });
      await expect.poll(() => directory.getByText(location).isVisible(), { timeout: 10_000 }).toBe(true);
    } finally {
      await editor.close();
      await watcher.close();
    }
  });
});

describe('the top bar on wide screens', () => {
  it('when the admin (six areas) reads Commons at 1024, 1280 and 1440 px, then no area, the co-op name or sign-out overlap, and nothing scrolls sideways', async () => {
    const browser = await openBrowser({ width: 1024, height: 800 });
    const { page } = browser;
    try {
      await page.goto(`${server.url}/sign-in`);
      await page.getByLabel('E-mail').fill('admin@demo.test');
      await page.getByLabel('Password').fill(DEMO.password);
      await page.getByRole('button', { name: 'Sign in' }).click();
      await page.getByRole('heading', { name: 'Commons', level: 1 }).waitFor();
      for (const width of [1024, 1280, 1440]) {
        await page.setViewportSize({ width, height: 800 });
        const boxes = await page.evaluate(() => {
          const header = document.querySelector('header')!;
          const pieces = [...header.querySelectorAll('nav a'), ...header.querySelectorAll('a[href="/"] > span'), ...header.querySelectorAll('button')];
          return pieces.map((el) => {
            const r = el.getBoundingClientRect();
            return { name: (el.textContent ?? '').trim(), left: r.left, right: r.right, top: r.top, bottom: r.bottom };
          });
        });
        expect(boxes.map((b) => b.name), `${width}`).toEqual(expect.arrayContaining(['Commons', 'Herd', 'Almanac', 'Grow-out', 'My farm', 'Sign out']));
        expect(boxes.some((b) => b.name.startsWith('Admin')), `${width}`).toBe(true);
        for (const [i, a] of boxes.entries()) {
          expect(a.right, `${a.name} inside the window at ${width}`).toBeLessThanOrEqual(width);
          for (const b of boxes.slice(i + 1)) {
            const overlap = a.left < b.right - 1 && b.left < a.right - 1 && a.top < b.bottom - 1 && b.top < a.bottom - 1;
            expect(overlap, `${a.name} and ${b.name} at ${width}`).toBe(false);
          }
        }
        const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
        expect(overflow, `${width}`).toBeLessThanOrEqual(0);
      }
    } finally {
      await browser.close();
    }
  });
});
