/**
 * What evaluating one chunk produces, in column-major typed arrays so it crosses the
 * worker-thread boundary by transfer (no copy, no per-case objects) and maps straight onto
 * the rows of `sweep_cases`. Pure: no I/O (the compute thread imports it).
 */
import { PARAM_SLOTS, RESULT_COLUMNS } from './columns';

export interface ChunkResult {
  chunkIndex: number;
  /** First case index of the chunk. */
  start: number;
  /** Number of cases. */
  count: number;
  /** count × RESULT_COLUMNS.length, row-major; NaN = no value (stored as NULL). */
  values: Float64Array;
  /** count × PARAM_SLOTS, row-major; NaN = unused slot. */
  params: Float64Array;
  feasible: Uint8Array;
  /** 1 when the evaluation itself failed (a crash, not an infeasible design). */
  failed: Uint8Array;
  failMask: Uint32Array;
  /** 1 when non-dominated among the chunk's feasible cases on the sweep's objectives. */
  chunkFront: Uint8Array;
  /** Slots (in `values`) of the sweep's objectives, for the live-front marks. */
  objectiveSlots: number[];
  /** Comma-separated reason codes, with the message for failed cases. */
  reasons: string[];
  /** Per-case JSON text of the non-flat parts (stage masses...), or null. */
  detail: (string | null)[];
  feasibleCount: number;
  failedCount: number;
  evalMs: number;
}

export const VALUE_WIDTH = RESULT_COLUMNS.length;

export function emptyChunk(chunkIndex: number, start: number, count: number): ChunkResult {
  return {
    chunkIndex,
    start,
    count,
    values: new Float64Array(count * VALUE_WIDTH).fill(NaN),
    params: new Float64Array(count * PARAM_SLOTS).fill(NaN),
    feasible: new Uint8Array(count),
    failed: new Uint8Array(count),
    failMask: new Uint32Array(count),
    chunkFront: new Uint8Array(count),
    objectiveSlots: [],
    reasons: new Array<string>(count).fill(''),
    detail: new Array<string | null>(count).fill(null),
    feasibleCount: 0,
    failedCount: 0,
    evalMs: 0
  };
}

/** A chunk whose every case failed with `message` (what a chunk that keeps failing becomes). */
export function failedChunk(chunkIndex: number, start: number, count: number, message: string): ChunkResult {
  const r = emptyChunk(chunkIndex, start, count);
  r.failed.fill(1);
  r.reasons.fill(`EVALUATION_FAILED: ${message}`.slice(0, 1000));
  r.failedCount = count;
  return r;
}

/** Typed arrays to transfer with postMessage. */
export function transferList(r: ChunkResult): ArrayBuffer[] {
  return [r.values.buffer, r.params.buffer, r.feasible.buffer, r.failed.buffer, r.failMask.buffer, r.chunkFront.buffer] as ArrayBuffer[];
}
