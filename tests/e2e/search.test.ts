/**
 * In Chromium: a buyer narrows MOSFETs by VGS(th) and RDS(on) at a gate drive, sees exactly the seed
 * parts that meet both bounds (plain filter over db/seeds/data here), shares the URL, sorts with the
 * keyboard, and opens a part.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { launchBrowser, screenshotPath } from '../helpers/browser.ts';
import { appUrl } from '../helpers/stack.ts';
import { signInContext } from '../helpers/session.ts';
import { demoMosfets } from '../../db/seeds/data/index.ts';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

/** VGS(th) max ≤ 1 V and RDS(on) ≤ 100 mΩ judged at the highest 25 °C line at or below 2.5 V; a buyer sees approved parts only (a designer also sees the pending parts they proposed). */
const expected = demoMosfets
  .filter((m) => m.reviewStatus === 'approved')
  .filter((m) => m.params.vgsThMaxV <= 1)
  .filter((m) => {
    const line = m.params.rdsOn.filter((r) => r.tjC === 25 && r.vgsV <= 2.5).sort((a, b) => b.vgsV - a.vgsV)[0];
    return line !== undefined && line.maxOhm <= 0.1;
  })
  .map((m) => m.mpn)
  .sort();

describe('search page', () => {
  it('narrows MOSFETs by VGS(th) and RDS(on) at 2.5 V, keeps the filter in the URL, and opens a part', async () => {
    expect(expected.length).toBeGreaterThan(1);
    const context = await browser.newContext({ acceptDownloads: true });
    await signInContext(context, 'buyer');
    const page = await context.newPage();
    const errors: string[] = [];
    page.on('console', (m) => m.type() === 'error' && errors.push(m.text()));
    page.on('pageerror', (e) => errors.push(e.message));

    await page.goto(`${appUrl()}/parts`);
    await page.waitForSelector('astro-island:not([ssr])'); // hydrated
    await page.getByRole('radio', { name: 'MOSFETs' }).check();
    await page.getByLabel('VGS(th) max at most').fill('1');
    await page.getByLabel('Gate drive VGS').fill('2.5');
    await page.getByLabel('RDS(on) at that drive at most').fill('100');
    await page.waitForFunction(() => /rdsOnMaxOhm=0\.1/.test(location.search) && /vgsThMaxV=1/.test(location.search));
    await page.waitForFunction((n) => {
      const rows = document.querySelectorAll('[data-testid="results-table"] tbody tr');
      return document.querySelector('[data-testid="result-count"]')?.textContent?.includes('match') && rows.length >= n;
    }, expected.length);
    const shown = await page
      .locator('[data-testid="results-table"] tbody tr')
      .evaluateAll((trs) => trs.map((tr) => tr.getAttribute('data-mpn')));
    const seed = new Set(demoMosfets.map((m) => m.mpn));
    expect(shown.filter((m) => seed.has(m!)).sort()).toEqual(expected);
    await page.screenshot({ path: screenshotPath('search-mosfets'), fullPage: false });

    // The URL alone reproduces the search.
    const shared = page.url();
    const second = await context.newPage();
    await second.goto(shared);
    await second.waitForSelector('astro-island:not([ssr])');
    await second.waitForSelector('[data-testid="results-table"] tbody tr');
    expect(await second.getByLabel('RDS(on) at that drive at most').inputValue()).toBe('100');
    await second.close();

    // Keyboard: sort by VGS(th) max with Enter on the header button.
    await page.getByRole('button', { name: /VGS\(th\) max/ }).focus();
    await page.keyboard.press('Enter');
    await page.waitForFunction(() => /sort=vgsThMaxV/.test(location.search));
    await page.waitForFunction(() => document.querySelector('th[aria-sort="ascending"]') !== null);

    await page.locator('[data-testid="part-link"]').first().click();
    await page.waitForSelector('[data-testid="part-page"]');
    const mpn = (await page.locator('[data-testid="part-mpn"]').textContent())?.trim();
    expect(expected).toContain(mpn);
    await expect(page.locator('[data-testid="rds-on"] tbody tr').count()).resolves.toBeGreaterThan(0);
    await expect(page.getByText('Parameters and test conditions').count()).resolves.toBe(1);
    expect(errors).toEqual([]);
    await context.close();
  });

  it('says so when nothing matches, and shows a refused bound next to its field', async () => {
    const context = await browser.newContext();
    await signInContext(context, 'designer');
    const page = await context.newPage();
    await page.goto(`${appUrl()}/parts?category=diode&vrrmMinV=100000`);
    await page.waitForSelector('[data-testid="search-empty"]');
    await page.goto(`${appUrl()}/parts?category=mosfet&rdsOnMaxOhm=0.05`);
    await page.waitForSelector('[data-testid="search-error"]');
    expect(await page.locator('[data-testid="search-error"]').textContent()).toContain('rdsOnAtVgsV');
    await context.close();
  });

  // Issue 14 item 5: on a phone the filters fold behind one button (collapsed, with the count of active
  // filters) so the results come first; on a laptop they stay open beside the results.
  it.each([
    [390, false],
    [1366, true],
  ])('at %i px the filters are open by default: %s', async (width, openByDefault) => {
    const context = await browser.newContext({ viewport: { width, height: 844 } });
    await signInContext(context, 'designer');
    const page = await context.newPage();
    // three filters in force (category, VGS(th) bound, lifecycle); the text search and the sort are not filters
    await page.goto(`${appUrl()}/parts?category=mosfet&vgsThMaxV=1&lifecycle=active&q=MQN&sort=mpn`);
    await page.waitForSelector('astro-island:not([ssr])');
    await page.waitForSelector('[data-testid="results-table"] tbody tr');
    const panel = page.getByTestId('filters-panel');
    const toggle = page.getByTestId('filters-toggle');
    await expect(panel.isVisible()).resolves.toBe(openByDefault);
    await expect(toggle.isVisible()).resolves.toBe(!openByDefault);
    await page.screenshot({ path: screenshotPath(`search-filters-${width}`), fullPage: false });
    if (!openByDefault) {
      await expect(toggle.getAttribute('aria-expanded')).resolves.toBe('false');
      await expect(page.getByTestId('filters-active').innerText()).resolves.toBe('3 active');
      // the first result row is on the first screen
      const firstRowTop = await page
        .locator('[data-testid="results-table"] tbody tr')
        .first()
        .evaluate((tr) => tr.getBoundingClientRect().top);
      expect(firstRowTop).toBeLessThan(844);
      // keyboard: focus the button, Enter opens the filters, the first category radio is reachable with Tab
      await toggle.focus();
      await page.keyboard.press('Enter');
      await expect(toggle.getAttribute('aria-expanded')).resolves.toBe('true');
      await panel.waitFor({ state: 'visible' });
      await expect(page.getByLabel('VGS(th) max at most').inputValue()).resolves.toBe('1');
      await page.screenshot({ path: screenshotPath(`search-filters-${width}-open`), fullPage: false });
      await page.keyboard.press('Space');
      await panel.waitFor({ state: 'hidden' });
    }
    await context.close();
  });
});
