/**
 * Layouts that fit a laptop (1366 px) and a phone (390 px): the page itself never scrolls sideways (a
 * wide table scrolls inside its own box), the header stays on screen. Screenshots of each page at both
 * widths go to test-results/.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { launchBrowser, screenshotPath } from '../helpers/browser.ts';
import { appDb, appUrl } from '../helpers/stack.ts';
import { signInContext, type DemoRole } from '../helpers/session.ts';

let browser: Browser;
const ids = { part: 0, design: 0 };
beforeAll(async () => {
  browser = await launchBrowser();
  const knex = appDb();
  ids.part = (await knex('parts').where({ category: 'mosfet', review_status: 'approved' }).first('id')).id;
  ids.design = (await knex('designs').orderBy('id').first('id')).id;
  await knex.destroy();
});
afterAll(async () => {
  await browser?.close();
});

const PAGES: [DemoRole | 'anonymous', string][] = [
  ['anonymous', '/signin'],
  ['anonymous', '/calculators'],
  ['designer', '/parts?category=mosfet'],
  ['designer', '/parts/{part}'],
  ['designer', '/designs'],
  ['designer', '/designs/{design}'],
  ['librarian', '/parts/import'],
  ['buyer', '/shortlist'],
  ['admin', '/people'],
];

describe.each([1366, 390])('at %i px wide', (width) => {
  it.each(PAGES)('as %s, %s does not scroll sideways and keeps the header on screen', async (role, path) => {
    const context = await browser.newContext({ viewport: { width, height: 900 } });
    if (role !== 'anonymous') await signInContext(context, role);
    const page = await context.newPage();
    const url = path.replace('{part}', String(ids.part)).replace('{design}', String(ids.design));
    await page.goto(appUrl() + url);
    await page.waitForLoadState('networkidle');
    const sizes = await page.evaluate(() => ({
      scrollWidth: document.documentElement.scrollWidth,
      innerWidth: window.innerWidth,
      headerRight: document.querySelector('header')!.getBoundingClientRect().right,
    }));
    const widest = await page.evaluate(() => {
      const over = [...document.querySelectorAll('body *')].filter((el) => el.getBoundingClientRect().right > window.innerWidth + 0.5);
      const leaf = over.filter((el) => !over.some((o) => o !== el && el.contains(o)));
      return leaf
        .slice(0, 3)
        .map((el) => `${el.tagName.toLowerCase()}.${[...el.classList].join('.')} (${Math.round(el.getBoundingClientRect().right)} px)`);
    });
    await page.screenshot({
      path: screenshotPath(`layout-${width}-${role}-${url.replace(/\W+/g, '-')}`),
      fullPage: false,
      caret: 'initial',
    });
    await context.close();
    expect(sizes.scrollWidth, `${url} at ${width} px; past the edge: ${widest.join(', ')}`).toBeLessThanOrEqual(sizes.innerWidth);
    expect(sizes.headerRight).toBeLessThanOrEqual(sizes.innerWidth);
  });
});
