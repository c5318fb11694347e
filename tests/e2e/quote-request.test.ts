/**
 * A buyer requests a quote from the shortlist in the browser (issue 13 item 4): ticks the demo fan's switch,
 * picks a supplier contact and sends; the mail sink holds the request with its CSV; the buyer enters the
 * answer on the request's page and the shortlist then buys the switch from the quoted source. Hand figures
 * (common practice rules, README "Buying"): need = ceil(1 × 500 × 1.02) = 510; the strip source sells 51
 * strips of 10 = 510 at 0.40 EUR = 204.00 EUR; the quote, MOQ 500 and one break at 0.21 EUR, is
 * 510 × 0.21 = 107.10 EUR, the cheaper, so the shortlist picks it.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { launchBrowser, screenshotPath, watchErrors } from '../helpers/browser.ts';
import { signInContext } from '../helpers/session.ts';
import { appDb, appUrl } from '../helpers/stack.ts';

const knex = appDb();
let browser: Browser;
let fanId = 0;
let switchId = 0;
const COMPANY = 'Harbour Test Parts';
const EMAIL = 'quotes@harbour-test.example';

beforeAll(async () => {
  browser = await launchBrowser();
  fanId = (await knex('designs').where({ name: 'BF-12 bench fan, 12 V, on/off from 3.3 V logic' }).first('id')).id;
  switchId = (await knex('design_parts').where({ design_id: fanId, role: 'switch', position: 0 }).first('part_id')).part_id;
  await knex('part_sources').where({ part_id: switchId }).del();
  const [id] = await knex('part_sources').insert({
    part_id: switchId,
    distributor: 'Test Strip Supply',
    sku: 'TSS-1',
    moq: 1,
    order_multiple: 10,
    stock_qty: 200,
    lead_time_days: 5,
    currency: 'EUR',
  });
  await knex('part_price_breaks').insert({ source_id: id, qty: 1, unit_price: 0.4 });
  await knex('supplier_contacts').insert({ name: 'Hal Moreno', company: COMPANY, email: EMAIL });
});
afterAll(async () => {
  await browser?.close();
  await knex.destroy();
});

describe('a buyer requests a quote for a shortlist line', () => {
  it('sends it, enters the answer, and the shortlist buys from the quote', async () => {
    const context = await browser.newContext({ viewport: { width: 1500, height: 1100 } });
    await signInContext(context, 'buyer');
    const page = await context.newPage();
    const errors = watchErrors(page);
    const mailBefore = Number((await knex('captured_mail').max({ m: 'id' }))[0].m ?? 0);
    await page.goto(`${appUrl()}/shortlist?boards-${fanId}=500`);
    const fan = page.locator(`section[data-design="${fanId}"]`);
    const switchRow = fan.locator('tr[data-line="switch"][data-option="0"]');
    expect(await switchRow.getByTestId('line-source').innerText()).toBe('Test Strip Supply TSS-1');

    await fan.getByText('Request a quote').click();
    const form = fan.getByTestId('quote-request-form');
    await form.locator(`input[name="line-switch-${switchId}"]`).check();
    await form.getByLabel('Supplier contact').selectOption({ label: `${COMPANY}: Hal Moreno <${EMAIL}>` });
    await form.getByRole('button', { name: /Send the request \(1 line\)/ }).click();
    const sent = form.getByTestId('quote-sent');
    await sent.waitFor();
    expect(await sent.innerText()).toContain(`Sent to ${EMAIL}`);

    const mail = await knex('captured_mail').where('id', '>', mailBefore).andWhere('envelope_to', 'like', `%${EMAIL}%`);
    expect(mail).toHaveLength(1);
    const [att] = JSON.parse(mail[0].attachments_json) as { text: string }[];
    // One line: need 510, order 510 (the strip source's order at 510), no date, no note.
    expect(att.text.split('\r\n')[1]).toMatch(/^1,[^,]+,[^,]+,510,510,,$/);

    await Promise.all([page.waitForEvent('load'), sent.getByRole('link').click()]);
    expect(await page.getByTestId('quote-state').innerText()).toContain('Sent, awaiting the answer');
    await page.locator('input[name="unitPrice-1"]').fill('0.21');
    await page.locator('input[name="currency-1"]').fill('EUR');
    await page.locator('input[name="moq-1"]').fill('500');
    await page.locator('input[name="leadTimeDays-1"]').fill('20');
    await page.locator('input[name="validUntil-1"]').fill('2027-02-01');
    await Promise.all([page.waitForEvent('load'), page.getByRole('button', { name: /Save the answer/ }).click()]);
    expect(await page.getByTestId('quote-state').innerText()).toContain('Answered');
    await page.screenshot({ path: screenshotPath('quote-request-answered') });

    await page.goto(`${appUrl()}/shortlist?boards-${fanId}=500`);
    const source = await fan.locator('tr[data-line="switch"][data-option="0"]').getByTestId('line-source').innerText();
    expect(source).toMatch(new RegExp(`^${COMPANY} Q\\d+-1$`));
    expect(await fan.locator('tr[data-line="switch"][data-option="0"]').innerText()).toContain('107.10');
    expect(errors).toEqual([]);
    await context.close();
  });
});
