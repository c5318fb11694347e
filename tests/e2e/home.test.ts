import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { launchBrowser, screenshotPath } from '../helpers/browser.ts';
import { appUrl, appDb } from '../helpers/stack.ts';
import { DEMO_PASSWORD, demoAddress } from '../helpers/session.ts';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

describe('home page (catalogue)', () => {
  it('shows the count and the most recently changed part of every category, the cautions, and no console errors', async () => {
    const knex = appDb();
    const counts: { category: string; n: number }[] = await knex('parts').select('category').count({ n: '*' }).groupBy('category');
    const samples: { category: string; mpn: string }[] = [];
    for (const { category } of counts) {
      samples.push(
        await knex('parts')
          .where({ category })
          .orderBy([
            { column: 'updated_at', order: 'desc' },
            { column: 'id', order: 'desc' },
          ])
          .first('category', 'mpn'),
      );
    }
    await knex.destroy();
    expect(samples).toHaveLength(4);

    const page = await browser.newPage();
    const errors: string[] = [];
    page.on('console', (m) => m.type() === 'error' && errors.push(m.text()));
    page.on('pageerror', (e) => errors.push(e.message));
    // The catalogue needs a signed-in person: sign in as the demo designer first.
    await page.goto(appUrl() + '/');
    await page.getByLabel('E-mail address').fill(demoAddress('designer'));
    await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(appUrl() + '/');
    for (const s of samples) {
      await expect(page.locator(`section[data-category="${s.category}"] tr[data-mpn="${s.mpn}"]`).count()).resolves.toBe(1);
    }
    for (const c of counts) {
      // The page never lists the whole catalogue: a count and a link to the paged search instead.
      await expect(page.getByTestId(`count-${c.category}`).innerText()).resolves.toContain(`(${Number(c.n)})`);
      await expect(page.getByTestId(`count-${c.category}`).getAttribute('href')).resolves.toBe(`/parts?category=${c.category}`);
      await expect(page.locator(`section[data-category="${c.category}"] tbody tr`).count()).resolves.toBeLessThanOrEqual(5);
    }
    await expect(page.getByRole('heading', { name: 'Cautions' }).count()).resolves.toBe(1);
    const font = await page.evaluate(() => getComputedStyle(document.body).fontFamily);
    expect(font).toContain('Source Sans 3');
    await page.screenshot({ path: screenshotPath('home'), fullPage: false });
    expect(errors).toEqual([]);
  });
});
