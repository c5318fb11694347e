import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { launchBrowser, screenshotPath } from '../helpers/browser.ts';
import { appUrl } from '../helpers/stack.ts';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
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
    expect(errors.filter((e) => !/status of 400/.test(e))).toEqual([]);
  });

  it('sizes a pull-down against an internal pull-up (docs/engineering.md §9 example: E12 6.8 kΩ)', async () => {
    const page = await browser.newPage();
    await page.goto(appUrl() + '/calculators');
    const result = page.getByTestId('pull-result');
    await result.waitFor();
    await expect(result.innerText()).resolves.toContain('6.8 kΩ');
  });
});
