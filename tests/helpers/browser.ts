/** Debian's Chromium driven by playwright-core (never a downloaded browser). See ../shared/stack.md. */
import { chromium, type Browser, type Page } from 'playwright-core';
import { mkdirSync } from 'node:fs';
import path from 'node:path';

/** playwright's launch() gives every browser a fresh temporary profile (a new user-data dir). */
export async function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
}

export function screenshotPath(name: string): string {
  const dir = process.env.TEST_ARTIFACTS_DIR ?? path.join(process.cwd(), 'test-results');
  mkdirSync(dir, { recursive: true });
  return path.join(dir, `${name}.png`);
}

/** Collects the page's console errors and uncaught exceptions (a test expects the list to stay empty). */
export function watchErrors(page: Page): string[] {
  const errors: string[] = [];
  page.on('console', (m) => m.type() === 'error' && errors.push(m.text()));
  page.on('pageerror', (e) => errors.push(e.message));
  return errors;
}
