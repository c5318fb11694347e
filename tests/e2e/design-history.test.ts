/**
 * In Chromium: a design page lists its revisions with who and when, links each revision's report, and
 * shows the changes between two chosen revisions (issue 14 item 3). The seeded "P-20 bench prototype"
 * moves in revision 2 from a USB 2.0 port to a 4 × AA NiMH pack and gives the controller its own supply
 * (db/seeds/designs.ts); the expected rows are written by hand from those seed values.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
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

describe('design revision history', () => {
  it('lists revisions with author and time, links each report, and diffs revision 1 against 2', async () => {
    const design = await knex('designs').where('name', 'like', 'P-20 bench prototype%').first('id');
    const context = await browser.newContext({ viewport: { width: 1366, height: 900 } });
    await signInContext(context, 'buyer');
    const page = await context.newPage();
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(e.message));
    await page.goto(`${appUrl()}/designs/${design.id}`);
    const revisions = page.getByTestId('revisions').locator('li');
    await expect(revisions.count()).resolves.toBe(2);
    const first = page.getByTestId('revisions').locator('li[data-revision="1"]');
    await expect(first.textContent()).resolves.toContain('Dana Okafor');
    await expect(first.textContent()).resolves.toMatch(/\d{4}-\d{2}-\d{2} \d{2}:\d{2} UTC/);
    const reportHref = await first.getByRole('link', { name: /Report/ }).getAttribute('href');
    expect(reportHref).toBe(`/api/designs/${design.id}/report.pdf?revision=1`);
    const report = await page.request.get(appUrl() + reportHref);
    expect(report.status()).toBe(200);
    expect(report.headers()['content-type']).toBe('application/pdf');

    // The compare form: revision 1 against revision 2 (the defaults for a two-revision design).
    await page.getByRole('button', { name: 'Show changes' }).click();
    await page.waitForURL(/from=1&to=2/);
    const diff = page.getByTestId('revision-diff');
    const row = async (field: string) => (await diff.locator(`tr[data-field="${field}"] td`).allTextContents()).map((t) => t.trim());
    expect(await row('supply.preset')).toEqual(['Supply preset', 'USB 2.0 port (bench prototype)', '4 × AA NiMH']);
    expect(await row('supply.minV')).toEqual(['Supply minimum', '4.75 V', '4 V']);
    expect(await row('supply.maxV')).toEqual(['Supply maximum', '5.25 V', '5.8 V']);
    expect(await row('supply.internalResistanceOhm')).toEqual(['Supply internal resistance', '0 Ω', '120 mΩ']);
    expect(await row('supply.currentLimitA')).toEqual(['Supply current limit', '0.5 A', 'none']);
    expect(await row('wiringResistanceOhm')).toEqual(['Wiring resistance', '150 mΩ', '50 mΩ']);
    expect(await row('logic.sharedSupply')).toEqual([
      'Controller fed from',
      'the motor supply (brown-out 3 V, regulator dropout 0.3 V)',
      'its own supply',
    ]);
    // unchanged fields are not listed
    expect(await diff.locator('tr[data-field="drive"]').count()).toBe(0);
    expect(await diff.locator('tr[data-field="ambientMaxC"]').count()).toBe(0);
    await diff.scrollIntoViewIfNeeded();
    await page.screenshot({ path: screenshotPath('design-history-1366'), fullPage: false });

    // A revision the design does not have is refused in words, with the ones it has.
    await page.goto(`${appUrl()}/designs/${design.id}?from=1&to=9`);
    await expect(page.getByTestId('design-history').getByRole('alert').textContent()).resolves.toContain('revisions 1, 2');
    expect(errors).toEqual([]);
    await context.close();
  });
});
