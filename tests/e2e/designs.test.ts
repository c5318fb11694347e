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

  it('says at what drive the agitator switches are judged, and a current limit clears a switch stall-thermal fail', async () => {
    const context = await browser.newContext({ viewport: { width: 1400, height: 1000 } });
    await signInContext(context, 'designer');
    const page = await context.newPage();
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(e.message));
    await page.goto(appUrl() + '/designs?q=agitator');
    await page.getByRole('link', { name: /AG-3 agitator/ }).click();
    const driveLine = page.getByTestId('switch-drive');
    await driveLine.waitFor();
    // The seed gives AG-3 a separate 12 V driver rail: its lowest supply is 12 V × 0.95 = 11.4 V (by hand).
    const selection = page.getByTestId('selection');
    const driverMpn = await selection.locator('tr[data-role="driver"] td:nth-child(3) .font-semibold').first().innerText();
    const switchMpn = await selection.locator('tr[data-role="switch"] td:nth-child(3) .font-semibold').first().innerText();
    await expect(driveLine.innerText()).resolves.toContain(`judged at driver ${driverMpn}:`);
    await expect(driveLine.innerText()).resolves.toContain('lowest driver supply of 11.4 V (the chosen driver)');
    await expect(page.getByTestId('driver-pairing').innerText()).resolves.toContain(`ranked for the chosen switch ${switchMpn}`);
    await expect(page.getByTestId('driver-supply-kind').inputValue()).resolves.toBe('separate');

    // CWN60L04-S3 (invented) jammed without protection: 1.65 A RMS gives about 228 °C, above its 150 °C Tj,max.
    // With a 1 A limit the jam current falls to about 0.89 A RMS, about (0.89/1.65)² ≈ 0.29 of the heat, so the rise of
    // ~178 K above 50 °C becomes ~52 K plus the RDS(on) tempco's share: well within 150 °C (hand estimate).
    const switches = page.getByTestId('candidates-switch');
    // The list shows the best 25 with a count; "show more" pages on when the ranking is longer.
    await expect(page.getByTestId('list-summary-switch').innerText()).resolves.toMatch(
      /^Showing \d+ of \d+: \d+ pass · \d+ marginal · \d+ fail/,
    );
    const more = page.getByTestId('step-switch').getByRole('button', { name: /Show all|more/ });
    if ((await more.count()) > 0) await more.click();
    const row = switches.locator('tr[data-mpn="CWN60L04-S3"]');
    await expect(row.getAttribute('data-verdict')).resolves.toBe('fail');
    await row.getByRole('button', { name: 'Reasons' }).click();
    const stallCheck = switches.locator('tr[data-check="stall-thermal"]');
    await stallCheck.locator('[title="fails"]').waitFor();
    await expect(stallCheck.innerText()).resolves.toContain('Junction temperature, jammed shaft');

    await page.getByTestId('stall-protection').selectOption('current-limit');
    await page.getByTestId('stall-limit').fill('1');
    await stallCheck.locator('[title="holds"]').waitFor();
    await expect(stallCheck.innerText()).resolves.toContain('With the current limit a jam settles');
    await expect(page.getByTestId('stall-case').innerText()).resolves.toContain('current limit 1 A');
    await expect(switches.locator('tr[data-mpn="CWN60L04-S3"]').getAttribute('data-verdict')).resolves.not.toBe('fail');

    // Recording a start at reset needs a sentence: the schema's message shows beside the field.
    await page.getByTestId('reset-start-intent').check();
    await page.getByTestId('reset-start-reason').fill('because');
    await page.getByText('Say in a sentence why the motor may run at reset.').waitFor();
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
