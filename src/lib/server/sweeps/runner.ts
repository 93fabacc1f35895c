/**
 * Queue side of sweeps: chunk jobs with deterministic ids, the finalize job, and removal of
 * waiting chunks on pause/cancel. Used by the API (producer, fails fast when Redis is down)
 * and by the worker (finalize). Relative imports only.
 *
 * Job ids: `sweep-<key>-g<gen>-chunk-<n>` and `sweep-<key>-finalize` (no ':' and never digits
 * only, as BullMQ requires), key = `<id>-<creation time, base 36>` so that ids stay unique when a
 * database is reset under a Redis that still remembers old jobs (sweep ids restart at 1).
 * `gen` is bumped by every resume, so a resumed run never collides
 * with the completed "skipped" jobs of the paused run, while within one run a chunk is queued
 * at most once. Whatever the queue does (duplicates, retries, stalled jobs), the chunk ledger
 * in store.ts is what guarantees each chunk is stored and counted once.
 */
import type { JobsOptions } from 'bullmq';
import { JOB_QUEUE, pingRedis, queue, type JobPayloads } from '../queue';

export class QueueUnavailableError extends Error {
  constructor(cause?: unknown) {
    super('The job queue is unavailable; try again shortly');
    this.name = 'QueueUnavailableError';
    this.cause = cause;
  }
}

/** The identity of a sweep in job ids. */
export interface SweepRef {
  id: number;
  createdAt: Date;
}
export const sweepKey = (s: SweepRef) => `${s.id}-${new Date(s.createdAt).getTime().toString(36)}`;
export const chunkJobId = (s: SweepRef, gen: number, chunk: number) => `sweep-${sweepKey(s)}-g${gen}-chunk-${chunk}`;
export const finalizeJobId = (s: SweepRef) => `sweep-${sweepKey(s)}-finalize`;

/** Chunk jobs retry with exponential backoff; the last attempt stores the chunk as failed cases. */
export const CHUNK_JOB_OPTIONS: JobsOptions = {
  attempts: 3,
  backoff: { type: 'exponential', delay: 500 },
  removeOnComplete: { count: 20_000, age: 24 * 3600 },
  removeOnFail: { count: 20_000, age: 7 * 24 * 3600 }
};

async function ensureRedis() {
  if (!(await pingRedis(1_500))) throw new QueueUnavailableError();
}

/** Queues the given chunks of a sweep run (in slices, so 40k chunks stay a few round trips). */
export async function enqueueChunks(sweep: SweepRef, gen: number, chunks: readonly number[]) {
  await ensureRedis();
  const q = queue(JOB_QUEUE.sweepChunk);
  try {
    for (let k = 0; k < chunks.length; k += 1_000) {
      await q.addBulk(
        chunks.slice(k, k + 1_000).map((chunk) => ({
          name: 'sweepChunk',
          data: { sweepId: sweep.id, gen, chunk } satisfies JobPayloads['sweepChunk'],
          opts: { ...CHUNK_JOB_OPTIONS, jobId: chunkJobId(sweep, gen, chunk) }
        }))
      );
    }
  } catch (e) {
    throw new QueueUnavailableError(e);
  }
}

export async function enqueueFinalize(sweep: SweepRef) {
  await queue(JOB_QUEUE.sweepFinalize).add('sweepFinalize', { sweepId: sweep.id } satisfies JobPayloads['sweepFinalize'], {
    attempts: 3,
    backoff: { type: 'exponential', delay: 1_000 },
    jobId: finalizeJobId(sweep),
    removeOnComplete: { count: 1_000 },
    removeOnFail: { count: 1_000 }
  });
}

/**
 * Removes the waiting/delayed chunk jobs of a run (active ones cannot be removed; they find
 * the sweep paused or cancelled when they commit and roll back). Best effort: a job left in
 * the queue is skipped by the worker anyway.
 */
export async function removeWaitingChunks(sweep: SweepRef, gen: number, chunks: readonly number[]) {
  if (!(await pingRedis(1_000))) return 0;
  const q = queue(JOB_QUEUE.sweepChunk);
  let removed = 0;
  for (let k = 0; k < chunks.length; k += 500) {
    const slice = chunks.slice(k, k + 500);
    const res = await Promise.all(slice.map((c) => q.remove(chunkJobId(sweep, gen, c)).catch(() => 0)));
    removed += res.reduce((a: number, b) => a + Number(b), 0);
  }
  return removed;
}

/**
 * Worker options of the sweeps queue. CPU work runs in compute threads, so lock renewal is
 * never starved and a short lock is safe: a worker that dies mid-chunk loses its lock within
 * seconds and another worker picks the chunk up (the ledger makes the redo harmless).
 * SWEEP_LOCK_MS overrides it (tests kill workers and do not want to wait).
 */
export function sweepWorkerOptions() {
  const lock = Number(process.env.SWEEP_LOCK_MS) || 10_000;
  return { lockDuration: lock, stalledInterval: Math.max(500, Math.round(lock / 2)), maxStalledCount: 2 };
}
