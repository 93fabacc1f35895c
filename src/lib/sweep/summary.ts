/**
 * Sweep summary after completion: feasible share, the best feasible case per objective, and the
 * sensitivity of each objective to each swept parameter, in two complementary forms:
 *
 * - `levels`: the mean objective over the feasible cases at each level of the parameter (its
 *   listed values, grid steps or catalogue choices; for a distribution, 10 equal-width bins over
 *   [min, max]) — the "main effect" plot of a designed experiment, readable for categorical
 *   parameters too;
 * - `spearman`: Spearman's rank correlation ρ between the parameter's value and the objective
 *   over the feasible cases (Pearson correlation of the ranks, ties given their average rank;
 *   C. Spearman, Am. J. Psychol. 15 (1904)); null for catalogue choices (no order) or when
 *   either side is constant. For big sweeps ρ is computed on a deterministic subsample (every
 *   s-th case index, at most `maxCorrelationSamples`, default 200,000: standard error ≈ 0.002).
 *
 * The accumulator is streaming: feed results in any order (chunks as they come back from the
 * database), then `finish()`. It rebuilds each case's parameter values from the spec, so only
 * the result rows are needed.
 */
import { planOf, type CaseDimension } from './cases';
import type { CaseResult } from './evaluate';
import { OBJECTIVE_METRICS, type ObjectiveMetric, type SweepSpec } from './spec';

/** The fields of a result the summary reads. */
export type SummaryInput = Pick<CaseResult, 'index' | 'feasible'> & Pick<CaseResult, ObjectiveMetric>;

export interface LevelEffect {
  /** The level: a value, a catalogue id, or a bin's centre. */
  level: number | string;
  /** For bins: [low, high) of the bin. */
  range: [number, number] | null;
  /** Feasible cases at this level. */
  count: number;
  /** Mean objective over them (null when none). */
  mean: number | null;
}

export interface Sensitivity {
  path: string;
  metric: ObjectiveMetric;
  spearman: number | null;
  /** Cases ρ was computed from. */
  samples: number;
  levels: LevelEffect[];
}

export interface SweepSummary {
  total: number;
  /** Results seen. */
  evaluated: number;
  feasible: number;
  /** feasible / evaluated (0 when none evaluated). */
  feasibleShare: number;
  /** Best feasible case per objective (ties: the lowest index); null when nothing is feasible. */
  best: { metric: ObjectiveMetric; direction: 'min' | 'max'; index: number | null; value: number | null }[];
  sensitivity: Sensitivity[];
  /** How the sensitivity was computed (shown beside it). */
  method: string;
}

const BINS = 10;

interface DimAcc {
  dim: CaseDimension;
  levelCount: number;
  levelOf: (value: number) => number;
  /** [level × objective] sums and counts. */
  sum: Float64Array;
  count: Float64Array;
}

export interface SummaryAccumulator {
  add(result: SummaryInput): void;
  finish(): SweepSummary;
}

/** A streaming summary of one sweep. */
export function makeSummaryAccumulator(
  spec: SweepSpec,
  options: { maxCorrelationSamples?: number } = {}
): SummaryAccumulator {
  const plan = planOf(spec);
  const objectives = spec.objectives;
  const m = objectives.length;
  const maxSamples = options.maxCorrelationSamples ?? 200_000;
  const stride = Math.max(1, Math.ceil(plan.total / maxSamples));
  const vec = new Float64Array(plan.dimensions.length);

  const dims: DimAcc[] = plan.dimensions.map((dim) => {
    let levelCount: number;
    let levelOf: (v: number) => number;
    if (dim.kind === 'levels') {
      const index = new Map<number, number>();
      dim.levels.forEach((x, i) => {
        if (!index.has(x)) index.set(x, i);
      });
      levelCount = dim.levels.length;
      levelOf = (v) => index.get(v) ?? 0;
    } else if (dim.kind === 'choices') {
      levelCount = dim.options.length;
      levelOf = (v) => v;
    } else {
      const { min, max } = dim;
      levelCount = BINS;
      levelOf = (v) => (max > min ? Math.min(BINS - 1, Math.max(0, Math.floor(((v - min) / (max - min)) * BINS))) : 0);
    }
    return { dim, levelCount, levelOf, sum: new Float64Array(levelCount * m), count: new Float64Array(levelCount * m) };
  });

  let evaluated = 0;
  let feasible = 0;
  const bestIndex: (number | null)[] = objectives.map(() => null);
  const bestValue = new Float64Array(m);
  // Subsample for ρ: parameter values and objective values, grown as needed.
  let cap = 1024;
  let n = 0;
  let xs = plan.dimensions.map(() => new Float64Array(cap));
  let ys = objectives.map(() => new Float64Array(cap));

  const add = (r: SummaryInput) => {
    evaluated++;
    if (!r.feasible) return;
    feasible++;
    plan.fill(r.index, vec);
    for (let j = 0; j < m; j++) {
      const o = objectives[j];
      const y = r[o.metric];
      if (!Number.isFinite(y)) continue;
      const b = bestIndex[j];
      const better = o.direction === 'min' ? y < bestValue[j] : y > bestValue[j];
      if (b === null || better || (y === bestValue[j] && r.index < b)) {
        bestIndex[j] = r.index;
        bestValue[j] = y;
      }
      for (let di = 0; di < dims.length; di++) {
        const d = dims[di];
        const k = d.levelOf(vec[di]) * m + j;
        d.sum[k] += y;
        d.count[k]++;
      }
    }
    if (r.index % stride === 0) {
      if (n === cap) {
        cap *= 2;
        const grow = (a: Float64Array) => {
          const g = new Float64Array(cap);
          g.set(a);
          return g;
        };
        xs = xs.map(grow);
        ys = ys.map(grow);
      }
      for (let d = 0; d < xs.length; d++) xs[d][n] = vec[d];
      for (let j = 0; j < m; j++) ys[j][n] = r[objectives[j].metric];
      n++;
    }
  };

  const finish = (): SweepSummary => {
    const sensitivity: Sensitivity[] = [];
    const yRanks = ys.map((y) => ranksOf(y.subarray(0, n)));
    dims.forEach((d, di) => {
      const xRanks = d.dim.kind === 'choices' ? null : ranksOf(xs[di].subarray(0, n));
      objectives.forEach((o, j) => {
        const levels: LevelEffect[] = [];
        for (let l = 0; l < d.levelCount; l++) {
          const c = d.count[l * m + j];
          const mean = c > 0 ? d.sum[l * m + j] / c : null;
          const dim = d.dim;
          if (dim.kind === 'levels') levels.push({ level: dim.levels[l], range: null, count: c, mean });
          else if (dim.kind === 'choices') levels.push({ level: dim.options[l].id, range: null, count: c, mean });
          else {
            const w = (dim.max - dim.min) / BINS;
            levels.push({ level: dim.min + (l + 0.5) * w, range: [dim.min + l * w, dim.min + (l + 1) * w], count: c, mean });
          }
        }
        sensitivity.push({
          path: d.dim.path,
          metric: o.metric,
          spearman: xRanks ? pearson(xRanks, yRanks[j]) : null,
          samples: n,
          levels
        });
      });
    });
    return {
      total: plan.total,
      evaluated,
      feasible,
      feasibleShare: evaluated > 0 ? feasible / evaluated : 0,
      best: objectives.map((o, j) => ({
        metric: o.metric,
        direction: o.direction,
        index: bestIndex[j],
        value: bestIndex[j] === null ? null : bestValue[j]
      })),
      sensitivity,
      method:
        `Mean ${objectives.map((o) => OBJECTIVE_METRICS[o.metric].label).join(', ')} over the feasible cases at each parameter level ` +
        `(distributions: ${BINS} equal-width bins), and Spearman rank correlation on ${stride === 1 ? 'all feasible cases' : `every ${stride}th case`}.`
    };
  };
  return { add, finish };
}

/** Summary of a complete set of results. */
export function summarizeSweep(spec: SweepSpec, results: Iterable<SummaryInput>): SweepSummary {
  const acc = makeSummaryAccumulator(spec);
  for (const r of results) acc.add(r);
  return acc.finish();
}

/** Ranks 1..n, ties given their average rank. */
export function ranksOf(x: ArrayLike<number>): Float64Array {
  const n = x.length;
  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => x[a] - x[b]);
  const r = new Float64Array(n);
  for (let i = 0; i < n; ) {
    let j = i + 1;
    while (j < n && x[order[j]] === x[order[i]]) j++;
    const avg = (i + j + 1) / 2; // mean of ranks i+1..j
    for (let k = i; k < j; k++) r[order[k]] = avg;
    i = j;
  }
  return r;
}

/** Pearson correlation; null when fewer than 3 points or either side is constant. */
export function pearson(a: ArrayLike<number>, b: ArrayLike<number>): number | null {
  const n = a.length;
  if (n < 3) return null;
  let ma = 0;
  let mb = 0;
  for (let i = 0; i < n; i++) {
    ma += a[i];
    mb += b[i];
  }
  ma /= n;
  mb /= n;
  let sab = 0;
  let saa = 0;
  let sbb = 0;
  for (let i = 0; i < n; i++) {
    const da = a[i] - ma;
    const db = b[i] - mb;
    sab += da * db;
    saa += da * da;
    sbb += db * db;
  }
  if (!(saa > 0 && sbb > 0)) return null;
  const rho = sab / Math.sqrt(saa * sbb);
  return Math.max(-1, Math.min(1, rho));
}
