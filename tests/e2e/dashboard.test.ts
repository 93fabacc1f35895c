import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { launchBrowser, newContext, screenshot, signIn } from './helpers';

describe('sign-in and dashboard in a real browser', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('sends an anonymous visitor to sign-in, which shows the one message for bad credentials', async () => {
    const page = await (await newContext(browser)).newPage();
    await page.goto('/');
    expect(new URL(page.url()).pathname).toBe('/signin');
    await page.getByLabel('E-mail').fill('engineer@tarnwick.example');
    await page.getByLabel('Password').fill('not-the-password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect.poll(() => page.getByRole('alert').textContent()).toContain('do not match');
    await screenshot(page, 'signin-error');
  });

  it('signs the demo engineer in and shows the seeded workspaces on the dashboard', async () => {
    const page = await (await newContext(browser)).newPage();
    await signIn(page, 'engineer@tarnwick.example');
    await expect.poll(() => page.getByTestId('user-name').textContent()).toBe('Ravi Tern');
    const list = page.getByTestId('workspace-list');
    await expect.poll(() => list.textContent()).toContain('Tarnwick Orbital · Small Launcher');
    expect(await list.textContent()).toContain('Tarnwick Orbital · Heavy Concepts');
    await screenshot(page, 'dashboard');

    await page.getByRole('link', { name: 'Tarnwick Orbital · Small Launcher' }).click();
    await expect.poll(() => page.getByTestId('workspace-title').textContent()).toBe('Tarnwick Orbital · Small Launcher');
    expect(await page.getByTestId('role-badge').textContent()).toBe('engineer');
    await screenshot(page, 'workspace');
  });
});
