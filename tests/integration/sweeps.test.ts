/**
 * The sweep engine on the real MariaDB, Redis and worker processes: complete runs, exact row
 * counts, determinism, pause/resume, cancel, a worker killed mid-chunk, two workers on one
 * sweep, an invalid stored spec, and the role/workspace checks of the sweep service.
 */
import './sweeps-env';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SMTPServer } from 'smtp-server';
import { config } from '../../src/lib/server/config';
import { MailMessage, Sweep } from '../../src/lib/server/db/models';
import { sequelize } from '../../src/lib/server/db/sequelize';
import { startMailbox } from '../../src/lib/server/mailbox';
import { fmtWithUnit } from '../../src/lib/components/quantities';
import { closeQueues, queue } from '../../src/lib/server/queue';
import { InputError } from '../../src/lib/server/sweeps/http';
import { closeRawPool, withConnection } from '../../src/lib/server/sweeps/pool';
import { enqueueChunks } from '../../src/lib/server/sweeps/runner';
import { cancelSweep, createSweep, getSweep, pauseSweep, resumeSweep } from '../../src/lib/server/sweeps/service';
import { MODEL_VERSION } from '../../src/lib/server/sweeps/engine';
import type { Running } from '../helpers/processes';
import { front } from '../../src/lib/server/sweeps/results';
import { paretoRanks } from '../../src/lib/sweep/pareto';
import { killHard, localsFor, newStudy, sizingSpec, sweepRow, waitFor, waitForStatus, workers } from './sweeps-support';

let mailbox: SMTPServer | null = null;
let farm: Running[] = [];
let engineer: App.Locals;
let viewer: App.Locals;

async function stopFarm() {
  await Promise.all(farm.map((w) => w.stop('SIGTERM')));
  farm = [];
}

/** Every stored row of a sweep, in case order (small sweeps only). */
async function rowsOf(id: number) {
  return withConnection((c) =>
    c.query(
      `SELECT case_index, feasible, failed, fail_mask, reasons, glow, payload_mass, dry_mass, propellant_mass,
              required_delta_v, total_losses, p0, p1, p2, pareto_rank
       FROM sweep_cases WHERE sweep_id = ? ORDER BY case_index`,
      [id]
    )
  ) as Promise<Record<string, unknown>[]>;
}

async function ledger(id: number) {
  const [r] = await withConnection((c) =>
    c.query('SELECT COUNT(*) AS chunks, COALESCE(SUM(case_count), 0) AS cases, COUNT(DISTINCT worker) AS workers FROM sweep_chunks WHERE sweep_id = ?', [id])
  );
  return { chunks: Number(r.chunks), cases: Number(r.cases), workers: Number(r.workers) };
}

async function countRows(id: number) {
  const [r] = await withConnection((c) =>
    c.query('SELECT COUNT(*) AS n, COUNT(DISTINCT case_index) AS d, MIN(case_index) AS lo, MAX(case_index) AS hi FROM sweep_cases WHERE sweep_id = ?', [id])
  );
  return { n: Number(r.n), distinct: Number(r.d), lo: Number(r.lo), hi: Number(r.hi) };
}

beforeAll(async () => {
  // Jobs of earlier runs (ids restart with the reset database) must not linger.
  await queue('sweeps').obliterate({ force: true });
  try {
    mailbox = await startMailbox(config.SMTP_PORT, config.SMTP_HOST);
  } catch {
    mailbox = null; // another fake SMTP server already listens: it stores into the same table
  }
  engineer = await localsFor('engineer@tarnwick.example');
  viewer = await localsFor('viewer@tarnwick.example');
});

afterAll(async () => {
  await stopFarm();
  await new Promise<void>((r) => (mailbox ? mailbox.close(() => r()) : r()));
  await closeQueues();
  await closeRawPool();
  await sequelize.close();
});

describe('one worker', () => {
  beforeAll(() => {
    farm = workers(1, 'one');
  });
  afterAll(stopFarm);

  it('completes a sweep with exactly N result rows, ranks, a summary and one e-mail', async () => {
    const study = await newStudy('small-launcher');
    const created = await createSweep(engineer, { studyId: study.id, spec: sizingSpec(3_000, 'exact rows') });
    expect(created.status).toBe('queued');
    expect(created.modelVersion).toBe(MODEL_VERSION);
    const n = created.counts.total;
    expect(n).toBe(3_000);
    expect(created.chunks.total).toBeGreaterThan(1);

    const s = await waitForStatus(created.id, 'completed', 45_000);
    expect(s.doneCases).toBe(n);
    expect(s.chunksDone).toBe(s.chunkCount);
    const rows = await countRows(s.id);
    expect(rows).toEqual({ n, distinct: n, lo: 0, hi: n - 1 });
    expect(await ledger(s.id)).toMatchObject({ chunks: s.chunkCount, cases: n });

    // Counters agree with the rows; ranks exist exactly for the feasible cases.
    const [agg] = await withConnection((c) =>
      c.query(
        `SELECT SUM(feasible) AS f, SUM(failed) AS x, SUM(pareto_rank IS NOT NULL) AS ranked, SUM(pareto_rank = 1) AS front,
                SUM(feasible = 0 AND pareto_rank IS NOT NULL) AS bad
         FROM sweep_cases WHERE sweep_id = ?`,
        [s.id]
      )
    );
    expect(Number(agg.f)).toBe(s.feasibleCases);
    expect(Number(agg.x)).toBe(s.failedCases);
    expect(s.feasibleCases).toBeGreaterThan(0);
    expect(Number(agg.ranked)).toBe(s.feasibleCases);
    expect(Number(agg.bad)).toBe(0);
    expect(Number(agg.front)).toBeGreaterThan(0);

    const summary = s.summary as { feasibleCases: number; best: { metric: string; caseIndex: number; value: number | null }[]; sensitivity: unknown[]; frontSize: number };
    expect(summary.feasibleCases).toBe(s.feasibleCases);
    expect(summary.frontSize).toBe(Number(agg.front));
    expect(summary.best.map((b) => b.metric)).toEqual(['glow', 'dryMass']);
    expect(summary.sensitivity.length).toBeGreaterThan(0);

    // The owner is told once.
    const mails = await waitFor('the completion e-mail', async () => {
      const m = await MailMessage.findAll({ where: { subject: 'Sweep completed: exact rows' } });
      return m.length ? m : null;
    });
    expect(mails).toHaveLength(1);
    expect(mails[0].rcptTo).toBe('engineer@tarnwick.example');
    // It names the best case of each objective with its value in the owner's units (SI here).
    const text = mails[0].raw ?? '';
    expect(text).toContain('Best feasible case on each objective:');
    for (const b of summary.best) expect(text).toContain(`${fmtWithUnit('mass', b.value, 'si')} (case ${b.caseIndex})`);
    expect(summary.best.every((b) => b.value! > 0)).toBe(true);
  });

  it('gives identical results for two runs of the same spec', async () => {
    const study = await newStudy('small-launcher');
    const spec = sizingSpec(1_200, 'determinism');
    const a = await createSweep(engineer, { studyId: study.id, spec });
    const b = await createSweep(engineer, { studyId: study.id, spec });
    await waitForStatus(a.id, 'completed');
    await waitForStatus(b.id, 'completed');
    const ra = await rowsOf(a.id);
    const rb = await rowsOf(b.id);
    expect(ra.length).toBe(1_200);
    expect(rb).toEqual(ra);
  });

  it('pauses (no more chunks land) and resumes to completion with nothing lost or doubled', async () => {
    const study = await newStudy('small-launcher');
    const created = await createSweep(engineer, { studyId: study.id, spec: sizingSpec(24_000, 'pause and resume') });
    await waitFor('a chunk with feasible cases', async () => (await sweepRow(created.id)).feasibleCases >= 1, 30_000, 25);
    const paused = await pauseSweep(engineer, created.id);
    expect(paused.status).toBe('paused');
    // An in-flight chunk is refused at commit: the counters freeze.
    await new Promise((r) => setTimeout(r, 2_500));
    const frozen = await sweepRow(created.id);
    expect(frozen.status).toBe('paused');
    expect(frozen.doneCases).toBeLessThan(frozen.totalCases);
    await new Promise((r) => setTimeout(r, 1_000));
    expect((await sweepRow(created.id)).doneCases).toBe(frozen.doneCases);
    expect((await countRows(created.id)).n).toBe(frozen.doneCases);

    // The live front (merged per-chunk marks) is exactly the non-dominated set of what is stored.
    const live = await front(frozen);
    expect(live.live).toBe(true);
    const stored = (await withConnection((c) =>
      c.query({ sql: 'SELECT case_index, glow, dry_mass FROM sweep_cases WHERE sweep_id = ? AND feasible = 1 ORDER BY case_index', rowsAsArray: true }, [frozen.id])
    )) as number[][];
    const ranks = paretoRanks([Float64Array.from(stored, (r) => r[1]), Float64Array.from(stored, (r) => r[2])], ['min', 'min']);
    const expected = stored.filter((_, i) => ranks[i] === 1).map((r) => r[0]);
    expect(expected.length).toBeGreaterThan(0);
    expect(live.cases.map((c) => c.caseIndex).sort((a, b) => a - b)).toEqual(expected);

    const resumed = await resumeSweep(engineer, created.id);
    expect(resumed.status).toBe('queued');
    const s = await waitForStatus(created.id, 'completed', 60_000);
    expect(s.runGen).toBe(1);
    expect(await countRows(s.id)).toEqual({ n: s.totalCases, distinct: s.totalCases, lo: 0, hi: s.totalCases - 1 });
    expect(await ledger(s.id)).toMatchObject({ chunks: s.chunkCount, cases: s.totalCases });
  });

  it('cancels: the sweep stops, its waiting chunks leave the queue, nothing lands afterwards', async () => {
    const study = await newStudy('small-launcher');
    const created = await createSweep(engineer, { studyId: study.id, spec: sizingSpec(30_000, 'cancel') });
    await waitFor('a first chunk', async () => (await sweepRow(created.id)).chunksDone >= 1, 30_000, 25);
    const cancelled = await cancelSweep(engineer, created.id);
    expect(cancelled.status).toBe('cancelled');
    await new Promise((r) => setTimeout(r, 2_500));
    const s = await sweepRow(created.id);
    expect(s.status).toBe('cancelled');
    expect(s.doneCases).toBeLessThan(s.totalCases);
    expect((await countRows(s.id)).n).toBe(s.doneCases);
    const waiting = (await queue('sweeps').getJobs(['waiting', 'delayed', 'prioritized'])).filter((j) => j?.data?.sweepId === s.id);
    expect(waiting).toHaveLength(0);
    await expect(resumeSweep(engineer, s.id)).rejects.toThrow(/cannot be resumed/);
  });

  it('fails a sweep whose stored spec is invalid at once, without retries (UnrecoverableError)', async () => {
    const study = await newStudy('small-launcher');
    const ok = await createSweep(engineer, { studyId: study.id, spec: sizingSpec(300, 'corrupted'), start: false });
    expect(ok.status).toBe('draft');
    const spec = structuredClone(ok.spec) as { objectives: unknown[] };
    spec.objectives = [];
    await Sweep.update({ spec, status: 'queued' }, { where: { id: ok.id } });
    const row = await sweepRow(ok.id);
    await enqueueChunks(row, 0, [0]);
    const s = await waitForStatus(ok.id, 'failed');
    expect(s.error).toMatch(/objectives/);
    const job = await waitFor('the failed job', async () => {
      const jobs = await queue('sweeps').getJobs(['failed']);
      return jobs.find((j) => j?.data?.sweepId === ok.id) ?? null;
    });
    expect(job.attemptsMade).toBe(1);
    expect(job.failedReason).toMatch(/invalid sweep spec/);
    expect((await countRows(ok.id)).n).toBe(0);
  });
});

describe('several workers', () => {
  afterAll(stopFarm);

  it('two workers share one sweep without duplicates', async () => {
    farm = workers(2, 'pair');
    const study = await newStudy('small-launcher');
    const created = await createSweep(engineer, { studyId: study.id, spec: sizingSpec(30_000, 'shared') });
    const s = await waitForStatus(created.id, 'completed', 60_000);
    expect(await countRows(s.id)).toEqual({ n: s.totalCases, distinct: s.totalCases, lo: 0, hi: s.totalCases - 1 });
    const l = await ledger(s.id);
    expect(l).toEqual({ chunks: s.chunkCount, cases: s.totalCases, workers: 2 });
    await stopFarm();
  });

  it('a worker killed mid-chunk loses and duplicates nothing once another takes over', async () => {
    const [victim] = (farm = workers(1, 'victim'));
    const study = await newStudy('small-launcher');
    const created = await createSweep(engineer, { studyId: study.id, spec: sizingSpec(30_000, 'killed worker') });
    await waitFor('a chunk in flight after the first commit', async () => {
      const s = await sweepRow(created.id);
      return s.chunksDone >= 1 && s.chunksDone < s.chunkCount - 1 && (await queue('sweeps').getActiveCount()) > 0;
    }, 30_000, 20);
    expect(await killHard(victim)).toBeGreaterThanOrEqual(2);
    const atKill = await sweepRow(created.id);
    expect(atKill.doneCases).toBeLessThan(atKill.totalCases);
    farm = workers(1, 'rescuer');
    const s = await waitForStatus(created.id, 'completed', 60_000);
    expect(await countRows(s.id)).toEqual({ n: s.totalCases, distinct: s.totalCases, lo: 0, hi: s.totalCases - 1 });
    expect(await ledger(s.id)).toMatchObject({ chunks: s.chunkCount, cases: s.totalCases, workers: 2 });
    expect(s.doneCases).toBe(s.totalCases);
  });
});

describe('input and access', () => {
  it('refuses invalid specs with field errors, and over-cap sweeps', async () => {
    const study = await newStudy('small-launcher');
    const bad = sizingSpec(100) as Record<string, any>;
    bad.baseline.stages[1].propulsion.ispVacuum = 100;
    bad.objectives = [{ metric: 'glow', direction: 'min' }];
    const e = await createSweep(engineer, { studyId: study.id, spec: bad }).catch((x) => x);
    expect(e).toBeInstanceOf(InputError);
    expect(e.errors['spec.baseline.stages.1.propulsion.ispVacuum']).toMatch(/vacuum Isp/);
    expect(e.errors['spec.objectives']).toMatch(/at least 2/);

    const huge = sizingSpec(100) as Record<string, any>;
    huge.sweep.parameters[2].values = { kind: 'count', min: 1.2, max: 1.6, count: Math.ceil(config.SWEEP_CASE_CAP / 15) + 1 };
    const cap = await createSweep(engineer, { studyId: study.id, spec: huge }).catch((x) => x);
    expect(cap).toBeInstanceOf(InputError);
    expect(cap.errors['spec.sweep.parameters']).toMatch(/more than the cap/);

    const noStudy = await createSweep(engineer, { spec: sizingSpec(10) }).catch((x) => x);
    expect(noStudy.errors.studyId).toMatch(/required/);
  });

  it('a viewer cannot create or cancel a sweep (403); another workspace is a 404', async () => {
    const study = await newStudy('small-launcher');
    const forbidden = await createSweep(viewer, { studyId: study.id, spec: sizingSpec(50), start: false }).catch((x) => x);
    expect(forbidden.status).toBe(403);
    const draft = await createSweep(engineer, { studyId: study.id, spec: sizingSpec(50), start: false });
    expect((await cancelSweep(viewer, draft.id).catch((x) => x)).status).toBe(403);
    expect((await pauseSweep(viewer, draft.id).catch((x) => x)).status).toBe(403);
    expect((await getSweep(viewer, draft.id)).id).toBe(draft.id);

    const heavy = await newStudy('heavy-concepts');
    const theirs = await createSweep(engineer, { studyId: heavy.id, spec: sizingSpec(50), start: false });
    const hidden = await getSweep(viewer, theirs.id).catch((x) => x);
    expect(hidden.status).toBe(404);
    expect(hidden.body.message).toBe('Sweep not found');
    expect((await getSweep(viewer, 999_999).catch((x) => x)).status).toBe(404);
    expect((await createSweep(viewer, { studyId: heavy.id, spec: sizingSpec(50) }).catch((x) => x)).status).toBe(404);
  });
});
