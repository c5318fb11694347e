/**
 * A buyer at the shortlist in the browser (issue 13): the demo fan (invented, ready, 500 boards per build)
 * gets hand-written supply data for its switch, so the figures follow from these rows alone: default
 * attrition 2 % (README "Configuration"), need = ceil(1 × 500 × 1.02) = 510; stock 200 + 0 = 200, short by
 * 310. The buyer prefers the reel source and leaves a note, sees the shortfall in words, downloads the CSV;
 * the fan's designer reads the note on the design page.
 */
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { launchBrowser, screenshotPath, watchErrors } from '../helpers/browser.ts';
import { signInContext } from '../helpers/session.ts';
import { appDb, appUrl } from '../helpers/stack.ts';
import { readCsvRecords } from '../../src/lib/csv.ts';

const knex = appDb();
let browser: Browser;
let fanId = 0;
let switchId = 0;
const NOTE = 'Reel only: the line feeds from reels';

beforeAll(async () => {
  browser = await launchBrowser();
  fanId = (await knex('designs').where({ name: 'BF-12 bench fan, 12 V, on/off from 3.3 V logic' }).first('id')).id;
  switchId = (await knex('design_parts').where({ design_id: fanId, role: 'switch', position: 0 }).first('part_id')).part_id;
  await knex('part_sources').where({ part_id: switchId }).del();
  const rows = [
    {
      distributor: 'Test Strip Supply',
      sku: 'TSS-1',
      moq: 1,
      order_multiple: 10,
      stock_qty: 200,
      lead_time_days: 5,
      currency: 'EUR',
      breaks: [[1, 0.4]],
    },
    {
      distributor: 'Test Reel House',
      sku: 'TRH-1',
      moq: 1000,
      order_multiple: 1000,
      stock_qty: 0,
      lead_time_days: 40,
      currency: 'USD',
      breaks: [[1000, 0.2]],
    },
  ];
  for (const { breaks, ...r } of rows) {
    const [id] = await knex('part_sources').insert({ part_id: switchId, ...r });
    await knex('part_price_breaks').insert(breaks.map(([qty, unit_price]) => ({ source_id: id, qty, unit_price })));
  }
});
afterAll(async () => {
  await browser?.close();
  await knex.destroy();
});

describe('a buyer at the shortlist for 500 boards', () => {
  it('prefers a source with a note, sees the shortfall in words and downloads the CSV; the designer reads the note', async () => {
    const context = await browser.newContext({ viewport: { width: 1500, height: 1100 }, acceptDownloads: true });
    await signInContext(context, 'buyer');
    const page = await context.newPage();
    const errors = watchErrors(page);
    await page.goto(`${appUrl()}/shortlist?boards-${fanId}=500`);
    const fan = page.locator(`section[data-design="${fanId}"]`);
    const switchRow = fan.locator('tr[data-line="switch"][data-option="0"]');
    // Without a preference the cheapest is bought (hand figures): the reel, 1000 × 0.20 USD × 0.915 = 183.00 EUR,
    // against the strip, 51 strips of 10 = 510 × 0.40 = 204.00 EUR. Stock is 200 + 0 = 200 either way.
    expect(await switchRow.getByTestId('line-source').innerText()).toBe('Test Reel House TRH-1');
    expect(await switchRow.getByTestId('line-stock').innerText()).toContain('✕ Short by 310: 200 in stock for 510 needed');

    await fan.getByText('Preferred sources and notes').click();
    const form = fan.getByTestId(`preference-switch-${switchId}`);
    await form.getByLabel('Buy from').selectOption({ label: 'Test Strip Supply TSS-1 (EUR)' });
    await form.getByLabel('Note for the designer').fill(NOTE);
    await Promise.all([page.waitForEvent('load'), form.getByRole('button', { name: 'Save' }).click()]);

    await switchRow.getByTestId('line-source').waitFor();
    expect(await switchRow.getByTestId('line-source').innerText()).toBe('Test Strip Supply TSS-1 · preferred by Bea Lindqvist');
    expect(await switchRow.getByTestId('line-note').innerText()).toContain(`Note from Bea Lindqvist: ${NOTE}`);
    expect(await switchRow.getByTestId('line-stock').innerText()).toContain('✕ Short by 310: 200 in stock for 510 needed');
    expect(await fan.getByTestId('shortlist-short').innerText()).toContain('✕ Short at 500 boards: Low-side switch');
    await fan.screenshot({ path: screenshotPath('shortlist-buyer-500') });

    const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('shortlist-csv').click()]);
    const records = readCsvRecords(readFileSync((await download.path())!, 'utf8')).map((r) => r.cells);
    const header = records[0];
    const rows = records.slice(1).map((c) => Object.fromEntries(header.map((h, i) => [h, c[i]])));
    const sw = rows.find(
      (r) => r.design_id === String(fanId) && r.row === 'line' && r.line === 'Low-side switch' && r.option === 'chosen',
    )!;
    // TSS-1 at 510: 51 strips of 10 = 510 × 0.40 = 204.00 EUR (hand figure).
    expect([sw.boards, sw.need, sw.sku, sw.preferred_by, sw.order_qty, sw.converted, sw.shortfall, sw.note]).toEqual([
      '500',
      '510',
      'TSS-1',
      'Bea Lindqvist',
      '510',
      '204.00',
      '310',
      NOTE,
    ]);
    expect(errors).toEqual([]);
    await context.close();

    const designer = await browser.newContext({ viewport: { width: 1400, height: 1000 } });
    await signInContext(designer, 'designer');
    const dpage = await designer.newPage();
    await dpage.goto(`${appUrl()}/designs/${fanId}`);
    const notes = dpage.getByTestId('design-buying-notes');
    expect(await notes.innerText()).toContain(NOTE);
    expect(await notes.innerText()).toContain('Test Strip Supply TSS-1');
    await designer.close();
  });
});
