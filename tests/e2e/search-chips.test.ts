/**
 * In Chromium: a buyer types "schottky 40 V" and presses Enter; the units become filter chips
 * (Diodes, Schottky, VRRM ≥ 40 V), the text box empties, the address bar carries the API filters, and
 * the table shows the approved seed Schottky diodes with VRRM ≥ 40 V (hand list from
 * db/seeds/data/diodes.ts). Removing the VRRM chip with Enter, the Schottky chip with a click and the
 * Diodes chip with Space widens the list each time.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { launchBrowser, screenshotPath } from '../helpers/browser.ts';
import { appUrl } from '../helpers/stack.ts';
import { signInContext } from '../helpers/session.ts';
import { demoDiodes } from '../../db/seeds/data/index.ts';

/** Hand list from db/seeds/data/diodes.ts: approved Schottky diodes with VRRM 40, 40, 40, 60, 100, 100 V. */
const SCHOTTKY_40V = ['ORS10-100-MA', 'ORS10-40-D123', 'ORS20-40-MA', 'ORS20-60-MA', 'ORS30-100-MB', 'ORS30-40-MB'];
/** Hand list: the approved Schottky diodes below 40 V (30 V and 20 V). */
const SCHOTTKY_BELOW_40V = ['ORS05-30-D323', 'ORS10-20-D123'];
/** Hand list: an approved ultrafast diode, which only shows once the Schottky chip is gone. */
const ULTRAFAST = 'ORU10-200-MA';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

const seed = new Set(demoDiodes.map((d) => d.mpn));

async function shownSeedMpns(page: Page): Promise<string[]> {
  const mpns = await page
    .locator('[data-testid="results-table"] tbody tr')
    .evaluateAll((trs) => trs.map((tr) => tr.getAttribute('data-mpn') ?? ''));
  return mpns.filter((m) => seed.has(m)).sort();
}

async function chipLabels(page: Page): Promise<string[]> {
  return page.getByTestId('filter-chip').evaluateAll((bs) => bs.map((b) => b.getAttribute('aria-label') ?? ''));
}

describe('unit queries as filter chips', () => {
  it('"schottky 40 V" + Enter becomes chips and filters; chips come off by keyboard and by click', async () => {
    const context = await browser.newContext();
    await signInContext(context, 'buyer');
    const page = await context.newPage();
    const errors: string[] = [];
    page.on('console', (m) => m.type() === 'error' && errors.push(m.text()));
    page.on('pageerror', (e) => errors.push(e.message));

    await page.goto(`${appUrl()}/parts`);
    await page.waitForSelector('astro-island:not([ssr])');
    const box = page.getByTestId('search-text');
    await box.fill('schottky 40 V');
    await expect(page.getByTestId('units-hint').innerText()).resolves.toContain('VRRM ≥ 40 V');
    await box.press('Enter');

    await page.waitForFunction(() => /vrrmMinV=40/.test(location.search) && /kind=schottky/.test(location.search));
    expect(new URL(page.url()).searchParams.get('q')).toBeNull();
    await expect(box.inputValue()).resolves.toBe('');
    await page.waitForFunction(() => !document.querySelector('[data-testid="result-count"]')?.textContent?.includes('Searching'));
    expect(await chipLabels(page)).toEqual(['Remove filter Diodes', 'Remove filter Schottky', 'Remove filter VRRM ≥ 40 V']);
    expect(await shownSeedMpns(page)).toEqual(SCHOTTKY_40V);
    await page.screenshot({ path: screenshotPath('search-chips'), fullPage: false });

    // The shared address shows the same chips and rows.
    const second = await context.newPage();
    await second.goto(page.url());
    await second.waitForSelector('[data-testid="results-table"] tbody tr');
    expect(await chipLabels(second)).toEqual(await chipLabels(page));
    expect(await shownSeedMpns(second)).toEqual(SCHOTTKY_40V);
    await second.close();

    // Keyboard: focus the VRRM chip, Enter removes it.
    await page.getByRole('button', { name: 'Remove filter VRRM ≥ 40 V' }).focus();
    await page.keyboard.press('Enter');
    await page.waitForFunction(() => !/vrrmMinV/.test(location.search) && /kind=schottky/.test(location.search));
    await page.waitForFunction((n) => document.querySelectorAll('[data-testid="results-table"] tbody tr').length >= n, 8);
    expect(await chipLabels(page)).toEqual(['Remove filter Diodes', 'Remove filter Schottky']);
    expect(await shownSeedMpns(page)).toEqual([...SCHOTTKY_40V, ...SCHOTTKY_BELOW_40V].sort());

    // Click: the Schottky chip goes, other diode kinds appear.
    await page.getByRole('button', { name: 'Remove filter Schottky' }).click();
    await page.waitForFunction(() => !/kind=/.test(location.search));
    await page.waitForSelector(`[data-mpn="${ULTRAFAST}"]`);
    expect(await chipLabels(page)).toEqual(['Remove filter Diodes']);

    // The last chip, with Space: no filter left, the address bar is bare, focus is back in the search box.
    await page.getByRole('button', { name: 'Remove filter Diodes' }).focus();
    await page.keyboard.press('Space');
    await page.waitForFunction(() => location.search === '');
    await expect(page.getByTestId('filter-chip').count()).resolves.toBe(0);
    await expect(page.evaluate(() => document.activeElement?.getAttribute('data-testid'))).resolves.toBe('search-text');
    expect(errors).toEqual([]);
    await context.close();
  });

  it('a part number with digits stays text: no chip, the part is found', async () => {
    const context = await browser.newContext();
    await signInContext(context, 'buyer');
    const page = await context.newPage();
    await page.goto(`${appUrl()}/parts`);
    await page.waitForSelector('astro-island:not([ssr])');
    await page.getByTestId('search-text').fill('ORS10-40-D123');
    await page.waitForFunction(() => new URLSearchParams(location.search).get('q') === 'ORS10-40-D123');
    await page.waitForSelector('[data-mpn="ORS10-40-D123"]');
    await expect(page.getByTestId('filter-chip').count()).resolves.toBe(0);
    await expect(page.getByTestId('units-hint').count()).resolves.toBe(0);
    await context.close();
  });
});
