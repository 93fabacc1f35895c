/**
 * Deterministic case generation. A case is one point of the sweep's parameter space with a
 * stable integer index 0..total−1; the same spec (seed included) always gives the same cases
 * in the same order, and any case can be rebuilt on its own, so any worker can evaluate any
 * chunk without coordination:
 *
 * - full grid: mixed-radix decoding of the index, the LAST parameter varying fastest (like
 *   nested loops with the first parameter outermost);
 * - Latin hypercube: for dimension d, case i falls in stratum π_d(i) of N equal-probability
 *   strata, π_d a seeded Fisher–Yates permutation computed from (seed, d) alone, plus a seeded
 *   jitter inside the stratum. Permutations are built once per plan (4 bytes × N per
 *   dimension, lazily) and shared by every chunk the process evaluates;
 * - random: each coordinate is a counter-based draw keyed by (seed, index, dimension), so case
 *   i needs no predecessors and no memory.
 *
 * Sampled plans draw a unit coordinate u ∈ (0, 1) per dimension and map it through the
 * parameter's inverse CDF: levels (lists, stepped or counted ranges, catalogue choices) are
 * equally likely, `uniform` is min + u·(max − min), `normal` is the truncated normal quantile.
 * The PRNG is this project's own counter-based hash (random.ts), not an npm package: the
 * sequential generators on npm cannot jump to draw i in O(1).
 */
import { truncatedNormalMass, normalCdf, normalQuantile } from './distributions';
import { STREAM, counterKey, dimKey, seededPermutation, streamKey, uniform01Keyed } from './random';
import {
  estimateCaseCount,
  numericLevels,
  parseParameterPath,
  type CatalogueEntry,
  type ParsedPath,
  type SweepSpec
} from './spec';

/** One case: its index and the swept values (catalogue choices by their id). */
export interface SweepCase {
  index: number;
  params: Record<string, number | string>;
}

/** How one swept parameter turns a coordinate into a value. */
export type CaseDimension =
  | { path: string; parsed: ParsedPath; kind: 'levels'; levels: Float64Array }
  | { path: string; parsed: ParsedPath; kind: 'choices'; options: readonly CatalogueEntry[] }
  | { path: string; parsed: ParsedPath; kind: 'uniform'; min: number; max: number }
  | {
      path: string;
      parsed: ParsedPath;
      kind: 'normal';
      mean: number;
      sd: number;
      min: number;
      max: number;
      /** Φ at the standardised bounds, precomputed. */
      cdfMin: number;
      cdfMax: number;
    };

/** A spec expanded into a case generator. Build once per spec; reuse for every chunk. */
export interface CasePlan {
  readonly spec: SweepSpec;
  /** Number of cases. */
  readonly total: number;
  readonly dimensions: readonly CaseDimension[];
  /**
   * Writes case `index`'s values into `out` (length ≥ dimensions.length) and returns it:
   * numeric values as they are, catalogue choices as the option's position. Allocates nothing
   * (after the first call of a Latin-hypercube plan, which builds its permutations).
   */
  fill(index: number, out: Float64Array): Float64Array;
  /** Case `index` as a readable object. */
  caseAt(index: number): SweepCase;
}

function levelCountOf(d: CaseDimension): number {
  return d.kind === 'levels' ? d.levels.length : d.kind === 'choices' ? d.options.length : NaN;
}

/** Value of dimension d at unit coordinate u ∈ (0, 1) (sampled plans). */
function valueAt(d: CaseDimension, u: number): number {
  switch (d.kind) {
    case 'levels': {
      const n = d.levels.length;
      const k = Math.floor(u * n);
      return d.levels[k < n ? k : n - 1];
    }
    case 'choices': {
      const n = d.options.length;
      const k = Math.floor(u * n);
      return k < n ? k : n - 1;
    }
    case 'uniform':
      return d.min + u * (d.max - d.min);
    case 'normal': {
      // Truncated-normal inverse CDF: Φ⁻¹(Φ(a) + u·(Φ(b) − Φ(a))) on the standardised bounds.
      const x = d.mean + d.sd * normalQuantile(d.cdfMin + u * (d.cdfMax - d.cdfMin));
      return x < d.min ? d.min : x > d.max ? d.max : x;
    }
  }
}

/** valueAt specialised to one dimension (one monomorphic closure per dimension, no switch per draw). */
function makeSampler(d: CaseDimension): (u: number) => number {
  switch (d.kind) {
    case 'levels': {
      const levels = d.levels;
      const n = levels.length;
      return (u) => {
        const k = Math.floor(u * n);
        return levels[k < n ? k : n - 1];
      };
    }
    case 'choices': {
      const n = d.options.length;
      return (u) => {
        const k = Math.floor(u * n);
        return k < n ? k : n - 1;
      };
    }
    case 'uniform': {
      const min = d.min;
      const span = d.max - d.min;
      return (u) => min + u * span;
    }
    case 'normal':
      return (u) => valueAt(d, u);
  }
}

function buildDimensions(spec: SweepSpec): CaseDimension[] {
  return spec.sweep.parameters.map((p): CaseDimension => {
    const parsed = parseParameterPath(p.path);
    if (!parsed) throw new RangeError(`sweep.parameters: unknown parameter path "${p.path}"`);
    const v = p.values;
    switch (v.kind) {
      case 'choices':
        return { path: p.path, parsed, kind: 'choices', options: v.options };
      case 'uniform':
        return { path: p.path, parsed, kind: 'uniform', min: v.min, max: v.max };
      case 'normal':
        return {
          path: p.path,
          parsed,
          kind: 'normal',
          mean: v.mean,
          sd: v.sd,
          min: v.min,
          max: v.max,
          cdfMin: normalCdf((v.min - v.mean) / v.sd),
          cdfMax: normalCdf((v.max - v.mean) / v.sd)
        };
      default:
        return { path: p.path, parsed, kind: 'levels', levels: numericLevels(v) };
    }
  });
}

function checkIndex(index: number, total: number): void {
  if (!(Number.isInteger(index) && index >= 0 && index < total))
    throw new RangeError(`case index must be an integer in [0, ${total - 1}], got ${index}`);
}

// Jitter stays this far from a stratum's edges so that rounding in u·N never moves a sample
// into the next stratum (matters for N up to ~10⁹).
const JITTER_MARGIN = 1e-6;

/** Expands a validated spec into its case plan. */
export function makeCasePlan(spec: SweepSpec): CasePlan {
  const dims = buildDimensions(spec);
  const nd = dims.length;
  const total = estimateCaseCount(spec);
  if (!(Number.isSafeInteger(total) && total >= 1))
    throw new RangeError(`sweep: the spec expands to ${total} cases`);
  const sampling = spec.sweep.sampling;
  for (const d of dims)
    if (d.kind === 'normal' && !(truncatedNormalMass(d.mean, d.sd, d.min, d.max) > 0))
      throw new RangeError(`${d.path}: the normal's bounds keep none of its probability mass`);

  let fill: (index: number, out: Float64Array) => Float64Array;
  if (sampling.plan === 'grid') {
    const radix = dims.map((d) => {
      if (d.kind !== 'levels' && d.kind !== 'choices')
        throw new RangeError(`${d.path}: a distribution cannot be expanded on a full grid`);
      return levelCountOf(d);
    });
    fill = (index, out) => {
      checkIndex(index, total);
      let rest = index;
      for (let k = nd - 1; k >= 0; k--) {
        const n = radix[k];
        const digit = rest % n;
        rest = (rest - digit) / n;
        const d = dims[k];
        out[k] = d.kind === 'levels' ? d.levels[digit] : digit;
      }
      return out;
    };
  } else if (sampling.plan === 'latinHypercube') {
    const seed = sampling.seed >>> 0;
    const perms: (Uint32Array | undefined)[] = new Array(nd).fill(undefined);
    // uniform01(seed, lhsJitter, index, k) hashed in stages (random.ts): same draws, fewer mixes.
    const jitterKey = streamKey(seed, STREAM.lhsJitter);
    const dimKeys = Uint32Array.from({ length: nd }, (_, k) => dimKey(k));
    const samplers = dims.map(makeSampler);
    fill = (index, out) => {
      checkIndex(index, total);
      const ck = counterKey(jitterKey, index);
      for (let k = 0; k < nd; k++) {
        let perm = perms[k];
        if (!perm) perm = perms[k] = seededPermutation(total, seed, STREAM.lhsPermutation, k);
        const jitter = JITTER_MARGIN + (1 - 2 * JITTER_MARGIN) * uniform01Keyed(ck, dimKeys[k]);
        out[k] = samplers[k]((perm[index] + jitter) / total);
      }
      return out;
    };
  } else {
    const seed = sampling.seed >>> 0;
    const randomKey = streamKey(seed, STREAM.random);
    const dimKeys = Uint32Array.from({ length: nd }, (_, k) => dimKey(k));
    const samplers = dims.map(makeSampler);
    fill = (index, out) => {
      checkIndex(index, total);
      const ck = counterKey(randomKey, index);
      for (let k = 0; k < nd; k++) out[k] = samplers[k](uniform01Keyed(ck, dimKeys[k]));
      return out;
    };
  }

  const scratch = new Float64Array(nd);
  const caseAt = (index: number): SweepCase => {
    fill(index, scratch);
    const params: Record<string, number | string> = {};
    for (let k = 0; k < nd; k++) {
      const d = dims[k];
      params[d.path] = d.kind === 'choices' ? d.options[scratch[k]].id : scratch[k];
    }
    return { index, params };
  };
  return Object.freeze({ spec, total, dimensions: Object.freeze(dims), fill, caseAt });
}

// One plan per spec object, so repeated caseAt/casesInRange calls share permutations.
const planCache = new WeakMap<SweepSpec, CasePlan>();

/** The cached plan of a spec object (or the plan itself). */
export function planOf(specOrPlan: SweepSpec | CasePlan): CasePlan {
  if ('fill' in specOrPlan) return specOrPlan;
  let plan = planCache.get(specOrPlan);
  if (!plan) {
    plan = makeCasePlan(specOrPlan);
    planCache.set(specOrPlan, plan);
  }
  return plan;
}

/** Number of cases of a spec. */
export function caseCount(spec: SweepSpec): number {
  return planOf(spec).total;
}

/** Case `index` of the spec (RangeError outside 0..total−1). */
export function caseAt(spec: SweepSpec | CasePlan, index: number): SweepCase {
  return planOf(spec).caseAt(index);
}

/** The cases with indexes start ≤ i < end, in order (a chunk). */
export function* casesInRange(
  spec: SweepSpec | CasePlan,
  start: number,
  end: number
): Generator<SweepCase, void, undefined> {
  const plan = planOf(spec);
  if (!(Number.isInteger(start) && Number.isInteger(end) && 0 <= start && start <= end && end <= plan.total))
    throw new RangeError(`case range must satisfy 0 ≤ start ≤ end ≤ ${plan.total}, got [${start}, ${end})`);
  for (let i = start; i < end; i++) yield plan.caseAt(i);
}

/** One chunk of a sweep: cases start ≤ i < end. */
export interface Chunk {
  /** 0-based chunk number. */
  chunk: number;
  start: number;
  end: number;
}

/** Splits 0..total−1 into consecutive chunks of chunkSize cases (the last may be shorter). */
export function chunkPlan(total: number, chunkSize: number): Chunk[] {
  if (!(Number.isSafeInteger(total) && total >= 0))
    throw new RangeError(`total must be a non-negative integer, got ${total}`);
  if (!(Number.isSafeInteger(chunkSize) && chunkSize >= 1))
    throw new RangeError(`chunkSize must be a positive integer, got ${chunkSize}`);
  const chunks: Chunk[] = [];
  for (let start = 0, chunk = 0; start < total; start += chunkSize, chunk++)
    chunks.push({ chunk, start, end: Math.min(total, start + chunkSize) });
  return chunks;
}
