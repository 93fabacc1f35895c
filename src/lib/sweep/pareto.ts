/**
 * Non-dominated sorting (Pareto ranks) on 1–4 objectives, each minimised or maximised.
 *
 * Rank 1 is the set of points no other point dominates; rank k the points non-dominated once
 * ranks < k are removed. q dominates p when q is no worse on every objective and better on at
 * least one; equal points therefore never dominate each other and share a rank.
 *
 * Every method first sorts the points lexicographically (objective 1, then 2, ...), so a point
 * can only be dominated by points before it. For 2 and 3 objectives each point is then
 * assigned, in that order, to the first front none of whose members dominates it. Fronts are
 * ordered so that "front k dominates p" is monotone in k (every member of front k+1 is
 * dominated by a member of front k), which allows a binary search over the fronts (Zhang,
 * Tian, Cheng & Jin, "An Efficient Approach to Nondominated Sorting for Evolutionary
 * Multiobjective Optimization", IEEE TEVC 19(2), 2015: ENS-BS). "Does front k dominate p":
 *
 * - 2 objectives: only the front's last member needs checking (after the sort it has the
 *   smallest second objective of its front): O(N log N) overall.
 * - 3 objectives: each front keeps the staircase of its members' (f2, f3) projections (the
 *   2-D non-dominated subset, sorted by f2), answered by one binary search — the dimension-
 *   sweep idea of Kung, Luccio & Preparata (J. ACM 22(4), 1975) and Jensen (IEEE TEVC 7(5),
 *   2003), per front. O(N log N) searches plus staircase updates.
 *
 * 4 objectives use divide and conquer over the sorted order instead (Jensen 2003; Fortin,
 * Grenier & Parizeau 2013), with one staircase per rank in each merge step in place of a second
 * level of recursion: see rank4. (A bucket k-d tree per front, used before, grew superlinearly:
 * 16–50 s for 1M uniform random points, against about 3 s now.)
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

/**
 * Dense ranks (0, 1, 2, ... with equal values sharing one) of column `j` of the distinct rows:
 * `uid[c]` is the distinct-row id of sorted row c.
 */
function denseRanks(v: Float64Array, count: number, m: number, j: number, uid: Int32Array, u: number): Int32Array {
  const keys = new Float64Array(u);
  for (let c = 0; c < count; c++) keys[uid[c]] = v[c * m + j];
  const order = argsortFloat64(keys);
  const r = new Int32Array(u);
  let rank = 0;
  for (let i = 0; i < u; i++) {
    if (i > 0 && keys[order[i]] !== keys[order[i - 1]]) rank++;
    r[order[i]] = rank;
  }
  return r;
}

/** Below this many points a block is ranked by direct pairwise comparison. */
const BLOCK = 48;

/**
 * Four objectives: divide and conquer over the sorted order (the scheme of Jensen, IEEE TEVC
 * 7(5), 2003, generalised to ties by Fortin, Grenier & Parizeau, GECCO 2013), computing
 * rank(p) = 1 + max{rank(q) : q dominates p}.
 *
 * Exact duplicates are merged first (they share a rank). The remaining rows are distinct and
 * sorted lexicographically, so for rows i < j, "i dominates j" is exactly r2[i] ≤ r2[j],
 * r3[i] ≤ r3[j] and r4[i] ≤ r4[j] on the dense ranks of objectives 2–4: objective 1 is no worse
 * by the sort, and distinct rows differ somewhere. solve(l, r) ranks rows [l, r), assuming every
 * row before l has already been applied: it solves the first half, passes the first half's
 * ranks to the second half (a 3-D dominance-maximum problem), then solves the second half.
 *
 * The pass is one sweep over both halves by objective 2 (first-half rows first on equal values)
 * keeping, for every rank k present in the first half, the staircase S_k (2-D non-dominated
 * subset) of the (r3, r4) projections of the first-half rows swept so far with rank ≥ k. The
 * sets are nested (S_k ⊇ S_{k+1}), so "S_k has a member ≤ p" is monotone in k and the best rank
 * for p is found by a binary search over k, each step one binary search in a staircase. A row
 * of rank k is added to S_k, then to the next lower staircases until one already dominates it
 * (then all lower ones do). This replaces the usual second level of recursion plus a Fenwick
 * tree by O(log F) staircase look-ups, F being the number of distinct ranks in the half.
 */
function rank4(v: Float64Array, count: number, ranks: Int32Array, origin: Int32Array): void {
  const m = 4;
  if (count === 0) return;
  // Distinct rows (duplicates are adjacent after the lexicographic sort).
  const uid = new Int32Array(count);
  let u = 0;
  for (let c = 0; c < count; c++) {
    let same = c > 0;
    if (same)
      for (let j = 0; j < m; j++)
        if (v[c * m + j] !== v[(c - 1) * m + j]) {
          same = false;
          break;
        }
    uid[c] = same ? u - 1 : u++;
  }
  const r2 = denseRanks(v, count, m, 1, uid, u);
  const r3 = denseRanks(v, count, m, 2, uid, u);
  const r4 = denseRanks(v, count, m, 3, uid, u);
  // Rows are kept as parallel arrays (id, r2, r3, r4, rank) in "position" order, so that every
  // pass reads memory in sequence: on entry to solve(l, r), positions l..r−1 hold rows l..r−1
  // ordered by (r2, id).
  const id = new Int32Array(u);
  const x2 = new Int32Array(u);
  const x3 = new Int32Array(u);
  const x4 = new Int32Array(u);
  const rk = new Int32Array(u).fill(1);
  const t1 = new Int32Array(u);
  const t2 = new Int32Array(u);
  const t3 = new Int32Array(u);
  const t4 = new Int32Array(u);
  const tk = new Int32Array(u);
  {
    const start = new Int32Array(u + 1);
    for (let i = 0; i < u; i++) start[r2[i] + 1]++;
    for (let k = 0; k < u; k++) start[k + 1] += start[k];
    for (let i = 0; i < u; i++) {
      const at = start[r2[i]]++;
      id[at] = i;
      x2[at] = r2[i];
      x3[at] = r3[i];
      x4[at] = r4[i];
    }
  }
  /** Moves positions [l, r) of the scratch arrays back. */
  const restore = (l: number, r: number): void => {
    id.set(t1.subarray(l, r), l);
    x2.set(t2.subarray(l, r), l);
    x3.set(t3.subarray(l, r), l);
    x4.set(t4.subarray(l, r), l);
    rk.set(tk.subarray(l, r), l);
  };
  /** Copies position s to scratch position d. */
  const stash = (s: number, d: number): void => {
    t1[d] = id[s];
    t2[d] = x2[s];
    t3[d] = x3[s];
    t4[d] = x4[s];
    tk[d] = rk[s];
  };

  // Staircases S_k (k = 1..F) in one arena: entries (r3 ascending, r4 strictly descending) at
  // off[k] .. off[k] + len[k]. A stamp other than the current pass's means "empty".
  const off = new Int32Array(u + 2);
  const len = new Int32Array(u + 2);
  const cap = new Int32Array(u + 2);
  const stamp = new Int32Array(u + 2);
  let pass = 0;
  let a3 = new Int32Array(1 << 16);
  let a4 = new Int32Array(1 << 16);
  let top = 0;

  /** Whether S_k holds a member ≤ (y3, y4). */
  const dominatedAt = (k: number, y3: number, y4: number): boolean => {
    if (stamp[k] !== pass) return false;
    const o = off[k];
    let lo = 0;
    let hi = len[k];
    while (lo < hi) {
      const h = (lo + hi) >>> 1;
      if (a3[o + h] <= y3) lo = h + 1;
      else hi = h;
    }
    return lo > 0 && a4[o + lo - 1] <= y4;
  };

  /** Adds (y3, y4) to S_k, S_{k−1}, ... down to the first staircase that already dominates it. */
  const add = (k: number, y3: number, y4: number): void => {
    for (; k >= 1; k--) {
      if (stamp[k] !== pass) {
        stamp[k] = pass;
        len[k] = 0;
        cap[k] = 0;
      }
      let o = off[k];
      const n = len[k];
      let lo = 0;
      let hi = n;
      while (lo < hi) {
        const h = (lo + hi) >>> 1;
        if (a3[o + h] <= y3) lo = h + 1;
        else hi = h;
      }
      if (lo > 0 && a4[o + lo - 1] <= y4) return; // dominated here, hence in every S_j, j < k
      // Members from `at` on have r3 ≥ y3; those with r4 ≥ y4 are dominated by the new one.
      const at = lo > 0 && a3[o + lo - 1] === y3 ? lo - 1 : lo;
      let e = at;
      while (e < n && a4[o + e] >= y4) e++;
      const newLen = n - (e - at) + 1;
      if (newLen > cap[k]) {
        const c = Math.max(8, cap[k] * 2);
        if (top + c > a3.length) {
          let size = a3.length * 2;
          while (top + c > size) size *= 2;
          const b3 = new Int32Array(size);
          const b4 = new Int32Array(size);
          b3.set(a3.subarray(0, top));
          b4.set(a4.subarray(0, top));
          a3 = b3;
          a4 = b4;
        }
        const d = top;
        for (let i = 0; i < at; i++) {
          a3[d + i] = a3[o + i];
          a4[d + i] = a4[o + i];
        }
        for (let i = e; i < n; i++) {
          a3[d + i - e + at + 1] = a3[o + i];
          a4[d + i - e + at + 1] = a4[o + i];
        }
        off[k] = o = d;
        cap[k] = c;
        top += c;
      } else if (e - at === 0) {
        for (let i = n - 1; i >= at; i--) {
          a3[o + i + 1] = a3[o + i];
          a4[o + i + 1] = a4[o + i];
        }
      } else if (e - at > 1) {
        for (let i = e; i < n; i++) {
          a3[o + i - e + at + 1] = a3[o + i];
          a4[o + i - e + at + 1] = a4[o + i];
        }
      }
      a3[o + at] = y3;
      a4[o + at] = y4;
      len[k] = newLen;
    }
  };

  // The distinct ranks of the first half, ascending, and each one's level (1-based) in it.
  const levels = new Int32Array(u);
  const levelOf = new Int32Array(u + 2);
  const seen = new Int32Array(u + 2);

  /** Passes the ranks of rows [l, mid) on to rows [mid, r) (each half at its positions). */
  const carry = (l: number, mid: number, r: number): void => {
    pass++;
    top = 0;
    // Staircase c holds the rows whose rank is ≥ levels[c − 1]: only ranks present in the first
    // half open a new level, so a gap between ranks costs nothing.
    let d = 0;
    for (let t = l; t < mid; t++) {
      const k = rk[t];
      if (seen[k] !== pass) {
        seen[k] = pass;
        levels[d++] = k;
      }
    }
    const lv = levels.subarray(0, d);
    if (d > 1) lv.sort();
    for (let c = 0; c < d; c++) levelOf[lv[c]] = c + 1;
    const highest = lv[d - 1];
    let best = 0; // highest level among the first-half rows swept so far
    let i = l;
    let j = mid;
    while (j < r) {
      if (i < mid && x2[i] <= x2[j]) {
        const c = levelOf[rk[i]];
        if (c > best) best = c;
        add(c, x3[i], x4[i]);
        i++;
      } else {
        const p = j++;
        const k = rk[p];
        if (k > highest) continue; // no first-half rank ≥ k: nothing can raise it
        // Lowest level whose rank is ≥ k: only a dominating rank ≥ k raises rk[p].
        let lo: number;
        if (seen[k] === pass) lo = levelOf[k];
        else {
          lo = 0;
          let hi = d;
          while (lo < hi) {
            const h = (lo + hi) >>> 1;
            if (lv[h] < k) lo = h + 1;
            else hi = h;
          }
          lo++;
        }
        const p3 = x3[p];
        const p4 = x4[p];
        if (lo > best || !dominatedAt(lo, p3, p4)) continue;
        let hi = best;
        while (lo < hi) {
          const h = (lo + hi + 1) >>> 1;
          if (dominatedAt(h, p3, p4)) lo = h;
          else hi = h - 1;
        }
        rk[p] = lv[lo - 1] + 1;
      }
    }
  };

  const solve = (l: number, r: number): void => {
    if (r - l <= BLOCK) {
      // Direct comparison in position order, which puts every dominating row first: q
      // dominates p when it is earlier in the sort (smaller id) and no worse on r3 and r4
      // (r2 is no worse by the position order).
      for (let p = l + 1; p < r; p++) {
        const i0 = id[p];
        const p3 = x3[p];
        const p4 = x4[p];
        let k = rk[p];
        for (let q = l; q < p; q++) if (rk[q] >= k && x3[q] <= p3 && x4[q] <= p4 && id[q] < i0) k = rk[q] + 1;
        rk[p] = k;
      }
      return;
    }
    const mid = (l + r) >>> 1;
    // Split positions [l, r) into the rows of each half, keeping the (r2, id) order.
    let a = l;
    let b = mid;
    for (let s = l; s < r; s++) stash(s, id[s] < mid ? a++ : b++);
    restore(l, r);
    solve(l, mid);
    carry(l, mid, r);
    solve(mid, r);
    // Merge the halves back into (r2, id) order for the caller.
    a = l;
    b = mid;
    let d = l;
    while (a < mid && b < r) {
      if (x2[a] < x2[b] || (x2[a] === x2[b] && id[a] < id[b])) stash(a++, d++);
      else stash(b++, d++);
    }
    while (a < mid) stash(a++, d++);
    while (b < r) stash(b++, d++);
    restore(l, r);
  };

  solve(0, u);
  const rankOf = r2; // r2 is no longer needed: reuse it for the rank of each row id
  for (let s = 0; s < u; s++) rankOf[id[s]] = rk[s];
  for (let c = 0; c < count; c++) ranks[origin[c]] = rankOf[uid[c]];
}

/**
 * Reorders four objectives (ranks do not depend on their order) so that the two that agree
 * most go last: rank4 keeps staircases of those two, and a staircase of two opposed
 * objectives (one nearly a decreasing function of the other) holds almost every point, which
 * makes each insertion linear. Agreement is estimated on up to 4,096 pseudo-random pairs of
 * usable points as (concordant − discordant) / pairs, with min/max applied.
 */
function staircaseLast(
  objectives: readonly Float64Array[],
  directions: readonly Direction[],
  include: Uint8Array | undefined
): [readonly Float64Array[], readonly Direction[]] {
  const n = objectives[0].length;
  const usable = (i: number): boolean =>
    (!include || include[i] !== 0) && objectives.every((o) => Number.isFinite(o[i]));
  const agree = new Float64Array(16);
  const sign = directions.map((d) => (d === 'max' ? -1 : 1));
  let h = 0x9e3779b9;
  for (let s = 0; s < 4096 && n > 1; s++) {
    h = (Math.imul(h ^ (h >>> 15), 0x2c1b3c6d) + s) >>> 0;
    const a = h % n;
    h = (Math.imul(h ^ (h >>> 13), 0x297a2d39) + s) >>> 0;
    const b = h % n;
    if (a === b || !usable(a) || !usable(b)) continue;
    for (let x = 0; x < 4; x++)
      for (let y = x + 1; y < 4; y++)
        agree[x * 4 + y] +=
          Math.sign(sign[x] * (objectives[x][a] - objectives[x][b])) *
          Math.sign(sign[y] * (objectives[y][a] - objectives[y][b]));
  }
  let bx = 2;
  let by = 3;
  for (let x = 0; x < 4; x++)
    for (let y = x + 1; y < 4; y++) if (agree[x * 4 + y] > agree[bx * 4 + by]) [bx, by] = [x, y];
  const order = [0, 1, 2, 3].filter((j) => j !== bx && j !== by).concat([bx, by]);
  return [order.map((j) => objectives[j]), order.map((j) => directions[j])];
}

function rankAll(
  objectives: readonly Float64Array[],
  directions: readonly Direction[],
  include: Uint8Array | undefined,
  firstOnly: boolean
): Int32Array {
  const n = validate(objectives, directions);
  if (include && include.length !== n) throw new RangeError(`include: length ${include.length}, expected ${n}`);
  const m = objectives.length;
  const ranks = new Int32Array(n);
  if (m === 4) [objectives, directions] = staircaseLast(objectives, directions, include);
  const { v, origin, count } = prepare(objectives, directions, include);
  if (m === 1) rank1(v, count, ranks, origin, firstOnly);
  else if (m === 2) rank2(v, count, ranks, origin, firstOnly);
  else if (m === 3) rank3(v, count, ranks, origin, firstOnly);
  else rank4(v, count, ranks, origin);
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
