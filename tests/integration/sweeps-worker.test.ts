/**
 * The chunk processor in-process: CPU work stays off the event loop (so BullMQ can renew
 * locks), a chunk that keeps failing becomes failed cases with reasons on its last attempt
 * (never a stuck sweep), and earlier attempts throw so BullMQ retries with backoff.
 */
import './sweeps-env';
import type { Job } from 'bullmq';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sequelize } from '../../src/lib/server/db/sequelize';
import { closeQueues, queue, type JobPayloads } from '../../src/lib/server/queue';
import { closeComputeThreads, evaluateChunkInThread } from '../../src/lib/server/sweeps/compute';
import { closeRawPool, withConnection } from '../../src/lib/server/sweeps/pool';
import { createSweep } from '../../src/lib/server/sweeps/service';
import { sweepChunk } from '../../jobs/processors/sweeps';
import { caseDetail } from '../../src/lib/server/sweeps/cases';
import { EXAMPLE_ASCENT_INPUT } from '../../src/lib/sweep/examples';
import { localsFor, newStudy, sizingSpec, sweepRow } from './sweeps-support';
import { makeEvaluator, type SweepSpec } from '../../src/lib/sweep';

function fakeJob(data: JobPayloads['sweepChunk'], attemptsMade: number): Job<JobPayloads['sweepChunk']> {
  return { data, attemptsMade, opts: { attempts: 3 }, updateProgress: async () => {} } as unknown as Job<JobPayloads['sweepChunk']>;
}

beforeAll(async () => {
  await queue('sweeps').obliterate({ force: true });
});

afterAll(async () => {
  await closeComputeThreads();
  await closeQueues();
  await closeRawPool();
  await sequelize.close();
});

describe('sweep chunk processor', () => {
  it('evaluates a chunk in a compute thread while the event loop keeps ticking', async () => {
    const engineer = await localsFor('engineer@tarnwick.example');
    const study = await newStudy('small-launcher');
    const n = 120_000;
    const s = await createSweep(engineer, { studyId: study.id, spec: sizingSpec(n, 'off the loop'), start: false });
    const row = await sweepRow(s.id);
    await evaluateChunkInThread('warm', JSON.stringify(row.spec), 0, 0, 100); // thread start-up
    let ticks = 0;
    const timer = setInterval(() => ticks++, 5);

    // The same cases evaluated inline block the loop: no timer callback can run meanwhile.
    const ev = makeEvaluator(row.spec as SweepSpec);
    let feasibleInline = 0;
    for (let i = 0; i < n; i++) if (ev.evaluate(i).feasible) feasibleInline++;
    expect(ticks).toBe(0);

    // In the compute thread the loop keeps running (so BullMQ can renew the job's lock).
    const r = await evaluateChunkInThread(`${s.id}`, JSON.stringify(row.spec), 0, 0, n);
    clearInterval(timer);
    expect(r.count).toBe(n);
    expect(ticks).toBeGreaterThanOrEqual(2);
    expect(r.feasible.reduce((a, b) => a + b, 0)).toBe(feasibleInline);
  });

  it('retries a failing chunk, then stores it as failed cases with the reason on the last attempt', async () => {
    const engineer = await localsFor('engineer@tarnwick.example');
    const study = await newStudy('small-launcher');
    const s = await createSweep(engineer, { studyId: study.id, spec: sizingSpec(600, 'always failing'), start: false });
    await withConnection((c) => c.query("UPDATE sweeps SET status = 'queued' WHERE id = ?", [s.id]));
    const broken = { evaluate: async () => Promise.reject(new Error('solver blew up')) };
    await expect(sweepChunk(fakeJob({ sweepId: s.id, gen: 0, chunk: 0 }, 0), broken)).rejects.toThrow('solver blew up');
    await expect(sweepChunk(fakeJob({ sweepId: s.id, gen: 0, chunk: 0 }, 1), broken)).rejects.toThrow('solver blew up');
    const last = await sweepChunk(fakeJob({ sweepId: s.id, gen: 0, chunk: 0 }, 2), broken);
    expect(last).toMatchObject({ chunk: 0, outcome: 'committed', failed: s.chunks.size });
    const rows = await withConnection((c) => c.query('SELECT failed, feasible, reasons FROM sweep_cases WHERE sweep_id = ?', [s.id]));
    expect(rows).toHaveLength(s.chunks.size);
    expect(rows.every((r: { failed: number; feasible: number; reasons: string }) => r.failed === 1 && r.feasible === 0 && r.reasons === 'EVALUATION_FAILED: solver blew up')).toBe(true);
    const after = await sweepRow(s.id);
    expect(after.failedCases).toBe(s.chunks.size);
    expect(after.chunksDone).toBe(1);
    expect(after.status).toBe('running');
    // A second delivery of the same chunk adds nothing.
    expect(await sweepChunk(fakeJob({ sweepId: s.id, gen: 0, chunk: 0 }, 0))).toMatchObject({ outcome: 'duplicate' });
    expect((await sweepRow(s.id)).doneCases).toBe(s.chunks.size);
  });

  it('recomputes an ascent-mode case with its trajectory on demand (nothing stored)', async () => {
    const engineer = await localsFor('engineer@tarnwick.example');
    const study = await newStudy('small-launcher');
    const s = await createSweep(engineer, { studyId: study.id, spec: EXAMPLE_ASCENT_INPUT, start: false });
    const d = await caseDetail(await sweepRow(s.id), 0);
    expect(d.stored).toBeNull();
    expect(d.evaluation?.feasible).toBe(true);
    const t = d.trajectory!;
    expect(t.time.length).toBeGreaterThan(50);
    // Non-decreasing time (a staging event repeats its instant), ending at the last burn-out.
    for (let i = 1; i < t.time.length; i++) expect(t.time[i]).toBeGreaterThanOrEqual(t.time[i - 1]);
    expect(t.time.at(-1)!).toBeGreaterThan(60);
    // The re-flight reaches the evaluated burn-out (the case's targeted 500 km orbit).
    expect(t.check.consistent).toBe(true);
    expect(t.altitude.at(-1)!).toBeCloseTo(d.evaluation!.detail!.ascent!.burnoutAltitude, -3);
    expect(Math.max(...t.dynamicPressure)).toBeCloseTo(d.evaluation!.values.maxDynamicPressure!, -2);
  });
});
