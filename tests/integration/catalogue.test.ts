/**
 * The propulsion catalogue on the real test database: all-or-nothing CSV import (a bad row,
 * a name already taken, a failure inside the transaction), workspace isolation, and through
 * the built server the JSON endpoint and the role check on the form actions (a viewer's
 * forged POST is refused). Works in workspaces of its own; the seeded demo data is only read.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { sequelize } from '../../src/lib/server/db/sequelize';
import { CatalogueEntry, Membership, User, Workspace } from '../../src/lib/server/db/models';
import * as catalogue from '../../src/lib/server/catalogue';
import { createToken } from '../../src/lib/server/tokens';
import { DEMO_CATALOGUE } from '../../src/lib/server/db/seed-catalogue';
import type { CatalogueEntry as CatalogueEntryT } from '../../src/lib/schemas/catalogue';
import { signInCookie, startWebServer, type Running } from '../helpers/processes';

const tag = randomUUID().slice(0, 8);
const created: string[] = [];
async function workspace() {
  const ws = await Workspace.create({ name: `Catalogue test ${tag}`, slug: `cat-${tag}-${created.length}`, description: '' });
  created.push(ws.id);
  return ws;
}
const count = (workspaceId: string) => CatalogueEntry.count({ where: { workspaceId } });

const HEAD = 'name,propellants,isp_sl_s,isp_vac_s,thrust_n,mass_kg,notes';
const GOOD = [`${HEAD}`, 'Alder A-1,LOX/RP-1,290,320,850000,1100,GG', 'Birch B-2,LOX/LH2,,450,100000,300,', 'Cedar C-3,LOX/CH4,305,340,200000,210,'].join('\n');

afterAll(async () => {
  await Workspace.destroy({ where: { id: created } });
  await sequelize.close();
});

describe('CSV import is all or nothing', () => {
  it('imports nothing when one row is bad, and reports that row and column', async () => {
    const ws = await workspace();
    const bad = GOOD.replace('Birch B-2,LOX/LH2,,450', 'Birch B-2,LOX/LH2,,four-fifty');
    const r = await catalogue.importCsv(ws.id, bad);
    expect(r).toEqual({ ok: false, errors: [{ row: 3, field: 'isp_vac_s', message: 'Vacuum Isp must be a number' }] });
    expect(await count(ws.id)).toBe(0);
  });

  it('imports every row of a good file in SI', async () => {
    const ws = await workspace();
    expect(await catalogue.importCsv(ws.id, GOOD)).toEqual({ ok: true, imported: 3 });
    const rows = await catalogue.list(ws.id);
    expect(rows.map((e) => e.name)).toEqual(['Alder A-1', 'Birch B-2', 'Cedar C-3']);
    expect(rows[1]).toMatchObject({ ispSeaLevelS: null, ispVacuumS: 450, thrustVacuumN: 100000, massKg: 300 });
  });

  it('refuses names already in the catalogue (case-insensitively) on their rows, importing nothing', async () => {
    const ws = await workspace();
    await catalogue.create(ws.id, { name: 'cedar c-3', propellants: 'LOX/CH4', ispSeaLevelS: 300, ispVacuumS: 330, thrustVacuumN: 1e5, massKg: 100, notes: '' });
    const r = await catalogue.importCsv(ws.id, GOOD);
    expect(r).toEqual({ ok: false, errors: [{ row: 4, field: 'name', message: '"Cedar C-3" is already in this catalogue' }] });
    expect(await count(ws.id)).toBe(1);
  });

  it('rolls back rows already written when a later insert fails inside the transaction', async () => {
    const ws = await workspace();
    const e = { propellants: 'LOX/RP-1', ispSeaLevelS: 290, ispVacuumS: 320, thrustVacuumN: 1e5, massKg: 100, notes: '' };
    // importEntries trusts its caller; the unique (workspace, name) index stops the third row.
    await expect(catalogue.importEntries(ws.id, [{ name: 'One', ...e }, { name: 'Two', ...e }, { name: 'ONE', ...e }])).rejects.toBeInstanceOf(
      catalogue.DuplicateNameError
    );
    expect(await count(ws.id)).toBe(0);
  });

  it('keeps workspaces apart: another workspace cannot read, change or delete an entry', async () => {
    const [a, b] = [await workspace(), await workspace()];
    const entry = await catalogue.create(a.id, { name: 'Solo', propellants: 'LOX/RP-1', ispSeaLevelS: null, ispVacuumS: 320, thrustVacuumN: 1e5, massKg: 100, notes: '' });
    expect(await catalogue.read(b.id, entry.id)).toBeNull();
    expect(await catalogue.update(b.id, entry.id, { ...entry, name: 'Stolen' })).toBeNull();
    expect(await catalogue.destroy(b.id, entry.id)).toBe(false);
    expect((await catalogue.read(a.id, entry.id))!.name).toBe('Solo');
    // The same name is fine in another workspace.
    await expect(catalogue.create(b.id, { ...entry, notes: '' })).resolves.toMatchObject({ name: 'Solo' });
  });
});

describe('through the built server', () => {
  const PORT = 3113;
  let server: Running & { url: string };
  let smallLauncher: Workspace;
  let heavy: Workspace;
  beforeAll(async () => {
    server = await startWebServer(PORT, { LOFTWISE_ENV: 'test' });
    smallLauncher = (await Workspace.findOne({ where: { slug: 'small-launcher' } }))!;
    heavy = (await Workspace.findOne({ where: { slug: 'heavy-concepts' } }))!;
  });
  afterAll(async () => {
    await server?.stop();
  });

  it('serves the catalogue as JSON in SI to any member, and 404 to others', async () => {
    const viewer = (await User.findOne({ where: { email: 'viewer@tarnwick.example' } }))!;
    const { token } = await createToken(viewer.id, `catalogue test ${tag}`);
    const get = (id: string, headers: Record<string, string> = { authorization: `Bearer ${token}` }) =>
      fetch(`${server.url}/api/workspaces/${id}/catalogue`, { headers });

    const res = await get(smallLauncher.id);
    expect(res.status).toBe(200);
    const body = await res.json();
    const demo = DEMO_CATALOGUE['small-launcher'];
    expect(body.entries).toHaveLength(demo.length);
    const k90 = body.entries.find((e: { name: string }) => e.name === 'Tallow T-90');
    expect(k90).toMatchObject({ propellants: 'LOX/RP-1', ispSeaLevelS: 288, ispVacuumS: 312, thrustVacuumN: 95000, massKg: 118 });

    // The viewer is not a member of heavy-concepts: same answer as a workspace that does not exist.
    expect((await get(heavy.id)).status).toBe(404);
    expect((await get(randomUUID())).status).toBe(404);
    expect((await get(smallLauncher.id, {})).status).toBe(401);
  });

  it('exports the catalogue as CSV that imports back into another workspace unchanged', async () => {
    const cookie = await signInCookie(server.url, 'viewer@tarnwick.example');
    const res = await fetch(`${server.url}/w/small-launcher/catalogue/export.csv`, { headers: { cookie } });
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toBe('text/csv; charset=utf-8');
    const text = await res.text();
    const copy = await workspace();
    expect(await catalogue.importCsv(copy.id, text)).toEqual({ ok: true, imported: DEMO_CATALOGUE['small-launcher'].length });
    const strip = ({ id: _i, workspaceId: _w, createdAt: _c, updatedAt: _u, ...e }: CatalogueEntryT) => e;
    expect((await catalogue.list(copy.id)).map(strip)).toEqual((await catalogue.list(smallLauncher.id)).map(strip));
    // Not a member of heavy-concepts: no export either.
    expect((await fetch(`${server.url}/w/heavy-concepts/catalogue/export.csv`, { headers: { cookie } })).status).toBe(404);
  });

  it("refuses a viewer's forged form posts and shows the viewer no editing controls", async () => {
    const cookie = await signInCookie(server.url, 'viewer@tarnwick.example');
    const page = await fetch(`${server.url}/w/small-launcher/catalogue`, { headers: { cookie } });
    const html = await page.text();
    expect(page.status).toBe(200);
    expect(html).toContain('Tallow T-90');
    expect(html).not.toContain('?/create');
    expect(html).not.toContain('?/delete');
    expect(html).not.toContain('Import from CSV');

    const before = await count(smallLauncher.id);
    const post = async (action: string, body: BodyInit) => {
      const res = await fetch(`${server.url}/w/small-launcher/catalogue?/${action}`, {
        method: 'POST',
        redirect: 'manual',
        headers: { cookie, origin: server.url, accept: 'application/json', 'x-sveltekit-action': 'true' },
        body
      });
      return { status: res.status, ...(await res.json()) };
    };
    const form = new URLSearchParams({ name: 'Forged', propellants: 'LOX/RP-1', ispSeaLevelS: '290', ispVacuumS: '320', thrust: '100', mass: '100' });
    const created = await post('create', form);
    expect(created).toMatchObject({ type: 'error', status: 403 });
    const anyId = (await CatalogueEntry.findOne({ where: { workspaceId: smallLauncher.id } }))!.id;
    expect(await post('delete', new URLSearchParams({ id: String(anyId) }))).toMatchObject({ type: 'error', status: 403 });
    const fd = new FormData();
    fd.set('file', new File([GOOD], 'x.csv', { type: 'text/csv' }));
    expect(await post('import', fd)).toMatchObject({ type: 'error', status: 403 });
    expect(await count(smallLauncher.id)).toBe(before);
  });

  it('lets an engineer add an entry typed in US units, stored in SI', async () => {
    const engineer = (await User.findOne({ where: { email: 'engineer@tarnwick.example' } }))!;
    const ws = await workspace();
    await Membership.create({ userId: engineer.id, workspaceId: ws.id, role: 'engineer' });
    await engineer.update({ units: 'us' });
    try {
      const cookie = await signInCookie(server.url, 'engineer@tarnwick.example');
      const res = await fetch(`${server.url}/w/${ws.slug}/catalogue?/create`, {
        method: 'POST',
        redirect: 'manual',
        headers: { cookie, origin: server.url, accept: 'text/html', 'content-type': 'application/x-www-form-urlencoded' },
        body: new URLSearchParams({ name: 'Imperial I-1', propellants: 'LOX/RP-1', ispSeaLevelS: '', ispVacuumS: '330', thrust: '200,000', mass: '2,500' })
      });
      expect(res.status).toBe(303);
      const [e] = await catalogue.list(ws.id);
      // NIST SP 811: 1 lbf = 4.4482216152605 N, 1 lb = 0.45359237 kg.
      expect(e.thrustVacuumN).toBeCloseTo(200_000 * 4.4482216152605, 6);
      expect(e.massKg).toBeCloseTo(2500 * 0.45359237, 9);
      expect(e.ispSeaLevelS).toBeNull();

      const bad = await fetch(`${server.url}/w/${ws.slug}/catalogue?/create`, {
        method: 'POST',
        headers: { cookie, origin: server.url, accept: 'application/json', 'x-sveltekit-action': 'true', 'content-type': 'application/x-www-form-urlencoded' },
        body: new URLSearchParams({ name: 'Imperial I-1', propellants: 'LOX/RP-1', ispSeaLevelS: '', ispVacuumS: '330', thrust: '1', mass: '1' })
      });
      const r = await bad.json();
      expect(r).toMatchObject({ type: 'failure', status: 400 });
      expect(r.data).toContain('already in this catalogue');
    } finally {
      await engineer.update({ units: 'si' });
    }
  });
});
