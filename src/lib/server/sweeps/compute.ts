/**
 * Client of the sweep compute threads (jobs/processors/sweep-thread.ts). The worker process
 * keeps its event loop free for BullMQ's lock renewal and the database while a thread burns
 * CPU. One thread per concurrent job; a thread that dies is replaced on the next request.
 */
import { Worker } from 'node:worker_threads';
import type { ChunkResult } from './chunk-result';

const BOOT = new URL('../../../../jobs/processors/thread-boot.mjs', import.meta.url);
const ENTRY = new URL('../../../../jobs/processors/sweep-thread.ts', import.meta.url).href;

export class ThreadTaskError extends Error {
  constructor(
    message: string,
    readonly remoteName: string,
    readonly errors?: Record<string, string>
  ) {
    super(message);
    this.name = 'ThreadTaskError';
  }
}

type Pending = { resolve: (v: unknown) => void; reject: (e: unknown) => void };

class ComputeThread {
  private worker: Worker | null = null;
  private pending = new Map<number, Pending>();
  private seq = 0;
  busy = 0;

  private spawn(): Worker {
    const w = new Worker(BOOT, { workerData: { entry: ENTRY } });
    w.on('message', (m: { id: number; ok: boolean; result?: unknown; error?: { name: string; message: string; errors?: Record<string, string> } }) => {
      const p = this.pending.get(m.id);
      if (!p) return;
      this.pending.delete(m.id);
      if (m.ok) p.resolve(m.result);
      else p.reject(new ThreadTaskError(m.error!.message, m.error!.name, m.error!.errors));
    });
    const fail = (e: unknown) => {
      for (const p of this.pending.values()) p.reject(e);
      this.pending.clear();
      this.worker = null;
    };
    w.on('error', fail);
    w.on('exit', (code) => fail(new Error(`compute thread exited with code ${code}`)));
    return w;
  }

  run<T>(msg: Record<string, unknown>, transfer: ArrayBuffer[] = []): Promise<T> {
    this.worker ??= this.spawn();
    const id = ++this.seq;
    this.busy++;
    return new Promise<T>((resolve, reject) => {
      this.pending.set(id, { resolve: resolve as (v: unknown) => void, reject });
      this.worker!.postMessage({ ...msg, id }, transfer);
    }).finally(() => this.busy--);
  }

  async close() {
    const w = this.worker;
    this.worker = null;
    if (w) await w.terminate();
  }
}

const threads: ComputeThread[] = [];

function pick(): ComputeThread {
  const max = Math.max(1, Number(process.env.SWEEP_THREADS ?? 1) || 1);
  const idle = threads.find((t) => t.busy === 0);
  if (idle) return idle;
  if (threads.length < max) {
    const t = new ComputeThread();
    threads.push(t);
    return t;
  }
  return threads.reduce((a, b) => (a.busy <= b.busy ? a : b));
}

/** Evaluates cases start ≤ i < end of a sweep in a compute thread. `key` identifies the spec (cache). */
export function evaluateChunkInThread(key: string, specJson: string, chunkIndex: number, start: number, end: number) {
  return pick().run<ChunkResult>({ task: 'chunk', key, spec: specJson, chunkIndex, start, end });
}

/** Pareto ranks of the given points (all feasible) in a compute thread. */
export function rankInThread(objectives: Float64Array[], directions: ('min' | 'max')[]) {
  return pick().run<Int32Array>({ task: 'rank', objectives, directions }, objectives.map((o) => o.buffer as ArrayBuffer));
}

export async function closeComputeThreads() {
  await Promise.all(threads.splice(0).map((t) => t.close()));
}
