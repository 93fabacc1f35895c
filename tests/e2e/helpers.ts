/**
 * Browser helpers: Debian's Chromium driven by playwright-core (never a downloaded browser),
 * with the flags this closed network needs (playwright gives every launch a fresh temporary
 * profile), and a screenshot folder (git-ignored).
 */
import { mkdirSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { BASE_URL } from './env';

export { BASE_URL };
export const SCREENSHOTS = resolve(import.meta.dirname, 'screenshots');
export const DEMO_PASSWORD = 'loftwise-demo';

export async function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: '/usr/bin/chromium',
    headless: true,
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync'
    ]
  });
}

export async function newContext(browser: Browser): Promise<BrowserContext> {
  return browser.newContext({ baseURL: BASE_URL, viewport: { width: 1440, height: 900 } });
}

/** Signs in through the sign-in form and waits for the app shell. */
export async function signIn(page: Page, email: string, password = DEMO_PASSWORD): Promise<void> {
  await page.goto('/signin');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await Promise.all([page.waitForURL((u) => !u.pathname.startsWith('/signin')), page.getByRole('button', { name: 'Sign in' }).click()]);
}

export async function screenshot(page: Page, name: string): Promise<string> {
  mkdirSync(SCREENSHOTS, { recursive: true });
  const path = join(SCREENSHOTS, `${name}.png`);
  await page.screenshot({ path, fullPage: true });
  return path;
}
