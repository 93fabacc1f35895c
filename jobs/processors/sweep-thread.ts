/**
 * A sweep compute thread: evaluates chunks and ranks fronts off the worker's event loop, so
 * BullMQ keeps renewing job locks while the CPU is busy. Pure computation: no DB, no Redis.
 * Messages: { id, task: 'chunk' | 'rank', ... } → { id, ok, result | error }.
 */
import { parentPort } from 'node:worker_threads';
import { transferList } from '../../src/lib/server/sweeps/chunk-result';
import { evaluateChunk, prepareSweep, rankFeasible, type PreparedSweep } from '../../src/lib/server/sweeps/engine';

// Plans (Latin-hypercube permutations included) are built once per sweep and reused by every chunk.
const prepared = new Map<string, PreparedSweep>();

function preparedFor(key: string, specJson: string): PreparedSweep {
  let p = prepared.get(key);
  if (!p) {
    p = prepareSweep(JSON.parse(specJson));
    if (prepared.size >= 4) prepared.delete(prepared.keys().next().value!);
    prepared.set(key, p);
  }
  return p;
}

export type ThreadRequest =
  | { id: number; task: 'chunk'; key: string; spec: string; chunkIndex: number; start: number; end: number }
  | { id: number; task: 'rank'; objectives: Float64Array[]; directions: ('min' | 'max')[] };

parentPort!.on('message', (msg: ThreadRequest) => {
  try {
    if (msg.task === 'chunk') {
      const r = evaluateChunk(preparedFor(msg.key, msg.spec), msg.chunkIndex, msg.start, msg.end);
      parentPort!.postMessage({ id: msg.id, ok: true, result: r }, transferList(r));
    } else {
      const ranks = rankFeasible(msg.objectives, msg.directions);
      parentPort!.postMessage({ id: msg.id, ok: true, result: ranks }, [ranks.buffer as ArrayBuffer]);
    }
  } catch (e) {
    const err = e instanceof Error ? { name: e.name, message: e.message, errors: (e as { errors?: unknown }).errors } : { name: 'Error', message: String(e) };
    parentPort!.postMessage({ id: msg.id, ok: false, error: err });
  }
});
