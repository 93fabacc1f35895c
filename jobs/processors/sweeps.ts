/**
 * Sweep jobs. `sweepChunk`: evaluate one chunk in a compute thread and commit it through the
 * chunk ledger (src/lib/server/sweeps/store.ts); `sweepFinalize`: rank, summarise, notify.
 * Results and status live in MariaDB; the job's return value is only a trace.
 */
import { UnrecoverableError, type Job } from 'bullmq';
import { config } from '../../src/lib/server/config';
import { Sweep, User, Workspace } from '../../src/lib/server/db/models';
import { fmtWithUnit, metricInfo } from '../../src/lib/components/quantities';
import type { SweepSummary } from '../../src/lib/server/sweeps/summary';
import { sendMail } from '../../src/lib/server/mail';
import type { JobPayloads } from '../../src/lib/server/queue';
import { failedChunk, type ChunkResult } from '../../src/lib/server/sweeps/chunk-result';
import { evaluateChunkInThread, rankInThread, ThreadTaskError } from '../../src/lib/server/sweeps/compute';
import { completeSweep } from '../../src/lib/server/sweeps/finalize';
import { withConnection } from '../../src/lib/server/sweeps/pool';
import { enqueueFinalize } from '../../src/lib/server/sweeps/runner';
import { commitChunk, loadSweepRow, markSweepFailed, type CommitOutcome } from '../../src/lib/server/sweeps/store';
import { assertSweepSpec, SweepSpecError, type SweepSpec } from '../../src/lib/sweep/spec';

/** Specs are frozen: validate each sweep's once per process. */
const validSpecs = new Map<number, SweepSpec>();

async function validSpec(sweepId: number, raw: unknown): Promise<SweepSpec> {
  const hit = validSpecs.get(sweepId);
  if (hit) return hit;
  try {
    // No case cap here: the cap applies when a sweep is created, not to one already accepted.
    const spec = assertSweepSpec(raw, { caseCap: Number.MAX_SAFE_INTEGER });
    if (validSpecs.size > 64) validSpecs.clear();
    validSpecs.set(sweepId, spec);
    return spec;
  } catch (e) {
    if (e instanceof SweepSpecError) {
      await markSweepFailed(sweepId, e.message);
      throw new UnrecoverableError(e.message);
    }
    throw e;
  }
}

/** Dependencies, replaceable in tests (e.g. an evaluator that always throws). */
export interface ChunkDeps {
  evaluate: (key: string, specJson: string, chunk: number, start: number, end: number) => Promise<ChunkResult>;
}
const defaultDeps: ChunkDeps = { evaluate: evaluateChunkInThread };

export async function sweepChunk(job: Job<JobPayloads['sweepChunk']>, deps: ChunkDeps = defaultDeps) {
  const { sweepId, gen, chunk } = job.data;
  const s = await loadSweepRow(sweepId);
  if (!s) return { skipped: 'deleted' };
  if (s.runGen !== gen || (s.status !== 'queued' && s.status !== 'running')) return { skipped: s.status, gen: s.runGen };
  await validSpec(sweepId, s.spec);

  const start = chunk * s.chunkSize;
  const end = Math.min(s.totalCases, start + s.chunkSize);
  if (!(chunk >= 0 && start < end)) throw new UnrecoverableError(`chunk ${chunk} is outside sweep ${sweepId}`);
  const attempt = job.attemptsMade + 1;
  const last = attempt >= (job.opts.attempts ?? 1);

  let result: ChunkResult;
  try {
    result = await deps.evaluate(`${sweepId}`, s.specJson, chunk, start, end);
  } catch (e) {
    if (e instanceof ThreadTaskError && e.remoteName === 'SweepSpecError') {
      await markSweepFailed(sweepId, e.message);
      throw new UnrecoverableError(e.message);
    }
    // A chunk that keeps failing becomes failed cases with the reason, never a stuck sweep.
    if (!last) throw e;
    result = failedChunk(chunk, start, end - start, e instanceof Error ? e.message : String(e));
  }

  let outcome: CommitOutcome;
  try {
    outcome = await commitChunk(sweepId, result, attempt);
  } catch (e) {
    if (last) await markSweepFailed(sweepId, `chunk ${chunk} could not be stored: ${e instanceof Error ? e.message : e}`).catch(() => {});
    throw e;
  }

  if (outcome.kind === 'committed' && outcome.claimedCompletion) {
    await enqueueFinalize(s);
  } else if (outcome.kind === 'duplicate') {
    // A retry of a chunk whose commit landed but whose finalize enqueue may not have.
    const now = await loadSweepRow(sweepId);
    if (now && now.finalizeClaimed && now.status === 'running') await enqueueFinalize(now);
  }
  await job.updateProgress({ chunk, cases: end - start, outcome: outcome.kind });
  return { chunk, outcome: outcome.kind, feasible: result.feasibleCount, failed: result.failedCount, evalMs: Math.round(result.evalMs) };
}

async function notifyOwner(sweepId: number) {
  const s = await loadSweepRow(sweepId);
  if (!s || !s.ownerId) return false;
  const claim = await withConnection((conn) =>
    conn.query('UPDATE sweeps SET notified_at = UTC_TIMESTAMP() WHERE id = ? AND notified_at IS NULL', [sweepId])
  );
  if (Number(claim.affectedRows) !== 1) return false;
  const owner = await User.findByPk(s.ownerId);
  if (!owner) return false;
  const ws = await Workspace.findByPk(s.workspaceId);
  // The best case of each objective, in the owner's display units.
  const summary = (await Sweep.findByPk(sweepId, { attributes: ['summary'] }))?.summary as SweepSummary | null;
  const best = (summary?.best ?? [])
    .filter((b) => b.caseIndex !== null && b.value !== null)
    .map((b) => `  ${metricInfo(b.metric).label}, ${b.direction === 'min' ? 'lowest' : 'highest'}: ${fmtWithUnit(metricInfo(b.metric).kind, b.value, owner.units)} (case ${b.caseIndex})`);
  try {
    await sendMail({
      to: owner.email,
      subject: `Sweep completed: ${s.name}`,
      text: [
        `Hello ${owner.displayName},`,
        '',
        `Your sweep "${s.name}" has completed: ${s.totalCases.toLocaleString('en-US')} cases, ` +
          `${s.feasibleCases.toLocaleString('en-US')} feasible, ${s.failedCases.toLocaleString('en-US')} failed.`,
        ...(best.length ? ['', 'Best feasible case on each objective:', ...best] : []),
        '',
        `Results: ${config.ORIGIN}/w/${ws?.slug ?? ''}/sweeps/${sweepId}`,
        '',
        'Conceptual estimates only: flight, range-safety and licensing decisions belong to qualified engineers and the applicable authorities.'
      ].join('\n')
    });
  } catch (e) {
    // Release the claim so the retried job sends it.
    await withConnection((conn) => conn.query('UPDATE sweeps SET notified_at = NULL WHERE id = ?', [sweepId]));
    throw e;
  }
  return true;
}

export async function sweepFinalize(job: Job<JobPayloads['sweepFinalize']>) {
  const { sweepId } = job.data;
  const s = await loadSweepRow(sweepId);
  if (!s) return { skipped: 'deleted' };
  if (s.status === 'completed') return { notified: await notifyOwner(sweepId) };
  if (s.status !== 'running' || !s.finalizeClaimed) return { skipped: s.status };
  try {
    const spec = await validSpec(sweepId, s.spec);
    const timings = await completeSweep(s, spec, rankInThread);
    const notified = await notifyOwner(sweepId);
    return { ...timings, notified };
  } catch (e) {
    if (e instanceof UnrecoverableError) throw e;
    if (job.attemptsMade + 1 >= (job.opts.attempts ?? 1))
      await markSweepFailed(sweepId, `ranking failed: ${e instanceof Error ? e.message : e}`).catch(() => {});
    throw e;
  }
}
