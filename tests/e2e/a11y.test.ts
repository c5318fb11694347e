/**
 * Accessibility in the browser: axe-core (WCAG 2.x A/AA rules) on every page, signed in as each role and
 * as an anonymous visitor; no serious or critical violation is allowed. Screenshots at 1366 px wide.
 */
import { createRequire } from 'node:module';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { launchBrowser, screenshotPath } from '../helpers/browser.ts';
import { appDb, appUrl } from '../helpers/stack.ts';
import { signInContext, type DemoRole } from '../helpers/session.ts';

const AXE_PATH = createRequire(import.meta.url).resolve('axe-core/axe.min.js');

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

interface Violation {
  id: string;
  impact: string | null;
  help: string;
  nodes: { target: string[]; html: string; failureSummary?: string }[];
}

async function seriousViolations(page: Page): Promise<string[]> {
  await page.addScriptTag({ path: AXE_PATH });
  const violations = (await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (ctx: Document, opts: object) => Promise<{ violations: unknown[] }> } }).axe;
    const result = await axe.run(document, { runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'] } });
    return result.violations;
  })) as Violation[];
  return violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map(
      (v) =>
        `${v.id} (${v.impact}): ${v.help} at ${v.nodes
          .slice(0, 3)
          .map((n) => n.target.join(' '))
          .join(', ')}`,
    );
}

const PAGES: Record<DemoRole | 'anonymous', string[]> = {
  anonymous: ['/signin', '/calculators', '/reset', '/no/such/page'],
  designer: ['/', '/parts', '/parts/{part}', '/designs', '/designs/{design}', '/designs/new', '/shortlist', '/account', '/calculators'],
  librarian: ['/', '/parts/{part}', '/parts/{part}/edit', '/parts/new', '/parts/import', '/review'],
  buyer: ['/', '/shortlist', '/quotes', '/parts/{part}'],
  admin: ['/people', '/mail', '/designs/{design}'],
};

describe.each(Object.entries(PAGES))('as %s', (role, paths) => {
  it.each(paths)('%s has no serious or critical accessibility violation', async (path) => {
    // bypassCSP: the app's CSP (rightly) refuses the injected axe script.
    const context = await browser.newContext({ viewport: { width: 1366, height: 900 }, bypassCSP: true });
    if (role !== 'anonymous') await signInContext(context, role as DemoRole);
    const page = await context.newPage();
    const url = path.replace('{part}', String(ids.part)).replace('{design}', String(ids.design));
    await page.goto(appUrl() + url);
    await page.waitForLoadState('networkidle');
    if (url.startsWith('/designs/')) await page.waitForSelector('[data-testid="step-switch"], [data-testid="design-inputs"]');
    const found = await seriousViolations(page);
    if (found.length) await page.screenshot({ path: screenshotPath(`a11y-${role}-${url.replace(/\W+/g, '-')}`), fullPage: true });
    await context.close();
    expect(found, `${role} ${url}`).toEqual([]);
  });
});
