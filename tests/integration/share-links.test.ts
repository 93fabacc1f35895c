/**
 * Share links carry the display units of their report, through the built server: the sweep
 * page's share action stores `units` (default: the creator's own setting; a bad value is a
 * field error naming `units`), the signed-out share page renders the report in the link's
 * units, and the reader's ?units=si|us switch overrides them (anything else falls back).
 * Uses the completed demo sweep of the seed and a user of its own whose setting is US customary.
 *
 * Conversion checked against NIST SP 811 (2008), Appendix B.8: 1 lb = 0.453 592 37 kg (exact),
 * so the demo sweep's 500 kg payload is 500 / 0.45359237 = 1102.31 lb, shown as "1,102 lb".
 * Its 500 km orbit is 310.69 mi (1 mi = 1609.344 m).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { Op } from 'sequelize';
import { sequelize } from '../../src/lib/server/db/sequelize';
import { Membership, ShareLink, Sweep, User, Workspace } from '../../src/lib/server/db/models';
import { hashPassword } from '../../src/lib/server/password';
import { signInCookie, startWebServer, type Running } from '../helpers/processes';

const PORT = 3115;
const WS = 'small-launcher';
const tag = randomUUID().slice(0, 8);
const email = `share-us-${tag}@share-test.example`;
const PASSWORD = 'share-units-pass-1';
const DEMO_SWEEP = 'Fennel-2 sizing for 500 kg to 500 km SSO';

describe('share links in the units of their report', () => {
  let server: Running & { url: string };
  let userId: string;
  let sweepId: number;
  let usCookie: string; // own engineer, units 'us'
  let siCookie: string; // demo engineer, units 'si'

  beforeAll(async () => {
    const u = await User.create({ email, displayName: 'Ima Pound', passwordHash: await hashPassword(PASSWORD), units: 'us' });
    userId = u.id;
    const ws = (await Workspace.findOne({ where: { slug: WS } }))!;
    await Membership.create({ userId, workspaceId: ws.id, role: 'engineer' });
    const sweep = await Sweep.findOne({ where: { workspaceId: ws.id, name: DEMO_SWEEP } });
    if (!sweep || sweep.status !== 'completed') throw new Error('the seed has no completed demo sweep');
    sweepId = sweep.id;
    server = await startWebServer(PORT, { LOFTWISE_ENV: 'test' });
    usCookie = await signInCookie(server.url, email, PASSWORD);
    siCookie = await signInCookie(server.url, 'engineer@tarnwick.example');
  });
  afterAll(async () => {
    await server?.stop();
    await ShareLink.destroy({ where: { sweepId: sweepId ?? 0, label: { [Op.like]: `%${tag}%` } } });
    if (userId) await User.destroy({ where: { id: userId } });
    await sequelize.close();
  });

  const sweepPath = () => `/w/${WS}/sweeps/${sweepId}`;

  /** The share form action as `use:enhance` posts it; the JSON answer's data is devalue text. */
  async function share(cookie: string, body: Record<string, string>) {
    const res = await fetch(`${server.url}${sweepPath()}?/share`, {
      method: 'POST',
      redirect: 'manual',
      headers: {
        cookie,
        origin: server.url,
        accept: 'application/json',
        'x-sveltekit-action': 'true',
        'content-type': 'application/x-www-form-urlencoded'
      },
      body: new URLSearchParams(body)
    });
    const json = (await res.json()) as { type: string; status: number; data: string };
    const path = json.data.match(/\/share\/[A-Za-z0-9_-]{43}/)?.[0] ?? null;
    return { json, path };
  }

  async function created(cookie: string, body: Record<string, string>) {
    const { json, path } = await share(cookie, body);
    expect(json.type, json.data).toBe('success');
    expect(path).not.toBeNull();
    return path!;
  }

  /** The share page signed out (no cookie at all). */
  async function open(path: string) {
    const res = await fetch(`${server.url}${path}`, { redirect: 'manual' });
    return { status: res.status, html: await res.text() };
  }

  const unitsOf = async (label: string) => (await ShareLink.findOne({ where: { sweepId, label } }))?.units;

  it('stores units=us and the signed-out share page shows the report in US customary units', async () => {
    const label = `us report ${tag}`;
    const path = await created(siCookie, { label, days: '7', units: 'us' });
    expect(await unitsOf(label)).toBe('us');

    const { status, html } = await open(path);
    expect(status).toBe(200);
    expect(html).toContain('GLOW (lb)');
    expect(html).toContain('Payload (lb)');
    expect(html).not.toContain('GLOW (kg)');
    expect(html).not.toContain('Payload (kg)');
    // NIST SP 811 B.8: 500 kg / 0.45359237 kg/lb = 1102.31 lb.
    expect(html).toContain('payload of 1,102 lb');
    // The 500 km orbit in statute miles: 500 / 1.609344 = 310.69 mi (NIST SP 811 B.8, exact factor).
    expect(html).toContain('circular at 310.7 mi');
    // The reader's switch, with the current system marked; still no way into the app.
    expect(html).toMatch(/<a[^>]*href="\?units=us"[^>]*aria-current="true"/);
    expect(html).toMatch(/<a[^>]*href="\?units=si"/);
    expect(html).not.toMatch(/href="\/(w|api|settings|dashboard)\b/);
  });

  it('switches units with ?units=si|us, and an invalid value falls back to the link’s units', async () => {
    const usPath = await created(siCookie, { label: `switch us ${tag}`, days: '1', units: 'us' });
    const si = await open(`${usPath}?units=si`);
    expect(si.status).toBe(200);
    expect(si.html).toContain('GLOW (kg)');
    expect(si.html).toContain('payload of 500 kg');
    expect(si.html).not.toContain('GLOW (lb)');
    expect(si.html).toMatch(/<a[^>]*href="\?units=si"[^>]*aria-current="true"/);

    for (const bad of ['metric', 'US', '', 'si%20']) {
      const r = await open(`${usPath}?units=${bad}`);
      expect(r.status, bad).toBe(200);
      expect(r.html, bad).toContain('GLOW (lb)');
      expect(r.html, bad).not.toContain('GLOW (kg)');
    }

    const siPath = await created(siCookie, { label: `switch si ${tag}`, days: '1', units: 'si' });
    expect((await open(siPath)).html).toContain('GLOW (kg)');
    const us = await open(`${siPath}?units=us`);
    expect(us.html).toContain('GLOW (lb)');
    expect(us.html).not.toContain('GLOW (kg)');
    expect((await open(`${siPath}?units=furlong`)).html).toContain('GLOW (kg)');
  });

  it('defaults to the creating user’s own units when the form leaves them out', async () => {
    await created(usCookie, { label: `default us ${tag}`, days: '30' });
    expect(await unitsOf(`default us ${tag}`)).toBe('us');
    await created(siCookie, { label: `default si ${tag}`, days: '30' });
    expect(await unitsOf(`default si ${tag}`)).toBe('si');
    // A user whose setting is US customary can still share in SI.
    await created(usCookie, { label: `chosen si ${tag}`, days: '30', units: 'si' });
    expect(await unitsOf(`chosen si ${tag}`)).toBe('si');
  });

  it('refuses a bad units value with a field error naming units, and creates nothing', async () => {
    const before = await ShareLink.count({ where: { sweepId } });
    for (const bad of ['cubits', 'SI', 'metric']) {
      const { json, path } = await share(siCookie, { label: `bad ${bad} ${tag}`, days: '30', units: bad });
      expect(json.type, bad).toBe('failure');
      expect(json.status, bad).toBe(400);
      expect(path).toBeNull();
      expect(json.data).toContain('"units"');
      expect(json.data).toContain('choose si (SI) or us (US customary) units for the report');
    }
    // The other fields keep their own errors, each under its field.
    const both = await share(siCookie, { label: 'x'.repeat(121), days: '5', units: 'us' });
    expect(both.json.status).toBe(400);
    expect(both.json.data).toContain('the label is at most 120 characters');
    expect(both.json.data).toContain('choose 1, 7, 30, 90 days');
    expect(await ShareLink.count({ where: { sweepId } })).toBe(before);
  });

  it('the sweep page offers the units select preselected with the user’s units and lists each link’s units', async () => {
    const page = async (cookie: string) => {
      const res = await fetch(`${server.url}${sweepPath()}`, { headers: { cookie }, redirect: 'manual' });
      expect(res.status).toBe(200);
      return res.text();
    };
    const us = await page(usCookie);
    expect(us).toMatch(/<label[^>]*for="sh-units"[^>]*>Units in the report<\/label>/);
    expect(us).toMatch(/<option value="us"[^>]*selected/);
    expect(us).not.toMatch(/<option value="si"[^>]*selected/);
    const si = await page(siCookie);
    expect(si).toMatch(/<option value="si"[^>]*selected/);
    expect(si).not.toMatch(/<option value="us"[^>]*selected/);
    // The links table: a units cell per link, with the ones made above.
    expect(si).toMatch(/<td[^>]*data-units="us"[^>]*>US customary<\/td>/);
    expect(si).toMatch(/<td[^>]*data-units="si"[^>]*>SI<\/td>/);
  });
});
