/**
 * In Chromium: a librarian drops a datasheet PDF on a part (the dropzone's file input), sees it listed
 * with its page count, and downloads it back byte for byte. A sheet of another part is questioned
 * before it attaches, and "Attach anyway" is reached and pressed with the keyboard alone.
 */
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { PDFDocument, StandardFonts } from 'pdf-lib';
import { launchBrowser, screenshotPath } from '../helpers/browser.ts';
import { appDb, appUrl } from '../helpers/stack.ts';
import { signInContext } from '../helpers/session.ts';

let browser: Browser;
const knex = appDb();
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await knex.destroy();
});

async function makePdf(mpn = 'PLR1NT15-S5'): Promise<Buffer> {
  const doc = await PDFDocument.create();
  const font = await doc.embedFont(StandardFonts.Helvetica);
  for (const n of [1, 2])
    doc.addPage([595, 842]).drawText(`${mpn} invented browser-test datasheet, page ${n}, ${Date.now()}`, { x: 40, y: 790, size: 11, font });
  return Buffer.from(await doc.save());
}

describe('datasheet upload on the part page', () => {
  it('a librarian drops a PDF and downloads it back', async () => {
    const part = await knex('parts').where({ mpn: 'PLR1NT15-S5' }).first('id');
    const pdf = await makePdf();
    const context = await browser.newContext({ acceptDownloads: true });
    await signInContext(context, 'librarian');
    const page = await context.newPage();
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(e.message));
    page.on('console', (m) => m.type() === 'error' && errors.push(m.text()));
    await page.goto(`${appUrl()}/parts/${part.id}`);
    await page.waitForSelector('[data-testid="datasheets"]');
    await page.waitForSelector('astro-island:not([ssr]) [data-testid="datasheets"]'); // the upload island is hydrated
    await page.getByLabel('Revision label (optional)').fill('Rev. 2');
    await page
      .locator('[data-testid="datasheet-input"]')
      .setInputFiles({ name: 'PLR1NT15-S5 datasheet.pdf', mimeType: 'application/pdf', buffer: pdf });
    await page.waitForSelector('[data-testid="upload-done"]');
    const row = page.locator('[data-testid="datasheet-row"]', { hasText: 'PLR1NT15-S5 datasheet.pdf' });
    await expect(row.textContent()).resolves.toContain('rev. Rev. 2 · 2 pages');
    await page.screenshot({ path: screenshotPath('part-datasheet'), fullPage: false });

    const [download] = await Promise.all([page.waitForEvent('download'), row.getByRole('link').click()]);
    expect(download.suggestedFilename()).toBe('PLR1NT15-S5 datasheet.pdf');
    const saved = await download.path();
    expect(Buffer.compare(readFileSync(saved!), pdf)).toBe(0);

    // A text file renamed to .pdf is refused with a message, and the list does not grow.
    const before = await page.locator('[data-testid="datasheet-row"]').count();
    await page
      .locator('[data-testid="datasheet-input"]')
      .setInputFiles({ name: 'notes.pdf', mimeType: 'application/pdf', buffer: Buffer.from('plain text, not a PDF') });
    await page.waitForSelector('[data-testid="upload-error"]');
    expect(await page.locator('[data-testid="datasheet-row"]').count()).toBe(before);

    // Another part's sheet: the question names the missing part number; Tab reaches "Attach anyway", Enter attaches.
    await page
      .locator('[data-testid="datasheet-input"]')
      .setInputFiles({ name: 'other part.pdf', mimeType: 'application/pdf', buffer: await makePdf('ORS20-40-MA') });
    const question = page.getByTestId('datasheet-question');
    await question.waitFor();
    await expect(question.textContent()).resolves.toContain('the part number PLR1NT15-S5 does not occur on pages 1–2');
    expect(await page.evaluate(() => document.activeElement?.getAttribute('data-testid'))).toBe('datasheet-question');
    await page.screenshot({ path: screenshotPath('part-datasheet-question'), fullPage: false });
    await page.keyboard.press('Tab');
    expect(await page.evaluate(() => document.activeElement?.textContent)).toBe('Attach anyway');
    await page.keyboard.press('Enter');
    await page.waitForSelector('[data-testid="upload-done"]');
    await expect(page.getByTestId('upload-done').textContent()).resolves.toContain('confirmed by you');
    expect(await page.locator('[data-testid="datasheet-row"]').count()).toBe(before + 1);
    expect(errors.filter((e) => !/Failed to load resource/.test(e))).toEqual([]);
    await context.close();
  });
});
