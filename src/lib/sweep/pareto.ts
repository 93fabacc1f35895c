/**
 * Non-dominated sorting (Pareto ranks) on 1–4 objectives, each minimised or maximised.
 *
 * Rank 1 is the set of points no other point dominates; rank k the points non-dominated once
 * ranks < k are removed. q dominates p when q is no worse on every objective and better on at
 * least one; equal points therefore never dominate each other and share a rank.
 *
 * Every method first sorts the points lexicographically (objective 1, then 2, ...), so a point
 * can only be dominated by points before it, then assigns each point, in that order, to the
 * first front none of whose members dominates it. Fronts are ordered so that "front k
 * dominates p" is monotone in k (every member of front k+1 is dominated by a member of front
 * k), which allows a binary search over the fronts (Zhang, Tian, Cheng & Jin, "An Efficient
 * Approach to Nondominated Sorting for Evolutionary Multiobjective Optimization", IEEE TEVC
 * 19(2), 2015: ENS-BS). What differs is how "does front k dominate p" is answered:
 *
 * - 2 objectives: only the front's last member needs checking (after the sort it has the
 *   smallest second objective of its front): O(N log N) overall.
 * - 3 objectives: each front keeps the staircase of its members' (f2, f3) projections (the
 *   2-D non-dominated subset, sorted by f2), answered by one binary search — the dimension-
 *   sweep idea of Kung, Luccio & Preparata (J. ACM 22(4), 1975) and Jensen (IEEE TEVC 7(5),
 *   2003), per front. O(N log N) searches plus staircase updates.
 * - 4 objectives: each front is a bucket k-d tree on objectives 2..4 (ENS-NDT, Gustavsson &
 *   Syberfeldt 2018), queried for a member ≤ p with pruning by each subtree's minimum corner.
 *
 * Inputs are one Float64Array per objective (all the same length); points that are excluded
 * (the `include` mask is 0, e.g. infeasible cases) or have a non-finite value get rank 0.
 */

export type Direction = 'min' | 'max';

function validate(objectives: readonly Float64Array[], directions: readonly Direction[]): number {
  const m = objectives.length;
  if (m < 1 || m > 4) throw new RangeError(`objectives: need 1 to 4 objective arrays, got ${m}`);
  if (directions.length !== m)
    throw new RangeError(`directions: need one per objective (${m}), got ${directions.length}`);
  const n = objectives[0].length;
  for (let j = 0; j < m; j++) {
    if (objectives[j].length !== n)
      throw new RangeError(`objectives[${j}]: length ${objectives[j].length}, expected ${n}`);
    if (directions[j] !== 'min' && directions[j] !== 'max')
      throw new RangeError(`directions[${j}] must be "min" or "max", got ${String(directions[j])}`);
  }
  return n;
}

/**
 * Gathers the candidates into a row-major matrix of minimised values (max objectives negated)
 * and sorts it lexicographically. Returns the matrix rows in sorted order and the original
 * index of each row.
 */
function prepare(
  objectives: readonly Float64Array[],
  directions: readonly Direction[],
  include: Uint8Array | undefined
): { v: Float64Array; origin: Int32Array; count: number } {
  const n = objectives[0].length;
  const m = objectives.length;
  if (include && include.length !== n)
    throw new RangeError(`include: length ${include.length}, expected ${n}`);
  const cand = new Int32Array(n);
  let count = 0;
  outer: for (let i = 0; i < n; i++) {
    if (include && !include[i]) continue;
    for (let j = 0; j < m; j++) if (!Number.isFinite(objectives[j][i])) continue outer;
    cand[count++] = i;
  }
  const sign = directions.map((d) => (d === 'max' ? -1 : 1));
  // Sort candidates by the first objective with a typed-array numeric sort of (value, index)
  // keys: far faster than a comparator sort. Ties on the first objective are then ordered by
  // the remaining objectives in a second, comparator pass over each run of equal keys.
  const f0 = objectives[0];
  const s0 = sign[0];
  const keys = new Float64Array(count);
  for (let c = 0; c < count; c++) keys[c] = s0 * f0[cand[c]] + 0; // + 0 turns −0 into 0
  const order = argsortFloat64(keys);
  const origin = new Int32Array(count);
  for (let c = 0; c < count; c++) origin[c] = cand[order[c]];
  const v = new Float64Array(count * m);
  for (let c = 0; c < count; c++) {
    const i = origin[c];
    for (let j = 0; j < m; j++) v[c * m + j] = sign[j] * objectives[j][i] + 0;
  }
  if (m > 1) sortTiedRuns(v, origin, count, m);
  return { v, origin, count };
}

/**
 * Indexes that sort `keys` ascending (stable for equal keys). Packs each key's order-preserving
 * 64-bit pattern into two 32-bit halves and runs an LSD radix sort over 16-bit digits.
 */
function argsortFloat64(keys: Float64Array): Uint32Array {
  const n = keys.length;
  const bits = new Uint32Array(keys.buffer, keys.byteOffset, n * 2);
  // IEEE-754 doubles order like sign-magnitude integers: flip all bits of negatives, only the
  // sign bit of positives (little-endian: bits[2i] is the low word, bits[2i+1] the high word).
  const lo = new Uint32Array(n);
  const hi = new Uint32Array(n);
  for (let i = 0; i < n; i++) {
    const h = bits[2 * i + 1];
    const l = bits[2 * i];
    if (h & 0x80000000) {
      hi[i] = ~h >>> 0;
      lo[i] = ~l >>> 0;
    } else {
      hi[i] = (h | 0x80000000) >>> 0;
      lo[i] = l;
    }
  }
  let idx = new Uint32Array(n);
  let tmp = new Uint32Array(n);
  for (let i = 0; i < n; i++) idx[i] = i;
  const count = new Uint32Array(65536);
  for (let pass = 0; pass < 4; pass++) {
    const word = pass < 2 ? lo : hi;
    const shift = (pass & 1) * 16;
    count.fill(0);
    let same = true;
    const first = (word[0] >>> shift) & 0xffff;
    for (let i = 0; i < n; i++) {
      const d = (word[i] >>> shift) & 0xffff;
      count[d]++;
      if (d !== first) same = false;
    }
    if (same) continue; // this digit is constant: the pass would not move anything
    let sum = 0;
    for (let d = 0; d < 65536; d++) {
      const c = count[d];
      count[d] = sum;
      sum += c;
    }
    for (let i = 0; i < n; i++) {
      const k = idx[i];
      const d = (word[k] >>> shift) & 0xffff;
      tmp[count[d]++] = k;
    }
    const t = idx;
    idx = tmp;
    tmp = t;
  }
  return idx;
}

/** Within each run of equal first objectives, sorts rows by the remaining objectives. */
function sortTiedRuns(v: Float64Array, origin: Int32Array, count: number, m: number): void {
  let a = 0;
  while (a < count) {
    let b = a + 1;
    while (b < count && v[b * m] === v[a * m]) b++;
    if (b - a > 1) {
      const rows = Array.from({ length: b - a }, (_, k) => a + k);
      rows.sort((p, q) => {
        for (let j = 1; j < m; j++) {
          const d = v[p * m + j] - v[q * m + j];
          if (d !== 0) return d;
        }
        return origin[p] - origin[q];
      });
      const vv = v.slice(a * m, b * m);
      const oo = origin.slice(a, b);
      for (let k = 0; k < rows.length; k++) {
        const r = rows[k] - a;
        origin[a + k] = oo[r];
        for (let j = 0; j < m; j++) v[(a + k) * m + j] = vv[r * m + j];
      }
    }
    a = b;
  }
}

/** A growable Float64Array. */
class F64List {
  data: Float64Array;
  length = 0;
  constructor(capacity = 8) {
    this.data = new Float64Array(capacity);
  }
  reserve(n: number): void {
    if (n <= this.data.length) return;
    let c = this.data.length * 2;
    while (c < n) c *= 2;
    const d = new Float64Array(c);
    d.set(this.data);
    this.data = d;
  }
}

/** Ranks for one objective: 1 + number of distinct better values. */
function rank1(v: Float64Array, count: number, ranks: Int32Array, origin: Int32Array, firstOnly: boolean): void {
  let rank = 0;
  for (let c = 0; c < count; c++) {
    if (c === 0 || v[c] !== v[c - 1]) rank++;
    if (firstOnly && rank > 1) break;
    ranks[origin[c]] = rank;
  }
}

/** Two objectives: compare with each front's last member only. */
function rank2(v: Float64Array, count: number, ranks: Int32Array, origin: Int32Array, firstOnly: boolean): void {
  const last1 = new F64List(64);
  const last2 = new F64List(64);
  let fronts = 0;
  for (let c = 0; c < count; c++) {
    const p1 = v[2 * c];
    const p2 = v[2 * c + 1];
    // Smallest k whose last member does not dominate p (its f1 ≤ p1 by the sort order).
    let lo = 0;
    let hi = firstOnly ? Math.min(fronts, 1) : fronts;
    while (lo < hi) {
      const k = (lo + hi) >>> 1;
      const l2 = last2.data[k];
      if (l2 < p2 || (l2 === p2 && last1.data[k] < p1)) lo = k + 1;
      else hi = k;
    }
    if (firstOnly && lo > 0) continue;
    if (lo === fronts) {
      last1.reserve(fronts + 1);
      last2.reserve(fronts + 1);
      fronts++;
    }
    last1.data[lo] = p1;
    last2.data[lo] = p2;
    ranks[origin[c]] = lo + 1;
  }
}

/**
 * One front's staircase of (f2, f3) projections: f2 strictly increasing, f3 strictly
 * decreasing, with the smallest f1 seen for each projection (the first inserted, by the sort).
 */
class Staircase {
  s1 = new F64List();
  s2 = new F64List();
  s3 = new F64List();
  get length(): number {
    return this.s2.length;
  }
  /** Largest position with s2 ≤ x, or −1. */
  floor(x: number): number {
    const s2 = this.s2.data;
    let lo = 0;
    let hi = this.s2.length;
    while (lo < hi) {
      const k = (lo + hi) >>> 1;
      if (s2[k] <= x) lo = k + 1;
      else hi = k;
    }
    return lo - 1;
  }
  /** Whether a member dominates p (given every member's f1 ≤ p1). */
  dominates(p1: number, p2: number, p3: number): boolean {
    const j = this.floor(p2);
    if (j < 0) return false;
    const q3 = this.s3.data[j];
    if (q3 < p3) return true;
    if (q3 > p3) return false;
    if (this.s2.data[j] < p2) return true;
    return this.s1.data[j] < p1;
  }
  /** Adds p (not dominated by any member). */
  insert(p1: number, p2: number, p3: number): void {
    const j = this.floor(p2);
    if (j >= 0 && this.s2.data[j] === p2 && this.s3.data[j] === p3) return; // a duplicate projection
    // Members from `at` on have s2 ≥ p2 (s2 = p2 only at j, then with s3 > p3); those with
    // s3 ≥ p3 are 2-D dominated by p, so p replaces them (any point they dominate, p does).
    const n = this.length;
    const at = j >= 0 && this.s2.data[j] === p2 ? j : j + 1;
    let r = at;
    while (r < n && this.s3.data[r] >= p3) r++;
    const removed = r - at;
    const newLen = n - removed + 1;
    for (const list of [this.s1, this.s2, this.s3]) {
      list.reserve(newLen);
      if (removed !== 1) list.data.copyWithin(at + 1, r, n);
      list.length = newLen;
    }
    this.s1.data[at] = p1;
    this.s2.data[at] = p2;
    this.s3.data[at] = p3;
  }
}

/** Three objectives: a staircase per front. */
function rank3(v: Float64Array, count: number, ranks: Int32Array, origin: Int32Array, firstOnly: boolean): void {
  const fronts: Staircase[] = [];
  for (let c = 0; c < count; c++) {
    const p1 = v[3 * c];
    const p2 = v[3 * c + 1];
    const p3 = v[3 * c + 2];
    let lo = 0;
    let hi = firstOnly ? Math.min(fronts.length, 1) : fronts.length;
    while (lo < hi) {
      const k = (lo + hi) >>> 1;
      if (fronts[k].dominates(p1, p2, p3)) lo = k + 1;
      else hi = k;
    }
    if (firstOnly && lo > 0) continue;
    if (lo === fronts.length) fronts.push(new Staircase());
    fronts[lo].insert(p1, p2, p3);
    ranks[origin[c]] = lo + 1;
  }
}

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

/** Any objective count ≥ 2 (used for 4): ENS-BS with a k-d tree per front. */
function rankEns(v: Float64Array, count: number, m: number, ranks: Int32Array, origin: Int32Array, firstOnly: boolean): void {
  const fronts: KdFront[] = [];
  for (let c = 0; c < count; c++) {
    let lo = 0;
    let hi = firstOnly ? Math.min(fronts.length, 1) : fronts.length;
    while (lo < hi) {
      const k = (lo + hi) >>> 1;
      if (fronts[k].dominates(c)) lo = k + 1;
      else hi = k;
    }
    if (firstOnly && lo > 0) continue;
    if (lo === fronts.length) fronts.push(new KdFront(v, m));
    fronts[lo].insert(c);
    ranks[origin[c]] = lo + 1;
  }
}

function rankAll(
  objectives: readonly Float64Array[],
  directions: readonly Direction[],
  include: Uint8Array | undefined,
  firstOnly: boolean
): Int32Array {
  const n = validate(objectives, directions);
  const m = objectives.length;
  const ranks = new Int32Array(n);
  const { v, origin, count } = prepare(objectives, directions, include);
  if (m === 1) rank1(v, count, ranks, origin, firstOnly);
  else if (m === 2) rank2(v, count, ranks, origin, firstOnly);
  else if (m === 3) rank3(v, count, ranks, origin, firstOnly);
  else rankEns(v, count, m, ranks, origin, firstOnly);
  return ranks;
}

/**
 * Pareto rank of every point (1 = non-dominated), 0 for points excluded by `include` or with a
 * non-finite objective value.
 *
 * @param objectives one Float64Array per objective (1–4), all of length N
 * @param directions `'min'` or `'max'` per objective
 * @param include optional mask (length N): 0 excludes a point (e.g. an infeasible case)
 * @example
 * paretoRanks([Float64Array.of(1, 2, 3), Float64Array.of(3, 1, 4)], ['min', 'min'])
 * // returns Int32Array [1, 1, 2]
 */
export function paretoRanks(
  objectives: readonly Float64Array[],
  directions: readonly Direction[],
  include?: Uint8Array
): Int32Array {
  return rankAll(objectives, directions, include, false);
}

/** Indexes (ascending) of the non-dominated points (rank 1); cheaper than full ranking. */
export function nonDominated(
  objectives: readonly Float64Array[],
  directions: readonly Direction[],
  include?: Uint8Array
): Int32Array {
  const ranks = rankAll(objectives, directions, include, true);
  let n = 0;
  for (let i = 0; i < ranks.length; i++) if (ranks[i] === 1) n++;
  const out = new Int32Array(n);
  for (let i = 0, k = 0; i < ranks.length; i++) if (ranks[i] === 1) out[k++] = i;
  return out;
}

/** A member of a live front: a case index and its objective values (in objective order). */
export interface FrontMember {
  index: number;
  values: readonly number[];
}

/**
 * Merges fronts (e.g. the current live front and a finished chunk's non-dominated cases) into
 * the non-dominated set of their union, sorted by case index. A case index that appears in
 * both (a retried chunk) is kept once, from the first input that has it.
 */
export function mergeFronts(
  current: readonly FrontMember[],
  incoming: readonly FrontMember[],
  directions: readonly Direction[]
): FrontMember[] {
  const seen = new Set<number>();
  const all: FrontMember[] = [];
  for (const list of [current, incoming])
    for (const member of list) {
      if (member.values.length !== directions.length)
        throw new RangeError(
          `front member ${member.index}: ${member.values.length} values, expected ${directions.length}`
        );
      if (seen.has(member.index)) continue;
      seen.add(member.index);
      all.push(member);
    }
  if (all.length === 0) return [];
  const objectives = directions.map((_, j) => Float64Array.from(all, (a) => a.values[j]));
  const keep = nonDominated(objectives, directions);
  const out = Array.from(keep, (k) => all[k]);
  out.sort((a, b) => a.index - b.index);
  return out;
}
