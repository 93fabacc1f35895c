import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signInCookie, startWebServer, type Running } from '../helpers/processes';

const PORT = 3111;

async function signIn(url: string, email: string, password: string) {
  return fetch(`${url}/signin`, {
    method: 'POST',
    redirect: 'manual',
    headers: { origin: url, accept: 'application/json', 'x-sveltekit-action': 'true', 'content-type': 'application/x-www-form-urlencoded' },
    body: new URLSearchParams({ email, password })
  });
}

describe('sign-in, sign-out and roles through the built server', () => {
  let server: Running & { url: string };
  beforeAll(async () => {
    server = await startWebServer(PORT, { LOFTWISE_ENV: 'test' });
  });
  afterAll(async () => {
    await server?.stop();
  });

  it('signs in with the right password and sets a session cookie', async () => {
    const res = await signIn(server.url, 'engineer@tarnwick.example', 'loftwise-demo');
    const body = await res.json();
    expect(body.type).toBe('redirect');
    expect(res.headers.getSetCookie().some((c) => c.startsWith('lw_session=') && /HttpOnly/i.test(c))).toBe(true);
  });

  it('gives the same answer for a wrong password and an unknown user', async () => {
    const wrong = await (await signIn(server.url, 'engineer@tarnwick.example', 'nope-nope')).json();
    const unknown = await (await signIn(server.url, 'nobody@tarnwick.example', 'nope-nope')).json();
    expect(wrong.type).toBe('failure');
    expect(wrong.status).toBe(400);
    expect(unknown.status).toBe(400);
    // The serialised action data is identical apart from the echoed e-mail.
    expect(wrong.data.replace('engineer@tarnwick.example', 'X')).toBe(unknown.data.replace('nobody@tarnwick.example', 'X'));
    expect(wrong.data).toContain('do not match');
  });

  it('names the field when the form is incomplete', async () => {
    const r = await (await signIn(server.url, '', '')).json();
    expect(r.status).toBe(400);
    expect(r.data).toContain('Enter your e-mail address');
  });

  it('ends the session on sign-out: the old cookie no longer works', async () => {
    const cookie = await signInCookie(server.url, 'engineer@tarnwick.example');
    const before = await fetch(`${server.url}/`, { headers: { cookie }, redirect: 'manual' });
    expect(before.status).toBe(200);
    const out = await fetch(`${server.url}/signout`, {
      method: 'POST',
      redirect: 'manual',
      headers: { cookie, origin: server.url, accept: 'text/html', 'content-type': 'application/x-www-form-urlencoded' },
      body: ''
    });
    expect(out.status).toBe(303);
    const after = await fetch(`${server.url}/`, { headers: { cookie }, redirect: 'manual' });
    expect(after.status).toBe(303);
    expect(after.headers.get('location')).toBe('/signin');
    const api = await fetch(`${server.url}/api/workspaces/00000000-0000-0000-0000-000000000000`, { headers: { cookie } });
    expect(api.status).toBe(401);
  });

  it('redirects anonymous pages to sign-in and answers anonymous API calls with 401', async () => {
    const page = await fetch(`${server.url}/w/small-launcher`, { redirect: 'manual' });
    expect(page.status).toBe(303);
    expect(page.headers.get('location')).toBe('/signin?next=%2Fw%2Fsmall-launcher');
    const api = await fetch(`${server.url}/api/workspaces/whatever`, {
      method: 'PATCH',
      headers: { 'content-type': 'application/json', origin: server.url },
      body: '{}'
    });
    expect(api.status).toBe(401);
    expect((await api.json()).message).toBe('Sign in required');
  });

  it('refuses a mutating route to a viewer with 403, hides foreign workspaces with 404, lets an admin through', async () => {
    const viewer = await signInCookie(server.url, 'viewer@tarnwick.example');
    const admin = await signInCookie(server.url, 'admin@tarnwick.example');
    const unknown = await fetch(`${server.url}/api/workspaces/no-such-workspace`, { headers: { cookie: admin } });
    expect(unknown.status).toBe(404);

    // Find the workspace ids through the admin, who belongs to both.
    const html = await (await fetch(`${server.url}/`, { headers: { cookie: admin } })).text();
    expect(html).toContain('Small Launcher');
    const { Workspace } = await import('../../src/lib/server/db/models');
    const small = await Workspace.findOne({ where: { slug: 'small-launcher' } });
    const heavy = await Workspace.findOne({ where: { slug: 'heavy-concepts' } });
    const patch = (cookie: string, id: string, body: unknown) =>
      fetch(`${server.url}/api/workspaces/${id}`, {
        method: 'PATCH',
        headers: { cookie, 'content-type': 'application/json', origin: server.url },
        body: JSON.stringify(body)
      });

    const r403 = await patch(viewer, small!.id, { description: 'viewer edit' });
    expect(r403.status).toBe(403);
    const r404 = await patch(viewer, heavy!.id, { description: 'viewer edit' });
    expect(r404.status).toBe(404);
    const r400 = await patch(admin, small!.id, { name: '' });
    expect(r400.status).toBe(400);
    expect((await r400.json()).errors.name).toBe('Name is required');
    const ok = await patch(admin, small!.id, { description: small!.description });
    expect(ok.status).toBe(200);
    const { sequelize } = await import('../../src/lib/server/db/sequelize');
    await sequelize.close();
  });
});
