/**
 * Sweeps as the API sees them: create-and-queue, list, read, cancel, pause, resume.
 * Access through access.ts (404 for foreign/unknown, 403 for a too-low role); bad input as
 * InputError (400 with field errors); Redis down as QueueUnavailableError (503).
 */
import { Op, type WhereOptions } from 'sequelize';
import { z } from 'zod';
import { config } from '../config';
import { Study, Sweep, type SweepStatus } from '../db/models';
import { requireWorkspace, userWorkspaces } from '../guard';
import { caseCount } from '../../sweep/cases';
import { parseSweepSpec, type SweepSpec } from '../../sweep/spec';
import { sweepAccess, studyAccess } from './access';
import { ConflictError, InputError, isUuid, parseOr400 } from './http';
import { MODEL_VERSION, chunkSizeFor } from './engine';
import { enqueueChunks, removeWaitingChunks } from './runner';
import { committedChunks, deleteSweepRows } from './store';
import { withConnection } from './pool';

export const sweepCreateSchema = z.object({
  studyId: z.string({ error: 'studyId is required' }).uuid('studyId must be a study id'),
  spec: z.unknown(),
  /** false: store as a draft without queueing (the builder's "save"). */
  start: z.boolean({ error: 'start must be true or false' }).default(true)
});

function isoOrNull(d: Date | null | undefined) {
  return d ? new Date(d).toISOString() : null;
}

/** Status, counts, progress and ETA of a sweep (the shape of GET /api/sweeps/[id]). */
export function sweepView(s: Sweep, opts: { spec?: boolean } = {}) {
  const now = Date.now();
  const total = s.totalCases;
  const done = s.doneCases;
  const started = s.startedAt ? new Date(s.startedAt).getTime() : null;
  const end = s.finishedAt ? new Date(s.finishedAt).getTime() : now;
  const elapsed = started ? Math.max(0.001, (end - started) / 1000) : 0;
  const rate = started && done > 0 ? done / elapsed : null;
  const active = s.status === 'running' || s.status === 'queued';
  const spec = s.spec as SweepSpec;
  return {
    id: s.id,
    workspaceId: s.workspaceId,
    studyId: s.studyId,
    ownerId: s.ownerId,
    name: s.name,
    question: spec?.question ?? '',
    mode: s.mode,
    status: s.status,
    counts: {
      total,
      done,
      feasible: s.feasibleCases,
      infeasible: done - s.feasibleCases - s.failedCases,
      failed: s.failedCases
    },
    chunks: { total: s.chunkCount, done: s.chunksDone, size: s.chunkSize },
    progress: total > 0 ? done / total : 1,
    /** Cases per second since the first chunk landed. */
    rate,
    /** Seconds left at the current rate (null when unknown or not running). */
    etaSeconds: active && rate ? Math.round((total - done) / rate) : null,
    /** True once every chunk is stored and ranking is under way or done. */
    ranking: s.finalizeClaimedAt !== null && s.status === 'running',
    objectives: spec?.objectives ?? [],
    modelVersion: s.modelVersion,
    summary: s.summary ?? null,
    error: s.error ?? null,
    createdAt: isoOrNull(s.createdAt),
    queuedAt: isoOrNull(s.queuedAt),
    startedAt: isoOrNull(s.startedAt),
    pausedAt: isoOrNull(s.pausedAt),
    finishedAt: isoOrNull(s.finishedAt),
    ...(opts.spec ? { spec } : {})
  };
}
export type SweepView = ReturnType<typeof sweepView>;

/** Validates a spec for this server (case cap from config); field errors prefixed with `prefix`. */
export function validateSpec(input: unknown, prefix = 'spec.'): SweepSpec {
  const r = parseSweepSpec(input, { caseCap: config.SWEEP_CASE_CAP });
  if (!r.ok) {
    const errors: Record<string, string> = {};
    for (const [k, v] of Object.entries(r.errors)) errors[k === '_' ? prefix.replace(/\.$/, '') || '_' : prefix + k] = v;
    throw new InputError('The sweep specification is invalid', errors);
  }
  return r.spec;
}

export async function createSweep(locals: App.Locals, body: unknown) {
  const input = parseOr400(sweepCreateSchema, body);
  const { study, workspace } = await studyAccess(locals, input.studyId, 'engineer');
  if (study.archived) throw new ConflictError('The study is archived; unarchive it to add sweeps');
  const spec = validateSpec(input.spec);
  const total = caseCount(spec);
  if (total > config.SWEEP_CASE_CAP)
    throw new InputError('The sweep specification is invalid', { 'spec.sweep.parameters': `${total} cases, more than the cap of ${config.SWEEP_CASE_CAP}` });
  const chunkSize = chunkSizeFor(spec.mode, total);
  const sweep = await Sweep.create({
    workspaceId: workspace.id,
    studyId: study.id,
    ownerId: locals.user!.id,
    name: spec.name,
    spec,
    mode: spec.mode,
    status: 'draft',
    totalCases: total,
    chunkSize,
    chunkCount: Math.ceil(total / chunkSize),
    modelVersion: MODEL_VERSION
  });
  // Job ids embed the creation time as stored (whole seconds), not the in-memory value.
  await sweep.reload();
  study.changed('updatedAt', true);
  await study.save();
  if (input.start) await startRun(sweep);
  return sweepView(sweep, { spec: true });
}

/** Queues the not-yet-stored chunks of a draft or paused sweep under a new run generation. */
async function startRun(sweep: Sweep) {
  const from = sweep.status;
  const gen = from === 'draft' && sweep.runGen === 0 && sweep.chunksDone === 0 ? 0 : sweep.runGen + 1;
  const [n] = await Sweep.update(
    { status: 'queued', runGen: gen, queuedAt: new Date(), pausedAt: null, error: null },
    { where: { id: sweep.id, status: from } }
  );
  if (n !== 1) throw new ConflictError('The sweep changed state meanwhile; reload it');
  const done = await committedChunks(sweep.id);
  const todo: number[] = [];
  for (let c = 0; c < sweep.chunkCount; c++) if (!done.has(c)) todo.push(c);
  try {
    await enqueueChunks(sweep, gen, todo);
  } catch (e) {
    await Sweep.update({ status: from, error: 'The job queue was unavailable; resume to try again' }, { where: { id: sweep.id } });
    throw e;
  }
  await sweep.reload();
}

export const sweepListSchema = z.object({
  workspace: z.string().min(1).max(64).optional(),
  studyId: z.string().uuid('studyId must be a study id').optional(),
  status: z.enum(['draft', 'queued', 'running', 'paused', 'completed', 'cancelled', 'failed'], { error: 'unknown status' }).optional(),
  limit: z.coerce.number({ error: 'limit must be a number' }).int().min(1).max(200).default(50),
  offset: z.coerce.number({ error: 'offset must be a number' }).int().min(0).max(1_000_000).default(0)
});

export async function listSweeps(locals: App.Locals, query: URLSearchParams) {
  const q = parseOr400(sweepListSchema, Object.fromEntries(query));
  const where: WhereOptions = {};
  if (q.studyId) {
    const { study } = await studyAccess(locals, q.studyId);
    Object.assign(where, { studyId: study.id });
  } else if (q.workspace) {
    const { workspace } = await requireWorkspace(locals, isUuid(q.workspace) ? { id: q.workspace } : { slug: q.workspace });
    Object.assign(where, { workspaceId: workspace.id });
  } else {
    const ids = (await userWorkspaces(locals.user!.id)).map((w) => w.id);
    Object.assign(where, { workspaceId: { [Op.in]: ids } });
  }
  if (q.status) Object.assign(where, { status: q.status });
  const { rows, count } = await Sweep.findAndCountAll({ where, order: [['createdAt', 'DESC'], ['id', 'DESC']], limit: q.limit, offset: q.offset });
  return { total: count, limit: q.limit, offset: q.offset, sweeps: rows.map((s) => sweepView(s)) };
}

export async function getSweep(locals: App.Locals, id: number) {
  const { sweep, role } = await sweepAccess(locals, id);
  return { ...sweepView(sweep, { spec: true }), role };
}

async function pendingChunks(sweep: Sweep) {
  const done = await committedChunks(sweep.id);
  const out: number[] = [];
  for (let c = 0; c < sweep.chunkCount; c++) if (!done.has(c)) out.push(c);
  return out;
}

/** Status change guarded in SQL, so it races correctly with the chunk commits (same row lock). */
async function transition(id: number, to: SweepStatus, from: SweepStatus[], extra: string): Promise<boolean> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await transitionOnce(id, to, from, extra);
    } catch (e) {
      // A deadlock against a chunk commit is resolved by retrying the single statement.
      if ((e as { errno?: number }).errno !== 1213 || attempt >= 3) throw e;
    }
  }
}

async function transitionOnce(id: number, to: SweepStatus, from: SweepStatus[], extra: string): Promise<boolean> {
  return withConnection(async (conn) => {
    const r = await conn.query(
      `UPDATE sweeps SET status = ?, ${extra} updated_at = UTC_TIMESTAMP()
       WHERE id = ? AND status IN (${from.map(() => '?').join(', ')}) AND finalize_claimed_at IS NULL`,
      [to, id, ...from]
    );
    return Number(r.affectedRows) === 1;
  });
}

export async function cancelSweep(locals: App.Locals, id: number) {
  const { sweep } = await sweepAccess(locals, id, 'engineer');
  const ok = await transition(id, 'cancelled', ['draft', 'queued', 'running', 'paused'], 'finished_at = UTC_TIMESTAMP(),');
  if (!ok) throw new ConflictError(`A ${sweep.status} sweep cannot be cancelled${sweep.finalizeClaimedAt ? ' (every case is already stored)' : ''}`);
  await removeWaitingChunks(sweep, sweep.runGen, await pendingChunks(sweep)).catch(() => 0);
  await sweep.reload();
  return sweepView(sweep);
}

export async function pauseSweep(locals: App.Locals, id: number) {
  const { sweep } = await sweepAccess(locals, id, 'engineer');
  const ok = await transition(id, 'paused', ['queued', 'running'], 'paused_at = UTC_TIMESTAMP(),');
  if (!ok) throw new ConflictError(`A ${sweep.status} sweep cannot be paused${sweep.finalizeClaimedAt ? ' (every case is already stored)' : ''}`);
  await removeWaitingChunks(sweep, sweep.runGen, await pendingChunks(sweep)).catch(() => 0);
  await sweep.reload();
  return sweepView(sweep);
}

export async function resumeSweep(locals: App.Locals, id: number) {
  const { sweep } = await sweepAccess(locals, id, 'engineer');
  if (sweep.status !== 'paused' && sweep.status !== 'draft') throw new ConflictError(`A ${sweep.status} sweep cannot be resumed`);
  await startRun(sweep);
  return sweepView(sweep);
}

/** Deletes a sweep and its cases (admins, or the owner while it is not running). */
export async function deleteSweep(locals: App.Locals, id: number) {
  const { sweep, role } = await sweepAccess(locals, id, 'engineer');
  if (role !== 'admin' && sweep.ownerId !== locals.user!.id) throw new ConflictError('Only the owner or an admin can delete a sweep');
  if (sweep.status === 'running' || sweep.status === 'queued') throw new ConflictError('Cancel the sweep before deleting it');
  await deleteSweepRows(id);
  return { deleted: id };
}

export { Study };
