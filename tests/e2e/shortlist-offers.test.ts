/**
 * A buyer reads the cached distributor figures on the shortlist in the browser at 1366 px (issue 13):
 * the demo fan (ready, 500 boards) gets two offers written straight into the offers cache, so the words
 * follow from these rows alone. Default attrition 2 % (README "Configuration"): need = ceil(500 × 1.02) =
 * 510; at MOQ 10 the order is 510, at the 100 break 510 × 0.25 = 127.50 EUR; 300 in stock is 210 short
 * (common practice: highest break at or below the order). Ages through the coarse formatter steps.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { launchBrowser, screenshotPath } from '../helpers/browser.ts';
import { signInContext } from '../helpers/session.ts';
import { appDb, appUrl } from '../helpers/stack.ts';

const knex = appDb();
let browser: Browser;
let fanId = 0;
const part: Record<string, number> = {};
const MIN = 60_000;

beforeAll(async () => {
  browser = await launchBrowser();
  fanId = (await knex('designs').where({ name: 'BF-12 bench fan, 12 V, on/off from 3.3 V logic' }).first('id')).id;
  const picks: { role: string; part_id: number }[] = await knex('design_parts').where({ design_id: fanId, position: 0 });
  for (const p of picks) part[p.role] = p.part_id;
  const now = Date.now();
  const base = { mpn: 'as-cached', distributor: 'Marlpit Components', currency: 'EUR' };
  await knex('distributor_offers').del();
  await knex('distributor_offers').insert([
    {
      ...base,
      part_id: part.switch,
      sku: 'MPC-T1',
      stock_qty: 300,
      moq: 10,
      price_breaks: JSON.stringify([
        { qty: 1, unitPrice: 0.31 },
        { qty: 100, unitPrice: 0.25 },
      ]),
      lead_time_days: 2,
      // 3 h 5 min ago: "fetched 3 h ago".
      fetched_at: new Date(now - 185 * MIN),
      checked_at: new Date(now - 185 * MIN),
      last_error: null,
    },
    {
      ...base,
      part_id: part.diode,
      sku: 'MPC-T2',
      stock_qty: 5000,
      moq: 1,
      price_breaks: JSON.stringify([{ qty: 1, unitPrice: 0.12 }]),
      lead_time_days: 5,
      // Fetched 26 h 5 min ago, last attempt failed 12 min 20 s ago.
      fetched_at: new Date(now - 1565 * MIN),
      checked_at: new Date(now - 12 * MIN - 20_000),
      last_error: 'no answer within 3000 ms (4 attempts)',
    },
  ]);
});
afterAll(async () => {
  await browser?.close();
  await knex.destroy();
});

describe('a buyer reads the cached distributor figures on the shortlist', () => {
  it('sees stock, price at the need, lead time and the age, and the failed fetch said in words, on screen and in print', async () => {
    const context = await browser.newContext({ viewport: { width: 1366, height: 900 } });
    await signInContext(context, 'buyer');
    const page = await context.newPage();
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(e.message));
    await page.goto(`${appUrl()}/shortlist`);
    const fan = page.locator(`section[data-design="${fanId}"]`);
    const offer = (key: string) => fan.locator(`tr[data-line="${key}"][data-option="0"]`).getByTestId('line-offer');

    const sw = offer('switch');
    expect(await sw.innerText()).toContain('Marlpit Components MPC-T1');
    expect(await sw.getByTestId('line-offer-age').innerText()).toBe('· fetched 3 h ago');
    expect(await sw.innerText()).toContain('✕ 300 in stock, short by 210 · 0.2500 EUR at 100+ (127.50 EUR for 510) · lead 2 d · MOQ 10');
    expect(await sw.getByTestId('line-offer-warning').count()).toBe(0);

    const diode = offer('diode');
    expect(await diode.innerText()).toContain('✓ 5,000 in stock · 0.1200 EUR at 1+ (61.20 EUR for 510) · lead 5 d'); // 510 × 0.12
    expect(await diode.getByTestId('line-offer-warning').innerText()).toBe(
      '⚠ Last fetch failed 12 min ago (no answer within 3000 ms (4 attempts)); the figure fetched 26 h ago is kept.',
    );
    expect(await fan.locator('tr[data-line="motor"]').getByTestId('line-offer-none').innerText()).toBe('— none cached');

    await sw.scrollIntoViewIfNeeded();
    await fan.screenshot({ path: screenshotPath('shortlist-offers-1366') });
    // Printed: an A4 landscape sheet less 10 mm margins is 277 mm = 277 / 25.4 × 96 ≈ 1047 CSS px wide (CSS: 96 px per inch).
    await page.setViewportSize({ width: 1047, height: 900 });
    await page.emulateMedia({ media: 'print' });
    expect(await sw.isVisible()).toBe(true);
    expect(await fan.getByTestId('build-quantity-form').isVisible()).toBe(false); // print drops the forms
    const fit = await fan.evaluate((el) => {
      const table = el.querySelector('table')!.getBoundingClientRect();
      return { tableRight: table.right, pageWidth: document.documentElement.clientWidth };
    });
    expect(fit.tableRight).toBeLessThanOrEqual(fit.pageWidth); // the whole table on the sheet, the figure column included
    await page.screenshot({ path: screenshotPath('shortlist-offers-print'), fullPage: true });
    expect(errors).toEqual([]);
    await context.close();
  });
});
