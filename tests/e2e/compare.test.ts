/**
 * In Chromium: compare opened from the design workspace (issue 14 item 2). On the demo AG-3 agitator the
 * designer ticks two switch rows, presses Compare and reads every check as a row, one column per part,
 * each cell with its verdict in words; the verdicts equal the ones the workspace list shows for the same
 * rows (the list's data-verdict). The table sits in a focusable named region that scrolls at 390 px; axe
 * finds no serious or critical violation. Screenshots at 1366 and 390 px.
 */
import { createRequire } from 'node:module';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { launchBrowser, screenshotPath } from '../helpers/browser.ts';
import { appDb, appUrl } from '../helpers/stack.ts';
import { signInContext } from '../helpers/session.ts';

const AXE_PATH = createRequire(import.meta.url).resolve('axe-core/axe.min.js');
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

describe('compare from the workspace', () => {
  it('ticks two switches, opens Compare and shows every check per part with the list’s verdicts', async () => {
    const design = await knex('designs').where({ name: AG3 }).first('id');
    // bypassCSP: the app's CSP (rightly) refuses the injected axe script.
    const context = await browser.newContext({ viewport: { width: 1366, height: 900 }, bypassCSP: true });
    await signInContext(context, 'designer');
    const page = await context.newPage();
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(e.message));
    await page.goto(`${appUrl()}/designs/${design.id}`);
    const table = page.getByTestId('candidates-switch');
    await table.locator('tr[data-mpn]').first().waitFor();
    const rows = table.locator('tr[data-mpn]');
    const picked: { mpn: string; verdict: string }[] = [];
    for (const i of [0, 1]) {
      const row = rows.nth(i);
      picked.push({ mpn: (await row.getAttribute('data-mpn'))!, verdict: (await row.getAttribute('data-verdict'))! });
      await row.getByRole('checkbox', { name: `Compare ${picked[i].mpn}` }).check();
    }
    const link = page.getByTestId('compare-switch');
    await expect(link.textContent()).resolves.toContain('Compare 2 side by side');
    await link.click();
    await page.waitForURL(/\/compare\?role=switch&ids=\d+,\d+/);

    const region = page.getByRole('region', { name: /Comparison of 2 switches/ });
    await expect(region.getAttribute('tabindex')).resolves.toBe('0');
    const head = (await page.getByTestId('compare-table').locator('thead th[data-part]').allTextContents()).map((t) => t.trim());
    expect(head.map((h) => picked.find((p) => h.startsWith(p.mpn))?.mpn)).toEqual(picked.map((p) => p.mpn));
    // The overall verdicts equal the workspace list's, in words (never colour alone).
    const verdictCells = page.locator('tr[data-row="verdict"] td');
    const WORD: Record<string, string> = { pass: 'Pass', marginal: 'Marginal', fail: 'Fail' };
    for (const [i, p] of picked.entries()) {
      await expect(verdictCells.nth(i).getAttribute('data-verdict')).resolves.toBe(p.verdict);
      await expect(verdictCells.nth(i).textContent()).resolves.toContain(WORD[p.verdict]);
    }
    // Checks as rows with readable names; the drain-voltage row shows volts and its limit.
    const drain = page.locator('tr[data-check="drain-voltage"]');
    await expect(drain.locator('th').textContent()).resolves.toContain('Drain voltage rating');
    const drainText = ((await drain.locator('td').first().textContent()) ?? '').replace(/\s+/g, ' ');
    expect(drainText).toMatch(/\d V · needs ≤ \d+(\.\d+)? V/);
    // Every cell that does not hold says why.
    const notHolding = page.locator('tbody td[data-verdict="fail"], tbody td[data-verdict="marginal"]');
    const count = await notHolding.count();
    for (let i = 0; i < count; i++) {
      const cell = notHolding.nth(i);
      if ((await cell.locator('[data-testid="cell-reason"]').count()) === 0) {
        // The overall verdict row carries the part's verdict, not a check's reason.
        await expect(cell.evaluate((td) => td.parentElement?.getAttribute('data-row'))).resolves.toBe('verdict');
      }
    }
    await page.screenshot({ path: screenshotPath('compare-1366'), fullPage: true });
    const width1366 = await page.evaluate(() => document.documentElement.scrollWidth);
    expect(width1366).toBeLessThanOrEqual(1366);

    await page.addScriptTag({ path: AXE_PATH });
    const serious = await page.evaluate(async () => {
      const axe = (
        window as unknown as { axe: { run: (ctx: Document, o: object) => Promise<{ violations: { id: string; impact: string }[] }> } }
      ).axe;
      const r = await axe.run(document, { runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'] } });
      return r.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical').map((v) => v.id);
    });
    expect(serious).toEqual([]);

    // At 390 px the page does not overflow; the table scrolls inside its region.
    await page.setViewportSize({ width: 390, height: 844 });
    const pageWidth = await page.evaluate(() => document.documentElement.scrollWidth);
    expect(pageWidth).toBeLessThanOrEqual(390);
    const scrolls = await region.evaluate((el) => el.scrollWidth > el.clientWidth);
    expect(scrolls).toBe(true);
    await page.screenshot({ path: screenshotPath('compare-390'), fullPage: true });
    expect(errors).toEqual([]);
    await context.close();
  });

  it('a list with nothing passing shows the closest candidates and what they miss', async () => {
    const design = await knex('designs').where({ name: AG3 }).first('id');
    const context = await browser.newContext({ viewport: { width: 1366, height: 900 } });
    await signInContext(context, 'designer');
    const page = await context.newPage();
    await page.goto(`${appUrl()}/designs/${design.id}`);
    await page.getByTestId('candidates-diode').locator('tr[data-mpn]').first().waitFor();
    await expect(page.getByTestId('near-miss-diode').count()).resolves.toBe(0);
    // 150 °C ambient: no diode keeps its junction under Tj max less the margin (the API test shows the same list).
    await page.getByLabel('Ambient max').fill('150');
    const note = page.getByTestId('near-miss-diode');
    await note.waitFor();
    await expect(note.textContent()).resolves.toContain('Nothing passes');
    const first = (await note.locator('li').first().textContent()) ?? '';
    expect(first).toMatch(/^closest: \S+ — .+(needs [≤≥] |: )/);
    await note.scrollIntoViewIfNeeded();
    await page.screenshot({ path: screenshotPath('workspace-near-miss-1366'), fullPage: false });
    await context.close();
  });
});
