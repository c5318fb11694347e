import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import type { Browser } from 'playwright-core';
import { launchBrowser, screenshotPath } from '../helpers/browser.ts';
import { appUrl } from '../helpers/stack.ts';
import { signInContext } from '../helpers/session.ts';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

describe('design workspace', () => {
  it('a designer builds a design from a catalogue motor, picks parts and alternates, and downloads the report', async () => {
    const context = await browser.newContext({ viewport: { width: 1400, height: 1000 }, acceptDownloads: true });
    await signInContext(context, 'designer');
    const page = await context.newPage();
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(e.message));
    page.on('console', (m) => m.type() === 'error' && errors.push(m.text()));
    await page.goto(appUrl() + '/designs/new');
    const motorSelect = page.getByTestId('motor-select');
    const option = await motorSelect.locator('option', { hasText: 'HVM-260P-060A' }).getAttribute('value');
    await motorSelect.selectOption(option!);
    await page.getByTestId('logic-preset').selectOption('3v3');
    await page.getByTestId('design-name').fill('Browser test pump');

    const switches = page.getByTestId('candidates-switch');
    await switches.locator('tr[data-verdict="pass"]').first().waitFor();
    await page.getByTestId('match-status').getByText('ranked').waitFor();
    const passing = switches.locator('tr[data-verdict="pass"]');
    const chosenMpn = (await passing.nth(0).getAttribute('data-mpn'))!;
    const altMpn = (await passing.nth(1).getAttribute('data-mpn'))!;
    await page.getByLabel(`Use ${chosenMpn}`).check();
    await page.getByLabel(`Alternate ${altMpn}`).check();
    // the reasons of a candidate open in place
    await passing.nth(0).getByRole('button', { name: 'Reasons' }).click();
    await switches.locator('tr[data-check="gate-drive"]').first().waitFor();

    const diodes = page.getByTestId('candidates-diode');
    const diodeMpn = (await diodes.locator('tr[data-verdict="pass"]').first().getAttribute('data-mpn'))!;
    await page.getByLabel(`Use ${diodeMpn}`).check();

    await page.getByTestId('save-design').click();
    await page.waitForURL(/\/designs\/\d+$/);
    const selection = page.getByTestId('selection');
    await selection.getByText(chosenMpn).first().waitFor();
    await expect(selection.locator('tr[data-role="switch"]').innerText()).resolves.toContain(altMpn);
    await expect(selection.locator('tr[data-role="diode"]').innerText()).resolves.toContain(diodeMpn);
    await page.getByTestId('power-on').waitFor();
    await page.screenshot({ path: screenshotPath('design-workspace'), fullPage: true });

    const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('report-link').click()]);
    const file = await download.path();
    expect(readFileSync(file!).subarray(0, 5).toString()).toBe('%PDF-');
    expect(download.suggestedFilename()).toMatch(/^browser-test-pump-rev1\.pdf$/);
    expect(errors).toEqual([]);
    await context.close();
  });

  it('shows that the 1.8 V agitator needs a gate driver', async () => {
    const context = await browser.newContext({ viewport: { width: 1400, height: 1000 } });
    await signInContext(context, 'buyer');
    const page = await context.newPage();
    await page.goto(appUrl() + '/designs?q=agitator');
    await page.getByRole('link', { name: /AG-3 agitator/ }).click();
    await page.getByTestId('driver-needed').waitFor();
    await page.getByTestId('candidates-driver').locator('tr[data-verdict="pass"], tr[data-verdict="marginal"]').first().waitFor();
    // a buyer reads the design but has no pick controls
    expect(await page.getByTestId('candidates-driver').locator('input[type="radio"]').count()).toBe(0);
    await context.close();
  });
});
