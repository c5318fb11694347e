/** Debian's Chromium driven by playwright-core (never a downloaded browser). See ../shared/stack.md. */
import { chromium, type Browser } from 'playwright-core';
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
