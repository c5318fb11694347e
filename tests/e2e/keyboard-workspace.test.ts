/**
 * Issue 14 item 10: a designer uses the workspace with the keyboard alone (Tab, Shift+Tab, Enter, Space,
 * arrow keys). From the home page they open a design, tab through the workspace's numbered steps in order,
 * pick a switch with the arrow keys, save, and download the bill of materials. At every stop the focus
 * is visible (an outline), on screen and not hidden under the sticky toolbar, and Tab always moves on (no
 * keyboard trap). Screenshots at 1366 px go to test-results/.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
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

interface Stop {
  /** A short description of the focused element: tag, name or text. */
  what: string;
  tag: string;
  type: string | null;
  name: string | null;
  href: string | null;
  testId: string | null;
  checked: boolean;
  /** Number of the workspace step the element sits in (0 outside the steps). */
  step: number;
  /** A visible outline is drawn (WCAG 2.4.7). */
  outlined: boolean;
  /** The element's middle is on screen and the element itself is what is there (not covered by the sticky toolbar). */
  unobscured: boolean;
  inToolbar: boolean;
  inDesk: boolean;
  inMain: boolean;
}

async function focused(page: Page): Promise<Stop> {
  return page.evaluate(() => {
    const el = document.activeElement as HTMLElement | null;
    if (!el || el === document.body) {
      return {
        what: 'body',
        tag: 'body',
        type: null,
        name: null,
        href: null,
        testId: null,
        checked: false,
        step: 0,
        outlined: false,
        unobscured: false,
        inToolbar: false,
        inDesk: false,
        inMain: false,
      };
    }
    const style = getComputedStyle(el);
    const box = el.getBoundingClientRect();
    const x = Math.min(Math.max(box.left + box.width / 2, 0), window.innerWidth - 1);
    const y = box.top + box.height / 2;
    const atPoint = y >= 0 && y < window.innerHeight ? document.elementFromPoint(x, y) : null;
    const section = el.closest('section[aria-labelledby^="step-"]');
    const label = el.getAttribute('aria-label') ?? (el.textContent ?? '').trim().slice(0, 40);
    return {
      what: `${el.tagName.toLowerCase()}${el.getAttribute('type') ? `[${el.getAttribute('type')}]` : ''} "${label}"`,
      tag: el.tagName.toLowerCase(),
      type: el.getAttribute('type'),
      name: el.getAttribute('name'),
      href: el.getAttribute('href'),
      testId: el.getAttribute('data-testid'),
      checked: (el as HTMLInputElement).checked === true,
      step: section ? Number(section.getAttribute('aria-labelledby')!.replace('step-', '')) : 0,
      outlined: style.outlineStyle !== 'none' && parseFloat(style.outlineWidth) >= 1,
      unobscured: atPoint != null && (atPoint === el || el.contains(atPoint) || atPoint.contains(el)),
      inToolbar: el.closest('[data-testid="workspace-toolbar"]') != null,
      inDesk: el.closest('[data-testid="desk-designs"]') != null,
      inMain: el.closest('main') != null,
    };
  });
}

/** Presses `key` until `done` holds for the focused element; every stop is kept. Fails after `max` presses (a trap or a dead end). */
async function pressUntil(page: Page, key: string, done: (s: Stop) => boolean, max: number, trail: Stop[]): Promise<Stop> {
  for (let i = 0; i < max; i++) {
    await page.keyboard.press(key);
    const stop = await focused(page);
    trail.push(stop);
    if (done(stop)) return stop;
  }
  throw new Error(
    `${key} × ${max} never reached the target; last stops: ${trail
      .slice(-5)
      .map((s) => s.what)
      .join(' → ')}`,
  );
}

const badFocus = (trail: Stop[]): string[] =>
  trail
    .filter((s) => s.tag !== 'body' && (!s.outlined || !s.unobscured))
    .map((s) => `${s.what} (outline ${s.outlined}, seen ${s.unobscured})`);

describe('keyboard only', () => {
  it('a designer opens a design from the home page, walks the steps in order, picks a switch, saves and downloads the BOM', async () => {
    const context = await browser.newContext({ viewport: { width: 1366, height: 900 }, acceptDownloads: true });
    await signInContext(context, 'designer');
    const page = await context.newPage();
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(e.message));

    // Home page: the first Tab reaches the skip link, which is shown while focused.
    await page.goto(`${appUrl()}/`);
    const trail: Stop[] = [];
    const skip = await pressUntil(page, 'Tab', () => true, 1, trail);
    expect(skip.href).toBe('#main');
    expect(skip.outlined && skip.unobscured).toBe(true);
    await page.keyboard.press('Enter');
    const fromMain: Stop[] = [];
    const design = await pressUntil(page, 'Tab', (s) => s.inDesk && /^\/designs\/\d+$/.test(s.href ?? ''), 40, fromMain);
    expect(
      fromMain.filter((s) => !s.inMain).map((s) => s.what),
      'after the skip link Tab starts inside the main content',
    ).toEqual([]);
    trail.push(...fromMain);
    await page.screenshot({ path: screenshotPath('keyboard-1366-home-design-link') });
    await page.keyboard.press('Enter');
    await page.waitForURL(new RegExp(`${design.href}$`));
    await page.getByTestId('match-status').getByText('ranked').waitFor();

    // Workspace: Tab from the top to the switch list, through the steps in their numbered order.
    const walk: Stop[] = [];
    await pressUntil(page, 'Tab', (s) => s.step === 4 && s.name === 'use-switch', 400, walk);
    const steps = walk.map((s) => s.step).filter((n) => n > 0);
    expect(steps, 'step numbers in the order Tab visits them').toEqual([...steps].sort((a, b) => a - b));
    expect(steps[0]).toBe(1);
    expect(steps.at(-1)).toBe(4);
    expect(badFocus([...trail, ...walk])).toEqual([]);

    // Pick a switch: an arrow key moves the choice to the next passing candidate and keeps the focus there.
    const before = await page.locator('input[name="use-switch"]:checked').getAttribute('aria-label');
    await page.keyboard.press('ArrowDown');
    const picked = await focused(page);
    expect(picked.name).toBe('use-switch');
    expect(picked.checked).toBe(true);
    expect(picked.what).not.toContain(before ?? '(none)');
    expect(picked.outlined && picked.unobscured).toBe(true);
    await page.getByText('unsaved changes').waitFor();
    await page.getByTestId('match-status').getByText('ranked').waitFor();
    expect((await focused(page)).what, 'focus stays on the pick after the list is re-ranked').toBe(picked.what);
    await page.screenshot({ path: screenshotPath('keyboard-1366-switch-picked') });

    // Back up to the toolbar with Shift+Tab, save with Enter: focus moves to the answer, not to the page.
    const back: Stop[] = [];
    await pressUntil(page, 'Shift+Tab', (s) => s.testId === 'save-design', 400, back);
    expect(badFocus(back)).toEqual([]);
    await page.keyboard.press('Enter');
    await page
      .getByTestId('save-status')
      .getByText(/Saved as revision \d+/)
      .waitFor();
    expect((await focused(page)).testId).toBe('save-status');

    // The BOM link is a few Shift+Tabs away; Enter downloads it.
    const toBom: Stop[] = [];
    const bom = await pressUntil(page, 'Shift+Tab', (s) => /\/bom\.csv$/.test(s.href ?? ''), 10, toBom);
    expect(bom.inToolbar && bom.outlined && bom.unobscured).toBe(true);
    await page.screenshot({ path: screenshotPath('keyboard-1366-bom-link') });
    const [download] = await Promise.all([page.waitForEvent('download'), page.keyboard.press('Enter')]);
    expect(download.suggestedFilename()).toMatch(/\.csv$/);

    // No trap: from the toolbar, Tab runs through the whole workspace and out of it.
    const out: Stop[] = [];
    await pressUntil(page, 'Tab', (s) => s.tag === 'body' || !s.inToolbar, 30, out);
    await pressUntil(page, 'Tab', (s) => s.tag === 'body' || (s.step === 0 && !s.inToolbar && out.some((o) => o.step >= 6)), 600, out);
    const laterSteps = out.map((s) => s.step).filter((n) => n > 0);
    expect(laterSteps).toEqual([...laterSteps].sort((a, b) => a - b));
    expect(badFocus(out)).toEqual([]);
    expect(errors).toEqual([]);
    await context.close();
  });
});
