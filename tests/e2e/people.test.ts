/**
 * An admin invites a new member; the invitation arrives in the fake SMTP server's outbox;
 * the new member opens the link signed out, sets a name and password, lands in the
 * workspace with the invited role, and can sign in again with that password. The link then
 * no longer works.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { BASE_URL, launchBrowser, newContext, screenshot, signIn } from './helpers';
// The e2e project's environment points these at the browser suite's own database.
import { Op } from 'sequelize';
import { sequelize } from '../../src/lib/server/db/sequelize';
import { User } from '../../src/lib/server/db/models';

describe('invite a member through the outbox', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
    // Leave the demo workspace's members as seeded for the other browser suites.
    await User.destroy({ where: { email: { [Op.like]: 'newcomer-%@tarnwick.example' } } });
    await sequelize.close();
  });

  it('admin invites, the e-mail arrives, the new member accepts and signs in', async () => {
    const address = `newcomer-${Date.now()}@tarnwick.example`;
    const admin = await (await newContext(browser)).newPage();
    await signIn(admin, 'admin@tarnwick.example');
    await admin.goto('/w/small-launcher');
    await admin.getByRole('link', { name: 'Members', exact: true }).click();
    await admin.waitForURL('**/w/small-launcher/members');
    await admin.getByLabel('E-mail').fill(address);
    await admin.getByRole('radio', { name: /^engineer/ }).check();
    await admin.getByRole('button', { name: 'Send invitation' }).click();
    await expect.poll(() => admin.getByRole('status').textContent()).toContain('Invitation sent');
    expect(await admin.getByTestId('invite-list').textContent()).toContain(address);
    await screenshot(admin, 'members');

    await admin.getByRole('link', { name: 'Outbox', exact: true }).click();
    await admin.waitForURL('**/w/small-launcher/outbox');
    const row = admin.getByTestId('outbox-table').getByRole('row').filter({ hasText: address });
    await expect.poll(() => row.count()).toBe(1);
    expect(await row.textContent()).toContain('Dana Quill invited you to Tarnwick Orbital · Small Launcher');
    await screenshot(admin, 'outbox');
    await row.getByRole('link').click();
    await admin.waitForURL(/\/outbox\/\d+$/);
    expect(await admin.getByTestId('msg-to').textContent()).toBe(address);
    const link = await admin.getByTestId('msg-body').getByRole('link').getAttribute('href');
    expect(link).toMatch(new RegExp(`^${BASE_URL}/invite/[A-Za-z0-9_-]{43}$`));
    await screenshot(admin, 'outbox-message');

    // The invitee has no session: a fresh browser context.
    const ctx = await newContext(browser);
    const guest = await ctx.newPage();
    await guest.goto(link!);
    expect(await guest.getByRole('heading', { level: 1 }).textContent()).toBe('Join Tarnwick Orbital · Small Launcher');
    await guest.getByLabel('Your name').fill('Noor Vance');
    await guest.getByLabel('New password').fill('short');
    await guest.getByLabel('Repeat password').fill('short');
    await guest.getByRole('button', { name: 'Accept and sign in' }).click();
    await expect.poll(() => guest.locator('#password-error').textContent()).toBe('Use at least 10 characters');
    // The password is not sent back into the form.
    expect(await guest.getByLabel('New password').inputValue()).toBe('');
    expect(await guest.getByLabel('Your name').inputValue()).toBe('Noor Vance');
    await screenshot(guest, 'invite-accept-error');

    await guest.getByLabel('New password').fill('tern-gull-petrel-skua');
    await guest.getByLabel('Repeat password').fill('tern-gull-petrel-skua');
    await guest.getByRole('button', { name: 'Accept and sign in' }).click();
    await guest.waitForURL('**/w/small-launcher');
    expect(await guest.getByTestId('user-name').textContent()).toBe('Noor Vance');
    expect(await guest.getByTestId('role-badge').textContent()).toBe('engineer');
    await screenshot(guest, 'invite-accepted');

    // Sign out, then sign in with the new password through the ordinary form.
    await guest.getByTestId('user-name').click();
    await guest.getByRole('menuitem', { name: 'Sign out' }).click();
    await guest.waitForURL('**/signin');
    await signIn(guest, address, 'tern-gull-petrel-skua');
    expect(await guest.getByTestId('user-name').textContent()).toBe('Noor Vance');

    // The link worked once.
    const again = await (await newContext(browser)).newPage();
    await again.goto(link!);
    expect(await again.getByTestId('invite-problem').textContent()).toContain('already been used');

    // Back on the members page the newcomer is listed and the invitation is no longer pending.
    await admin.goto('/w/small-launcher/members');
    expect(await admin.getByTestId('members-table').textContent()).toContain('Noor Vance');
    expect(await admin.getByTestId('no-invites').isVisible()).toBe(true);
  });

  it('keeps the last admin: demoting the only admin is refused beside the role', async () => {
    const admin = await (await newContext(browser)).newPage();
    await signIn(admin, 'admin@tarnwick.example');
    await admin.goto('/w/small-launcher/members');
    const row = admin.getByTestId('members-table').getByRole('row').filter({ hasText: 'admin@tarnwick.example' });
    await row.getByLabel('Role of Dana Quill', { exact: true }).selectOption('viewer');
    await row.getByRole('button', { name: 'Save role of Dana Quill' }).click();
    await expect.poll(() => row.getByRole('alert').textContent()).toContain('at least one admin');
    // The select goes back to the role Dana still has.
    await expect.poll(() => row.getByLabel('Role of Dana Quill', { exact: true }).inputValue()).toBe('admin');
    await screenshot(admin, 'members-last-admin');
  });

  it('shows members and outbox to admins only, and refuses them to others', async () => {
    const eng = await (await newContext(browser)).newPage();
    await signIn(eng, 'engineer@tarnwick.example');
    await eng.goto('/w/small-launcher');
    expect(await eng.getByRole('link', { name: 'Members', exact: true }).count()).toBe(0);
    expect(await eng.getByRole('link', { name: 'Outbox', exact: true }).count()).toBe(0);
    expect((await eng.goto('/w/small-launcher/members'))!.status()).toBe(403);
    expect((await eng.goto('/w/small-launcher/outbox'))!.status()).toBe(403);
  });
});
