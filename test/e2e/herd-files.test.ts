import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { randomUUID } from 'node:crypto';
import { afterAll, describe, expect, it } from 'vitest';
import { browserTestApp, collectPageErrors, openBrowser, sidewaysScroll } from '../support/browser';
import { csv, HEADER, pdfText, testImage } from '../support/herd-files';

// The demo co-op is loaded into the test cluster; member@demo.test keeps Hazelrun Rabbitry.
const DEMO = { member: 'member@demo.test', password: 'burrowline-demo' };

const app = browserTestApp(DEMO.password);
const work = fs.mkdtempSync(path.join(os.tmpdir(), 'burrowline-herd-files-'));
afterAll(() => {
  fs.rmSync(work, { recursive: true, force: true });
});

function herdFile(tag: string, sireOfKit: string) {
  return csv(
    `${HEADER},colour,weight_lb`,
    `${tag}-S,Quince ${tag},buck,New Zealand,2023-02-01,,,White,9.8`,
    `${tag}-D,Sorrel ${tag},doe,Californian,2023-03-01,,,Californian markings,9.1`,
    `${tag}-K,Linden ${tag},doe,cross,2024-04-10,${sireOfKit},${tag}-D,Broken white,`,
  );
}

describe('herd files: a member brings a herd in from a spreadsheet and takes it out again', () => {
  it('when the member imports a CSV with one bad row, fixes it, confirms, then exports the herd and downloads a pedigree, then every step works on the screen', async () => {
    const tag = `E${randomUUID().slice(0, 5).toUpperCase()}`;
    const browser = await openBrowser({ width: 1280, height: 900 });
    const errors = collectPageErrors(browser.page);
    const { page } = browser;
    try {
      await app.signIn(page, DEMO.member);
      await page.goto(`${app.url}/herd`);
      await page.getByRole('heading', { name: 'Herd', level: 1 }).waitFor();
      await page.getByRole('link', { name: 'Import' }).click();
      await page.getByRole('heading', { name: 'Import a herd spreadsheet', level: 1 }).waitFor();

      // A file whose kit names a sire that is neither in the file nor in the herd.
      const bad = path.join(work, 'herd-bad.csv');
      fs.writeFileSync(bad, herdFile(tag, `${tag}-X`));
      await page.getByLabel('Spreadsheet (CSV file)').setInputFiles(bad);
      await page.getByRole('button', { name: 'Upload and check' }).click();
      await page.getByText('1 row needs fixing').waitFor();
      const table = page.getByRole('table', { name: 'Rows of the file, with what importing would do' });
      await expect.poll(() => table.getByRole('row').count()).toBe(4);
      const badRow = table.getByRole('row').filter({ hasText: `${tag}-K` });
      expect(await badRow.innerText()).toMatch(/^4\s/);
      expect(await badRow.innerText()).toContain(`No animal with tattoo ${tag}-X in this file or in your herd`);
      expect(await page.getByRole('button', { name: 'Confirm import' }).isDisabled()).toBe(true);
      await page.screenshot({ path: '.data/e2e-import-preview-1280.png', fullPage: true });

      // The same screen on a phone: cards, no sideways scrolling.
      await page.setViewportSize({ width: 375, height: 800 });
      await page.getByRole('list', { name: 'Rows of the file' }).waitFor();
      expect(await sidewaysScroll(page)).toBeLessThanOrEqual(0);
      await page.screenshot({ path: '.data/e2e-import-preview-375.png', fullPage: true });
      await page.setViewportSize({ width: 1280, height: 900 });

      // Fixed: the kit's sire is the buck of the same file.
      const fixed = path.join(work, 'herd-fixed.csv');
      fs.writeFileSync(fixed, herdFile(tag, `${tag}-S`));
      await page.getByLabel('Choose the fixed file').setInputFiles(fixed);
      await page.getByRole('button', { name: 'Upload and check' }).click();
      await page.getByText('Confirming will add 3 animals and record 2 weigh-ins, in one step.').waitFor();
      await page.getByRole('button', { name: 'Confirm import' }).click();
      await page.getByText(`Imported herd-fixed.csv`).waitFor();
      await page.getByText('3 animals added, 0 animals updated, 2 weigh-ins recorded.', { exact: false }).waitFor();
      await page.screenshot({ path: '.data/e2e-import-done-1280.png', fullPage: true });

      // The herd shows them.
      await page.getByRole('link', { name: 'See the Herd' }).click();
      await page.getByRole('heading', { name: 'Herd', level: 1 }).waitFor();
      await page.getByLabel('Search').fill(tag);
      await page.waitForURL((url) => url.searchParams.get('search') === tag);
      await expect.poll(() => page.getByText('1–3 of 3 animals').isVisible(), { timeout: 10_000 }).toBe(true);
      expect(await page.getByRole('main').innerText()).toContain(`Linden ${tag}`);

      // Export CSV honours the table's search.
      const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Export CSV' }).click()]);
      expect(download.suggestedFilename()).toMatch(/^hazelrun-rabbitry-herd-\d{4}-\d{2}-\d{2}\.csv$/);
      const exported = fs.readFileSync((await download.path())!, 'utf8');
      const lines = exported.replace(/^\uFEFF/, '').trim().split(/\r\n/);
      expect(lines[0]).toBe('tattoo,name,sex,breed,born,sire,dam,colour,registration,hutch,bred_by,weight_lb,weighed,status,coi_percent,breed_makeup,age_class');
      expect(lines.slice(1).map((l) => l.split(',')[0]).sort()).toEqual([`${tag}-D`, `${tag}-K`, `${tag}-S`]);
      expect(lines.find((l) => l.startsWith(`${tag}-K,`))).toContain(`,${tag}-S,${tag}-D,`);

      // The kit's page: photos and its pedigree certificate.
      await page.getByRole('link', { name: `${tag}-K`, exact: true }).first().click();
      await page.getByRole('heading', { name: `Linden ${tag}`, level: 1 }).waitFor();
      const photo = path.join(work, 'linden.jpg');
      fs.writeFileSync(photo, await testImage('jpeg', { width: 1200, height: 900 }));
      await page.getByLabel('Caption (optional)').fill('Linden at weaning');
      await page.getByLabel('Add photos').setInputFiles(photo);
      await page.getByRole('button', { name: /Open full size/ }).first().waitFor();
      await expect.poll(() => page.getByRole('img', { name: 'Linden at weaning' }).evaluate((img: HTMLImageElement) => img.naturalWidth)).toBe(480);
      await page.getByRole('region', { name: 'Photos' }).screenshot({ path: '.data/e2e-animal-photos-1280.png' });

      const [pdf] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Pedigree PDF' }).click()]);
      expect(pdf.suggestedFilename()).toBe(`pedigree-${tag}-K-linden-${tag.toLowerCase()}.pdf`);
      const { text } = await pdfText(fs.readFileSync((await pdf.path())!));
      expect(text).toContain(`Linden ${tag}`);
      expect(text).toContain(`${tag}-S Quince ${tag}`);
      expect(text).toContain('Issued by Hazelrun Rabbitry');

      await page.setViewportSize({ width: 375, height: 800 });
      await page.getByRole('region', { name: 'Photos' }).scrollIntoViewIfNeeded();
      expect(await sidewaysScroll(page)).toBeLessThanOrEqual(0);
      await page.getByRole('region', { name: 'Photos' }).screenshot({ path: '.data/e2e-animal-photos-375.png' });
      await page.getByRole('button', { name: /Open full size/ }).first().click();
      await page.getByRole('dialog').waitFor();
      await page.screenshot({ path: '.data/e2e-photo-viewer-375.png' });
      expect(errors).toEqual([]);
    } finally {
      await browser.close();
    }
  });
});
