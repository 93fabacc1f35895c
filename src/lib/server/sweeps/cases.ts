/**
 * One case in full (GET /api/sweeps/[id]/cases/[index]) and single-case previews
 * (POST /api/evaluate). The full result — budget terms, stage masses, margins — is
 * recomputed by re-evaluating the case (deterministic), never stored per case.
 */
import { error } from '@sveltejs/kit';
import { z } from 'zod';
import type { Sweep } from '../db/models';
import { evaluateOne, prepareSweep, type PreparedSweep } from './engine';
import { InputError, parseOr400 } from './http';
import { caseRow } from './results';
import { ascentTrajectory } from './trajectory';
import type { SweepSpec } from '../../sweep/spec';
import { validateSpec } from './service';

// Prepared sweeps (plans, Latin-hypercube permutations) of recently opened sweeps.
const cache = new Map<number, PreparedSweep>();
function prepared(sweep: Sweep): PreparedSweep {
  let p = cache.get(sweep.id);
  if (!p) {
    p = prepareSweep(sweep.spec);
    if (cache.size >= 8) cache.delete(cache.keys().next().value!);
    cache.set(sweep.id, p);
  }
  return p;
}

export function caseIndexParam(raw: string | undefined, total: number): number {
  if (!raw || !/^(0|[1-9][0-9]{0,9})$/.test(raw) || Number(raw) >= total) error(404, 'Case not found');
  return Number(raw);
}

export async function caseDetail(sweep: Sweep, index: number) {
  const stored = await caseRow(sweep, index);
  let evaluation: ReturnType<typeof evaluateOne> | null = null;
  let evaluationError: string | null = null;
  try {
    evaluation = evaluateOne(prepared(sweep), index);
  } catch (e) {
    evaluationError = e instanceof Error ? e.message : String(e);
  }
  return {
    sweepId: sweep.id,
    caseIndex: index,
    mode: sweep.mode,
    modelVersion: sweep.modelVersion,
    /** The stored row (null while its chunk has not landed yet). */
    stored,
    /** The case re-evaluated now: params, budget terms, stage masses, reasons. */
    evaluation,
    evaluationError,
    /** Ascent mode: the trajectory, re-flown on demand, with its check against the evaluation. */
    trajectory: evaluation ? safeTrajectory(sweep.spec as SweepSpec, evaluation) : null
  };
}

function safeTrajectory(spec: SweepSpec, e: ReturnType<typeof evaluateOne>) {
  try {
    return ascentTrajectory(spec, e.detail, e.values.payloadMass);
  } catch {
    // A vehicle the core refuses to fly (RangeError) has no trajectory to show.
    return null;
  }
}

export const evaluateSchema = z.object({
  spec: z.unknown(),
  caseIndex: z.number({ error: 'caseIndex must be a number' }).int('caseIndex must be a whole number').min(0, 'caseIndex must be at least 0').default(0)
});

/** Evaluates one case of a spec that need not be saved (the builder's preview). */
export function previewCase(body: unknown) {
  const input = parseOr400(evaluateSchema, body);
  const spec = validateSpec(input.spec);
  let p: PreparedSweep;
  try {
    p = prepareSweep(spec);
  } catch (e) {
    throw new InputError('This specification cannot be previewed', { 'spec.mode': e instanceof Error ? e.message : String(e) });
  }
  if (input.caseIndex >= p.plan.total)
    throw new InputError('Invalid input', { caseIndex: `caseIndex must be below ${p.plan.total} (the number of cases)` });
  const one = evaluateOne(p, input.caseIndex);
  return { total: p.plan.total, ...one, trajectory: safeTrajectory(spec, one) };
}
