/**
 * Personal settings through the built server: a password change ends every other session
 * of the account (not the one that made the change), display units are saved per user, and
 * a personal API token is shown once, works as a Bearer token, and stops working when revoked.
 * Uses a user of its own, so the demo passwords stay as they are.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { sequelize } from '../../src/lib/server/db/sequelize';
import { ApiToken, Membership, User, Workspace } from '../../src/lib/server/db/models';
import { hashPassword } from '../../src/lib/server/password';
import { signInCookie, startWebServer, type Running } from '../helpers/processes';

const PORT = 3114;
const tag = randomUUID().slice(0, 8);
const email = `settings-${tag}@people-test.example`;
const PASSWORD = 'first-password-1';

describe('settings through the built server', () => {
  let server: Running & { url: string };
  let userId: string;
  beforeAll(async () => {
    const u = await User.create({ email, displayName: 'Sett Ings', passwordHash: await hashPassword(PASSWORD) });
    userId = u.id;
    const ws = (await Workspace.findOne({ where: { slug: 'small-launcher' } }))!;
    await Membership.create({ userId, workspaceId: ws.id, role: 'viewer' });
    server = await startWebServer(PORT, { LOFTWISE_ENV: 'test' });
  });
  afterAll(async () => {
    await server?.stop();
    await User.destroy({ where: { id: userId } });
    await sequelize.close();
  });

  const action = (cookie: string, name: string, body: Record<string, string>, accept = 'application/json') =>
    fetch(`${server.url}/settings?/${name}`, {
      method: 'POST',
      redirect: 'manual',
      headers: {
        cookie,
        origin: server.url,
        accept,
        'content-type': 'application/x-www-form-urlencoded',
        ...(accept === 'application/json' ? { 'x-sveltekit-action': 'true' } : {})
      },
      body: new URLSearchParams(body)
    });
  const signedIn = async (cookie: string) => (await fetch(`${server.url}/settings`, { headers: { cookie }, redirect: 'manual' })).status === 200;

  it('refuses a wrong current password or a short new one, echoing no password back', async () => {
    const cookie = await signInCookie(server.url, email, PASSWORD);
    const wrong = await (await action(cookie, 'password', { current: 'not-it-at-all', password: 'second-password-2', confirm: 'second-password-2' })).json();
    expect(wrong).toMatchObject({ type: 'failure', status: 400 });
    expect(wrong.data).toContain('That is not your current password');
    expect(wrong.data).not.toContain('second-password-2');
    const short = await (await action(cookie, 'password', { current: PASSWORD, password: 'short', confirm: 'short' })).json();
    expect(short.data).toContain('Use at least 10 characters');
    const differ = await (await action(cookie, 'password', { current: PASSWORD, password: 'second-password-2', confirm: 'second-password-3' })).json();
    expect(differ.data).toContain('The two passwords differ');
  });

  it('ends the other sessions on a password change and keeps the current one', async () => {
    const a = await signInCookie(server.url, email, PASSWORD);
    const b = await signInCookie(server.url, email, PASSWORD);
    expect(await signedIn(a)).toBe(true);
    expect(await signedIn(b)).toBe(true);
    const res = await action(a, 'password', { current: PASSWORD, password: 'second-password-2', confirm: 'second-password-2' }, 'text/html');
    expect(res.status).toBe(303);
    expect(res.headers.get('location')).toBe('/settings?done=password');
    expect(await signedIn(a)).toBe(true);
    expect(await signedIn(b)).toBe(false);
    await expect(signInCookie(server.url, email, PASSWORD)).rejects.toThrow();
    await expect(signInCookie(server.url, email, 'second-password-2')).resolves.toMatch(/^lw_session=/);
  });

  it('saves the display units on the user', async () => {
    const cookie = await signInCookie(server.url, email, 'second-password-2');
    expect((await action(cookie, 'units', { units: 'us' }, 'text/html')).status).toBe(303);
    expect((await User.findByPk(userId))!.units).toBe('us');
    const bad = await (await action(cookie, 'units', { units: 'cubits' })).json();
    expect(bad).toMatchObject({ type: 'failure', status: 400 });
    expect((await User.findByPk(userId))!.units).toBe('us');
  });

  it('shows a new API token once, stores only its hash, and refuses it after revocation', async () => {
    const cookie = await signInCookie(server.url, email, 'second-password-2');
    const created = await (await action(cookie, 'createToken', { name: 'sweep script', expires: '30' })).json();
    expect(created.type).toBe('success');
    const token = created.data.match(/lw_[A-Za-z0-9_-]{43}/)?.[0];
    expect(token).toBeTruthy();

    const row = (await ApiToken.findOne({ where: { userId, name: 'sweep script' } }))!;
    expect(row.tokenHash).not.toContain(token!.slice(3));
    expect(row.expiresAt!.getTime() - Date.now()).toBeGreaterThan(29 * 86_400_000);

    // The settings page lists it by prefix only.
    const page = await (await fetch(`${server.url}/settings`, { headers: { cookie } })).text();
    expect(page).toContain('sweep script');
    expect(page).not.toContain(token!);

    const ws = (await Workspace.findOne({ where: { slug: 'small-launcher' } }))!;
    const api = () => fetch(`${server.url}/api/workspaces/${ws.id}/catalogue`, { headers: { authorization: `Bearer ${token}` } });
    expect((await api()).status).toBe(200);
    expect((await action(cookie, 'revokeToken', { id: String(row.id) }, 'text/html')).status).toBe(303);
    expect((await api()).status).toBe(401);
  });

  it('lets an admin rename a workspace and edit its notes, and refuses a viewer', async () => {
    const ws = await Workspace.create({ name: `Rename me ${tag}`, slug: `rename-${tag}`, description: 'old notes' });
    try {
      await Membership.create({ userId, workspaceId: ws.id, role: 'admin' });
      const cookie = await signInCookie(server.url, email, 'second-password-2');
      const post = (body: Record<string, string>, accept = 'text/html') =>
        fetch(`${server.url}/w/${ws.slug}/settings`, {
          method: 'POST',
          redirect: 'manual',
          headers: { cookie, origin: server.url, accept, 'content-type': 'application/x-www-form-urlencoded', ...(accept === 'application/json' ? { 'x-sveltekit-action': 'true' } : {}) },
          body: new URLSearchParams(body)
        });
      const blank = await (await post({ name: '  ', description: 'x' }, 'application/json')).json();
      expect(blank).toMatchObject({ type: 'failure', status: 400 });
      expect(blank.data).toContain('Enter a name');
      expect((await post({ name: `Renamed ${tag}`, description: 'Trades for a new upper stage.' })).status).toBe(303);
      const after = (await Workspace.findByPk(ws.id))!;
      expect([after.name, after.description, after.slug]).toEqual([`Renamed ${tag}`, 'Trades for a new upper stage.', `rename-${tag}`]);

      await Membership.update({ role: 'viewer' }, { where: { userId, workspaceId: ws.id } });
      expect((await post({ name: 'Viewer was here', description: '' })).status).toBe(403);
      expect((await Workspace.findByPk(ws.id))!.name).toBe(`Renamed ${tag}`);
    } finally {
      await ws.destroy();
    }
  });
});
