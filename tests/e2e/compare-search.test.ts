/**
 * In Chromium: compare from the catalogue search against a chosen design, and the near-miss hint of a
 * search with nothing found (issue 14 item 2). The URL carries the filter (the search page's rule), so
 * the test opens filtered searches directly. Expected values from the seed data file.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { launchBrowser, screenshotPath } from '../helpers/browser.ts';
import { appDb, appUrl } from '../helpers/stack.ts';
import { signInContext } from '../helpers/session.ts';
import { demoDiodes } from '../../db/seeds/data/diodes.ts';

const AG3 = 'AG-3 agitator, 24 V, 1.8 V logic through a gate driver';
let browser: Browser;
const knex = appDb();
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await knex.destroy();
});

describe('compare from search', () => {
  it('ticks two diodes in the search, chooses the AG-3 design and opens its comparison', async () => {
    const design = await knex('designs').where({ name: AG3 }).first('id');
    const context = await browser.newContext({ viewport: { width: 1366, height: 900 } });
    await signInContext(context, 'designer');
    const page = await context.newPage();
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(e.message));
    await page.goto(`${appUrl()}/parts?category=diode&vrrmMinV=40`);
    const rows = page.locator('[data-testid="results-table"] tbody tr');
    await rows.first().waitFor();
    const mpns: string[] = [];
    for (const i of [0, 1]) {
      const mpn = (await rows.nth(i).getAttribute('data-mpn'))!;
      mpns.push(mpn);
      await rows
        .nth(i)
        .getByRole('checkbox', { name: `Compare ${mpn}` })
        .check();
    }
    const select = page.getByTestId('compare-design');
    await expect.poll(async () => select.locator(`option[value="${design.id}"]`).count()).toBe(1);
    await select.selectOption(String(design.id));
    await page.getByTestId('search-compare-link').click();
    await page.waitForURL(new RegExp(`/designs/${design.id}/compare\\?role=diode&ids=\\d+,\\d+`));
    const heads = await page.getByTestId('compare-table').locator('thead th[data-part] a').allTextContents();
    expect(heads.map((h) => h.trim())).toEqual(mpns);
    await expect(page.locator('tr[data-check="reverse-voltage"] th').textContent()).resolves.toContain('Reverse voltage');
    expect(errors).toEqual([]);
    await context.close();
  });

  it('a search with nothing found names the closest parts and what they miss', async () => {
    const best = Math.max(
      ...demoDiodes.filter((d) => d.params.kind === 'schottky' && d.reviewStatus === 'approved').map((d) => d.params.vrrmV),
    );
    const context = await browser.newContext({ viewport: { width: 390, height: 844 } });
    await signInContext(context, 'designer');
    const page = await context.newPage();
    await page.goto(`${appUrl()}/parts?category=diode&kind=schottky&vrrmMinV=150`);
    const hint = page.getByTestId('search-near-miss');
    await hint.waitFor();
    await expect(hint.locator('li').first().textContent()).resolves.toContain(`VRRM ${best} V, needs ≥ 150 V`);
    await page.screenshot({ path: screenshotPath('search-near-miss-390'), fullPage: false });
    await context.close();
  });
});
