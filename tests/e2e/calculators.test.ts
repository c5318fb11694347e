import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { launchBrowser, screenshotPath } from '../helpers/browser.ts';
import { appDb, appUrl } from '../helpers/stack.ts';
import { signInContext } from '../helpers/session.ts';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
const knex = appDb();
afterAll(async () => {
  await browser?.close();
  await knex.destroy();
});

describe('calculators page', () => {
  it('draws the motor curves at both supply ends and warns on an inconsistent datasheet', async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 1400 } });
    const errors: string[] = [];
    page.on('console', (m) => m.type() === 'error' && errors.push(m.text()));
    page.on('pageerror', (e) => errors.push(e.message));
    await page.goto(appUrl() + '/calculators');
    for (const id of ['chart-speed', 'chart-current', 'chart-power', 'chart-efficiency']) {
      await page.getByTestId(id).waitFor();
      // two series (min and max supply) per chart
      expect(await page.getByTestId(id).locator('polyline').count()).toBe(2);
    }
    await expect(page.getByTestId('consistency-ok').count()).resolves.toBe(1);
    // Stall current at the 3.3 V maximum: Is' = V'/R with R = 3 V / 1.8 A (docs/engineering.md §2 re-scaling) = 1.98 A.
    await expect(page.getByTestId('stall-callout').innerText()).resolves.toContain('1.98 A');
    await page.screenshot({ path: screenshotPath('calculators'), fullPage: true });

    // A datasheet claiming 60 g·cm for this motor disagrees with itself (docs/engineering.md §2.6 M1: ratio ≈ 1.733).
    await page.getByLabel('Stall torque unit').selectOption('g·cm');
    await page.getByLabel('Stall torque', { exact: true }).fill('60');
    await page.getByTestId('consistency-warning').waitFor();
    // 60 g·cm = 5.884e-3 N·m (SI Brochure g_n); model 3.39531e-3 N·m → 1.733, shown to 3 digits.
    expect(await page.getByTestId('torque-ratio').innerText()).toBe('1.73');

    expect(errors).toEqual([]);
    // Bad input is named at the field (the browser logs the deliberate 400 answer as a failed resource).
    await page.getByLabel('No-load current', { exact: true }).fill('5');
    await page.getByText('below the stall current').first().waitFor();
    // The results of the earlier, accepted inputs stay visible but greyed and say so.
    await page.getByTestId('motor-stale').waitFor();
    await expect(page.getByTestId('motor-results').getAttribute('class')).resolves.toContain('opacity-40');
    // The summary names the field as the form labels it, never by the API's path.
    await expect(page.getByTestId('motor-status').innerText()).resolves.toContain('Check the marked field: No-load current.');
    await expect(page.getByTestId('motor-status').innerText()).resolves.not.toContain('motor.');
    // Each current has its own unit: 200 mA of no-load current leaves the 1.8 A stall current as it is.
    await page.getByLabel('No-load current unit').selectOption('mA');
    await page.getByLabel('No-load current', { exact: true }).fill('200');
    await page.getByTestId('motor-status').getByText('up to date').waitFor();
    await expect(page.getByLabel('Stall current unit').inputValue()).resolves.toBe('A');
    await expect(page.getByTestId('stall-callout').innerText()).resolves.toContain('1.98 A');
    await expect(page.getByTestId('motor-stale').count()).resolves.toBe(0);
    // Anonymous: the actions ask for a sign-in.
    await expect(page.getByTestId('motor-actions').innerText()).resolves.toContain('Sign in');
    expect(errors.filter((e) => !/status of 400/.test(e))).toEqual([]);
  });

  it('a designer starts a design from the calculated motor and proposes it to the catalogue, where it waits for review', async () => {
    const context = await browser.newContext({ viewport: { width: 1366, height: 1000 } });
    await signInContext(context, 'designer');
    const page = await context.newPage();
    await page.goto(appUrl() + '/calculators');
    await page.getByTestId('motor-status').getByText('up to date').waitFor();
    const start = page.getByTestId('start-design');
    // The default motor of the form: 3 V, 12,000 rpm, 0.2 A, 1.8 A, 3.3953 mN·m on 2.4 to 3.3 V.
    expect(await start.getAttribute('href')).toBe('/designs/new?ratedV=3&rpm=12000&i0A=0.2&isA=1.8&tsNm=0.0033953&vMin=2.4&vMax=3.3');

    // Propose: a part number nobody has, refused first without a maker (the field is named), then sent.
    const mpn = `CALC-M-${Date.now().toString(36).toUpperCase()}`;
    await page.getByRole('button', { name: 'Propose this motor to the catalogue' }).click();
    const form = page.getByTestId('propose-form');
    await form.getByLabel('Part number').fill(mpn);
    await form.getByRole('button', { name: 'Send for review' }).click();
    await form.getByText('Check the marked field: Maker.').waitFor();
    await form.getByLabel('Maker').fill('Invented Motor Works');
    await form.getByRole('button', { name: 'Send for review' }).click();
    await page.getByTestId('proposed').waitFor();
    const row = await knex('parts').where({ mpn }).first('category', 'review_status', 'manufacturer');
    expect(row).toEqual({ category: 'motor', review_status: 'pending', manufacturer: 'Invented Motor Works' });
    await page.screenshot({ path: screenshotPath('calculators-proposed'), fullPage: true });

    await start.click();
    await page.waitForURL(/\/designs\/new\?/);
    await page.getByTestId('from-calculator').waitFor();
    await expect(page.getByTestId('motor-select').inputValue()).resolves.toBe('manual');
    await expect(page.getByLabel('No-load current').inputValue()).resolves.toBe('200');
    await expect(page.getByLabel('Stall current', { exact: true }).inputValue()).resolves.toBe('1.8');
    await context.close();
  });

  it('sizes a pull-down against an internal pull-up (docs/engineering.md §9 example: E12 6.8 kΩ)', async () => {
    const page = await browser.newPage();
    await page.goto(appUrl() + '/calculators');
    const result = page.getByTestId('pull-result');
    await result.waitFor();
    await expect(result.innerText()).resolves.toContain('6.8 kΩ');
  });
});
