/**
 * The sweep JSON API through the built server (`node build/index.js`): session cookies and
 * Bearer tokens, roles, 404 for other workspaces, field errors, sorted pages with keyset
 * cursors, the front, one case re-evaluated, the streamed CSV with neutralised formula
 * cells, previews, token revocation, and 503 when the queue is unreachable.
 */
import './sweeps-env';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sequelize } from '../../src/lib/server/db/sequelize';
import { closeQueues, queue } from '../../src/lib/server/queue';
import { closeRawPool, withConnection } from '../../src/lib/server/sweeps/pool';
import { signInCookie, startWebServer, type Running } from '../helpers/processes';
import { sizingSpec, waitFor, workers } from './sweeps-support';

const PORT = 3131;
let server: Running & { url: string };
let farm: Running[] = [];
const cookies: Record<string, string> = {};

async function call(path: string, opts: { as?: string; bearer?: string; method?: string; body?: unknown; url?: string } = {}) {
  const headers: Record<string, string> = { accept: 'application/json' };
  if (opts.as) headers.cookie = cookies[opts.as];
  if (opts.bearer) headers.authorization = `Bearer ${opts.bearer}`;
  if (opts.body !== undefined) headers['content-type'] = 'application/json';
  const base = opts.url ?? server.url;
  if (opts.method && opts.method !== 'GET') headers.origin = base;
  const res = await fetch(`${base}${path}`, { method: opts.method ?? 'GET', headers, body: opts.body === undefined ? undefined : JSON.stringify(opts.body) });
  const text = await res.text();
  let body: any = text;
  try {
    body = JSON.parse(text);
  } catch {
    /* CSV or text */
  }
  return { status: res.status, body, headers: res.headers, text };
}

let studyId: string;
let heavyStudyId: string;
let sweepId: number;

beforeAll(async () => {
  await queue('sweeps').obliterate({ force: true });
  server = await startWebServer(PORT, { LOFTWISE_ENV: 'test' });
  farm = workers(1, 'api');
  for (const who of ['engineer', 'viewer', 'admin']) cookies[who] = await signInCookie(server.url, `${who}@tarnwick.example`);
});

afterAll(async () => {
  await Promise.all(farm.map((w) => w.stop()));
  await server?.stop();
  await closeQueues();
  await closeRawPool();
  await sequelize.close();
});

describe('studies and sweeps over HTTP', () => {
  it('creates studies (engineer+, viewer 403) and lists them', async () => {
    const created = await call('/api/studies', { as: 'engineer', method: 'POST', body: { workspace: 'small-launcher', name: 'API study', question: 'Which upper stage?' } });
    expect(created.status).toBe(201);
    studyId = created.body.id;
    const heavy = await call('/api/studies', { as: 'engineer', method: 'POST', body: { workspace: 'heavy-concepts', name: 'Heavy study' } });
    heavyStudyId = heavy.body.id;
    const denied = await call('/api/studies', { as: 'viewer', method: 'POST', body: { workspace: 'small-launcher', name: 'nope' } });
    expect(denied.status).toBe(403);
    const bad = await call('/api/studies', { as: 'engineer', method: 'POST', body: { workspace: 'small-launcher', name: '' } });
    expect(bad.status).toBe(400);
    expect(bad.body.errors.name).toMatch(/needs a name/);
    const list = await call('/api/studies?workspace=small-launcher', { as: 'viewer' });
    expect(list.body.studies.map((s: { id: string }) => s.id)).toContain(studyId);
    const hidden = await call(`/api/studies/${heavyStudyId}`, { as: 'viewer' });
    expect(hidden.status).toBe(404);
    const patched = await call(`/api/studies/${studyId}`, { as: 'engineer', method: 'PATCH', body: { notes: 'kept', archived: false } });
    expect(patched.body.notes).toBe('kept');
  });

  it('creates and runs a sweep (201), refuses bad specs with field errors, hides it from other workspaces', async () => {
    const spec = sizingSpec(1_500, 'api sweep') as any;
    // A catalogue entry whose id and name a spreadsheet would run as formulas.
    spec.sweep.parameters[1].values.options[0].id = '=HYPERLINK("http://x.invalid")';
    spec.sweep.parameters[1].values.options[0].name = '+cmd';
    const res = await call('/api/sweeps', { as: 'engineer', method: 'POST', body: { studyId, spec } });
    expect(res.status).toBe(201);
    sweepId = res.body.id;
    expect(res.body.counts.total).toBe(1_500);

    const bad = await call('/api/sweeps', { as: 'engineer', method: 'POST', body: { studyId, spec: { ...spec, mode: 'warp' } } });
    expect(bad.status).toBe(400);
    expect(bad.body.errors['spec.mode']).toMatch(/budget/);
    expect((await call('/api/sweeps', { as: 'viewer', method: 'POST', body: { studyId, spec } })).status).toBe(403);
    expect((await call('/api/sweeps', { as: 'viewer', method: 'POST', body: { studyId: heavyStudyId, spec } })).status).toBe(404);

    const done = await waitFor('the sweep to complete', async () => {
      const r = await call(`/api/sweeps/${sweepId}`, { as: 'viewer' });
      return r.body.status === 'completed' ? r.body : null;
    }, 45_000, 200);
    expect(done.counts.done).toBe(1_500);
    expect(done.progress).toBe(1);
    expect(done.summary.best).toHaveLength(2);

    expect((await call(`/api/sweeps/${sweepId}/cancel`, { as: 'viewer', method: 'POST' })).status).toBe(403);
    expect((await call(`/api/sweeps/${sweepId}/cancel`, { as: 'engineer', method: 'POST' })).status).toBe(409);
    const theirs = await call('/api/sweeps', { as: 'engineer', method: 'POST', body: { studyId: heavyStudyId, spec: sizingSpec(30), start: false } });
    expect((await call(`/api/sweeps/${theirs.body.id}`, { as: 'viewer' })).status).toBe(404);
    expect((await call(`/api/sweeps/${theirs.body.id}/cases`, { as: 'viewer' })).status).toBe(404);
    expect((await call('/api/sweeps/abc', { as: 'viewer' })).status).toBe(404);
    const list = await call('/api/sweeps?workspace=small-launcher', { as: 'viewer' });
    expect(list.body.sweeps.map((s: { id: number }) => s.id)).toContain(sweepId);
    expect(list.body.sweeps.map((s: { id: number }) => s.id)).not.toContain(theirs.body.id);
  });

  it('serves sorted, filtered pages with keyset cursors that match the database order', async () => {
    const p1 = await call(`/api/sweeps/${sweepId}/cases?sort=glow&dir=asc&limit=25&feasible=1`, { as: 'viewer' });
    expect(p1.status).toBe(200);
    expect(p1.body.cases).toHaveLength(25);
    const p2 = await call(`/api/sweeps/${sweepId}/cases?sort=glow&dir=asc&limit=25&feasible=1&after=${encodeURIComponent(p1.body.next)}`, { as: 'viewer' });
    const got = [...p1.body.cases, ...p2.body.cases].map((c: { caseIndex: number }) => c.caseIndex);
    const expected = (await withConnection((c) =>
      c.query({ sql: 'SELECT case_index FROM sweep_cases WHERE sweep_id = ? AND feasible = 1 ORDER BY glow, case_index LIMIT 50', rowsAsArray: true }, [sweepId])
    )) as number[][];
    expect(got).toEqual(expected.map((r) => r[0]));
    expect(p1.body.cases.every((c: { feasible: boolean }) => c.feasible)).toBe(true);

    const ranged = await call(`/api/sweeps/${sweepId}/cases?sort=dryMass&dir=desc&max.glow=20000&limit=10`, { as: 'viewer' });
    expect(ranged.body.cases.every((c: { values: { glow: number } }) => c.values.glow <= 20_000)).toBe(true);
    const dry = ranged.body.cases.map((c: { values: { dryMass: number } }) => c.values.dryMass);
    expect(dry).toEqual([...dry].sort((a, b) => b - a));

    const bad = await call(`/api/sweeps/${sweepId}/cases?sort=password&limit=0&min.nope=1`, { as: 'viewer' });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.errors).sort()).toEqual(['limit', 'min.nope', 'sort']);
  });

  it('filters on swept parameters: numeric ranges and catalogue choices, with errors naming the query field', async () => {
    // The sweep is a grid: 5 first-stage structural coefficients (0.06…0.10 by 0.01) × 3 upper-stage
    // engines × 100 lift-off T/W values = 1,500 cases; a filter on one dimension keeps that share.
    const path = 'stages.0.structuralCoefficient';
    const range = await call(`/api/sweeps/${sweepId}/cases?limit=1000&min.param.${path}=0.07&max.param.${path}=0.08`, { as: 'viewer' });
    expect(range.status).toBe(200);
    expect(range.body.total).toBe(2 * 3 * 100);
    expect(range.body.cases.every((c: { params: Record<string, number> }) => c.params[path] >= 0.07 - 1e-12 && c.params[path] <= 0.08 + 1e-12)).toBe(true);
    expect(new Set(range.body.cases.map((c: { params: Record<string, number> }) => c.params[path].toFixed(2)))).toEqual(new Set(['0.07', '0.08']));

    const engine = 'stages.1.propulsion';
    const one = await call(`/api/sweeps/${sweepId}/cases?limit=10&is.param.${engine}=pl-hx-vac&sort=glow`, { as: 'viewer' });
    expect(one.body.total).toBe(500);
    expect(one.body.cases.every((c: { params: Record<string, string> }) => c.params[engine] === 'pl-hx-vac')).toBe(true);
    const two = await call(`/api/sweeps/${sweepId}/cases?limit=1&is.param.${engine}=pl-hx-vac,pl-mx-vac&min.param.${path}=0.1`, { as: 'viewer' });
    expect(two.body.total).toBe(2 * 100);

    const bad = await call(
      `/api/sweeps/${sweepId}/cases?min.param.stages.9.thrustToWeight=1&min.param.${engine}=2&is.param.${path}=x&max.param.liftoffThrustToWeight=abc`,
      { as: 'viewer' }
    );
    expect(bad.status).toBe(400);
    expect(bad.body.errors['max.param.liftoffThrustToWeight']).toMatch(/must be a number/);
    const unknownChoice = await call(`/api/sweeps/${sweepId}/cases?is.param.${engine}=no-such-engine`, { as: 'viewer' });
    expect(unknownChoice.status).toBe(400);
    expect(unknownChoice.body.errors[`is.param.${engine}`]).toMatch(/"no-such-engine" is not one of the choices/);
    const misuse = await call(`/api/sweeps/${sweepId}/cases?min.param.stages.9.thrustToWeight=1&min.param.${engine}=2&is.param.${path}=x`, { as: 'viewer' });
    expect(misuse.status).toBe(400);
    expect(Object.keys(misuse.body.errors).sort()).toEqual([`is.param.${path}`, `min.param.${engine}`, 'min.param.stages.9.thrustToWeight']);
    expect(misuse.body.errors['min.param.stages.9.thrustToWeight']).toMatch(/not swept here/);
  });

  it('returns the front (rank 1) and one case re-evaluated identically', async () => {
    const f = await call(`/api/sweeps/${sweepId}/front`, { as: 'viewer' });
    expect(f.body.live).toBe(false);
    expect(f.body.size).toBeGreaterThan(0);
    expect(f.body.cases.every((c: { paretoRank: number }) => c.paretoRank === 1)).toBe(true);
    const one = f.body.cases[0];
    const detail = await call(`/api/sweeps/${sweepId}/cases/${one.caseIndex}`, { as: 'viewer' });
    expect(detail.status).toBe(200);
    expect(detail.body.stored.caseIndex).toBe(one.caseIndex);
    expect(detail.body.evaluation.values.glow).toBe(one.values.glow);
    expect(detail.body.evaluation.values.requiredDeltaV).toBe(one.values.requiredDeltaV);
    expect((await call(`/api/sweeps/${sweepId}/cases/1500`, { as: 'viewer' })).status).toBe(404);
  });

  it('streams the CSV export with formula cells neutralised', async () => {
    const res = await fetch(`${server.url}/api/sweeps/${sweepId}/export.csv`, { headers: { cookie: cookies.viewer } });
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toMatch(/text\/csv/);
    expect(res.headers.get('content-length')).toBeNull();
    const reader = res.body!.getReader();
    let chunks = 0;
    let text = '';
    for (;;) {
      const { done, value } = await reader.read();
      if (done) break;
      chunks++;
      text += new TextDecoder().decode(value);
    }
    expect(chunks).toBeGreaterThan(1);
    const lines = text.trimEnd().split('\r\n');
    expect(lines).toHaveLength(1_501);
    expect(lines[0]).toContain('stages.1.propulsion');
    expect(text).toContain(`"'=HYPERLINK(""http://x.invalid"")"`);
    expect(text).not.toMatch(/(^|,)=HYPERLINK/m);
  });

  it('exports only the cases matching the table filters, in case order', async () => {
    const engine = 'stages.1.propulsion';
    const res = await call(`/api/sweeps/${sweepId}/export.csv?is.param.${engine}=pl-hx-vac&feasible=1`, { as: 'viewer' });
    expect(res.status).toBe(200);
    expect(res.headers.get('content-disposition')).toMatch(/-filtered\.csv"$/);
    const lines = res.text.trimEnd().split('\r\n');
    const col = lines[0].split(',').indexOf(engine);
    const feasibleCol = lines[0].split(',').indexOf('feasible');
    const body = lines.slice(1).map((l) => l.split(','));
    // The same set the cases API counts for these filters.
    const counted = await call(`/api/sweeps/${sweepId}/cases?is.param.${engine}=pl-hx-vac&feasible=1&limit=1`, { as: 'viewer' });
    expect(body).toHaveLength(counted.body.total);
    expect(body.length).toBeGreaterThan(0);
    expect(body.every((cells) => cells[col] === 'pl-hx-vac' && cells[feasibleCol] === '1')).toBe(true);
    const order = body.map((cells) => Number(cells[0]));
    expect(order).toEqual([...order].sort((a, b) => a - b));
    const bad = await call(`/api/sweeps/${sweepId}/export.csv?is.param.${engine}=nope`, { as: 'viewer' });
    expect(bad.status).toBe(400);
    expect(bad.body.errors[`is.param.${engine}`]).toMatch(/not one of the choices/);
  });

  it('previews one case from an unsaved spec, with field errors for a bad one', async () => {
    const ok = await call('/api/evaluate', { as: 'viewer', method: 'POST', body: { spec: sizingSpec(30), caseIndex: 3 } });
    expect(ok.status).toBe(200);
    expect(ok.body.caseIndex).toBe(3);
    expect(ok.body.values.glow).toBeGreaterThan(0);
    const bad = await call('/api/evaluate', { as: 'viewer', method: 'POST', body: { spec: { ...sizingSpec(30), objectives: [] } } });
    expect(bad.status).toBe(400);
    expect(bad.body.errors['spec.objectives']).toBeTruthy();
  });

  it('deletes a sweep with its cases (owner or admin, not while queued or running; viewer 403)', async () => {
    const d = await call('/api/sweeps', { as: 'engineer', method: 'POST', body: { studyId, spec: sizingSpec(300, 'to delete') } });
    const id = d.body.id;
    await waitFor('the sweep to complete', async () => (await call(`/api/sweeps/${id}`, { as: 'engineer' })).body.status === 'completed', 30_000, 200);
    expect((await call(`/api/sweeps/${id}`, { as: 'viewer', method: 'DELETE' })).status).toBe(403);
    expect((await call(`/api/sweeps/${id}`, { as: 'engineer', method: 'DELETE' })).status).toBe(200);
    expect((await call(`/api/sweeps/${id}`, { as: 'engineer' })).status).toBe(404);
    const [left] = await withConnection((c) =>
      c.query(
        `SELECT (SELECT COUNT(*) FROM sweep_cases WHERE sweep_id = ?) AS cases, (SELECT COUNT(*) FROM sweep_chunks WHERE sweep_id = ?) AS chunks,
                (SELECT COUNT(*) FROM sweep_front_marks WHERE sweep_id = ?) AS marks`,
        [id, id, id]
      )
    );
    expect([Number(left.cases), Number(left.chunks), Number(left.marks)]).toEqual([0, 0, 0]);
  });

  it('personal API tokens: created from a session, used as Bearer, revoked', async () => {
    const t = await call('/api/tokens', { as: 'engineer', method: 'POST', body: { name: 'script' } });
    expect(t.status).toBe(201);
    expect(t.body.token).toMatch(/^lw_/);
    const viaToken = await call(`/api/sweeps/${sweepId}`, { bearer: t.body.token });
    expect(viaToken.status).toBe(200);
    expect((await call('/api/tokens', { bearer: t.body.token, method: 'POST', body: { name: 'more' } })).status).toBe(403);
    expect((await call(`/api/tokens/${t.body.id}`, { as: 'viewer', method: 'DELETE' })).status).toBe(404);
    expect((await call(`/api/tokens/${t.body.id}`, { as: 'engineer', method: 'DELETE' })).status).toBe(200);
    expect((await call(`/api/sweeps/${sweepId}`, { bearer: t.body.token })).status).toBe(401);
  });

  it('answers 503 when the queue is unreachable and keeps the sweep as a draft', async () => {
    const down = await startWebServer(PORT + 1, { LOFTWISE_ENV: 'test', REDIS_PORT: '1' });
    try {
      const cookie = await signInCookie(down.url, 'engineer@tarnwick.example');
      const res = await fetch(`${down.url}/api/sweeps`, {
        method: 'POST',
        headers: { cookie, origin: down.url, 'content-type': 'application/json' },
        body: JSON.stringify({ studyId, spec: sizingSpec(30, 'no queue') })
      });
      expect(res.status).toBe(503);
      const [row] = await withConnection((c) => c.query("SELECT status, error FROM sweeps WHERE name = 'no queue'"));
      expect(row.status).toBe('draft');
      expect(row.error).toMatch(/queue/);
    } finally {
      await down.stop();
    }
  });
});
