/**
 * The compute side of a sweep, pure (no I/O): it runs in the compute threads and, for single
 * cases, in the web server. Builds on SWEEP-CORE (src/lib/sweep): the case plan (`planOf`,
 * `plan.fill`), the evaluator (`makeEvaluator` → flat `CaseResult`, `evaluateCase` with
 * detail), the non-dominated sort (`nonDominated`, `paretoRanks`).
 */
import type { CasePlan } from '../../sweep/cases';
import { SWEEP_MODEL_VERSION, caseReasonCodes, evaluateCase, makeEvaluator, type CaseResult } from '../../sweep/evaluate';
import { nonDominated, paretoRanks, type Direction } from '../../sweep/pareto';
import { assertSweepSpec, type SweepSpec } from '../../sweep/spec';
import { COLUMN_BY_KEY, PARAM_SLOTS, RESULT_COLUMNS } from './columns';
import { emptyChunk, VALUE_WIDTH, type ChunkResult } from './chunk-result';

/** Recorded with every sweep: which model produced its numbers. */
export const MODEL_VERSION = SWEEP_MODEL_VERSION;

/**
 * Cases per chunk job, for ~0.2–2 s of work per job (measured: see tests/bench/sweeps.bench.ts).
 * Coarse jobs keep BullMQ's per-job overhead negligible (STACK.md: ~10k tiny jobs/s) and the
 * batch() writes large; small enough that a lost chunk costs seconds, and that two workers
 * share even a small sweep.
 */
export function chunkSizeFor(mode: 'budget' | 'ascent', total: number): number {
  const target = mode === 'budget' ? 10_000 : 250;
  // Small sweeps still split into a few chunks, so several workers share them.
  const min = mode === 'budget' ? 250 : 10;
  return Math.max(min, Math.min(target, Math.ceil(total / 8)));
}

export interface PreparedSweep {
  spec: SweepSpec;
  plan: CasePlan;
  evaluate: (index: number) => CaseResult;
  objectiveSlots: number[];
  directions: Direction[];
}

export function prepareSweep(raw: unknown): PreparedSweep {
  const spec = assertSweepSpec(raw, { caseCap: Number.MAX_SAFE_INTEGER });
  const objectiveSlots = spec.objectives.map((o) => RESULT_COLUMNS.findIndex((c) => c.key === o.metric));
  if (objectiveSlots.some((s) => s < 0)) throw new Error('an objective has no result column');
  const evaluator = makeEvaluator(spec);
  return { spec, plan: evaluator.plan, evaluate: (i) => evaluator.evaluate(i), objectiveSlots, directions: spec.objectives.map((o) => o.direction) };
}

const KEYS = RESULT_COLUMNS.map((c) => c.key);

/** Evaluates cases start ≤ i < end into a ChunkResult; a case that throws becomes a failed case. */
export function evaluateChunk(p: PreparedSweep, chunkIndex: number, start: number, end: number): ChunkResult {
  const t0 = performance.now();
  const n = end - start;
  const r = emptyChunk(chunkIndex, start, n);
  r.objectiveSlots = p.objectiveSlots;
  const x = new Float64Array(Math.max(1, p.plan.dimensions.length));
  for (let i = 0; i < n; i++) {
    const index = start + i;
    p.plan.fill(index, x);
    for (let j = 0; j < p.plan.dimensions.length && j < PARAM_SLOTS; j++) r.params[i * PARAM_SLOTS + j] = x[j];
    try {
      const c = p.evaluate(index);
      const off = i * VALUE_WIDTH;
      for (let k = 0; k < VALUE_WIDTH; k++) {
        const v = (c as unknown as Record<string, unknown>)[KEYS[k]];
        r.values[off + k] = typeof v === 'number' && Number.isFinite(v) ? v : NaN;
      }
      r.feasible[i] = c.feasible ? 1 : 0;
      r.failMask[i] = c.failMask >>> 0;
      r.reasons[i] = c.reasons.join(',');
      r.detail[i] = null;
      if (c.feasible) r.feasibleCount++;
    } catch (e) {
      r.failed[i] = 1;
      r.reasons[i] = `EVALUATION_FAILED: ${e instanceof Error ? e.message : String(e)}`.slice(0, 1000);
      r.failedCount++;
    }
  }
  markChunkFront(p, r);
  r.evalMs = performance.now() - t0;
  return r;
}

/** Marks the chunk's own non-dominated feasible cases (the candidates of the live front). */
export function markChunkFront(p: PreparedSweep, r: ChunkResult) {
  const include = new Uint8Array(r.count);
  const objectives = p.objectiveSlots.map(() => new Float64Array(r.count));
  for (let i = 0; i < r.count; i++) {
    let ok = r.feasible[i] === 1;
    p.objectiveSlots.forEach((slot, j) => {
      const v = r.values[i * VALUE_WIDTH + slot];
      objectives[j][i] = v;
      if (!Number.isFinite(v)) ok = false;
    });
    include[i] = ok ? 1 : 0;
  }
  for (const i of nonDominated(objectives, p.directions, include)) r.chunkFront[i] = 1;
}

/** Pareto ranks (1 = front) of feasible points. */
export function rankFeasible(objectives: Float64Array[], directions: Direction[]): Int32Array {
  return paretoRanks(objectives, directions);
}

/** Swept values by path (catalogue choices by id) of one case. */
export function caseParams(p: PreparedSweep, index: number) {
  return p.plan.caseAt(index).params;
}

/**
 * One case in full, for the case page and previews (re-evaluated with detail, never stored):
 * flat values, reasons, and SWEEP-CORE's detail (budget terms with origins, stage table,
 * constraint checks, assumptions).
 */
export function evaluateOne(p: PreparedSweep, index: number) {
  const params = caseParams(p, index);
  const c = evaluateCase(p.spec, params, index);
  const values: Record<string, number | null> = {};
  for (const k of KEYS) {
    const v = (c as unknown as Record<string, unknown>)[k];
    values[k] = typeof v === 'number' && Number.isFinite(v) ? v : null;
  }
  return {
    caseIndex: index,
    params,
    feasible: c.feasible,
    reasons: [...c.reasons],
    warnings: caseReasonCodes(c.warnMask),
    values,
    units: Object.fromEntries(RESULT_COLUMNS.map((col) => [col.key, col.unit])),
    detail: c.detail
  };
}

export { COLUMN_BY_KEY };
