/**
 * In Chromium: a buyer opens a part's supply data form, is stopped at the field by a zero price (the shared
 * schema, before any request), changes a stock figure and a price break with the keyboard, saves, and reads
 * the change in the part's history in words. The expected history line is written by hand.
 * The part, its distributor and SKU are invented.
 */
import { createRequire } from 'node:module';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import request from 'supertest';
import { launchBrowser, screenshotPath } from '../helpers/browser.ts';
import { appDb, appUrl } from '../helpers/stack.ts';
import { sessionCookie, signInContext } from '../helpers/session.ts';

const AXE_PATH = createRequire(import.meta.url).resolve('axe-core/axe.min.js');

let browser: Browser;
const knex = appDb();
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await knex.destroy();
});

async function freshPart(): Promise<number> {
  const res = await request(appUrl())
    .post('/api/parts')
    .set('Cookie', await sessionCookie('librarian'))
    .set('Content-Type', 'application/json')
    .send(
      JSON.stringify({
        category: 'diode',
        manufacturer: 'Ostler Rectifier Works',
        mpn: `ORS60-E2E-T${Date.now().toString(36)}`,
        description: 'Test Schottky diode for the supply form in the browser',
        package: 'SMA',
        reviewStatus: 'approved',
        params: { kind: 'schottky', vrrmV: 60, ifAvA: 1, ifsmA: 30, vfV: 0.55, vfAtIfA: 1, trrNs: null },
        sources: [
          {
            distributor: 'Fenwick Row Electronics',
            sku: 'FRE-E2E',
            moq: 1,
            orderMultiple: 1,
            leadTimeDays: 7,
            stockQty: 200,
            currency: 'EUR',
            priceBreaks: [
              { qty: 1, unitPrice: 0.4 },
              { qty: 100, unitPrice: 0.25 },
            ],
          },
        ],
      }),
    );
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.id as number;
}

describe('supply data form on the part page', () => {
  it('a buyer changes a stock figure and a price break and sees the history line', async () => {
    const id = await freshPart();
    const context = await browser.newContext({ viewport: { width: 1280, height: 1600 } });
    await signInContext(context, 'buyer');
    const page = await context.newPage();
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(e.message));
    page.on('console', (m) => m.type() === 'error' && errors.push(m.text()));
    const writes: string[] = [];
    page.on('request', (r) => r.method() === 'PUT' && writes.push(r.url()));
    await page.goto(`${appUrl()}/parts/${id}`);

    await page.getByText('Edit supply data').click();
    await page.waitForSelector('astro-island:not([ssr]) [data-testid="supply-editor"]');
    const stock = page.locator('input[name="sources.0.stockQty"]');
    const price = page.locator('input[name="sources.0.priceBreaks.1.unitPrice"]');

    // A zero price is stopped at its field by the shared schema; nothing is sent.
    await price.fill('0');
    await price.press('Enter');
    await page.getByTestId('supply-error').waitFor();
    expect(await price.getAttribute('aria-invalid')).toBe('true');
    expect(await page.locator('#sources\\.0\\.priceBreaks\\.1\\.unitPrice-error').textContent()).toContain('Unit price must be');
    expect(writes).toEqual([]);

    // Typed with the keyboard into the focused fields; Enter in a field saves the form.
    await stock.focus();
    await page.keyboard.press('Control+A');
    await page.keyboard.type('1240');
    await price.focus();
    await page.keyboard.press('Control+A');
    await page.keyboard.type('0.22');
    expect(await page.locator('[data-testid="supply-break-0-1"]').textContent()).toContain('100+ at 0.2200 EUR');
    // The fixed price loses its refusal as soon as it is typed (the form re-checks with the shared schema).
    expect(await price.getAttribute('aria-invalid')).toBe('false');
    expect(await page.getByTestId('supply-error').count()).toBe(0);
    await page.screenshot({ path: screenshotPath('part-supply-form'), fullPage: false });
    await Promise.all([page.waitForEvent('load'), price.press('Enter')]);
    expect(writes.length).toBe(1);

    const history = page.getByTestId('history');
    await history.waitFor();
    const text = (await history.textContent())!.replace(/\s+/g, ' ');
    expect(text).toContain('Supply data changed');
    expect(text).toContain('Fenwick Row Electronics FRE-E2E: stock 200 → 1,240; break 100: 0.2500 → 0.2200 EUR');
    expect(await page.getByTestId('sources').textContent()).toContain('1,240');
    await page.screenshot({ path: screenshotPath('part-supply-history'), fullPage: false });
    expect(errors).toEqual([]);
    await context.close();
  });

  it('the open form has no serious or critical WCAG 2.1 A/AA violation (axe-core, as in a11y.test.ts)', async () => {
    const id = await freshPart();
    // axe is injected as a script: like a11y.test.ts this context bypasses the page's CSP.
    const context = await browser.newContext({ viewport: { width: 1366, height: 900 }, bypassCSP: true });
    await signInContext(context, 'buyer');
    const page = await context.newPage();
    await page.goto(`${appUrl()}/parts/${id}`);
    await page.getByText('Edit supply data').click();
    await page.waitForSelector('astro-island:not([ssr]) [data-testid="supply-editor"]');
    await page.getByRole('button', { name: 'Add price break to Fenwick Row Electronics FRE-E2E' }).press('Enter');
    await page.locator('input[name="sources.0.priceBreaks.2.unitPrice"]').waitFor();
    expect(await page.evaluate(() => document.activeElement?.getAttribute('name'))).toBe('sources.0.priceBreaks.2.unitPrice');
    await page.addScriptTag({ path: AXE_PATH });
    const violations = await page.evaluate(async () => {
      const axe = (
        window as unknown as {
          axe: { run: (ctx: Element, opts: object) => Promise<{ violations: { id: string; impact: string | null }[] }> };
        }
      ).axe;
      const form = document.querySelector('[data-testid="supply-editor"]')!;
      const result = await axe.run(form, { runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'] } });
      return result.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical').map((v) => v.id);
    });
    expect(violations).toEqual([]);
    await context.close();
  });
});
