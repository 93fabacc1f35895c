/**
 * Pareto ranking time (prints figures; no timed asserts). Run: `npx tsx tests/bench/pareto.bench.ts`.
 *
 * Data: seeded uniform random objectives (the hard case for non-dominated sorting: many fronts
 * of moderate size), a "trade-like" set where objectives are correlated (GLOW, dry mass and
 * losses rise together, as in a sizing sweep; for 4 objectives plus a margin), a grid-like set
 * with heavy ties, and for 4 objectives a set where one objective is a decreasing function of
 * another (a redundant, opposed pair: every point is then on the first front).
 */
import { paretoRanks, type Direction } from '../../src/lib/sweep/pareto';
import { uniform01 } from '../../src/lib/sweep/random';

function uniformData(n: number, m: number, seed: number): Float64Array[] {
  return Array.from({ length: m }, (_, j) => {
    const a = new Float64Array(n);
    for (let i = 0; i < n; i++) a[i] = uniform01(seed, 1, i, j);
    return a;
  });
}

function correlatedData(n: number, seed: number): Float64Array[] {
  const glow = new Float64Array(n);
  const dry = new Float64Array(n);
  const loss = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const size = uniform01(seed, 2, i, 0);
    glow[i] = 20_000 + 40_000 * size + 2_000 * uniform01(seed, 2, i, 1);
    dry[i] = 2_000 + 3_000 * size + 1_500 * uniform01(seed, 2, i, 2);
    loss[i] = 1_800 - 300 * size + 200 * uniform01(seed, 2, i, 3);
  }
  return [glow, dry, loss];
}

function tiedData(n: number, m: number, seed: number): Float64Array[] {
  return Array.from({ length: m }, (_, j) => {
    const a = new Float64Array(n);
    for (let i = 0; i < n; i++) a[i] = Math.floor(uniform01(seed, 3, i, j) * 20);
    return a;
  });
}

/** Adds a fourth objective (a margin, maximised) that rises with the first, plus noise. */
function withMargin(objectives: Float64Array[], seed: number): Float64Array[] {
  const glow = objectives[0];
  const margin = new Float64Array(glow.length);
  for (let i = 0; i < glow.length; i++) margin[i] = glow[i] / 1_000 + 10 * uniform01(seed, 4, i, 0);
  return [...objectives, margin];
}

/** Uniform, except that objective 4 falls exactly as objective 3 rises (a redundant pair). */
function opposedData(n: number, seed: number): Float64Array[] {
  const objectives = uniformData(n, 4, seed);
  for (let i = 0; i < n; i++) objectives[3][i] = 1 - objectives[2][i];
  return objectives;
}

function time(label: string, objectives: Float64Array[], directions: Direction[], repeats = 3): void {
  let best = Infinity;
  let fronts = 0;
  for (let r = 0; r < repeats; r++) {
    const t0 = performance.now();
    const ranks = paretoRanks(objectives, directions);
    const dt = performance.now() - t0;
    best = Math.min(best, dt);
    fronts = 0;
    for (let i = 0; i < ranks.length; i++) if (ranks[i] > fronts) fronts = ranks[i];
  }
  const n = objectives[0].length.toLocaleString('en-US');
  console.log(
    `pareto  ${label.padEnd(44)} N=${n.padStart(9)}  fronts=${String(fronts).padStart(5)}  best of ${repeats}: ${(best / 1000).toFixed(3)} s`
  );
}

const N = 1_000_000;
time('2 objectives, uniform random', uniformData(N, 2, 11), ['min', 'min']);
time('3 objectives, uniform random (target ≤ 3 s)', uniformData(N, 3, 12), ['min', 'max', 'min']);
time('3 objectives, correlated trade-like', correlatedData(N, 13), ['min', 'min', 'min']);
time('3 objectives, 20 levels each (heavy ties)', tiedData(N, 3, 14), ['min', 'min', 'min']);

time('4 objectives, uniform random (target ≤ 5 s)', uniformData(N, 4, 16), ['min', 'min', 'max', 'min']);
time('4 objectives, 20 levels each (heavy ties)', tiedData(N, 4, 17), ['min', 'min', 'min', 'min']);
time('4 objectives, correlated trade-like + margin', withMargin(correlatedData(N, 18), 18), ['min', 'min', 'min', 'max']);
time('4 objectives, one pair opposed', opposedData(N, 19), ['min', 'min', 'min', 'min']);
