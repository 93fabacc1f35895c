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
