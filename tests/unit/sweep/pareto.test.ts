/**
 * Pareto ranks against a brute-force reference: the textbook definition applied literally
 * (repeatedly peel off the points no remaining point dominates, O(N²) per front), on seeded
 * random data with deliberate ties and duplicate points.
 */
import { describe, expect, test } from 'vitest';
import { mergeFronts, nonDominated, paretoRanks, type Direction, type FrontMember } from '../../../src/lib/sweep/pareto';
import { uniform01 } from '../../../src/lib/sweep/random';

/** q dominates p: no worse on every objective, better on one (directions applied). */
function dominates(obj: Float64Array[], dirs: Direction[], q: number, p: number): boolean {
  let strictly = false;
  for (let j = 0; j < obj.length; j++) {
    const a = dirs[j] === 'min' ? obj[j][q] : -obj[j][q];
    const b = dirs[j] === 'min' ? obj[j][p] : -obj[j][p];
    if (a > b) return false;
    if (a < b) strictly = true;
  }
  return strictly;
}

function bruteForceRanks(obj: Float64Array[], dirs: Direction[], include?: Uint8Array): Int32Array {
  const n = obj[0].length;
  const ranks = new Int32Array(n);
  let remaining: number[] = [];
  for (let i = 0; i < n; i++) {
    if (include && !include[i]) continue;
    if (obj.some((o) => !Number.isFinite(o[i]))) continue;
    remaining.push(i);
  }
  let rank = 0;
  while (remaining.length) {
    rank++;
    const front = remaining.filter((p) => !remaining.some((q) => q !== p && dominates(obj, dirs, q, p)));
    for (const p of front) ranks[p] = rank;
    const inFront = new Set(front);
    remaining = remaining.filter((p) => !inFront.has(p));
  }
  return ranks;
}

/**
 * Seeded data: values drawn from a few discrete levels (many ties on each objective) or
 * continuous, with some rows copied exactly (duplicates).
 */
function randomData(seed: number, n: number, m: number, levels: number): Float64Array[] {
  const obj = Array.from({ length: m }, () => new Float64Array(n));
  for (let i = 0; i < n; i++) {
    const copyOf = uniform01(seed, 9, i, 99) < 0.1 && i > 0 ? Math.floor(uniform01(seed, 8, i, 0) * i) : -1;
    for (let j = 0; j < m; j++) {
      const u = uniform01(seed, 7, i, j);
      obj[j][i] = copyOf >= 0 ? obj[j][copyOf] : levels > 0 ? Math.floor(u * levels) : u * 100 - 50;
    }
  }
  return obj;
}

const DIRECTION_SETS: Record<number, Direction[][]> = {
  2: [['min', 'min'], ['max', 'min'], ['max', 'max']],
  3: [['min', 'min', 'min'], ['min', 'max', 'min'], ['max', 'max', 'min']],
  4: [['min', 'min', 'min', 'min'], ['max', 'min', 'max', 'min'], ['min', 'max', 'max', 'max']]
};

describe('paretoRanks equals the brute-force O(N²) ranking', () => {
  for (const m of [2, 3, 4]) {
    for (const levels of [0, 4, 12]) {
      for (const dirs of DIRECTION_SETS[m]) {
        test(`${m} objectives, ${levels ? `${levels} levels (ties)` : 'continuous'}, ${dirs.join('/')}`, () => {
          for (let seed = 1; seed <= 6; seed++) {
            const n = 50 + seed * 60;
            const obj = randomData(seed * 7919 + m * 31 + levels, n, m, levels);
            const include = Uint8Array.from({ length: n }, (_, i) => (uniform01(seed, 5, i, 0) < 0.85 ? 1 : 0));
            expect(Array.from(paretoRanks(obj, dirs))).toEqual(Array.from(bruteForceRanks(obj, dirs)));
            expect(Array.from(paretoRanks(obj, dirs, include))).toEqual(
              Array.from(bruteForceRanks(obj, dirs, include))
            );
          }
        });
      }
    }
  }

  test('duplicate points share a rank; every rank from 1 to the max is used', () => {
    const f1 = Float64Array.of(1, 1, 2, 2, 3, 1);
    const f2 = Float64Array.of(5, 5, 4, 4, 6, 5);
    const ranks = paretoRanks([f1, f2], ['min', 'min']);
    expect(Array.from(ranks)).toEqual([1, 1, 1, 1, 2, 1]);
  });

  test('a point equal on one objective and better on the other dominates (weak dominance)', () => {
    const f1 = Float64Array.of(1, 1, 1);
    const f2 = Float64Array.of(3, 2, 2);
    const f3 = Float64Array.of(0, 0, 0);
    expect(Array.from(paretoRanks([f1, f2], ['min', 'min']))).toEqual([2, 1, 1]);
    expect(Array.from(paretoRanks([f1, f2, f3], ['min', 'min', 'min']))).toEqual([2, 1, 1]);
    expect(Array.from(paretoRanks([f1, f2, f3, f3], ['min', 'min', 'min', 'max']))).toEqual([2, 1, 1]);
  });

  test('non-finite values and excluded points get rank 0; −0 equals 0', () => {
    const f1 = Float64Array.of(NaN, 1, Infinity, -0, 0);
    const f2 = Float64Array.of(0, 1, 0, 2, 2);
    expect(Array.from(paretoRanks([f1, f2], ['min', 'min']))).toEqual([0, 1, 0, 1, 1]);
    expect(Array.from(paretoRanks([f1, f2], ['min', 'min'], Uint8Array.of(1, 0, 1, 1, 1)))).toEqual([0, 0, 0, 1, 1]);
  });

  test.each([2, 3, 4])('larger seeded sets (2 000 points), %i objectives', (m) => {
    {
      const obj = randomData(424242 + m, 2000, m, m === 2 ? 0 : 30);
      const dirs = DIRECTION_SETS[m][1];
      expect(Array.from(paretoRanks(obj, dirs))).toEqual(Array.from(bruteForceRanks(obj, dirs)));
    }
  });

  test('mismatched lengths and directions are refused', () => {
    expect(() => paretoRanks([new Float64Array(3), new Float64Array(2)], ['min', 'min'])).toThrow(RangeError);
    expect(() => paretoRanks([new Float64Array(3)], ['min', 'min'])).toThrow(/directions/);
    expect(() => paretoRanks([], [])).toThrow(/objectives/);
  });
});

describe('nonDominated and mergeFronts', () => {
  test('nonDominated returns exactly the rank-1 indexes', () => {
    for (const m of [2, 3, 4]) {
      const obj = randomData(77 + m, 500, m, 8);
      const dirs = DIRECTION_SETS[m][2];
      const ranks = bruteForceRanks(obj, dirs);
      const expected = Array.from(ranks.keys()).filter((i) => ranks[i] === 1);
      expect(Array.from(nonDominated(obj, dirs))).toEqual(expected);
    }
  });

  test('merging per-chunk fronts gives the front of the whole set, and a retried chunk changes nothing', () => {
    const m = 3;
    const dirs: Direction[] = ['min', 'max', 'min'];
    const obj = randomData(31337, 1200, m, 10);
    const member = (i: number): FrontMember => ({ index: i, values: obj.map((o) => o[i]) });
    let front: FrontMember[] = [];
    for (let start = 0; start < 1200; start += 100) {
      const chunk = obj.map((o) => o.slice(start, start + 100));
      const local = Array.from(nonDominated(chunk, dirs), (k) => member(start + k));
      front = mergeFronts(front, local, dirs);
      if (start === 500) front = mergeFronts(front, local, dirs); // the same chunk reported twice
    }
    const ranks = bruteForceRanks(obj, dirs);
    const expected = Array.from(ranks.keys()).filter((i) => ranks[i] === 1);
    expect(front.map((f) => f.index)).toEqual(expected);
  });
});

/** Rows whose objectives rise together (many fronts), with a few far-worse rows mixed in. */
function correlatedData(seed: number, n: number): Float64Array[] {
  const obj = Array.from({ length: 4 }, () => new Float64Array(n));
  for (let i = 0; i < n; i++) {
    const size = uniform01(seed, 6, i, 9) * 10 + (uniform01(seed, 6, i, 8) < 0.05 ? 40 : 0);
    for (let j = 0; j < 4; j++) obj[j][i] = Math.round((size + uniform01(seed, 6, i, j)) * 20) / 20;
  }
  return obj;
}

describe('four objectives at larger sizes', () => {
  test('5 seeds × 2 000 points on coarse grids (3–8 levels: ties, duplicates), some non-finite, against the brute force', () => {
    for (let seed = 1; seed <= 5; seed++) {
      const n = 2000;
      const obj = randomData(seed * 104729, n, 4, [3, 5, 8, 5, 4][seed - 1]);
      for (let i = 0; i < n; i++)
        if (uniform01(seed, 4, i, 0) < 0.01) obj[i % 4][i] = [NaN, Infinity, -Infinity][i % 3];
      const include = Uint8Array.from({ length: n }, (_, i) => (uniform01(seed, 4, i, 1) < 0.9 ? 1 : 0));
      const dirs = DIRECTION_SETS[4][seed % 3];
      expect(Array.from(paretoRanks(obj, dirs))).toEqual(Array.from(bruteForceRanks(obj, dirs)));
      expect(Array.from(paretoRanks(obj, dirs, include))).toEqual(Array.from(bruteForceRanks(obj, dirs, include)));
    }
  });

  test('an opposed pair (objective 4 falls as objective 3 rises) and correlated sets with many fronts, against the brute force', () => {
    for (let seed = 1; seed <= 3; seed++) {
      const opposed = randomData(seed * 31, 1500, 4, seed === 1 ? 0 : 10);
      for (let i = 0; i < 1500; i++) opposed[3][i] = 7 - 2 * opposed[2][i];
      const dirs = DIRECTION_SETS[4][0];
      expect(Array.from(paretoRanks(opposed, dirs))).toEqual(Array.from(bruteForceRanks(opposed, dirs)));
      const corr = correlatedData(seed, 1500);
      const ranks = paretoRanks(corr, dirs);
      expect(Math.max(...ranks)).toBeGreaterThan(50); // many fronts, with gaps between clusters
      expect(Array.from(ranks)).toEqual(Array.from(bruteForceRanks(corr, dirs)));
    }
  });

  test('5 000 points: equals the previous k-d tree method (uniform, 6-level grid, correlated)', () => {
    const sets: [Float64Array[], Direction[]][] = [
      [randomData(5001, 5000, 4, 0), DIRECTION_SETS[4][1]],
      [randomData(5002, 5000, 4, 6), DIRECTION_SETS[4][2]],
      [correlatedData(5003, 5000), DIRECTION_SETS[4][0]]
    ];
    for (const [obj, dirs] of sets) expect(Array.from(paretoRanks(obj, dirs))).toEqual(Array.from(kdTreeRanks(obj, dirs)));
  });

  test('40 000 points with a constant fourth objective rank as with three (the separate 3-objective method)', () => {
    for (const levels of [0, 7]) {
      const obj = randomData(40_000 + levels, 40_000, 3, levels);
      const dirs: Direction[] = ['min', 'max', 'min'];
      const four = paretoRanks([...obj, new Float64Array(40_000).fill(2.5)], [...dirs, 'max']);
      expect(Array.from(four)).toEqual(Array.from(paretoRanks(obj, dirs)));
      // and reordering the objectives changes nothing
      const swapped = paretoRanks([obj[2], new Float64Array(40_000).fill(1), obj[0], obj[1]], ['min', 'min', 'min', 'max']);
      expect(Array.from(swapped)).toEqual(Array.from(four));
    }
  });
});

// ---------------------------------------------------------------------------------------------
// The previous 4-objective method, kept here verbatim as a second, independent reference at
// sizes the brute force cannot reach: ENS-BS (Zhang et al., IEEE TEVC 19(2), 2015) with a
// bucket k-d tree per front (ENS-NDT, Gustavsson & Syberfeldt, Evol. Comput. 26(1), 2018).
// Only its preparation is simplified (a comparator sort instead of the radix sort).

const BUCKET = 16;

/** A k-d tree node over objectives 1..m−1; leaves hold up to BUCKET sorted-row positions. */
class KdNode {
  /** Per-dimension minimum over the subtree (for pruning dominance queries). */
  readonly min: Float64Array;
  dim = -1;
  split = 0;
  left: KdNode | null = null;
  right: KdNode | null = null;
  pts: Int32Array | null = new Int32Array(BUCKET);
  count = 0;
  constructor(k: number) {
    this.min = new Float64Array(k).fill(Infinity);
  }
}

/**
 * One front as a bucket k-d tree on objectives 1..m−1 (objective 0 is ordered by the sort),
 * after ENS-NDT (Gustavsson & Syberfeldt, "A New Algorithm Using the Non-Dominated Tree to
 * Improve Non-Dominated Sorting", Evolutionary Computation 26(1), 2018): a query visits only
 * subtrees whose minimum corner is ≤ p, so fronts that do not dominate p are rejected quickly.
 */
class KdFront {
  private root: KdNode;
  private last = -1;
  private readonly k: number;
  private static stack: KdNode[] = [];
  constructor(
    private readonly v: Float64Array,
    private readonly m: number
  ) {
    this.k = m - 1;
    this.root = new KdNode(this.k);
  }

  /** Whether sorted row q (before p) dominates row p. */
  private dom(q: number, p: number): boolean {
    const m = this.m;
    const v = this.v;
    const qm = q * m;
    const pm = p * m;
    let strictly = v[qm] < v[pm];
    for (let j = 1; j < m; j++) {
      const a = v[qm + j];
      const b = v[pm + j];
      if (a > b) return false;
      if (a < b) strictly = true;
    }
    return strictly;
  }

  dominates(p: number): boolean {
    if (this.last >= 0 && this.dom(this.last, p)) return true;
    const v = this.v;
    const pm = p * this.m;
    const k = this.k;
    const stack = KdFront.stack;
    let top = 0;
    stack[top++] = this.root;
    while (top > 0) {
      const node = stack[--top];
      const min = node.min;
      let prune = false;
      for (let d = 0; d < k; d++)
        if (min[d] > v[pm + 1 + d]) {
          prune = true;
          break;
        }
      if (prune) continue;
      if (node.pts) {
        const pts = node.pts;
        for (let i = node.count - 1; i >= 0; i--) if (this.dom(pts[i], p)) return true;
      } else {
        // Points on the right have coordinate ≥ split; they cannot be ≤ p when p is below it.
        if (v[pm + 1 + node.dim] >= node.split) stack[top++] = node.right!;
        stack[top++] = node.left!;
      }
    }
    return false;
  }

  insert(p: number): void {
    this.last = p;
    const v = this.v;
    const m = this.m;
    const k = this.k;
    const pm = p * m;
    let node = this.root;
    for (;;) {
      const min = node.min;
      for (let d = 0; d < k; d++) if (v[pm + 1 + d] < min[d]) min[d] = v[pm + 1 + d];
      if (node.pts) break;
      node = v[pm + 1 + node.dim] < node.split ? node.left! : node.right!;
    }
    if (node.count === node.pts!.length) {
      if (!this.splitLeaf(node)) {
        // Every point of the bucket is equal on objectives 1..m−1: grow it instead.
        const grown = new Int32Array(node.pts!.length * 2);
        grown.set(node.pts!);
        node.pts = grown;
      } else {
        node = v[pm + 1 + node.dim] < node.split ? node.left! : node.right!;
        const min = node.min;
        for (let d = 0; d < k; d++) if (v[pm + 1 + d] < min[d]) min[d] = v[pm + 1 + d];
      }
    }
    node.pts![node.count++] = p;
  }

  /** Splits a full leaf at the mid-range of its widest dimension; false if all points coincide. */
  private splitLeaf(node: KdNode): boolean {
    const v = this.v;
    const m = this.m;
    const pts = node.pts!;
    let bestDim = -1;
    let bestSpread = 0;
    let bestLo = 0;
    let bestHi = 0;
    for (let d = 0; d < this.k; d++) {
      let lo = Infinity;
      let hi = -Infinity;
      for (let i = 0; i < node.count; i++) {
        const x = v[pts[i] * m + 1 + d];
        if (x < lo) lo = x;
        if (x > hi) hi = x;
      }
      if (hi - lo > bestSpread) {
        bestSpread = hi - lo;
        bestDim = d;
        bestLo = lo;
        bestHi = hi;
      }
    }
    if (bestDim < 0) return false;
    let split = 0.5 * (bestLo + bestHi);
    if (!(split > bestLo)) split = bestHi; // rounding: keep both sides non-empty
    const left = new KdNode(this.k);
    const right = new KdNode(this.k);
    for (let i = 0; i < node.count; i++) {
      const q = pts[i];
      const child = v[q * m + 1 + bestDim] < split ? left : right;
      if (child.count === child.pts!.length) {
        const grown = new Int32Array(child.pts!.length * 2);
        grown.set(child.pts!);
        child.pts = grown;
      }
      child.pts![child.count++] = q;
      for (let d = 0; d < this.k; d++) {
        const x = v[q * m + 1 + d];
        if (x < child.min[d]) child.min[d] = x;
      }
    }
    node.dim = bestDim;
    node.split = split;
    node.left = left;
    node.right = right;
    node.pts = null;
    node.count = 0;
    return true;
  }
}

/** ENS-BS with a k-d tree per front, on rows sorted lexicographically. */
function rankEns(v: Float64Array, count: number, m: number, ranks: Int32Array, origin: Int32Array): void {
  const fronts: KdFront[] = [];
  for (let c = 0; c < count; c++) {
    let lo = 0;
    let hi = fronts.length;
    while (lo < hi) {
      const k = (lo + hi) >>> 1;
      if (fronts[k].dominates(c)) lo = k + 1;
      else hi = k;
    }
    if (lo === fronts.length) fronts.push(new KdFront(v, m));
    fronts[lo].insert(c);
    ranks[origin[c]] = lo + 1;
  }
}

function kdTreeRanks(obj: Float64Array[], dirs: Direction[]): Int32Array {
  const n = obj[0].length;
  const m = obj.length;
  const rows: number[] = [];
  for (let i = 0; i < n; i++) if (obj.every((o) => Number.isFinite(o[i]))) rows.push(i);
  const val = (i: number, j: number): number => (dirs[j] === 'max' ? -obj[j][i] : obj[j][i]) + 0;
  rows.sort((p, q) => {
    for (let j = 0; j < m; j++) {
      const d = val(p, j) - val(q, j);
      if (d !== 0) return d;
    }
    return p - q;
  });
  const v = new Float64Array(rows.length * m);
  rows.forEach((i, c) => {
    for (let j = 0; j < m; j++) v[c * m + j] = val(i, j);
  });
  const ranks = new Int32Array(n);
  rankEns(v, rows.length, m, ranks, Int32Array.from(rows));
  return ranks;
}
